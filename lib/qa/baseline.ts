/**
 * Baselines: the reference value of a metric (IEC 61223-3-5:2019 §4.7: set at acceptance or after major service) as
 * the mean of selected results, and the mean MTF curve of those results.
 */
import { QaError, assertFinite } from "./qa-error";

export interface BaselineStats {
  mean: number;
  /** Sample standard deviation (n − 1 in the denominator); null when n = 1. */
  sd: number | null;
  n: number;
  min: number;
  max: number;
}

/**
 * Summary statistics of the selected results' values (any unit). Two-pass mean and SD for accuracy.
 * Throws QaError for an empty list or a non-finite value.
 */
export function computeBaseline(values: readonly number[]): BaselineStats {
  const n = values.length;
  if (n < 1) throw new QaError("a baseline needs at least 1 result, got 0");
  let sum = 0;
  let min = Infinity;
  let max = -Infinity;
  values.forEach((v, i) => {
    assertFinite(v, `baseline value ${i}`);
    sum += v;
    if (v < min) min = v;
    if (v > max) max = v;
  });
  const mean = sum / n;
  let sd: number | null = null;
  if (n > 1) {
    let ss = 0;
    for (const v of values) ss += (v - mean) ** 2;
    sd = Math.sqrt(ss / (n - 1));
  }
  return { mean, sd, n, min, max };
}

export interface MtfCurveInput {
  frequencyCyclesPerMm: readonly number[];
  value: readonly number[];
}

export interface AveragedMtfCurve {
  /** Common grid: multiples of the grid step inside the curves' shared frequency range, cycles/mm. */
  frequencyCyclesPerMm: number[];
  /** Mean MTF at each grid frequency. */
  value: number[];
  /** Sample SD (n − 1) at each grid frequency; null when only one curve was given. */
  sd: number[] | null;
  curveCount: number;
}

/** Largest grid averageMtfCurves will build; a finer grid is almost certainly a unit mistake. */
export const MAX_MTF_GRID_POINTS = 4096;

function checkCurve(curve: MtfCurveInput, index: number): void {
  const f = curve.frequencyCyclesPerMm;
  if (f.length !== curve.value.length) {
    throw new QaError(`MTF curve ${index} has ${f.length} frequencies but ${curve.value.length} values`);
  }
  if (f.length < 2) throw new QaError(`MTF curve ${index} needs at least 2 samples, got ${f.length}`);
  for (let i = 0; i < f.length; i++) {
    assertFinite(f[i]!, `MTF curve ${index} frequency ${i}`);
    assertFinite(curve.value[i]!, `MTF curve ${index} value ${i}`);
    if (i > 0 && !(f[i]! > f[i - 1]!)) {
      throw new QaError(`MTF curve ${index} frequencies must increase strictly, got ${f[i - 1]} then ${f[i]} at sample ${i}`);
    }
  }
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

/** Linear interpolation of a strictly increasing sampled curve at x (x inside its range). */
function interpolate(f: readonly number[], v: readonly number[], x: number): number {
  let lo = 0;
  let hi = f.length - 1;
  if (x <= f[0]!) return v[0]!;
  if (x >= f[hi]!) return v[hi]!;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (f[mid]! <= x) lo = mid;
    else hi = mid;
  }
  const t = (x - f[lo]!) / (f[hi]! - f[lo]!);
  return v[lo]! + t * (v[hi]! - v[lo]!);
}

/**
 * Mean (and SD) of several MTF curves on a common frequency grid. Each curve is resampled by linear interpolation
 * at k·gridStep for every k with k·gridStep inside the range shared by all curves (no extrapolation).
 *
 * @param gridStep cycles/mm; default: the finest median sample spacing among the curves.
 * @param maxFrequency cycles/mm; default: the end of the shared range. Must not exceed it.
 * @throws QaError for no curves, malformed curves, a non-positive step, a maxFrequency beyond the shared range,
 *   no grid point in the range, or more than MAX_MTF_GRID_POINTS grid points.
 */
export function averageMtfCurves(curves: readonly MtfCurveInput[], gridStep?: number, maxFrequency?: number): AveragedMtfCurve {
  if (curves.length === 0) throw new QaError("averaging MTF curves needs at least 1 curve, got 0");
  curves.forEach(checkCurve);
  const start = Math.max(...curves.map((c) => c.frequencyCyclesPerMm[0]!));
  const sharedEnd = Math.min(...curves.map((c) => c.frequencyCyclesPerMm[c.frequencyCyclesPerMm.length - 1]!));
  if (!(sharedEnd > start)) {
    throw new QaError(`MTF curves share no frequency range: latest start ${start}, earliest end ${sharedEnd} cycles/mm`);
  }
  const step =
    gridStep ??
    Math.min(...curves.map((c) => median(c.frequencyCyclesPerMm.slice(1).map((f, i) => f - c.frequencyCyclesPerMm[i]!))));
  assertFinite(step, "MTF grid step");
  if (step <= 0) throw new QaError(`MTF grid step must be positive, got ${step} cycles/mm`);
  const end = maxFrequency ?? sharedEnd;
  assertFinite(end, "maximum MTF frequency");
  if (end > sharedEnd * (1 + 1e-12)) {
    throw new QaError(`maximum frequency ${end} cycles/mm exceeds the range shared by the curves (ends at ${sharedEnd} cycles/mm)`);
  }
  const slack = 1e-9 * step;
  const kFirst = Math.ceil((start - slack) / step);
  const kLast = Math.floor((Math.min(end, sharedEnd) + slack) / step);
  const count = kLast - kFirst + 1;
  if (count < 1) throw new QaError(`no grid point of step ${step} cycles/mm lies between ${start} and ${end} cycles/mm`);
  if (count > MAX_MTF_GRID_POINTS) {
    throw new QaError(`MTF grid would have ${count} points, more than ${MAX_MTF_GRID_POINTS}; use a larger grid step than ${step} cycles/mm`);
  }

  const frequency: number[] = [];
  const mean: number[] = [];
  const sd: number[] = [];
  const samples = new Float64Array(curves.length);
  for (let k = kFirst; k <= kLast; k++) {
    // Clamp into the shared range so a grid point within `slack` of an end does not fall outside a curve.
    const x = Math.min(Math.max(k * step, start), sharedEnd);
    curves.forEach((c, j) => {
      samples[j] = interpolate(c.frequencyCyclesPerMm, c.value, x);
    });
    const stats = computeBaseline(Array.from(samples));
    frequency.push(k * step);
    mean.push(stats.mean);
    sd.push(stats.sd ?? 0);
  }
  return { frequencyCyclesPerMm: frequency, value: mean, sd: curves.length > 1 ? sd : null, curveCount: curves.length };
}
