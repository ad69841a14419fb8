import { ZodError } from "zod";

/** One error vocabulary for the whole server; each code maps to one HTTP status. */
export const ERROR_STATUS = {
  bad_request: 400,
  unauthorized: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  payload_too_large: 413,
  unsupported_media_type: 415,
  validation_failed: 422,
  unprocessable_image: 422,
  unavailable: 503,
  internal: 500,
} as const;

export type ErrorCode = keyof typeof ERROR_STATUS;

export class AppError extends Error {
  readonly code: ErrorCode;
  readonly details?: Record<string, unknown>;
  constructor({ code, message, details }: { code: ErrorCode; message: string; details?: Record<string, unknown> }) {
    super(message);
    this.name = "AppError";
    this.code = code;
    this.details = details;
  }
  get status(): number {
    return ERROR_STATUS[this.code];
  }
}

export const notFound = (what: string) => new AppError({ code: "not_found", message: `${what} not found` });
export const forbidden = (message = "Your role does not allow this action") => new AppError({ code: "forbidden", message });

export interface ErrorBody {
  error: string;
  code: ErrorCode;
  issues?: { path: string; message: string }[];
  [key: string]: unknown;
}

/** Maps any thrown value to a JSON error body and status: ZodError → 422 with issues, AppError → its status, else 500. */
export function toErrorBody(err: unknown): { status: number; body: ErrorBody } {
  if (err instanceof ZodError) {
    const issues = err.issues.map((i) => ({ path: i.path.join("."), message: i.message }));
    const summary = issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)).join("; ");
    return { status: 422, body: { error: `Invalid input — ${summary}`, code: "validation_failed", issues } };
  }
  if (err instanceof AppError) {
    return { status: err.status, body: { error: err.message, code: err.code, ...(err.details ?? {}) } };
  }
  console.error("[halfmax] unexpected error", err);
  return { status: 500, body: { error: "Internal error — the details were logged on the server", code: "internal" } };
}

export function toErrorResponse(err: unknown): Response {
  const { status, body } = toErrorBody(err);
  return Response.json(body, { status });
}
