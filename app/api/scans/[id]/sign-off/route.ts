import { getScanDetail, signOffScan } from "@/db/queries/scans";
import { parseId, readOptionalJson, withUser } from "@/lib/api/handler";
import { scanToJson } from "@/lib/scans/scan-json";
import { signOffSchema } from "@/lib/validations/scan";

export const dynamic = "force-dynamic";

// POST /api/scans/{id}/sign-off – physicist signs off the current result ({ note? })
export const POST = withUser<{ id: string }>("signOffScans", async ({ req, user, params }) => {
  const id = parseId(params.id, "Scan");
  const { note } = signOffSchema.parse(await readOptionalJson(req));
  await signOffScan(id, user, note);
  return Response.json(scanToJson(await getScanDetail(id, user)));
});
