import { getFleetStatus } from "@/db/queries/fleet";
import { createScanner, listScannersForUser } from "@/db/queries/scanners";
import { readJson, withUser } from "@/lib/api/handler";
import { versionedCache } from "@/lib/cache/change-version";
import { createScannerSchema } from "@/lib/validations/scanner";

export const dynamic = "force-dynamic";

/** The serialised fleet answer per visibility scope, reused between recorded changes (see lib/cache/change-version.ts). */
const fleetBodies = versionedCache<string>(Number(process.env.FLEET_CACHE_MS ?? 5_000));

// GET /api/scanners – the scanners the caller may see (engineers: assigned ones) with latest status, schedule state,
// open alerts and an MTF50 sparkline; ?includeInactive=1 adds retired scanners
export const GET = withUser("viewFleet", async ({ req, user }) => {
  const includeInactive = new URL(req.url).searchParams.get("includeInactive") === "1";
  const scope = `${user.role === "engineer" ? `engineer:${user.id}` : "all"}:${includeInactive ? 1 : 0}`;
  const body = await fleetBodies(scope, async () => {
    const scanners = await listScannersForUser(user, { includeInactive });
    const status = await getFleetStatus(scanners.map((s) => s.id));
    return JSON.stringify({ scanners: scanners.map((s) => ({ ...s, status: status.get(s.id) ?? null })) });
  });
  return new Response(body, { headers: { "content-type": "application/json" } });
});

// POST /api/scanners – create a scanner (admin)
export const POST = withUser("manageScanners", async ({ req, user }) => {
  const input = createScannerSchema.parse(await readJson(req));
  const { id } = await createScanner(input, user.id);
  return Response.json({ id }, { status: 201 });
});
