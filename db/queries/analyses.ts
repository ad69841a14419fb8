import { and, asc, eq, gt, sql } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { analyses, metricValues, qaTests, type Modality } from "@/db/schema";
import type { AnalysisMethod, AnalysisResult } from "@/lib/analysis/types";
import { alertingFlags, detectDrift, METRICS, metricsForMethod, type DriftFlag } from "@/lib/qa";
import { evaluateAnalysis, type ResultEvaluation } from "@/lib/scans/evaluate";
import { applyResultToAlerts } from "./alerts";
import { insertAuditEvent } from "./audit";
import { getQaContext, type QaContext } from "./qa-config";

/** The scanner's routine test for a method; created (monthly, to be adjusted by the physicist) on first use. */
export async function findOrCreateTest(tx: DbOrTx, scannerId: number, method: AnalysisMethod): Promise<number> {
  const [existing] = await tx
    .select({ id: qaTests.id })
    .from(qaTests)
    .where(and(eq(qaTests.scannerId, scannerId), eq(qaTests.method, method), eq(qaTests.active, true)))
    .orderBy(asc(qaTests.id))
    .limit(1);
  if (existing) return existing.id;
  const names: Record<AnalysisMethod, string> = { point: "Point-source PSF", line: "Line-source LSF", edge: "Edge presampled MTF", disk: "Circular-edge TTF" };
  const [row] = await tx
    .insert(qaTests)
    .values({ scannerId, method, name: names[method], phantom: "", protocol: "Created automatically from the first upload; describe the phantom and protocol.", frequency: "monthly" })
    .$returningId();
  return row!.id;
}

const DRIFT_WINDOW = 30;

/** Drift flags (control-limit run rules) that involve the newest value, per metric with a baseline SD > 0. */
async function driftForNewResult(tx: DbOrTx, scannerId: number, testId: number, ctx: QaContext, evaluation: ResultEvaluation, measuredAt: Date): Promise<DriftFlag[]> {
  const flags: DriftFlag[] = [];
  for (const m of evaluation.metrics) {
    const b = ctx.baselines.get(m.metric);
    // Only metrics that are evaluated (have a tolerance) are watched for drift.
    if (!b || !b.sd || b.sd <= 0 || m.value === null || m.status === "no-baseline") continue;
    const rows = await tx
      .select({ value: metricValues.value, at: metricValues.measuredAt })
      .from(metricValues)
      .where(and(eq(metricValues.scannerId, scannerId), eq(metricValues.testId, testId), eq(metricValues.metric, m.metric), eq(metricValues.isCurrent, true), gt(metricValues.measuredAt, b.setAt)))
      .orderBy(sql`${metricValues.measuredAt} desc`)
      .limit(DRIFT_WINDOW);
    const points = rows.filter((r) => r.value !== null).reverse().map((r) => ({ value: r.value as number, at: r.at }));
    points.push({ value: m.value, at: measuredAt });
    const limits = { mean: b.mean, sd: b.sd, n: b.n, lower2: b.mean - 2 * b.sd, upper2: b.mean + 2 * b.sd, lower3: b.mean - 3 * b.sd, upper3: b.mean + 3 * b.sd };
    const drift = detectDrift(points, limits, METRICS[m.metric].direction);
    for (const f of alertingFlags(drift, points.length - 1)) flags.push({ ...f, description: `${METRICS[m.metric].label}: ${f.description}` });
  }
  return flags;
}

export interface RecordAnalysisInput {
  scanId: number;
  scannerId: number;
  modality: Modality;
  testId: number;
  measuredAt: Date;
  result: AnalysisResult;
  options: Record<string, unknown>;
  userId: number;
  appUrl: string;
}

/**
 * Store one analysis of a scan (revision n+1, now current), its metric rows with statuses against the baseline, and
 * apply the alert rules — all inside the caller's transaction.
 */
export async function recordAnalysis(tx: DbOrTx, input: RecordAnalysisInput) {
  const [rev] = await tx.select({ max: sql<number>`coalesce(max(${analyses.revision}), 0)` }).from(analyses).where(eq(analyses.scanId, input.scanId));
  const revision = Number(rev?.max ?? 0) + 1;
  await tx.update(analyses).set({ isCurrent: false }).where(eq(analyses.scanId, input.scanId));
  await tx.update(metricValues).set({ isCurrent: false }).where(eq(metricValues.scanId, input.scanId));
  const ctx = await getQaContext(tx, input.scannerId, input.testId, input.modality, metricsForMethod(input.result.method));
  const evaluation = evaluateAnalysis(input.result, ctx);
  const driftFlags = await driftForNewResult(tx, input.scannerId, input.testId, ctx, evaluation, input.measuredAt);
  const [row] = await tx
    .insert(analyses)
    .values({
      scanId: input.scanId,
      revision,
      isCurrent: true,
      method: input.result.method,
      options: input.options,
      result: { ...input.result, evaluation, driftFlags } as unknown as Record<string, unknown>,
      analysisVersion: input.result.version,
      status: evaluation.status,
      createdById: input.userId,
    })
    .$returningId();
  const analysisId = row!.id;
  await tx.insert(metricValues).values(
    evaluation.metrics.map((m) => ({
      analysisId, scanId: input.scanId, scannerId: input.scannerId, testId: input.testId, metric: m.metric,
      value: m.value, status: m.status, isCurrent: true, measuredAt: input.measuredAt,
    })),
  );
  const alertChanges = await applyResultToAlerts(tx, {
    scannerId: input.scannerId, testId: input.testId, scanId: input.scanId, evaluation, driftFlags, actorUserId: input.userId, appUrl: input.appUrl,
  });
  await insertAuditEvent(tx, {
    actorUserId: input.userId, action: revision === 1 ? "analysis.create" : "analysis.rerun", entityType: "scan", entityId: input.scanId,
    scannerId: input.scannerId, details: { analysisId, revision, method: input.result.method, status: evaluation.status, options: input.options },
  });
  return { analysisId, revision, evaluation, driftFlags, alertChanges };
}
