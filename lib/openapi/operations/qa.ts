/** QA operations per scanner: routine tests and schedules, baselines, tolerances, trend, CSV export. */
import { createBaselineSchema, putTestsSchema, putTolerancesSchema, reportQuerySchema, trendQuerySchema } from "@/lib/validations/qa";
import { idNotFound, type ApiOperation } from "../operation";
import { documentFields, z } from "../registry";
import { baselineSchema, qaTestSchema, toleranceSchema, trendSchema } from "../responses-qa";

const scannerNotFound = idNotFound("Scanner");
const dateFrom = { description: "On or after this day (YYYY-MM-DD)", format: "date" } as const;
const dateTo = { description: "On or before this day, inclusive (YYYY-MM-DD)", format: "date" } as const;

const baselineBody = documentFields(createBaselineSchema, {
  testId: "The routine test the results belong to",
  scanIds: "Results (scan ids) to average, e.g. those of the acceptance test",
  reason: "Why, e.g. acceptance test, or after tube replacement",
});
const baselinesWritten = {
  status: 201,
  description: "The new baselines (one per metric) and all baselines now in force",
  json: z.object({ baselineIds: z.array(z.number().int().positive()), baselines: z.array(baselineSchema) }),
} as const;
const baselineErrors = { 404: scannerNotFound, 422: "A field is invalid, the test is not this scanner's, or a scan is not a result of the test" };

export const QA_OPERATIONS: ApiOperation[] = [
  {
    method: "get", path: "/api/scanners/{id}/tests", tag: "QA", access: "viewFleet",
    summary: "The scanner's routine tests with frequency, last result and due state",
    success: { status: 200, description: "Tests in creation order", json: z.object({ tests: z.array(qaTestSchema) }) },
    errors: { 404: scannerNotFound },
  },
  {
    method: "put", path: "/api/scanners/{id}/tests", tag: "QA", access: "manageSchedules",
    summary: "Create or update routine tests and their schedules",
    description: "Entries with an `id` update that test, entries without create one. Tests not listed stay as they are; retire one with `active: false`.",
    body: { json: documentFields(putTestsSchema, { tests: "Tests to create or update (at most 20)" }) },
    success: { status: 200, description: "All of the scanner's tests after the change", json: z.object({ tests: z.array(qaTestSchema) }) },
    errors: { 404: scannerNotFound, 422: "A field is invalid, or a test id is not this scanner's" },
  },
  {
    method: "get", path: "/api/scanners/{id}/baselines", tag: "QA", access: "viewFleet",
    summary: "Baselines in force, with mean, SD, n, averaged MTF curve and reason",
    query: z.object({ history: z.enum(["1"]).optional().openapi({ description: "1 adds superseded baselines" }) }),
    success: { status: 200, description: "Baselines by test and metric, newest first", json: z.object({ baselines: z.array(baselineSchema) }) },
    errors: { 404: scannerNotFound },
  },
  {
    method: "put", path: "/api/scanners/{id}/baselines", tag: "QA", access: "manageBaselines",
    summary: "Set a new baseline from chosen results",
    description: "The baselines in force for the test are kept as history, and stored statuses are re-evaluated against the new ones.",
    body: { json: baselineBody },
    success: baselinesWritten,
    errors: baselineErrors,
  },
  {
    method: "post", path: "/api/scanners/{id}/baselines", tag: "QA", access: "manageBaselines",
    summary: "Set a new baseline from chosen results (same as PUT)",
    body: { json: baselineBody },
    success: baselinesWritten,
    errors: baselineErrors,
  },
  {
    method: "get", path: "/api/scanners/{id}/tolerances", tag: "QA", access: "viewFleet",
    summary: "Warning and action levels per test and metric",
    description: "Stored levels, or the modality default with its source (`isDefault`).",
    success: { status: 200, description: "Levels by test and metric", json: z.object({ tolerances: z.array(toleranceSchema) }) },
    errors: { 404: scannerNotFound },
  },
  {
    method: "put", path: "/api/scanners/{id}/tolerances", tag: "QA", access: "manageTolerances",
    summary: "Set warning and action levels",
    description: "Each entry names test, metric, mode (relative % of baseline, or absolute in the metric's unit), both levels and their source. Stored statuses are re-evaluated.",
    body: { json: documentFields(putTolerancesSchema, { tolerances: "Levels to set (1–50 entries)" }) },
    success: { status: 200, description: "All levels after the change", json: z.object({ tolerances: z.array(toleranceSchema) }) },
    errors: { 404: scannerNotFound, 422: "A field is invalid, the levels are out of order, or the test does not produce the metric" },
  },
  {
    method: "get", path: "/api/scanners/{id}/trend", tag: "QA", access: "viewFleet",
    summary: "One metric over time: points, baseline, tolerance band, control limits, drift, service and alert events",
    query: documentFields(trendQuerySchema, {
      metric: "Metric to trend, e.g. fwhmMm, mtf50, mtf10",
      testId: "Routine test; default: the first active test that produces the metric",
      from: dateFrom,
      to: dateTo,
    }),
    success: { status: 200, description: "The trend", json: trendSchema },
    errors: { 404: scannerNotFound, 422: "A query value is invalid, or the test is not this scanner's" },
  },
  {
    method: "get", path: "/api/scanners/{id}/report", tag: "QA", access: "viewReports",
    summary: "PDF QA report of the scanner for a period",
    // 12 months = REPORT_DEFAULT_MONTHS in lib/report/report-data.ts (not imported: the document should not load the PDF report code).
    description: "Without dates the period is the last 12 months; with one date it runs 12 months from or to it.",
    query: documentFields(reportQuerySchema, { from: dateFrom, to: dateTo }),
    success: {
      status: 200, description: "The report",
      raw: { mediaTypes: ["application/pdf"] },
      headers: { "content-disposition": "attachment; filename=\"halfmax-qa-report-<scanner>-<from>-to-<to>.pdf\"" },
    },
    errors: { 404: scannerNotFound, 422: "from or to is not a date, or from is after to" },
  },
  {
    method: "get", path: "/api/scanners/{id}/results.csv", tag: "QA", access: "viewFleet",
    summary: "Results as CSV: one row per result and metric, units in the column names",
    query: documentFields(reportQuerySchema, { from: dateFrom, to: dateTo }),
    success: {
      status: 200, description: "CSV with a header row (value_mm, value_cycles_per_mm, value_ratio …)",
      raw: { mediaTypes: ["text/csv"], text: true },
      headers: { "content-disposition": "attachment; filename=\"halfmax-<scanner>-results.csv\"" },
    },
    errors: { 404: scannerNotFound, 422: "from or to is not a date" },
  },
];
