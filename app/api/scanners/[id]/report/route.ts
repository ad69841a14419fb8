import { withUser } from "@/lib/api/handler";
import { scannerFromParams } from "@/lib/api/scanner-scope";
import { renderQaReportPdf } from "@/lib/report/pdf-report";
import { getReportData } from "@/lib/report/report-data";
import { reportQuerySchema } from "@/lib/validations/qa";

export const dynamic = "force-dynamic";
// pdfkit reads its font metrics from disk: Node.js runtime only.
export const runtime = "nodejs";

// GET /api/scanners/{id}/report?from=&to= – PDF QA report for a scanner and period (application/pdf)
export const GET = withUser<{ id: string }>("viewReports", async ({ req, user, params }) => {
  const scanner = await scannerFromParams(params, user);
  // Empty fields (`?from=&to=`, as a date form sends them) mean "not given".
  const query = [...new URL(req.url).searchParams].filter(([, v]) => v.trim() !== "");
  const range = reportQuerySchema.parse(Object.fromEntries(query));
  const data = await getReportData(scanner, range);
  const pdf = await renderQaReportPdf(data);
  const slug = scanner.name.replace(/[^\w]+/g, "-").replace(/^-+|-+$/g, "").toLowerCase() || `scanner-${scanner.id}`;
  const day = (d: Date) => d.toISOString().slice(0, 10);
  const name = `halfmax-qa-report-${slug}-${day(data.period.from)}-to-${day(data.period.to)}.pdf`;
  return new Response(new Uint8Array(pdf), {
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `attachment; filename="${name}"`,
      "content-length": String(pdf.length),
      "cache-control": "private, no-store",
    },
  });
});
