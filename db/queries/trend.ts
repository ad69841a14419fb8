import { and, asc, eq, gte, lte, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { auditEvents, baselines, metricValues, qaTests, serviceEvents, users, type Modality } from "@/db/schema";
import { defaultTolerance, detectDrift, METRICS, metricsForMethod, type MetricKey } from "@/lib/qa";
import { AppError } from "@/lib/errors";
import { getQaContext } from "./qa-config";

export interface TrendBand {
  warningLimit: number;
  actionLimit: number;
}

/**
 * Trend of one metric for one scanner × test: points (current analysis of each scan) with status, the baseline in force
 * and its history, tolerance levels as absolute values, control limits (±2σ, ±3σ), drift flags, and service and
 * alert events in the range.
 */
export async function getTrend(scannerId: number, modality: Modality, q: { metric: MetricKey; testId?: number; from?: Date; to?: Date }) {
  const tests = await db().select().from(qaTests).where(eq(qaTests.scannerId, scannerId)).orderBy(asc(qaTests.id));
  const eligible = tests.filter((t) => metricsForMethod(t.method).includes(q.metric));
  const test = q.testId ? tests.find((t) => t.id === q.testId) : eligible.find((t) => t.active) ?? eligible[0];
  if (q.testId && !test) throw new AppError({ code: "validation_failed", message: `Test ${q.testId} does not belong to this scanner` });
  const def = METRICS[q.metric];
  const empty = { scannerId, metric: q.metric, label: def.label, unit: def.unit, direction: def.direction, test: null, points: [], baseline: null, baselineHistory: [], tolerance: null, band: null, controlLimits: null, driftFlags: [], serviceEvents: [], alertEvents: [] };
  if (!test) return empty;
  const to = q.to ? new Date(q.to.getTime() + 86_399_999) : undefined;
  const range = [q.from ? gte(metricValues.measuredAt, q.from) : undefined, to ? lte(metricValues.measuredAt, to) : undefined];
  const [points, ctx, history, services, alertRows] = await Promise.all([
    db()
      .select({ scanId: metricValues.scanId, at: metricValues.measuredAt, value: metricValues.value, status: metricValues.status })
      .from(metricValues)
      .where(and(eq(metricValues.scannerId, scannerId), eq(metricValues.testId, test.id), eq(metricValues.metric, q.metric), eq(metricValues.isCurrent, true), ...range))
      .orderBy(asc(metricValues.measuredAt)),
    getQaContext(db(), scannerId, test.id, modality, [q.metric]),
    db().select().from(baselines).where(and(eq(baselines.scannerId, scannerId), eq(baselines.testId, test.id), eq(baselines.metric, q.metric))).orderBy(asc(baselines.setAt)),
    db()
      .select({ id: serviceEvents.id, at: serviceEvents.performedAt, description: serviceEvents.description, parts: serviceEvents.parts, engineer: users.name, alertId: serviceEvents.alertId })
      .from(serviceEvents)
      .innerJoin(users, eq(serviceEvents.engineerId, users.id))
      .where(and(eq(serviceEvents.scannerId, scannerId), q.from ? gte(serviceEvents.performedAt, q.from) : undefined, to ? lte(serviceEvents.performedAt, to) : undefined))
      .orderBy(asc(serviceEvents.performedAt)),
    db()
      .select({ id: auditEvents.id, at: auditEvents.at, action: auditEvents.action, entityId: auditEvents.entityId })
      .from(auditEvents)
      .where(and(eq(auditEvents.scannerId, scannerId), eq(auditEvents.entityType, "alert"), sql`${auditEvents.action} in ('alert.open','alert.acknowledge','alert.resolve')`, q.from ? gte(auditEvents.at, q.from) : undefined, to ? lte(auditEvents.at, to) : undefined))
      .orderBy(asc(auditEvents.at)),
  ]);
  const baseline = ctx.baselines.get(q.metric) ?? null;
  const stored = ctx.tolerances.get(q.metric);
  const tolerance = stored ? { ...stored, evaluated: true } : { ...defaultTolerance(modality, q.metric), isDefault: true, evaluated: false };
  let band: TrendBand | null = null;
  if (!tolerance.evaluated) band = null;
  else if (tolerance.mode === "absolute") band = { warningLimit: tolerance.warning, actionLimit: tolerance.action };
  else if (baseline) {
    const sign = def.direction === "higher-is-worse" ? 1 : -1;
    band = { warningLimit: baseline.mean * (1 + (sign * tolerance.warning) / 100), actionLimit: baseline.mean * (1 + (sign * tolerance.action) / 100) };
  }
  const controlLimits = baseline && baseline.sd && baseline.sd > 0
    ? { mean: baseline.mean, sd: baseline.sd, lower2: baseline.mean - 2 * baseline.sd, upper2: baseline.mean + 2 * baseline.sd, lower3: baseline.mean - 3 * baseline.sd, upper3: baseline.mean + 3 * baseline.sd }
    : null;
  const after = baseline ? points.filter((p) => p.value !== null && p.at > baseline.setAt) : [];
  const driftFlags = controlLimits && after.length
    ? detectDrift(after.map((p) => ({ value: p.value as number, at: p.at })), { ...controlLimits, n: baseline!.n }, def.direction).flags
        .filter((f) => f.isBadSide)
        .map((f) => ({ rule: f.rule, description: f.description, side: f.side, scanIds: f.pointIndices.map((i) => after[i]!.scanId) }))
    : [];
  return {
    scannerId,
    metric: q.metric,
    label: def.label,
    unit: def.unit,
    direction: def.direction,
    test: { id: test.id, name: test.name, method: test.method, frequency: test.frequency },
    points,
    baseline: baseline ? { mean: baseline.mean, sd: baseline.sd, n: baseline.n, setAt: baseline.setAt } : null,
    baselineHistory: history.map((b) => ({ id: b.id, mean: b.mean, sd: b.sd, n: b.n, setAt: b.setAt, supersededAt: b.supersededAt, reason: b.reason })),
    tolerance: { mode: tolerance.mode, warning: tolerance.warning, action: tolerance.action, source: tolerance.source, isDefault: tolerance.isDefault, evaluated: tolerance.evaluated },
    band,
    controlLimits,
    driftFlags,
    serviceEvents: services,
    alertEvents: alertRows.map((a) => ({ at: a.at, action: a.action, alertId: Number(a.entityId) })),
  };
}
