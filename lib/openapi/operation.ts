/**
 * The shape of one documented operation, and the tags that group them. The entries live in operations/*.ts
 * (one file per area of the API) and are collected in routes.ts.
 */
import type { Permission } from "@/lib/auth/roles";
import type { ErrorStatus, z } from "./registry";

/** Tags in the order the document and the docs page show them, with one line each. */
export const API_TAGS = [
  { name: "Scans", description: "Upload phantom images, read analysis results (FWHM, FWTM, MTF), re-analyse and sign off" },
  { name: "Scanners", description: "The scanner register: the imaging systems under QA" },
  { name: "QA", description: "Per scanner: routine tests and schedules, baselines, tolerances, trends and CSV export" },
  { name: "Alerts", description: "Alerts raised by results, overdue tests and drift; the service log" },
  { name: "Sites", description: "Hospitals and buildings that hold scanners" },
  { name: "Users", description: "Accounts and roles (administrators)" },
  { name: "Account", description: "The caller's own account, and password set-up by e-mailed link" },
  { name: "Tokens", description: "Personal API tokens for scripts" },
  { name: "Mail", description: "Outgoing e-mail: the outbox and a test message (administrators)" },
  { name: "System", description: "Health and this API description" },
] as const;

export type ApiTag = (typeof API_TAGS)[number]["name"];

/** Who may call an operation: anyone, any signed-in user, or users whose role holds a permission (lib/auth/roles). */
export type ApiAccess = "public" | "signed-in" | Permission;

export interface ApiSuccess {
  status: 200 | 201 | 202;
  description: string;
  /** JSON body schema. */
  json?: z.ZodType;
  /** Non-JSON body: its media types, and whether it is text (CSV) or binary (images, files). */
  raw?: { mediaTypes: string[]; text?: boolean };
  /** Response headers worth knowing, name → description. */
  headers?: Record<string, string>;
}

export interface ApiOperation {
  method: "get" | "post" | "put" | "patch" | "delete";
  /** URL path with `{id}` for dynamic segments, as under app/api (e.g. "/api/scans/{id}/file"). */
  path: string;
  tag: ApiTag;
  summary: string;
  description?: string;
  access: ApiAccess;
  /** Query parameters; declare a 422 in `errors` when the handler validates them. */
  query?: z.ZodObject;
  /** JSON body, or multipart/form-data fields (values are strings, files are binary). */
  body?: { json: z.ZodType; required?: boolean } | { multipart: z.ZodObject };
  success: ApiSuccess;
  /**
   * Errors beyond the derived ones (401/403 from access, 404 from a path id, 400/422 from a body), or a more
   * specific meaning for a derived one. A string keeps the Error body; give `json` when the body has another shape.
   */
  errors?: Partial<Record<ErrorStatus, string | { description: string; json: z.ZodType }>>;
}

/** The usual 404 meaning for a path id. */
export const idNotFound = (what: string) => `${what} not found, or not visible to the caller`;
