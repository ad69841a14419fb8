import type { SessionUser } from "@/db/queries/users";
import { authenticateRequest, requirePermission } from "@/lib/auth/request-user";
import type { Permission } from "@/lib/auth/roles";
import { AppError, toErrorResponse } from "@/lib/errors";

type RouteContext<P> = { params: Promise<P> };

/**
 * The one gate of every authenticated route handler: caller (session or Bearer token) → permission → handler,
 * with every thrown error mapped to JSON by toErrorResponse.
 */
export function withUser<P = Record<string, string>>(
  permission: Permission | null,
  handler: (ctx: { req: Request; user: SessionUser; params: P }) => Promise<Response>,
) {
  return async (req: Request, context: RouteContext<P>): Promise<Response> => {
    try {
      const user = await authenticateRequest(req);
      if (permission) requirePermission(user, permission);
      const params = (await context?.params) ?? ({} as P);
      return await handler({ req, user, params });
    } catch (err) {
      return toErrorResponse(err);
    }
  };
}

/** Parse a JSON body, answering 400 (not 500) when it is not JSON. */
export async function readJson(req: Request): Promise<unknown> {
  try {
    return await req.json();
  } catch {
    throw new AppError({ code: "bad_request", message: "Request body must be JSON" });
  }
}

/** Parse a JSON body that may be absent (empty → {}), answering 400 when it is present but not JSON. */
export async function readOptionalJson(req: Request): Promise<unknown> {
  const text = await req.text();
  if (text.trim() === "") return {};
  try {
    return JSON.parse(text);
  } catch {
    throw new AppError({ code: "bad_request", message: "Request body must be JSON" });
  }
}

/** Parse a positive integer route id, 404 otherwise. */
export function parseId(raw: string | undefined, what: string): number {
  const n = Number(raw);
  if (!Number.isSafeInteger(n) || n <= 0) throw new AppError({ code: "not_found", message: `${what} not found` });
  return n;
}
