/**
 * Browser-side JSON calls to Halfmax's own API. Errors come back as `{ error, code, issues? }` (lib/errors.ts);
 * fetchJson turns them into an ApiError whose message is the server's readable `error` text.
 */

export interface ApiIssue {
  path: string;
  message: string;
}

export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly issues: ApiIssue[];
  constructor(message: string, status: number, code: string, issues: ApiIssue[] = []) {
    super(message);
    this.name = "ApiError";
    this.status = status;
    this.code = code;
    this.issues = issues;
  }
}

export interface FetchJsonOptions {
  method?: "GET" | "POST" | "PATCH" | "DELETE";
  /** Serialised as JSON. */
  body?: unknown;
  signal?: AbortSignal;
}

/** Calls the API with the session cookie and returns the parsed JSON body; throws ApiError on any non-2xx answer. */
export async function fetchJson<T>(url: string, { method = "GET", body, signal }: FetchJsonOptions = {}): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, {
      method,
      signal,
      credentials: "same-origin",
      headers: body === undefined ? { accept: "application/json" } : { accept: "application/json", "content-type": "application/json" },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch (err) {
    if (err instanceof DOMException && err.name === "AbortError") throw err;
    throw new ApiError("Could not reach the Halfmax server. Check your connection and try again.", 0, "network");
  }
  const text = await res.text();
  let parsed: unknown = undefined;
  if (text) {
    try {
      parsed = JSON.parse(text);
    } catch {
      parsed = undefined;
    }
  }
  if (!res.ok) {
    const errorBody = (parsed ?? {}) as { error?: unknown; code?: unknown; issues?: unknown };
    const message =
      typeof errorBody.error === "string" && errorBody.error
        ? errorBody.error
        : res.status === 401
          ? "Your session has ended. Sign in again."
          : `The server answered ${res.status} ${res.statusText || ""}`.trim();
    const issues = Array.isArray(errorBody.issues) ? (errorBody.issues as ApiIssue[]) : [];
    throw new ApiError(message, res.status, typeof errorBody.code === "string" ? errorBody.code : "http_error", issues);
  }
  return parsed as T;
}

/** A readable sentence for any thrown value (ApiError message, or a generic fallback). */
export function errorMessage(err: unknown): string {
  if (err instanceof ApiError) return err.message;
  if (err instanceof Error && err.message) return err.message;
  return "Something went wrong. Try again.";
}
