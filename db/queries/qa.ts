import { and, asc, desc, eq, inArray, isNull, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { analyses, baselines, metricValues, qaTests, scans, tolerances, type Modality } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { averageMtfCurves, computeBaseline, DEFAULT_EVALUATED_METRICS, defaultTolerance, evaluateResult, isMetricKey, METRICS, validateTolerance, worstStatus, type MetricKey, type Status, QaError } from "@/lib/qa";
import type { CreateBaselineInput, QaTestInput, ToleranceInput } from "@/lib/validations/qa";
import { insertAuditEvent } from "./audit";
import { getQaContext } from "./qa-config";

export async function listTestsForScanner(scannerId: number, tx: DbOrTx = db()) {
  return tx.select().from(qaTests).where(eq(qaTests.scannerId, scannerId)).orderBy(asc(qaTests.id));
}

async function requireTest(tx: DbOrTx, scannerId: number, testId: number) {
  const [t] = await tx.select().from(qaTests).where(and(eq(qaTests.id, testId), eq(qaTests.scannerId, scannerId)));
  if (!t) throw new AppError({ code: "validation_failed", message: `Test ${testId} does not belong to this scanner` });
  return t;
}

/** Create or update the scanner's routine tests (tests not listed are left alone; deactivate with active:false). */
export async function putTests(scannerId: number, tests: QaTestInput[], actorUserId: number) {
  await db().transaction(async (tx) => {
    for (const t of tests) {
      const { id, ...fields } = t;
      if (id) {
        await requireTest(tx, scannerId, id);
        await tx.update(qaTests).set(fields).where(eq(qaTests.id, id));
      } else {
        await tx.insert(qaTests).values({ ...fields, scannerId });
      }
    }
    await insertAuditEvent(tx, { actorUserId, action: "tests.update", entityType: "scanner", entityId: scannerId, scannerId, details: { tests } });
  });
  return listTestsForScanner(scannerId);
}

export async function listBaselines(scannerId: number, opts: { includeHistory?: boolean } = {}) {
  const conds = [eq(baselines.scannerId, scannerId)];
  if (!opts.includeHistory) conds.push(isNull(baselines.supersededAt));
  return db().select().from(baselines).where(and(...conds)).orderBy(asc(baselines.testId), asc(baselines.metric), desc(baselines.setAt));
}

/**
 * New baseline for one scanner × test from chosen results: mean and sample SD per metric and the averaged MTF curve.
 * The baselines in force are superseded (kept as history) and stored statuses are re-evaluated, in one transaction.
 */
export async function createBaseline(scannerId: number, modality: Modality, input: CreateBaselineInput, actorUserId: number) {
  return db().transaction(async (tx) => {
    const test = await requireTest(tx, scannerId, input.testId);
    const rows = await tx
      .select({ scanId: metricValues.scanId, metric: metricValues.metric, value: metricValues.value, result: analyses.result })
      .from(metricValues)
      .innerJoin(analyses, eq(metricValues.analysisId, analyses.id))
      .where(and(eq(metricValues.scannerId, scannerId), eq(metricValues.testId, test.id), eq(metricValues.isCurrent, true), inArray(metricValues.scanId, input.scanIds)));
    const found = new Set(rows.map((r) => r.scanId));
    const missing = input.scanIds.filter((id) => !found.has(id));
    if (missing.length) throw new AppError({ code: "validation_failed", message: `Scans ${missing.join(", ")} are not results of this test on this scanner` });
    const byMetric = new Map<MetricKey, number[]>();
    const curves = new Map<number, { frequencyCyclesPerMm: number[]; value: number[] }>();
    for (const r of rows) {
      if (!isMetricKey(r.metric) || r.value === null) continue;
      byMetric.set(r.metric, [...(byMetric.get(r.metric) ?? []), r.value]);
      const mtf = (r.result as { mtf?: { frequencyCyclesPerMm: number[]; value: number[] } }).mtf;
      if (mtf && !curves.has(r.scanId)) curves.set(r.scanId, mtf);
    }
    if (byMetric.size === 0) throw new AppError({ code: "validation_failed", message: "The selected results have no metric values" });
    let mtfCurve: { frequencyCyclesPerMm: number[]; value: number[] } | null = null;
    try {
      const avg = averageMtfCurves([...curves.values()]);
      mtfCurve = { frequencyCyclesPerMm: avg.frequencyCyclesPerMm, value: avg.value };
    } catch (err) {
      if (!(err instanceof QaError)) throw err;
    }
    const now = new Date();
    const [lastScan] = await tx.select({ at: sql<Date>`max(${scans.acquiredAt})` }).from(scans).where(inArray(scans.id, input.scanIds));
    const setAt = lastScan?.at ? new Date(lastScan.at) : now;
    await tx.update(baselines).set({ supersededAt: now }).where(and(eq(baselines.scannerId, scannerId), eq(baselines.testId, test.id), isNull(baselines.supersededAt)));
    const created: number[] = [];
    for (const [metric, values] of byMetric) {
      const stats = computeBaseline(values);
      const [row] = await tx
        .insert(baselines)
        .values({ scannerId, testId: test.id, metric, mean: stats.mean, sd: stats.sd, n: stats.n, scanIds: input.scanIds, mtfCurve, reason: input.reason, setById: actorUserId, setAt })
        .$returningId();
      created.push(row!.id);
    }
    await insertAuditEvent(tx, { actorUserId, action: "baseline.set", entityType: "scanner", entityId: scannerId, scannerId, details: { testId: test.id, scanIds: input.scanIds, reason: input.reason, baselineIds: created } });
    await reevaluateStatuses(tx, scannerId, test.id, modality);
    return created;
  });
}

/** Tolerances of every test × metric, stored or default (isDefault true), with their sources. */
export async function listTolerances(scannerId: number, modality: Modality) {
  const tests = await listTestsForScanner(scannerId);
  const stored = await db().select().from(tolerances).where(eq(tolerances.scannerId, scannerId));
  return tests.flatMap((t) =>
    (Object.keys(METRICS) as MetricKey[])
      .filter((m) => METRICS[m].methods.includes(t.method))
      .map((m) => {
        const s = stored.find((x) => x.testId === t.id && x.metric === m);
        if (s) return { testId: t.id, metric: m, mode: s.mode, warning: s.warning, action: s.action, source: s.source, direction: METRICS[m].direction, isDefault: false, evaluated: true, updatedAt: s.updatedAt };
        const d = defaultTolerance(modality, m);
        const evaluated = DEFAULT_EVALUATED_METRICS.includes(m);
        return { testId: t.id, metric: m, mode: d.mode, warning: d.warning, action: d.action, source: evaluated ? d.source : `Not evaluated until a tolerance is set (suggested levels shown). ${d.source}`, direction: METRICS[m].direction, isDefault: true, evaluated, updatedAt: null };
      }),
  );
}

export async function putTolerances(scannerId: number, modality: Modality, input: ToleranceInput[], actorUserId: number) {
  await db().transaction(async (tx) => {
    const testIds = new Set<number>();
    for (const t of input) {
      const test = await requireTest(tx, scannerId, t.testId);
      if (!isMetricKey(t.metric) || !METRICS[t.metric].methods.includes(test.method)) {
        throw new AppError({ code: "validation_failed", message: `The ${test.method} test does not produce ${t.metric}` });
      }
      try {
        validateTolerance({ metric: t.metric, mode: t.mode, warning: t.warning, action: t.action, source: t.source });
      } catch (err) {
        if (err instanceof QaError) throw new AppError({ code: "validation_failed", message: `${METRICS[t.metric].label}: ${err.message}` });
        throw err;
      }
      const values = { mode: t.mode, warning: t.warning, action: t.action, source: t.source, updatedById: actorUserId, updatedAt: new Date() };
      await tx.insert(tolerances).values({ scannerId, testId: t.testId, metric: t.metric, ...values }).onDuplicateKeyUpdate({ set: values });
      testIds.add(t.testId);
    }
    await insertAuditEvent(tx, { actorUserId, action: "tolerances.update", entityType: "scanner", entityId: scannerId, scannerId, details: { tolerances: input } });
    for (const testId of testIds) await reevaluateStatuses(tx, scannerId, testId, modality);
  });
}

/**
 * Re-evaluate stored statuses of a scanner × test's current results against the baselines and tolerances now in force
 * (after either changes), so the fleet view and trends show the new statuses at once.
 */
export async function reevaluateStatuses(tx: DbOrTx, scannerId: number, testId: number, modality: Modality): Promise<void> {
  const ctx = await getQaContext(tx, scannerId, testId, modality, Object.keys(METRICS) as MetricKey[]);
  const rows = await tx
    .select({ id: metricValues.id, analysisId: metricValues.analysisId, metric: metricValues.metric, value: metricValues.value, status: metricValues.status })
    .from(metricValues)
    .where(and(eq(metricValues.scannerId, scannerId), eq(metricValues.testId, testId), eq(metricValues.isCurrent, true)));
  const perAnalysis = new Map<number, Status[]>();
  const changes = new Map<Status, number[]>();
  for (const r of rows) {
    if (!isMetricKey(r.metric)) continue;
    const b = ctx.baselines.get(r.metric);
    const status = evaluateResult(r.value, b ? { mean: b.mean, sd: b.sd } : null, ctx.tolerances.get(r.metric) ?? null).status;
    perAnalysis.set(r.analysisId, [...(perAnalysis.get(r.analysisId) ?? []), status]);
    if (status !== r.status) changes.set(status, [...(changes.get(status) ?? []), r.id]);
  }
  for (const [status, ids] of changes) {
    for (let i = 0; i < ids.length; i += 500) await tx.update(metricValues).set({ status }).where(inArray(metricValues.id, ids.slice(i, i + 500)));
  }
  const byStatus = new Map<Status, number[]>();
  for (const [analysisId, statuses] of perAnalysis) {
    const s = worstStatus(statuses);
    byStatus.set(s, [...(byStatus.get(s) ?? []), analysisId]);
  }
  for (const [status, ids] of byStatus) {
    for (let i = 0; i < ids.length; i += 500) await tx.update(analyses).set({ status }).where(inArray(analyses.id, ids.slice(i, i + 500)));
  }
}
