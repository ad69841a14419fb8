import { listResultRows } from "@/db/queries/results-export";
import { withUser } from "@/lib/api/handler";
import { scannerFromParams } from "@/lib/api/scanner-scope";
import { isMetricKey, METRICS } from "@/lib/qa";
import { toCsv } from "@/lib/report/csv";
import { reportQuerySchema } from "@/lib/validations/qa";

export const dynamic = "force-dynamic";

// GET /api/scanners/{id}/results.csv?from=&to= – one row per result and metric, units in the header (text/csv)
export const GET = withUser<{ id: string }>("viewFleet", async ({ req, user, params }) => {
  const scanner = await scannerFromParams(params, user);
  const range = reportQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  const rows = await listResultRows(scanner.id, range);
  // Units live in the header: each value goes in the column of its unit (MTF at Nyquist is a ratio).
  const header = ["scan_id", "test_date_utc", "test", "method", "metric", "value_mm", "value_cycles_per_mm", "value_ratio", "status", "analysis_revision", "analysis_version", "file_name", "signed_off_at_utc", "signed_off_by"];
  const byUnit = (metric: string, value: number | null) => {
    const unit = isMetricKey(metric) ? METRICS[metric].unit : "";
    return [unit === "mm" ? value : null, unit === "cycles/mm" ? value : null, unit === "" ? value : null];
  };
  const csv = toCsv(
    header,
    rows.map((r) => [
      r.scanId, r.measuredAt, r.testName, r.method, r.metric, ...byUnit(r.metric, r.value), r.status, r.analysisRevision, r.analysisVersion, r.fileName, r.signedOffAt, r.signedOffBy,
    ]),
  );
  const name = `halfmax-${scanner.name.replace(/[^\w]+/g, "-").toLowerCase()}-results.csv`;
  return new Response(csv, { headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="${name}"` } });
});
