import { updateUser } from "@/db/queries/user-admin";
import { getUserById, toPublicUser } from "@/db/queries/users";
import { parseId, readJson, withUser } from "@/lib/api/handler";
import { notFound } from "@/lib/errors";
import { updateUserSchema } from "@/lib/validations/user";

export const dynamic = "force-dynamic";
type Params = { id: string };

// PATCH /api/users/{id} – change name, role, active flag or mail preference (admin)
export const PATCH = withUser<Params>("manageUsers", async ({ req, user, params }) => {
  const id = parseId(params.id, "User");
  await updateUser(id, updateUserSchema.parse(await readJson(req)), user);
  const updated = await getUserById(id);
  if (!updated) throw notFound("User");
  return Response.json({ user: toPublicUser(updated) });
});
