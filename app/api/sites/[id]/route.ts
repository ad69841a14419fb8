import { deleteSite, updateSite } from "@/db/queries/sites";
import { parseId, readJson, withUser } from "@/lib/api/handler";
import { updateSiteSchema } from "@/lib/validations/site";

export const dynamic = "force-dynamic";
type Params = { id: string };

// PATCH /api/sites/{id} – rename a site (admin)
export const PATCH = withUser<Params>("manageSites", async ({ req, user, params }) => {
  await updateSite(parseId(params.id, "Site"), updateSiteSchema.parse(await readJson(req)), user.id);
  return Response.json({ ok: true });
});

// DELETE /api/sites/{id} – delete an empty site (admin)
export const DELETE = withUser<Params>("manageSites", async ({ user, params }) => {
  await deleteSite(parseId(params.id, "Site"), user.id);
  return Response.json({ ok: true });
});
