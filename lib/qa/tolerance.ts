/**
 * Tolerances and the evaluation of one measured metric against its baseline.
 *
 * Two tiers, as recommended in the domain notes (§5) and in the vocabulary of IAEA Human Health Series No. 1 (2009):
 * a **warning** level (investigate) and an **action** level (act; consider suspension). No universal numeric tolerance
 * is published for resolution tests, so every tolerance carries a `source` saying where its numbers come from.
 *
 * Boundary rule: a value that reaches a level exactly is at that level (reaching the action level exactly is
 * "action"; reaching the warning level exactly is "warning"). Comparisons allow LEVEL_EPSILON so binary rounding
 * (100·(1.15 − 1)/1 = 14.999999999999991) does not move a value off a level it reaches in decimal.
 */
import { METRICS, formatMetric, type MetricDirection, type MetricKey } from "./metrics";
import { QaError, assertFinite } from "./qa-error";

/** Outcome of a check. "no-baseline" means "not evaluated": no baseline, no tolerance, or no measured value. */
export type Status = "pass" | "warning" | "action" | "no-baseline";

/**
 * "relative": warning/action are percent deviations from the baseline mean in the bad direction (10 → 10 % worse).
 * "absolute": warning/action are bounds in the metric's unit (FWHM warning at 1.2 mm, action at 1.4 mm;
 * MTF50 warning at 0.45 cycles/mm, action at 0.40 cycles/mm).
 */
export type ToleranceMode = "relative" | "absolute";

export interface Tolerance {
  metric: MetricKey;
  mode: ToleranceMode;
  warning: number;
  action: number;
  /** Bad direction; defaults to the metric's direction in METRICS. */
  direction?: MetricDirection;
  /** Where the numbers come from: a citation, "common practice", or a local decision. */
  source: string;
}

export interface BaselineReference {
  mean: number;
  /** Sample SD of the baseline results; null for a single-result baseline. Not used by the tolerance check. */
  sd: number | null;
}

/** Why a result was or was not evaluated; lets the UI say more than the four statuses. */
export type EvaluationBasis = "evaluated" | "no-value" | "no-baseline" | "no-tolerance";

export interface Evaluation {
  status: Status;
  /** 100·(value − baseline mean)/baseline mean, signed (positive = above baseline); null without a value or baseline. */
  deviationPercent: number | null;
  basis: EvaluationBasis;
  /** One sentence for people, e.g. "MTF50 12.0 % below baseline: warning (warning at 10 %, action at 15 %)". */
  message: string;
}

/** Tolerance for floating-point comparisons with a level: 1e-9 of the level's magnitude (at least 1e-12). */
export const LEVEL_EPSILON = 1e-9;

/** Severity order used by worstStatus: higher is worse. "no-baseline" ranks lowest: it means nothing was evaluated. */
export const STATUS_SEVERITY: Readonly<Record<Status, number>> = {
  "no-baseline": 0,
  pass: 1,
  warning: 2,
  action: 3,
};

/** Bad direction of a tolerance: its own `direction`, else the metric's. */
export function toleranceDirection(tolerance: Tolerance): MetricDirection {
  return tolerance.direction ?? METRICS[tolerance.metric].direction;
}

/**
 * Checks that a tolerance is usable and throws QaError otherwise: finite levels; relative levels ≥ 0 with
 * warning ≤ action; absolute levels ordered in the bad direction (higher-is-worse: warning ≤ action;
 * lower-is-worse: warning ≥ action). Equal levels are allowed (no separate warning tier).
 */
export function validateTolerance(tolerance: Tolerance): void {
  if (!Object.prototype.hasOwnProperty.call(METRICS, tolerance.metric)) {
    throw new QaError(`unknown metric "${String(tolerance.metric)}"`);
  }
  assertFinite(tolerance.warning, `${tolerance.metric} warning level`);
  assertFinite(tolerance.action, `${tolerance.metric} action level`);
  const { warning, action } = tolerance;
  if (tolerance.mode === "relative") {
    if (warning < 0 || action < 0) {
      throw new QaError(`relative levels are percent deviations and must be ≥ 0, got warning ${warning}, action ${action}`);
    }
    if (warning > action) {
      throw new QaError(`relative warning level must not exceed the action level, got warning ${warning} %, action ${action} %`);
    }
    return;
  }
  if (tolerance.mode !== "absolute") {
    throw new QaError(`tolerance mode must be "relative" or "absolute", got "${String(tolerance.mode)}"`);
  }
  const direction = toleranceDirection(tolerance);
  if (direction === "higher-is-worse" && warning > action) {
    throw new QaError(`${tolerance.metric} is worse when higher, so the absolute warning level must be ≤ the action level, got ${warning} and ${action}`);
  }
  if (direction === "lower-is-worse" && warning < action) {
    throw new QaError(`${tolerance.metric} is worse when lower, so the absolute warning level must be ≥ the action level, got ${warning} and ${action}`);
  }
}

function reaches(amount: number, level: number): boolean {
  return amount >= level - Math.max(1e-12, LEVEL_EPSILON * Math.abs(level));
}

function pct(x: number): string {
  return `${Math.abs(x).toFixed(1)} %`;
}

/**
 * Evaluates one measured value.
 *
 * - value null (metric not measured): status "no-baseline", basis "no-value" — never "pass".
 * - tolerance null: status "no-baseline", basis "no-tolerance" (deviation still reported when a baseline exists).
 * - relative mode: needs a baseline (else "no-baseline"); the bad-direction deviation
 *   (higher-is-worse: +deviationPercent; lower-is-worse: −deviationPercent) is compared with the levels.
 * - absolute mode: no baseline needed; higher-is-worse: value ≥ level; lower-is-worse: value ≤ level.
 * In both modes reaching a level exactly counts as reaching it (see LEVEL_EPSILON).
 *
 * Throws QaError for a non-finite value, an invalid tolerance, or (relative mode) a baseline mean that is not a
 * positive finite number.
 */
export function evaluateResult(
  value: number | null,
  baseline: BaselineReference | null,
  tolerance: Tolerance | null,
): Evaluation {
  if (value !== null) assertFinite(value, "measured value");
  if (baseline !== null) assertFinite(baseline.mean, "baseline mean");
  if (tolerance !== null) validateTolerance(tolerance);
  const label = tolerance ? METRICS[tolerance.metric].label : "value";

  const deviationPercent =
    value !== null && baseline !== null && baseline.mean !== 0 ? (100 * (value - baseline.mean)) / baseline.mean : null;

  if (value === null) {
    return { status: "no-baseline", deviationPercent: null, basis: "no-value", message: `${label} was not measured, so it was not evaluated` };
  }
  if (tolerance === null) {
    return { status: "no-baseline", deviationPercent, basis: "no-tolerance", message: `no tolerance is set for ${label}, so it was not evaluated` };
  }
  const direction = toleranceDirection(tolerance);
  const levels = `warning at ${tolerance.warning}${tolerance.mode === "relative" ? " %" : ""}, action at ${tolerance.action}${tolerance.mode === "relative" ? " %" : ""}`;

  if (tolerance.mode === "relative") {
    if (baseline === null) {
      return { status: "no-baseline", deviationPercent: null, basis: "no-baseline", message: `${label} has no baseline yet, so it was not evaluated` };
    }
    if (!(baseline.mean > 0)) {
      throw new QaError(`a relative tolerance needs a positive baseline mean, got ${baseline.mean} for ${label}`);
    }
    const dev = deviationPercent as number;
    const badDeviation = direction === "higher-is-worse" ? dev : -dev;
    const status: Status = reaches(badDeviation, tolerance.action) ? "action" : reaches(badDeviation, tolerance.warning) ? "warning" : "pass";
    const side = dev === 0 ? "equal to baseline" : `${pct(dev)} ${dev > 0 ? "above" : "below"} baseline`;
    return { status, deviationPercent: dev, basis: "evaluated", message: `${label} ${side}: ${status} (${levels})` };
  }

  const sign = direction === "higher-is-worse" ? 1 : -1;
  const status: Status = reaches(sign * value, sign * tolerance.action) ? "action" : reaches(sign * value, sign * tolerance.warning) ? "warning" : "pass";
  const unit = METRICS[tolerance.metric].unit;
  return {
    status,
    deviationPercent,
    basis: "evaluated",
    message: `${label} ${formatMetric(tolerance.metric, value)}: ${status} (${levels}${unit ? ` ${unit}` : ""})`,
  };
}

/** The worst of several statuses (action > warning > pass > no-baseline); "no-baseline" for an empty list. */
export function worstStatus(statuses: Iterable<Status>): Status {
  let worst: Status = "no-baseline";
  for (const s of statuses) {
    if (!(s in STATUS_SEVERITY)) throw new QaError(`unknown status "${String(s)}"`);
    if (STATUS_SEVERITY[s] > STATUS_SEVERITY[worst]) worst = s;
  }
  return worst;
}
