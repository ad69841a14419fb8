/** Shared helpers of the result charts: colours (the design tokens' hex values, for SVG/canvas) and interpolation. */

export const CHART_COLOURS = {
  primary: "#463C8C", // accent
  second: "#255E8C", // info
  third: "#855000", // warn
  baseline: "#5F6770", // ink-subtle
  reference: "#8E8E84", // line-control
  grid: "#DADAD2", // line
  axis: "#4B535C", // ink-muted
} as const;

/** Tick and label text of the chart axes. */
export const AXIS_TICK = { fill: CHART_COLOURS.axis, fontSize: 12 } as const;

/**
 * Linear interpolation of (xs, ys) at x; xs ascending. Null outside [xs[0], xs[last]] (no extrapolation) or for empty
 * input.
 */
export function interpolateAt(xs: readonly number[], ys: readonly number[], x: number): number | null {
  const n = Math.min(xs.length, ys.length);
  if (n === 0 || !Number.isFinite(x)) return null;
  if (x < xs[0]! || x > xs[n - 1]!) return null;
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (xs[mid]! <= x) lo = mid;
    else hi = mid;
  }
  const x0 = xs[lo]!;
  const x1 = xs[hi]!;
  if (x1 === x0) return ys[lo]!;
  const t = (x - x0) / (x1 - x0);
  return ys[lo]! + t * (ys[hi]! - ys[lo]!);
}

/**
 * Positions where a profile crosses `level`, by linear interpolation between the bracketing samples: the outermost
 * crossings on each side of the maximum (left, right). Null when the profile does not fall below the level on a side.
 */
export function levelCrossings(xs: readonly number[], ys: readonly number[], level: number): { left: number; right: number } | null {
  const n = Math.min(xs.length, ys.length);
  if (n < 3) return null;
  let peak = 0;
  for (let i = 1; i < n; i++) if (ys[i]! > ys[peak]!) peak = i;
  let left: number | null = null;
  for (let i = peak; i > 0; i--) {
    if (ys[i - 1]! < level && ys[i]! >= level) {
      left = xs[i - 1]! + ((level - ys[i - 1]!) / (ys[i]! - ys[i - 1]!)) * (xs[i]! - xs[i - 1]!);
      break;
    }
  }
  let right: number | null = null;
  for (let i = peak; i < n - 1; i++) {
    if (ys[i + 1]! < level && ys[i]! >= level) {
      right = xs[i]! + ((ys[i]! - level) / (ys[i]! - ys[i + 1]!)) * (xs[i + 1]! - xs[i]!);
      break;
    }
  }
  return left === null || right === null ? null : { left, right };
}

/** About `target` (at most target + 2) evenly spaced round ticks (steps 1, 2, 2.5 or 5 × 10ⁿ) within [min, max]. */
export function niceTicks(min: number, max: number, target = 6): number[] {
  if (!Number.isFinite(min) || !Number.isFinite(max) || !(max > min)) return [Number.isFinite(min) ? min : 0];
  const raw = (max - min) / target;
  const magnitude = 10 ** Math.floor(Math.log10(raw));
  // The finest round step that gives at most target + 2 ticks.
  const candidates = [0.5, 1, 2, 2.5, 5, 10, 20].map((k) => k * magnitude);
  const step = candidates.find((c) => Math.floor((max - min) / c + 1e-9) + 1 <= target + 2) ?? 20 * magnitude;
  const ticks: number[] = [];
  for (let t = Math.ceil(min / step - 1e-9) * step; t <= max + step * 1e-9; t += step) ticks.push(Math.abs(t) < step * 1e-9 ? 0 : Number(t.toPrecision(12)));
  return ticks;
}

/** Fewest decimals (0–4) that print every tick exactly, e.g. 2 for [0, 0.25, 0.5]. */
export function tickDigits(ticks: readonly number[]): number {
  for (let d = 0; d < 4; d++) if (ticks.every((t) => Math.abs(Number(t.toFixed(d)) - t) < 1e-9)) return d;
  return 4;
}
