/**
 * Shewhart control limits from a baseline period and run rules that flag drift before a tolerance is breached.
 *
 * Limits: mean ± 2σ (warning limits) and mean ± 3σ (control limits), σ = sample SD (n − 1) of the baseline values
 * (Shewhart control chart; Western Electric, Statistical Quality Control Handbook, 1956). An individuals chart often
 * estimates σ from the mean moving range instead (Montgomery, Introduction to Statistical Quality Control — from
 * memory); Halfmax uses the baseline SD so that limits and baseline agree.
 *
 * Run rules (DRIFT_RULES): a documented subset of the Western Electric rules (1956) and Nelson's rules
 * (L. S. Nelson, J. Quality Technology 16(4), 1984 — rule numbers from memory). "Beyond kσ" is strict: a value on a
 * limit is not beyond it. A value equal to the mean is on neither side and breaks a run; equal neighbours break a trend.
 */
import { computeBaseline } from "./baseline";
import type { MetricDirection } from "./metrics";
import { QaError, assertFinite } from "./qa-error";

export interface ControlLimits {
  mean: number;
  sd: number;
  n: number;
  lower2: number;
  upper2: number;
  lower3: number;
  upper3: number;
}

export type DriftSide = "high" | "low";

export interface DriftFlag {
  /** Stable rule id from DRIFT_RULES, e.g. "2-of-3-beyond-2-sigma". */
  rule: string;
  /** Rule text with its source. */
  description: string;
  /** Indices into the `points` array given to detectDrift (not the time-sorted order). */
  pointIndices: number[];
  side: DriftSide;
  /** True when `side` is the metric's bad side (high for widths, low for MTF metrics). */
  isBadSide: boolean;
}

export interface DriftResult {
  flags: DriftFlag[];
}

export interface ZoneRule {
  kind: "zone";
  id: string;
  description: string;
  /** Consecutive points examined. */
  window: number;
  /** How many of them must lie beyond `sigmas`·σ from the mean on the same side. */
  count: number;
  /** 0 means "on that side of the mean". */
  sigmas: number;
}

export interface TrendRule {
  kind: "trend";
  id: string;
  description: string;
  /** Number of consecutive points, each strictly above (or below) the one before. */
  length: number;
}

/** The run rules Halfmax applies, in reporting order. Edit here and only here. */
export const DRIFT_RULES: readonly (ZoneRule | TrendRule)[] = [
  {
    kind: "zone",
    id: "beyond-3-sigma",
    description: "1 point beyond the 3σ control limit (Western Electric rule 1, 1956; Nelson rule 1, 1984)",
    window: 1,
    count: 1,
    sigmas: 3,
  },
  {
    kind: "zone",
    id: "2-of-3-beyond-2-sigma",
    description: "2 of 3 consecutive points beyond 2σ on the same side (Western Electric rule 2, 1956; Nelson rule 5, 1984)",
    window: 3,
    count: 2,
    sigmas: 2,
  },
  {
    kind: "zone",
    id: "4-of-5-beyond-1-sigma",
    description: "4 of 5 consecutive points beyond 1σ on the same side (Western Electric rule 3, 1956; Nelson rule 6, 1984)",
    window: 5,
    count: 4,
    sigmas: 1,
  },
  {
    kind: "zone",
    id: "8-on-one-side",
    description: "8 consecutive points on the same side of the mean (Western Electric rule 4, 1956; Nelson rule 2 uses 9, 1984)",
    window: 8,
    count: 8,
    sigmas: 0,
  },
  {
    kind: "trend",
    id: "6-trending",
    description: "6 consecutive points each increasing or each decreasing (Nelson rule 3, 1984)",
    length: 6,
  },
];

/**
 * Control limits from baseline values (any unit). Throws QaError for fewer than 2 values, non-finite values, or
 * values with zero spread (limits would collapse onto the mean and flag every later change).
 */
export function controlLimits(baselineValues: readonly number[]): ControlLimits {
  if (baselineValues.length < 2) {
    throw new QaError(`control limits need at least 2 baseline values, got ${baselineValues.length}`);
  }
  const { mean, sd, n } = computeBaseline(baselineValues);
  if (sd === null || sd === 0) {
    throw new QaError(`control limits need baseline values with some spread, got ${n} values all equal to ${mean}`);
  }
  return { mean, sd, n, lower2: mean - 2 * sd, upper2: mean + 2 * sd, lower3: mean - 3 * sd, upper3: mean + 3 * sd };
}

function badSide(direction: MetricDirection): DriftSide {
  return direction === "higher-is-worse" ? "high" : "low";
}

/**
 * Applies DRIFT_RULES to results in time order (normally the results after the baseline period, newest last). Points are sorted by `at` (stable for equal times); flags refer to
 * indices of the given array. Overlapping firing windows of the same rule and side merge into one flag whose
 * pointIndices are the points that meet the condition (zone rules: the points beyond the zone; trend: the whole
 * run), in time order. Both sides are reported; `isBadSide` marks those that matter for alerting.
 * Throws QaError for a non-finite value or an unparseable date.
 */
export function detectDrift(
  points: readonly { value: number; at: Date | string }[],
  limits: ControlLimits,
  direction: MetricDirection,
): DriftResult {
  assertFinite(limits.mean, "control-limit mean");
  assertFinite(limits.sd, "control-limit SD");
  const order = points.map((p, index) => {
    assertFinite(p.value, `value of point ${index}`);
    const time = (p.at instanceof Date ? p.at : new Date(p.at)).getTime();
    if (Number.isNaN(time)) throw new QaError(`date of point ${index} is not a valid date, got ${String(p.at)}`);
    return { index, time, value: p.value };
  });
  order.sort((a, b) => a.time - b.time || a.index - b.index);
  const bad = badSide(direction);
  const flags: DriftFlag[] = [];

  for (const rule of DRIFT_RULES) {
    const span = rule.kind === "zone" ? rule.window : rule.length;
    // Per side: the flag being extended and the last position of its latest firing window.
    const current = new Map<DriftSide, { flag: DriftFlag; end: number }>();
    const fire = (side: DriftSide, indices: number[], start: number): void => {
      const previous = current.get(side);
      if (previous && previous.end >= start) {
        for (const i of indices) if (!previous.flag.pointIndices.includes(i)) previous.flag.pointIndices.push(i);
        previous.end = start + span - 1;
        return;
      }
      const flag: DriftFlag = { rule: rule.id, description: rule.description, pointIndices: [...indices], side, isBadSide: side === bad };
      flags.push(flag);
      current.set(side, { flag, end: start + span - 1 });
    };
    if (rule.kind === "zone") {
      const upper = limits.mean + rule.sigmas * limits.sd;
      const lower = limits.mean - rule.sigmas * limits.sd;
      for (let start = 0; start + rule.window <= order.length; start++) {
        const window = order.slice(start, start + rule.window);
        for (const side of ["high", "low"] as const) {
          const beyond = window.filter((p) => (side === "high" ? p.value > upper : p.value < lower));
          if (beyond.length >= rule.count) fire(side, beyond.map((p) => p.index), start);
        }
      }
    } else {
      for (let start = 0; start + rule.length <= order.length; start++) {
        const window = order.slice(start, start + rule.length);
        let rising = true;
        let falling = true;
        for (let i = 1; i < window.length; i++) {
          if (!(window[i]!.value > window[i - 1]!.value)) rising = false;
          if (!(window[i]!.value < window[i - 1]!.value)) falling = false;
        }
        const indices = window.map((p) => p.index);
        if (rising) fire("high", indices, start);
        if (falling) fire("low", indices, start);
      }
    }
  }
  return { flags };
}

/** Flags whose points include `pointIndex` (e.g. the newest result) and lie on the bad side: what should alert now. */
export function alertingFlags(drift: DriftResult, pointIndex: number): DriftFlag[] {
  return drift.flags.filter((f) => f.isBadSide && f.pointIndices.includes(pointIndex));
}
