import { createSite, listSites } from "@/db/queries/sites";
import { readJson, withUser } from "@/lib/api/handler";
import { createSiteSchema } from "@/lib/validations/site";

export const dynamic = "force-dynamic";

// GET /api/sites – all sites with their scanner counts
export const GET = withUser("viewFleet", async () => Response.json({ sites: await listSites() }));

// POST /api/sites – create a site (admin)
export const POST = withUser("manageSites", async ({ req, user }) => {
  const site = await createSite(createSiteSchema.parse(await readJson(req)), user.id);
  return Response.json({ site }, { status: 201 });
});
