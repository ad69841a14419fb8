/**
 * Everything the periodic QA report of one scanner shows, gathered from the database in one call: identity, period,
 * per-test results, trends, baselines, MTF curves, tolerances, alerts, service events and sign-off status.
 * Widths in mm, MTF50/MTF10 and Nyquist in cycles/mm, MTF values dimensionless. Dates are UTC.
 */
import { listTestsForScanner, listTolerances } from "@/db/queries/qa";
import {
  getSiteForReport,
  listBaselinesInForce,
  listLastResultByTest,
  listReportAlerts,
  listReportResults,
  listReportServiceEvents,
  type ReportRange,
} from "@/db/queries/report";
import type { ScannerListItem } from "@/db/queries/scanners";
import { getTrend } from "@/db/queries/trend";
import type { Alert, QaTest } from "@/db/schema";
import { AppError } from "@/lib/errors";
import {
  addMonthsUtc,
  averageMtfCurves,
  dueState,
  METRICS,
  metricsForMethod,
  QaError,
  type DueStateName,
  type Frequency,
  type MetricDirection,
  type MetricKey,
  type MetricUnit,
  type Status,
  type ToleranceMode,
} from "@/lib/qa";
import { ANALYSIS_VERSION, APP_VERSION } from "@/lib/version";

/** Length of the default period, ending today (UTC), when the caller gives no dates. */
export const REPORT_DEFAULT_MONTHS = 12;
const DAY_MS = 86_400_000;

export interface ReportPeriod {
  /** 00:00 UTC of the first day. */
  from: Date;
  /** 00:00 UTC of the last day (inclusive). */
  to: Date;
  /** Last millisecond of the last day. */
  toEnd: Date;
  /** True when neither date was given and the default period was used. */
  isDefault: boolean;
}

export interface ReportScanner {
  id: number;
  name: string;
  siteName: string;
  siteCity: string;
  modality: string;
  manufacturer: string;
  model: string;
  serialNumber: string;
  location: string;
  responsiblePhysicist: string | null;
  engineers: string[];
  active: boolean;
}

export type StatusCounts = Record<Status, number>;

export interface ReportTolerance {
  mode: ToleranceMode;
  /** Percent worse than baseline (relative) or a bound in the metric's unit (absolute). */
  warning: number;
  action: number;
  source: string;
  /** True when no level was set locally and the Halfmax default applies. */
  isDefault: boolean;
}

export interface ReportMetric {
  metric: MetricKey;
  label: string;
  unit: MetricUnit;
  digits: number;
  direction: MetricDirection;
  /** Current result of each scan in the period, oldest first. */
  points: { scanId: number; at: Date; value: number | null; status: Status }[];
  /** Points with a value (null = not measurable in that result). */
  valueCount: number;
  latest: { at: Date; value: number | null; status: Status } | null;
  baseline: { mean: number; sd: number | null; n: number; setAt: Date } | null;
  /** 100·(latest − baseline mean)/baseline mean, signed; null without a latest value or baseline. */
  deviationPercent: number | null;
  /** Warning and action levels as values in the metric's unit; null when relative levels have no baseline. */
  band: { warningLimit: number; actionLimit: number } | null;
  tolerance: ReportTolerance;
}

export interface ReportMtfCurve {
  frequencyCyclesPerMm: number[];
  value: number[];
}

export interface ReportMtf {
  /** Mean of the period's current MTF curves on a common grid; null without curves or when they cannot be averaged. */
  periodMean: (ReportMtfCurve & { curveCount: number }) | null;
  /** Why there is no period mean although results exist (e.g. curves share no frequency range). */
  periodNote: string | null;
  latest: (ReportMtfCurve & { at: Date }) | null;
  /** Mean curve stored with the baseline in force. */
  baseline: ReportMtfCurve | null;
  /** Nyquist frequency of the latest result, cycles/mm. */
  nyquistCyclesPerMm: number | null;
}

export interface ReportTest {
  id: number;
  name: string;
  method: QaTest["method"];
  phantom: string;
  active: boolean;
  schedule: { frequency: Frequency; lastResultAt: Date | null; dueAt: Date | null; state: DueStateName; asOf: Date };
  resultCount: number;
  lastResultAt: Date | null;
  statusCounts: StatusCounts;
  signedOff: number;
  notSignedOff: number;
  baseline: { setAt: Date; setBy: string; reason: string; n: number } | null;
  metrics: ReportMetric[];
  mtf: ReportMtf;
}

export interface ReportAlert {
  id: number;
  testName: string | null;
  cause: Alert["cause"];
  state: Alert["state"];
  summary: string;
  occurrences: number;
  openedAt: Date;
  acknowledgedAt: Date | null;
  acknowledgedBy: string | null;
  resolvedAt: Date | null;
  resolvedBy: string | null;
  resolutionNote: string | null;
}

export interface ReportServiceEvent {
  id: number;
  performedAt: Date;
  engineer: string;
  description: string;
  parts: string;
  alertId: number | null;
}

export interface ReportData {
  generatedAt: Date;
  appVersion: string;
  analysisVersion: string;
  /** Analysis versions that produced the period's current results (may include older ones). */
  analysisVersionsInPeriod: string[];
  scanner: ReportScanner;
  period: ReportPeriod;
  tests: ReportTest[];
  alerts: ReportAlert[];
  serviceEvents: ReportServiceEvent[];
  signOff: {
    results: number;
    signedOff: number;
    signers: string[];
    notSignedOff: { scanId: number; at: Date; testName: string; status: Status }[];
  };
  /** Every test × metric tolerance in force, with whether it is a Halfmax default. */
  tolerances: { testName: string; metric: MetricKey; label: string; unit: MetricUnit; tolerance: ReportTolerance }[];
}

const startOfUtcDay = (d: Date) => new Date(Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate()));

/**
 * Whole UTC days of the report: the given dates (time of day dropped), or the REPORT_DEFAULT_MONTHS months that end
 * today. With only one date, the other is REPORT_DEFAULT_MONTHS away (the end never later than today when only
 * `from` is given). Throws AppError 422 when from is after to or a date is invalid.
 */
export function resolveReportPeriod(range: { from?: Date; to?: Date }, now = new Date()): ReportPeriod {
  for (const [name, d] of [["from", range.from], ["to", range.to]] as const) {
    if (d && Number.isNaN(d.getTime())) throw new AppError({ code: "validation_failed", message: `${name} is not a valid date` });
  }
  const today = startOfUtcDay(now);
  let to = range.to ? startOfUtcDay(range.to) : null;
  let from = range.from ? startOfUtcDay(range.from) : null;
  if (!to) {
    const fromPlusPeriod = from ? new Date(addMonthsUtc(from, REPORT_DEFAULT_MONTHS).getTime() - DAY_MS) : today;
    to = fromPlusPeriod < today ? fromPlusPeriod : today;
  }
  if (!from) from = new Date(addMonthsUtc(to, -REPORT_DEFAULT_MONTHS).getTime() + DAY_MS);
  if (from > to) {
    throw new AppError({ code: "validation_failed", message: `from (${from.toISOString().slice(0, 10)}) must not be after to (${to.toISOString().slice(0, 10)})` });
  }
  return { from, to, toEnd: new Date(to.getTime() + DAY_MS - 1), isDefault: !range.from && !range.to };
}

const emptyCounts = (): StatusCounts => ({ pass: 0, warning: 0, action: 0, "no-baseline": 0 });

/** The period's MTF curves averaged (lib/qa averageMtfCurves); a note instead when they cannot be. */
function periodMtf(curves: ReportMtfCurve[]): Pick<ReportMtf, "periodMean" | "periodNote"> {
  if (curves.length === 0) return { periodMean: null, periodNote: null };
  try {
    const avg = averageMtfCurves(curves);
    return { periodMean: { frequencyCyclesPerMm: avg.frequencyCyclesPerMm, value: avg.value, curveCount: avg.curveCount }, periodNote: null };
  } catch (err) {
    if (err instanceof QaError) return { periodMean: null, periodNote: `The period's MTF curves could not be averaged: ${err.message}` };
    throw err;
  }
}

/**
 * Gather the report of one scanner for a period (see resolveReportPeriod for the defaults). The caller has already
 * checked that the user may see the scanner (getScannerForUser). Tests are the active ones plus inactive tests with
 * results in the period; metrics are those the test's method produces that have a value in the period or a baseline.
 * Throws AppError 422 for an invalid period.
 */
export async function getReportData(scanner: ScannerListItem, range: { from?: Date; to?: Date }, now = new Date()): Promise<ReportData> {
  const period = resolveReportPeriod(range, now);
  const r: ReportRange = { from: period.from, toEnd: period.toEnd };
  const [site, allTests, results, baselineRows, lastByTest, alertRows, serviceRows, toleranceRows] = await Promise.all([
    getSiteForReport(scanner.siteId),
    listTestsForScanner(scanner.id),
    listReportResults(scanner.id, r),
    listBaselinesInForce(scanner.id),
    listLastResultByTest(scanner.id, period.toEnd),
    listReportAlerts(scanner.id, r),
    listReportServiceEvents(scanner.id, r),
    listTolerances(scanner.id, scanner.modality),
  ]);
  const testsWithResults = new Set(results.map((x) => x.testId));
  const tests = allTests.filter((t) => t.active || testsWithResults.has(t.id));
  const scheduleAsOf = now < period.toEnd ? now : period.toEnd;

  const reportTests: ReportTest[] = [];
  for (const test of tests) {
    const own = results.filter((x) => x.testId === test.id);
    const baselines = baselineRows.filter((b) => b.testId === test.id);
    const latestBaseline = baselines.reduce<(typeof baselines)[number] | null>((a, b) => (!a || b.setAt > a.setAt ? b : a), null);
    const trends = await Promise.all(
      metricsForMethod(test.method).map((metric) => getTrend(scanner.id, scanner.modality, { metric, testId: test.id, from: period.from, to: period.to })),
    );
    const metrics: ReportMetric[] = [];
    for (const t of trends) {
      if (!t.tolerance) continue; // only when the test is missing, which the testId filter above rules out
      const def = METRICS[t.metric];
      const points = t.points.map((p) => ({ scanId: p.scanId, at: p.at, value: p.value, status: p.status }));
      const valueCount = points.filter((p) => p.value !== null).length;
      if (valueCount === 0 && !t.baseline) continue;
      const last = points[points.length - 1];
      const latest = last ? { at: last.at, value: last.value, status: last.status } : null;
      const deviationPercent =
        latest && latest.value !== null && t.baseline && t.baseline.mean !== 0 ? (100 * (latest.value - t.baseline.mean)) / t.baseline.mean : null;
      metrics.push({
        metric: t.metric, label: def.label, unit: def.unit, digits: def.digits, direction: def.direction,
        points, valueCount, latest, baseline: t.baseline, deviationPercent, band: t.band,
        tolerance: t.tolerance,
      });
    }
    const statusCounts = emptyCounts();
    for (const x of own) statusCounts[x.status] += 1;
    const withCurve = own.filter((x) => x.mtf !== null);
    const latestWithCurve = withCurve[withCurve.length - 1];
    const lastResultAt = lastByTest.get(test.id) ?? null;
    const due = dueState(lastResultAt, test.frequency, scheduleAsOf);
    reportTests.push({
      id: test.id, name: test.name, method: test.method, phantom: test.phantom, active: test.active,
      schedule: { frequency: test.frequency, lastResultAt, dueAt: due.dueAt, state: due.state, asOf: scheduleAsOf },
      resultCount: own.length,
      lastResultAt: own.length ? own[own.length - 1]!.acquiredAt : null,
      statusCounts,
      signedOff: own.filter((x) => x.signedOffAt !== null).length,
      notSignedOff: own.filter((x) => x.signedOffAt === null).length,
      baseline: latestBaseline ? { setAt: latestBaseline.setAt, setBy: latestBaseline.setBy, reason: latestBaseline.reason, n: latestBaseline.n } : null,
      metrics,
      mtf: {
        ...periodMtf(withCurve.map((x) => x.mtf!)),
        latest: latestWithCurve ? { ...latestWithCurve.mtf!, at: latestWithCurve.acquiredAt } : null,
        baseline: baselines.find((b) => b.mtfCurve)?.mtfCurve ?? null,
        nyquistCyclesPerMm: latestWithCurve?.nyquistCyclesPerMm ?? own[own.length - 1]?.nyquistCyclesPerMm ?? null,
      },
    });
  }

  const testName = new Map(allTests.map((t) => [t.id, t.name]));
  const shown = new Set(reportTests.flatMap((t) => t.metrics.map((m) => `${t.id}:${m.metric}`)));
  const signed = results.filter((x) => x.signedOffAt !== null);
  return {
    generatedAt: now,
    appVersion: APP_VERSION,
    analysisVersion: ANALYSIS_VERSION,
    analysisVersionsInPeriod: [...new Set(results.map((x) => x.analysisVersion))].sort(),
    scanner: {
      id: scanner.id, name: scanner.name, siteName: site?.name ?? scanner.siteName, siteCity: site?.city ?? "",
      modality: scanner.modality, manufacturer: scanner.manufacturer, model: scanner.model, serialNumber: scanner.serialNumber,
      location: scanner.location, responsiblePhysicist: scanner.responsiblePhysicistName, engineers: scanner.engineers.map((e) => e.name),
      active: scanner.active,
    },
    period,
    tests: reportTests,
    alerts: alertRows,
    serviceEvents: serviceRows,
    signOff: {
      results: results.length,
      signedOff: signed.length,
      signers: [...new Set(signed.map((x) => x.signedOffBy).filter((n): n is string => n !== null))].sort(),
      notSignedOff: results
        .filter((x) => x.signedOffAt === null)
        .map((x) => ({ scanId: x.scanId, at: x.acquiredAt, testName: x.testId !== null ? testName.get(x.testId) ?? `Test ${x.testId}` : "No test", status: x.status })),
    },
    tolerances: toleranceRows
      .filter((t) => shown.has(`${t.testId}:${t.metric}`))
      .map((t) => ({
        testName: testName.get(t.testId) ?? `Test ${t.testId}`,
        metric: t.metric,
        label: METRICS[t.metric].label,
        unit: METRICS[t.metric].unit,
        tolerance: { mode: t.mode, warning: t.warning, action: t.action, source: t.source, isDefault: t.isDefault },
      })),
  };
}
