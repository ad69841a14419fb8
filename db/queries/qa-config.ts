import { and, eq, isNull } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { baselines, tolerances, type Modality } from "@/db/schema";
import { DEFAULT_EVALUATED_METRICS, defaultTolerance, isMetricKey, type MetricKey, type Tolerance } from "@/lib/qa";

export interface QaContext {
  baselines: Map<MetricKey, { id: number; mean: number; sd: number | null; n: number; setAt: Date; mtfCurve: { frequencyCyclesPerMm: number[]; value: number[] } | null }>;
  /** Stored tolerance per metric, else the modality default (marked by `isDefault`) for DEFAULT_EVALUATED_METRICS. */
  tolerances: Map<MetricKey, Tolerance & { isDefault: boolean }>;
}

/** Baselines in force and tolerances of one scanner × test, for evaluating results. */
export async function getQaContext(tx: DbOrTx, scannerId: number, testId: number, modality: Modality, metrics: readonly MetricKey[]): Promise<QaContext> {
  const [bRows, tRows] = await Promise.all([
    tx.select().from(baselines).where(and(eq(baselines.scannerId, scannerId), eq(baselines.testId, testId), isNull(baselines.supersededAt))),
    tx.select().from(tolerances).where(and(eq(tolerances.scannerId, scannerId), eq(tolerances.testId, testId))),
  ]);
  const ctx: QaContext = { baselines: new Map(), tolerances: new Map() };
  for (const b of bRows) {
    if (isMetricKey(b.metric)) ctx.baselines.set(b.metric, { id: b.id, mean: b.mean, sd: b.sd, n: b.n, setAt: b.setAt, mtfCurve: b.mtfCurve ?? null });
  }
  for (const t of tRows) {
    if (isMetricKey(t.metric)) ctx.tolerances.set(t.metric, { metric: t.metric, mode: t.mode, warning: t.warning, action: t.action, source: t.source, isDefault: false });
  }
  for (const m of metrics) {
    if (!ctx.tolerances.has(m) && DEFAULT_EVALUATED_METRICS.includes(m)) ctx.tolerances.set(m, { ...defaultTolerance(modality, m), isDefault: true });
  }
  return ctx;
}
