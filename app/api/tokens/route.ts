import { createApiToken, listApiTokensForUser } from "@/db/queries/tokens";
import { readJson, withUser } from "@/lib/api/handler";
import { createTokenSchema } from "@/lib/validations/user";

export const dynamic = "force-dynamic";

// GET /api/tokens – the caller's personal API tokens (never the secrets)
export const GET = withUser(null, async ({ user }) => Response.json({ tokens: await listApiTokensForUser(user.id) }));

// POST /api/tokens – create a personal API token; the secret is in this response only
export const POST = withUser(null, async ({ req, user }) => {
  const { name } = createTokenSchema.parse(await readJson(req));
  return Response.json(await createApiToken(user.id, name), { status: 201 });
});
