import { forbidden, redirect } from "next/navigation";
import type { SessionUser } from "@/db/queries/users";
import { getSessionUser } from "./request-user";
import { can, type Permission } from "./roles";

/** Server components: the signed-in user, or a redirect to the sign-in page. */
export async function requireUser(): Promise<SessionUser> {
  const user = await getSessionUser();
  if (!user) redirect("/login");
  return user;
}

/** Server components: the signed-in user holding `permission`; otherwise the 403 page (HTTP 403). */
export async function requirePagePermission(permission: Permission): Promise<SessionUser> {
  const user = await requireUser();
  if (!can(user.role, permission)) forbidden();
  return user;
}
