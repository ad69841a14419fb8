import { getServerSession } from "next-auth";
import { decode } from "next-auth/jwt";
import { getActiveUserById, getUserByApiTokenHash, toSessionUser, type SessionUser } from "@/db/queries/users";
import { AppError } from "@/lib/errors";
import { can, type Permission } from "./roles";
import { authOptions } from "./options";
import { hashToken } from "./tokens";

/**
 * The caller of an API request: `Authorization: Bearer <token>` (personal API token) or the next-auth session cookie.
 * The user is re-read from the database so deactivation and role changes apply at once. Throws 401 when neither is valid.
 */
export async function authenticateRequest(req: Request): Promise<SessionUser> {
  const header = req.headers.get("authorization");
  if (header) {
    const match = /^Bearer\s+(\S+)$/i.exec(header.trim());
    if (!match) throw new AppError({ code: "unauthorized", message: "Malformed Authorization header: use 'Bearer <token>'" });
    const user = await getUserByApiTokenHash(hashToken(match[1]!));
    if (!user) throw new AppError({ code: "unauthorized", message: "API token is invalid or revoked" });
    return user;
  }
  const user = await sessionUserFromCookie(req);
  if (!user) throw new AppError({ code: "unauthorized", message: "Sign in or send an API token (Authorization: Bearer …)" });
  return user;
}

const SESSION_COOKIES = ["__Secure-next-auth.session-token", "next-auth.session-token"];

/** The next-auth session from the request's own cookie header (no dependence on Next's request scope). */
async function sessionUserFromCookie(req: Request): Promise<SessionUser | null> {
  const cookies = new Map(
    (req.headers.get("cookie") ?? "")
      .split(";")
      .map((c) => c.trim().split("="))
      .filter((p) => p.length >= 2)
      .map(([k, ...v]) => [k!, decodeURIComponent(v.join("="))]),
  );
  const raw = SESSION_COOKIES.map((n) => cookies.get(n)).find(Boolean);
  const secret = process.env.NEXTAUTH_SECRET;
  if (!raw || !secret) return null;
  try {
    const token = await decode({ token: raw, secret });
    const id = token?.uid;
    if (!id) return null;
    const user = await getActiveUserById(Number(id));
    return user ? toSessionUser(user) : null;
  } catch {
    return null;
  }
}

/** The signed-in, still-active user of the current request (server components, actions), or null. */
export async function getSessionUser(): Promise<SessionUser | null> {
  const session = await getServerSession(authOptions);
  const id = session?.user?.id;
  if (!id) return null;
  const user = await getActiveUserById(Number(id));
  return user ? toSessionUser(user) : null;
}

/** Throws 403 unless the user's role grants the permission. */
export function requirePermission(user: SessionUser, permission: Permission): void {
  if (!can(user.role, permission)) {
    throw new AppError({ code: "forbidden", message: `Your role (${user.role}) does not allow this action` });
  }
}
