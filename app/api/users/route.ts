import { createUser } from "@/db/queries/user-admin";
import { listUsers } from "@/db/queries/users";
import { readJson, withUser } from "@/lib/api/handler";
import { createUserSchema } from "@/lib/validations/user";

export const dynamic = "force-dynamic";

// GET /api/users – all users (admin)
export const GET = withUser("manageUsers", async () => Response.json({ users: await listUsers() }));

// POST /api/users – create a user with a password, or invite them by e-mail when no password is given (admin)
export const POST = withUser("manageUsers", async ({ req, user }) => {
  const created = await createUser(createUserSchema.parse(await readJson(req)), user);
  return Response.json(created, { status: 201 });
});
