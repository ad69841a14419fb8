/**
 * The zod → OpenAPI bridge: extends zod with `.openapi()` once, and holds the pieces every operation shares
 * (security schemes, path ids, field descriptions, error statuses). Import `z` from here in lib/openapi so the
 * extension is in place before any `.openapi()` call.
 */
import { extendZodWithOpenApi, type ZodOpenAPIMetadata } from "@asteasolutions/zod-to-openapi";
import { z } from "zod";
import { ERROR_STATUS, type ErrorCode } from "@/lib/errors";

extendZodWithOpenApi(z);

export { z };

/** The two ways to authenticate: a personal API token or the browser's next-auth session cookie. */
export const SECURITY_SCHEMES = {
  bearerAuth: {
    type: "http",
    scheme: "bearer",
    description:
      "Personal API token: create one under Account & tokens, or run `npm run --silent token -- <email>` on the server. " +
      "Send it as `Authorization: Bearer <token>`. Requests act as the token's owner, with that user's role.",
  },
  sessionCookie: {
    type: "apiKey",
    in: "cookie",
    name: "next-auth.session-token",
    description: "Browser session after signing in (on HTTPS the cookie is named `__Secure-next-auth.session-token`).",
  },
} as const;

export type SecuritySchemeName = keyof typeof SECURITY_SCHEMES;

/** Every HTTP status an error can carry, from the one code → status table in lib/errors. */
export type ErrorStatus = (typeof ERROR_STATUS)[ErrorCode];

/** The error codes that answer with `status`, e.g. 422 → ["validation_failed", "unprocessable_image"]. */
export function errorCodesFor(status: ErrorStatus): ErrorCode[] {
  return (Object.keys(ERROR_STATUS) as ErrorCode[]).filter((code) => ERROR_STATUS[code] === status);
}

/** What each error status means in this API; an operation may replace the text with a more specific one. */
export const ERROR_MEANINGS: Record<ErrorStatus, string> = {
  400: "The request is malformed (e.g. the body is not JSON, or the multipart body cannot be read)",
  401: "No valid session cookie or API token",
  403: "The caller's role does not allow this action",
  404: "Not found, or not visible to the caller (service engineers see only their assigned scanners)",
  409: "Conflicts with the current state",
  413: "Too large",
  415: "Unsupported media type",
  422: "The input failed validation (`issues` lists each field), or an image could not be decoded or analysed",
  500: "Unexpected server error; the details are in the server log",
  503: "A dependency (the database) is unavailable",
};

/** The 422 every operation with a body can answer. */
export const VALIDATION_FAILED_MEANING = "The input failed validation (code validation_failed); `issues` lists each field and what is wrong";

/** Schema of a numeric path id (`{id}` in a path); the handlers answer 404 for anything but a positive integer. */
export const pathIdSchema = z.coerce
  .number()
  .int()
  .positive()
  .openapi({ description: "Numeric id", examples: [3] });

/** Documentation of one request field: a description, or OpenAPI schema keywords (description, format, examples …). */
export type FieldDoc = string | ZodOpenAPIMetadata;

/**
 * Attach OpenAPI documentation to a schema that may come from another module (lib/validations). When the bundler
 * gives that module its own copy of zod, the `.openapi()` extension is missing there; zod's own `.meta()` carries
 * the same keywords and the generator reads both.
 */
export function withDoc<T extends z.ZodType>(schema: T, doc: ZodOpenAPIMetadata): T {
  const extended = schema as T & { openapi?: (d: ZodOpenAPIMetadata) => T };
  return typeof extended.openapi === "function" ? extended.openapi(doc) : (schema.meta(doc as Record<string, unknown>) as T);
}

/**
 * The same object schema with descriptions (or other OpenAPI keywords) attached to some fields. Validation is
 * unchanged: each field keeps its own zod schema, only documentation metadata is added.
 */
export function documentFields<Shape extends z.ZodRawShape>(
  schema: z.ZodObject<Shape>,
  docs: { [K in keyof Shape]?: FieldDoc },
): z.ZodObject<Shape> {
  const documented: Record<string, z.ZodType> = {};
  for (const [key, doc] of Object.entries(docs) as [string, FieldDoc | undefined][]) {
    const field = schema.shape[key] as z.ZodType | undefined;
    if (!field) throw new Error(`documentFields: the schema has no field "${key}"`);
    if (doc !== undefined) documented[key] = withDoc(field, typeof doc === "string" ? { description: doc } : doc);
  }
  return schema.extend(documented) as unknown as z.ZodObject<Shape>;
}
