import { getTrend } from "@/db/queries/trend";
import { withUser } from "@/lib/api/handler";
import { scannerFromParams } from "@/lib/api/scanner-scope";
import { isMetricKey } from "@/lib/qa";
import { trendQuerySchema } from "@/lib/validations/qa";

export const dynamic = "force-dynamic";

// GET /api/scanners/{id}/trend?metric=<fwhmMm|mtf50|mtf10|…>&testId=&from=&to= – points with status, baseline, tolerance band, control limits, drift flags, service and alert events
export const GET = withUser<{ id: string }>("viewFleet", async ({ req, user, params }) => {
  const scanner = await scannerFromParams(params, user);
  const q = trendQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  if (!isMetricKey(q.metric)) throw new Error("unreachable: metric validated by the schema");
  return Response.json(await getTrend(scanner.id, scanner.modality, { ...q, metric: q.metric }));
});
