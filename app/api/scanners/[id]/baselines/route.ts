import { createBaseline, listBaselines } from "@/db/queries/qa";
import { readJson, withUser } from "@/lib/api/handler";
import { scannerFromParams } from "@/lib/api/scanner-scope";
import { createBaselineSchema } from "@/lib/validations/qa";

export const dynamic = "force-dynamic";
type Params = { id: string };

// GET /api/scanners/{id}/baselines – baselines in force (?history=1 adds superseded ones) with mean, SD, n, MTF curve, reason
export const GET = withUser<Params>("viewFleet", async ({ req, user, params }) => {
  const scanner = await scannerFromParams(params, user);
  const includeHistory = new URL(req.url).searchParams.get("history") === "1";
  return Response.json({ baselines: await listBaselines(scanner.id, { includeHistory }) });
});

async function setBaseline({ req, user, params }: { req: Request; user: Parameters<typeof scannerFromParams>[1]; params: Params }) {
  const scanner = await scannerFromParams(params, user);
  const input = createBaselineSchema.parse(await readJson(req));
  const ids = await createBaseline(scanner.id, scanner.modality, input, user.id);
  return Response.json({ baselineIds: ids, baselines: await listBaselines(scanner.id) }, { status: 201 });
}

// PUT /api/scanners/{id}/baselines – set a new baseline from chosen results ({ testId, scanIds, reason }); the old one is kept as history (physicist)
export const PUT = withUser<Params>("manageBaselines", setBaseline);
// POST /api/scanners/{id}/baselines – same as PUT
export const POST = withUser<Params>("manageBaselines", setBaseline);
