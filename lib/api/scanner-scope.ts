import { getScannerForUser } from "@/db/queries/scanners";
import type { SessionUser } from "@/db/queries/users";
import { parseId } from "./handler";

/** The scanner named in the route, if the caller may see it (404 otherwise). */
export async function scannerFromParams(params: { id: string }, user: SessionUser) {
  return getScannerForUser(parseId(params.id, "Scanner"), user);
}
