import { revokeApiToken } from "@/db/queries/tokens";
import { parseId, withUser } from "@/lib/api/handler";

export const dynamic = "force-dynamic";

// DELETE /api/tokens/{id} – revoke one of the caller's tokens
export const DELETE = withUser<{ id: string }>(null, async ({ user, params }) => {
  await revokeApiToken(user.id, parseId(params.id, "Token"));
  return Response.json({ ok: true });
});
