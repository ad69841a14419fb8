import { withUser } from "@/lib/api/handler";

export const dynamic = "force-dynamic";

// GET /api/me – who the caller is (useful to check a token)
export const GET = withUser(null, async ({ user }) => Response.json({ user }));
