import { and, eq, gte, inArray, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { alerts, analyses, metricValues, qaTests, scans } from "@/db/schema";
import { versionedCache } from "@/lib/cache/change-version";
import { dueState, type DueStateName, type Frequency, type Status } from "@/lib/qa";

export interface TestStatus {
  testId: number;
  name: string;
  method: string;
  frequency: Frequency;
  lastTestAt: Date | null;
  lastScanId: number | null;
  status: Status | null;
  due: DueStateName;
  dueAt: Date | null;
  overdueByDays: number | null;
}

export interface ScannerStatus {
  tests: TestStatus[];
  lastTestAt: Date | null;
  /** Worst latest status over the scanner's active tests ("no-baseline" when nothing is evaluated; null when never tested). */
  latestStatus: Status | null;
  openAlerts: number;
  /** Worst schedule state over active tests. */
  due: DueStateName;
  /** MTF50 (cycles/mm) of the last results in the past year, oldest first, for a small trend line. */
  sparkline: { at: Date; value: number }[];
}

const SEVERITY: Record<Status, number> = { "no-baseline": 0, pass: 1, warning: 2, action: 3 };
const DUE_SEVERITY: Record<DueStateName, number> = { ok: 0, "never-tested": 1, due: 2, overdue: 3 };
const SPARK_POINTS = 16;

/** Fleet status is cached for a few seconds between changes (FLEET_CACHE_MS; 0 disables). */
const fleetCache = versionedCache<Map<number, ScannerStatus>>(Number(process.env.FLEET_CACHE_MS ?? 5_000));

/**
 * Latest status, schedule state, open alerts and a sparkline per scanner. Served from a short-lived cache that any
 * recorded change invalidates; pass `now` to compute afresh for a given moment.
 */
export function getFleetStatus(scannerIds: number[], now?: Date): Promise<Map<number, ScannerStatus>> {
  if (now) return computeFleetStatus(scannerIds, now);
  const key = [...scannerIds].sort((a, b) => a - b).join(",");
  return fleetCache(key, () => computeFleetStatus(scannerIds, new Date()));
}

/** The uncached computation: four set-based queries. */
export async function computeFleetStatus(scannerIds: number[], now = new Date()): Promise<Map<number, ScannerStatus>> {
  const out = new Map<number, ScannerStatus>();
  if (scannerIds.length === 0) return out;
  for (const id of scannerIds) out.set(id, { tests: [], lastTestAt: null, latestStatus: null, openAlerts: 0, due: "ok", sparkline: [] });
  const yearAgo = new Date(now.getTime() - 365 * 86_400_000);
  const tests = await db().select().from(qaTests).where(and(inArray(qaTests.scannerId, scannerIds), eq(qaTests.active, true)));
  const testIds = tests.map((t) => t.id);
  const [latest, alertCounts, spark] = await Promise.all([
    testIds.length === 0
      ? Promise.resolve([])
      : db()
          .select({ testId: scans.testId, scanId: scans.id, at: scans.acquiredAt, status: analyses.status })
          .from(scans)
          .innerJoin(analyses, and(eq(analyses.scanId, scans.id), eq(analyses.isCurrent, true)))
          .innerJoin(
            // Loose index scan on scans(test_id, acquired_at): one probe per test.
            sql`(select ${scans.testId} as t_id, max(${scans.acquiredAt}) as max_at from ${scans} where ${inArray(scans.testId, testIds)} group by ${scans.testId}) latest`,
            sql`latest.t_id = ${scans.testId} and latest.max_at = ${scans.acquiredAt}`,
          ),
    db()
      .select({ scannerId: alerts.scannerId, n: sql<number>`count(*)` })
      .from(alerts)
      .where(and(inArray(alerts.scannerId, scannerIds), inArray(alerts.state, ["open", "acknowledged"])))
      .groupBy(alerts.scannerId),
    db().execute(sql`
      select scanner_id as scannerId, measured_at as at, value from (
        select ${metricValues.scannerId}, ${metricValues.measuredAt}, ${metricValues.value},
               row_number() over (partition by ${metricValues.scannerId} order by ${metricValues.measuredAt} desc) as rn
        from ${metricValues}
        where ${and(inArray(metricValues.scannerId, scannerIds), eq(metricValues.metric, "mtf50"), eq(metricValues.isCurrent, true), gte(metricValues.measuredAt, yearAgo))}
      ) recent where rn <= ${SPARK_POINTS} order by scanner_id, measured_at`),
  ]);
  const latestByTest = new Map<number, (typeof latest)[number]>();
  for (const l of latest) if (l.testId !== null) {
    const prev = latestByTest.get(l.testId);
    if (!prev || l.scanId > prev.scanId) latestByTest.set(l.testId, l);
  }
  for (const t of tests) {
    const s = out.get(t.scannerId)!;
    const l = latestByTest.get(t.id);
    const d = dueState(l?.at ?? null, t.frequency, now);
    s.tests.push({ testId: t.id, name: t.name, method: t.method, frequency: t.frequency, lastTestAt: l?.at ?? null, lastScanId: l?.scanId ?? null, status: l?.status ?? null, due: d.state, dueAt: d.dueAt, overdueByDays: d.overdueByDays });
    if (l && (!s.lastTestAt || l.at > s.lastTestAt)) s.lastTestAt = l.at;
    if (l && (s.latestStatus === null || SEVERITY[l.status] > SEVERITY[s.latestStatus])) s.latestStatus = l.status;
    if (DUE_SEVERITY[d.state] > DUE_SEVERITY[s.due]) s.due = d.state;
  }
  for (const a of alertCounts) out.get(a.scannerId)!.openAlerts = Number(a.n);
  const sparkRows = (spark as unknown as [{ scannerId: number; at: Date; value: number | null }[]])[0];
  for (const p of sparkRows) if (p.value !== null) out.get(Number(p.scannerId))?.sparkline.push({ at: new Date(p.at), value: Number(p.value) });
  return out;
}
