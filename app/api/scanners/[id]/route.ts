import { deleteScanner, getScannerForUser, updateScanner } from "@/db/queries/scanners";
import { parseId, readJson, withUser } from "@/lib/api/handler";
import { updateScannerSchema } from "@/lib/validations/scanner";

export const dynamic = "force-dynamic";
type Params = { id: string };

// GET /api/scanners/{id} – one scanner with site, responsible physicist and assigned engineers
export const GET = withUser<Params>("viewFleet", async ({ user, params }) =>
  Response.json({ scanner: await getScannerForUser(parseId(params.id, "Scanner"), user) }),
);

// PATCH /api/scanners/{id} – change a scanner (admin)
export const PATCH = withUser<Params>("manageScanners", async ({ req, user, params }) => {
  const id = parseId(params.id, "Scanner");
  await updateScanner(id, updateScannerSchema.parse(await readJson(req)), user.id);
  return Response.json({ scanner: await getScannerForUser(id, user) });
});

// DELETE /api/scanners/{id} – delete a scanner without scans, or retire one with history (admin)
export const DELETE = withUser<Params>("manageScanners", async ({ user, params }) =>
  Response.json(await deleteScanner(parseId(params.id, "Scanner"), user.id)),
);
