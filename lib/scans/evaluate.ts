import type { AnalysisResult } from "@/lib/analysis/types";
import { evaluateResult, formatMetric, METRICS, metricsForMethod, worstStatus, type MetricKey, type Status } from "@/lib/qa";
import type { QaContext } from "@/db/queries/qa-config";

export interface MetricEvaluation {
  metric: MetricKey;
  value: number | null;
  status: Status;
  deviationPercent: number | null;
  message: string;
  baselineMean: number | null;
  tolerance: { mode: "relative" | "absolute"; warning: number; action: number; source: string; isDefault: boolean } | null;
}

export interface ResultEvaluation {
  status: Status;
  metrics: MetricEvaluation[];
  /** One line naming the worst metric, for alerts and e-mails. */
  headline: string;
}

/** The value of a metric in an analysis result (same keys as the CLI JSON). */
export function metricValue(result: AnalysisResult, metric: MetricKey): number | null {
  const v = (result as unknown as Record<string, unknown>)[metric];
  return typeof v === "number" && Number.isFinite(v) ? v : null;
}

/** Evaluate every metric the method produces against the baselines and tolerances in force. */
export function evaluateAnalysis(result: AnalysisResult, ctx: QaContext): ResultEvaluation {
  const metrics = metricsForMethod(result.method).map((metric): MetricEvaluation => {
    const value = metricValue(result, metric);
    const baseline = ctx.baselines.get(metric) ?? null;
    const tolerance = ctx.tolerances.get(metric) ?? null;
    const ev = evaluateResult(value, baseline ? { mean: baseline.mean, sd: baseline.sd } : null, tolerance);
    return {
      metric,
      value,
      status: ev.status,
      deviationPercent: ev.deviationPercent,
      message: ev.message,
      baselineMean: baseline?.mean ?? null,
      tolerance: tolerance
        ? { mode: tolerance.mode, warning: tolerance.warning, action: tolerance.action, source: tolerance.source, isDefault: tolerance.isDefault }
        : null,
    };
  });
  const status = worstStatus(metrics.map((m) => m.status));
  const worst = metrics.find((m) => m.status === status && status !== "no-baseline" && status !== "pass");
  const headline = worst
    ? `${METRICS[worst.metric].label} ${formatMetric(worst.metric, worst.value)} — ${worst.message}`
    : status === "pass"
      ? "All metrics within tolerance"
      : "No baseline yet: results are recorded but not evaluated";
  return { status, metrics, headline };
}
