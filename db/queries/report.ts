import { and, asc, eq, gte, isNull, lte, or, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/mysql-core";
import { db } from "@/db/client";
import { alerts, analyses, baselines, qaTests, scans, serviceEvents, sites, users } from "@/db/schema";

/** A period of whole UTC days: `from` at 00:00 of the first day, `toEnd` the last millisecond of the last day. */
export interface ReportRange {
  from: Date;
  toEnd: Date;
}

/** The site row of a scanner (name and city), for the report's identity block. */
export async function getSiteForReport(siteId: number) {
  const [row] = await db().select({ name: sites.name, city: sites.city }).from(sites).where(eq(sites.id, siteId));
  return row ?? null;
}

/**
 * Current result of every scan of a scanner acquired in the period, oldest first: the analysis status, sign-off, and
 * only the parts of the stored result JSON the report draws (`mtf`, `nyquist`), extracted in the database so the
 * spread curves and evaluation details are not transferred.
 */
export async function listReportResults(scannerId: number, range: ReportRange) {
  const rows = await db()
    .select({
      scanId: scans.id,
      testId: scans.testId,
      acquiredAt: scans.acquiredAt,
      status: analyses.status,
      analysisVersion: analyses.analysisVersion,
      signedOffAt: scans.signedOffAt,
      signedOffBy: users.name,
      mtfJson: sql<string | null>`json_extract(${analyses.result}, '$.mtf')`,
      nyquistJson: sql<string | number | null>`json_extract(${analyses.result}, '$.nyquist')`,
    })
    .from(scans)
    .innerJoin(analyses, and(eq(analyses.scanId, scans.id), eq(analyses.isCurrent, true)))
    .leftJoin(users, eq(scans.signedOffById, users.id))
    .where(and(eq(scans.scannerId, scannerId), gte(scans.acquiredAt, range.from), lte(scans.acquiredAt, range.toEnd)))
    .orderBy(asc(scans.acquiredAt), asc(scans.id));
  return rows.map(({ mtfJson, nyquistJson, ...r }) => ({ ...r, mtf: parseMtf(mtfJson), nyquistCyclesPerMm: parseNumber(nyquistJson) }));
}

function parseMtf(raw: string | null): { frequencyCyclesPerMm: number[]; value: number[] } | null {
  if (raw === null) return null;
  const v = (typeof raw === "string" ? JSON.parse(raw) : raw) as { frequencyCyclesPerMm?: unknown; value?: unknown } | null;
  if (!v || !Array.isArray(v.frequencyCyclesPerMm) || !Array.isArray(v.value)) return null;
  return { frequencyCyclesPerMm: v.frequencyCyclesPerMm as number[], value: v.value as number[] };
}

function parseNumber(raw: string | number | null): number | null {
  if (raw === null) return null;
  const n = typeof raw === "number" ? raw : Number(raw);
  return Number.isFinite(n) ? n : null;
}

/** Date of each test's latest result on or before `until` (for the schedule state at the end of the period). */
export async function listLastResultByTest(scannerId: number, until: Date): Promise<Map<number, Date>> {
  const rows = await db()
    .select({ testId: scans.testId, at: sql<Date | null>`max(${scans.acquiredAt})`.mapWith(scans.acquiredAt) })
    .from(scans)
    .where(and(eq(scans.scannerId, scannerId), lte(scans.acquiredAt, until)))
    .groupBy(scans.testId);
  const out = new Map<number, Date>();
  for (const r of rows) if (r.testId !== null && r.at !== null) out.set(r.testId, r.at);
  return out;
}

/** Baselines in force (one row per test × metric) with who set them. */
export async function listBaselinesInForce(scannerId: number) {
  return db()
    .select({
      testId: baselines.testId,
      metric: baselines.metric,
      mean: baselines.mean,
      sd: baselines.sd,
      n: baselines.n,
      mtfCurve: baselines.mtfCurve,
      reason: baselines.reason,
      setAt: baselines.setAt,
      setBy: users.name,
    })
    .from(baselines)
    .innerJoin(users, eq(baselines.setById, users.id))
    .where(and(eq(baselines.scannerId, scannerId), isNull(baselines.supersededAt)))
    .orderBy(asc(baselines.testId), asc(baselines.metric));
}

const acknowledger = alias(users, "acknowledger");
const resolver = alias(users, "resolver");

/** Alerts open at any time in the period (opened before its end, not resolved before its start), oldest first. */
export async function listReportAlerts(scannerId: number, range: ReportRange) {
  return db()
    .select({
      id: alerts.id,
      testName: qaTests.name,
      cause: alerts.cause,
      state: alerts.state,
      summary: alerts.summary,
      occurrences: alerts.occurrences,
      openedAt: alerts.openedAt,
      acknowledgedAt: alerts.acknowledgedAt,
      acknowledgedBy: acknowledger.name,
      resolvedAt: alerts.resolvedAt,
      resolvedBy: resolver.name,
      resolutionNote: alerts.resolutionNote,
    })
    .from(alerts)
    .leftJoin(qaTests, eq(alerts.testId, qaTests.id))
    .leftJoin(acknowledger, eq(alerts.acknowledgedById, acknowledger.id))
    .leftJoin(resolver, eq(alerts.resolvedById, resolver.id))
    .where(and(eq(alerts.scannerId, scannerId), lte(alerts.openedAt, range.toEnd), or(isNull(alerts.resolvedAt), gte(alerts.resolvedAt, range.from))))
    .orderBy(asc(alerts.openedAt), asc(alerts.id));
}

/** Service events performed in the period, oldest first, with the engineer's name. */
export async function listReportServiceEvents(scannerId: number, range: ReportRange) {
  return db()
    .select({
      id: serviceEvents.id,
      performedAt: serviceEvents.performedAt,
      engineer: users.name,
      description: serviceEvents.description,
      parts: serviceEvents.parts,
      alertId: serviceEvents.alertId,
    })
    .from(serviceEvents)
    .innerJoin(users, eq(serviceEvents.engineerId, users.id))
    .where(and(eq(serviceEvents.scannerId, scannerId), gte(serviceEvents.performedAt, range.from), lte(serviceEvents.performedAt, range.toEnd)))
    .orderBy(asc(serviceEvents.performedAt), asc(serviceEvents.id));
}
