import { createScanner, listScannersForUser } from "@/db/queries/scanners";
import { readJson, withUser } from "@/lib/api/handler";
import { createScannerSchema } from "@/lib/validations/scanner";

export const dynamic = "force-dynamic";

// GET /api/scanners – the scanners the caller may see (engineers: assigned ones); ?includeInactive=1 adds retired ones
export const GET = withUser("viewFleet", async ({ req, user }) => {
  const includeInactive = new URL(req.url).searchParams.get("includeInactive") === "1";
  return Response.json({ scanners: await listScannersForUser(user, { includeInactive }) });
});

// POST /api/scanners – create a scanner (admin)
export const POST = withUser("manageScanners", async ({ req, user }) => {
  const input = createScannerSchema.parse(await readJson(req));
  const { id } = await createScanner(input, user.id);
  return Response.json({ id }, { status: 201 });
});
