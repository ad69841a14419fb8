/** System, Account and Tokens operations. */
import { MAIL_PREFERENCES } from "@/db/schema";
import { createTokenSchema, passwordSchema } from "@/lib/validations/user";
import type { ApiOperation } from "../operation";
import { documentFields, withDoc, z } from "../registry";
import {
  apiTokenSchema,
  createdApiTokenSchema,
  healthSchema,
  mailPreferenceSchema,
  okSchema,
  openApiDocumentSchema,
  passwordResetAcceptedSchema,
  sessionUserSchema,
} from "../responses";

// Request bodies declared inline in their route files (not exported there), rebuilt here from the shared pieces.
// Keep in step with app/api/password/reset, app/api/password/set and app/api/me/preferences; better: export them
// from lib/validations/user.ts and import them here.
const passwordResetBody = z.object({ email: z.email().openapi({ description: "The account's e-mail address" }) });
const passwordSetBody = z.object({
  token: z.string().min(10).openapi({ description: "The token from the invitation or reset link" }),
  password: withDoc(passwordSchema, { description: "The new password" }),
});
const mailPreferenceBody = z.object({
  mailPreference: z.enum(MAIL_PREFERENCES).openapi({ description: "immediate: one e-mail per alert; digest: one a day; off: none" }),
});

export const ACCOUNT_OPERATIONS: ApiOperation[] = [
  {
    method: "get", path: "/api/health", tag: "System", access: "public",
    summary: "App version and database status",
    success: { status: 200, description: "The database answers", json: healthSchema },
    errors: { 503: { description: "The database does not answer (status \"degraded\")", json: healthSchema } },
  },
  {
    method: "get", path: "/api/openapi.json", tag: "System", access: "public",
    summary: "This API description (OpenAPI 3.1)",
    success: { status: 200, description: "The OpenAPI document", json: openApiDocumentSchema },
  },
  {
    method: "get", path: "/api/me", tag: "Account", access: "signed-in",
    summary: "Who the caller is (useful to check a token)",
    success: { status: 200, description: "The caller", json: z.object({ user: sessionUserSchema }) },
  },
  {
    method: "patch", path: "/api/me/preferences", tag: "Account", access: "signed-in",
    summary: "Set the caller's own mail preference",
    body: { json: mailPreferenceBody },
    success: { status: 200, description: "The preference now in force", json: mailPreferenceSchema },
  },
  {
    method: "post", path: "/api/password/reset", tag: "Account", access: "public",
    summary: "Ask for a password-reset e-mail",
    description: "The answer is the same whether or not the address has an account, so the form does not reveal accounts.",
    body: { json: passwordResetBody },
    success: { status: 202, description: "Accepted; a reset link is mailed if the account exists", json: passwordResetAcceptedSchema },
  },
  {
    method: "post", path: "/api/password/set", tag: "Account", access: "public",
    summary: "Set a password with an invitation or reset token",
    body: { json: passwordSetBody },
    success: { status: 200, description: "Password set; sign in with it", json: okSchema },
    errors: { 400: "The body is not JSON, or the link is invalid, already used or expired" },
  },
  {
    method: "get", path: "/api/tokens", tag: "Tokens", access: "signed-in",
    summary: "The caller's personal API tokens (never the secrets)",
    success: { status: 200, description: "Tokens, newest first", json: z.object({ tokens: z.array(apiTokenSchema) }) },
  },
  {
    method: "post", path: "/api/tokens", tag: "Tokens", access: "signed-in",
    summary: "Create a personal API token",
    description: "The secret is in this response only; only its hash is stored.",
    body: { json: documentFields(createTokenSchema, { name: "Name it after the script that uses it" }) },
    success: { status: 201, description: "Created", json: createdApiTokenSchema },
  },
  {
    method: "delete", path: "/api/tokens/{id}", tag: "Tokens", access: "signed-in",
    summary: "Revoke one of the caller's tokens",
    success: { status: 200, description: "Revoked: requests with this token are refused from now on", json: okSchema },
    errors: { 404: "No active token with this id belongs to the caller" },
  },
];
