import { parseId, readJson, withUser } from "@/lib/api/handler";
import { reanalyseScan } from "@/lib/scans/ingest";
import { scanToJson } from "@/lib/scans/scan-json";
import { reanalyseSchema } from "@/lib/validations/scan";

export const dynamic = "force-dynamic";

// POST /api/scans/{id}/analyses – re-run the analysis with a new method, ROI or pixel spacing; all revisions are kept
export const POST = withUser<{ id: string }>("reanalyseScans", async ({ req, user, params }) => {
  const input = reanalyseSchema.parse(await readJson(req));
  const detail = await reanalyseScan(parseId(params.id, "Scan"), input, user);
  return Response.json(scanToJson(detail), { status: 201 });
});
