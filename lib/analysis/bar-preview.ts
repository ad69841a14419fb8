/**
 * Resolution preview: what a bar (square-wave) test pattern looks like after the measured system, under the linear
 * shift-invariant model — image = object ∗ LSF along the direction across the bars.
 *
 * Each group is `barsPerGroup` bright bars (value 1, width half a period) on a dark background (0), centred on 0 mm.
 * Samples are cell averages on a grid of step Δ = 1/samplesPerMm: the input value is the fraction of the cell
 * [x − Δ/2, x + Δ/2] covered by bars, and the kernel value is the integral of the piecewise-linear LSF over the cell,
 * divided by the LSF's total area (unit area, so the output keeps the input's mean). The LSF is re-centred on its
 * centroid so that the preview shows blur, not displacement. Convolution is done directly in space (sizes are small).
 *
 * Modulation is measured at the pattern centre as output(bar centre) − output(gap centre), using the central bar(s)
 * and the central gap(s) at ±period/2, divided by the input's bar contrast (1). For an infinitely long pattern this is
 * the square-wave response (Coltman, J. Opt. Soc. Am. 44 (1954) 468 — citation from memory):
 * C(f) = (4/π)[M(f) − M(3f)/3 + M(5f)/5 − …]. It is signed: a negative value means contrast reversal.
 */
import { AnalysisError } from "./errors";

export interface BarPreviewOptions {
  /** Line spread function: positions (mm, strictly increasing) and values (any scale; normalised to unit area). */
  lsf: { positionMm: readonly number[]; value: readonly number[] };
  /** Bar-pattern frequencies, cycles/mm (one line pair = one bar + one gap per period). */
  frequenciesCyclesPerMm: readonly number[];
  /** Bars per group (≥ 2); default BAR_PREVIEW_DEFAULTS.barsPerGroup. */
  barsPerGroup?: number;
  /** Preview sampling, samples/mm; default samplesPerPeriod × the highest frequency. */
  samplesPerMm?: number;
  /** Length of each group's window, mm; default: the pattern plus a margin of max(one period, LSF reach) each side. */
  lengthMm?: number;
}

export interface BarPreviewGroup {
  frequencyCyclesPerMm: number;
  /** Sample positions, mm, centred on the pattern centre (0). */
  positionMm: number[];
  /** Bar pattern, cell-averaged, 0 … 1. */
  input: number[];
  /** input ∗ LSF (unit area). */
  output: number[];
  /** Central bar-minus-gap difference of the output (input contrast 1); signed. */
  modulation: number;
}

export interface BarPreview {
  samplesPerMm: number;
  groups: BarPreviewGroup[];
}

/** Defaults and limits of renderBarPreview and barPreviewFrequencies (the one place they are set). */
export const BAR_PREVIEW_DEFAULTS = {
  barsPerGroup: 4,
  /** Default samples per period of the highest frequency. */
  samplesPerPeriod: 32,
  /** Fewer samples per period of the highest frequency are refused: a bar would span < 4 samples. */
  minSamplesPerPeriod: 8,
  maxSamplesPerGroup: 50_000,
  /** Multiples of MTF50 offered by barPreviewFrequencies. */
  frequencyFactors: [0.5, 0.75, 1, 1.25, 1.5],
  /** Significant digits of the offered frequencies. */
  significantDigits: 2,
} as const;

interface Kernel {
  /** h[j] is the weight at offset (kMin + j)·Δ. */
  weights: Float64Array;
  kMin: number;
}

/** Integral of the piecewise-linear LSF (zero outside its samples) from −∞ to each of the ascending `edges`. */
function cumulativeIntegral(x: readonly number[], y: readonly number[], edges: Float64Array): Float64Array {
  const out = new Float64Array(edges.length);
  let seg = 0;
  let before = 0; // integral over segments fully left of `seg`
  for (let e = 0; e < edges.length; e++) {
    const u = edges[e]!;
    if (u <= x[0]!) {
      out[e] = 0;
      continue;
    }
    while (seg < x.length - 1 && x[seg + 1]! <= u) {
      before += ((x[seg + 1]! - x[seg]!) * (y[seg]! + y[seg + 1]!)) / 2;
      seg++;
    }
    if (seg >= x.length - 1) {
      out[e] = before;
      continue;
    }
    const a = x[seg]!;
    const t = (u - a) / (x[seg + 1]! - a);
    const yu = y[seg]! + t * (y[seg + 1]! - y[seg]!);
    out[e] = before + ((u - a) * (y[seg]! + yu)) / 2;
  }
  return out;
}

function buildKernel(lsf: BarPreviewOptions["lsf"], step: number): Kernel {
  const x = lsf.positionMm;
  const y = lsf.value;
  if (x.length !== y.length) throw new AnalysisError(`LSF has ${x.length} positions but ${y.length} values`);
  if (x.length < 2) throw new AnalysisError(`LSF needs at least 2 samples, got ${x.length}`);
  let area = 0;
  let moment = 0;
  for (let i = 0; i < x.length; i++) {
    if (!Number.isFinite(x[i]!) || !Number.isFinite(y[i]!)) throw new AnalysisError(`LSF sample ${i} is not finite: (${x[i]}, ${y[i]})`);
    if (i === 0) continue;
    const a = x[i - 1]!;
    const b = x[i]!;
    if (!(b > a)) throw new AnalysisError(`LSF positions must increase strictly, got ${a} then ${b} mm at sample ${i}`);
    area += ((b - a) * (y[i - 1]! + y[i]!)) / 2;
    moment += ((b - a) * (y[i - 1]! * (2 * a + b) + y[i]! * (a + 2 * b))) / 6; // exact ∫x·L(x) on a linear segment
  }
  if (!(area > 0)) throw new AnalysisError(`LSF area must be positive to normalise it, got ${area}`);
  const centre = moment / area;
  const kMin = Math.floor((x[0]! - centre) / step + 0.5);
  const kMax = Math.floor((x[x.length - 1]! - centre) / step + 0.5);
  const edges = new Float64Array(kMax - kMin + 2);
  for (let j = 0; j < edges.length; j++) edges[j] = centre + (kMin + j - 0.5) * step;
  const cumulative = cumulativeIntegral(x, y, edges);
  const weights = new Float64Array(kMax - kMin + 1);
  let sum = 0;
  for (let j = 0; j < weights.length; j++) {
    weights[j] = cumulative[j + 1]! - cumulative[j]!;
    sum += weights[j]!;
  }
  for (let j = 0; j < weights.length; j++) weights[j] = weights[j]! / sum;
  return { weights, kMin };
}

/** Linear interpolation of samples at positions (i − centreIndex)·step. */
function sampleAt(values: Float64Array, step: number, centreIndex: number, xMm: number): number {
  const p = xMm / step + centreIndex;
  const i = Math.min(Math.max(Math.floor(p), 0), values.length - 2);
  const t = p - i;
  return values[i]! + t * (values[i + 1]! - values[i]!);
}

/**
 * Renders one bar group per frequency, blurred by the LSF (see the module comment for the model and conventions).
 * @throws AnalysisError for a malformed LSF (unequal lengths, < 2 samples, non-increasing positions, non-finite
 *   values, area ≤ 0), no or non-positive frequencies, barsPerGroup not an integer ≥ 2, fewer than
 *   minSamplesPerPeriod samples per period, a lengthMm shorter than a pattern, or a group longer than
 *   maxSamplesPerGroup samples.
 */
export function renderBarPreview(options: BarPreviewOptions): BarPreview {
  const d = BAR_PREVIEW_DEFAULTS;
  const freqs = options.frequenciesCyclesPerMm;
  if (freqs.length === 0) throw new AnalysisError("bar preview needs at least 1 frequency, got 0");
  for (const f of freqs) {
    if (!Number.isFinite(f) || f <= 0) throw new AnalysisError(`bar frequencies must be positive cycles/mm, got ${f}`);
  }
  const bars = options.barsPerGroup ?? d.barsPerGroup;
  if (!Number.isInteger(bars) || bars < 2) throw new AnalysisError(`barsPerGroup must be an integer ≥ 2, got ${bars}`);
  const fMax = Math.max(...freqs);
  const samplesPerMm = options.samplesPerMm ?? d.samplesPerPeriod * fMax;
  if (!Number.isFinite(samplesPerMm) || samplesPerMm < d.minSamplesPerPeriod * fMax) {
    throw new AnalysisError(
      `preview sampling must give at least ${d.minSamplesPerPeriod} samples per period at ${fMax} cycles/mm (≥ ${d.minSamplesPerPeriod * fMax} samples/mm), got ${samplesPerMm}`,
    );
  }
  const step = 1 / samplesPerMm;
  const kernel = buildKernel(options.lsf, step);
  const reachMm = (Math.max(Math.abs(kernel.kMin), Math.abs(kernel.kMin + kernel.weights.length - 1)) + 1) * step;

  const groups = freqs.map((frequency): BarPreviewGroup => {
    const period = 1 / frequency;
    const halfBar = period / 4;
    const centres = Array.from({ length: bars }, (_, j) => (j - (bars - 1) / 2) * period);
    const patternHalf = centres[bars - 1]! + halfBar;
    let halfWindow = patternHalf + Math.max(period, reachMm);
    if (options.lengthMm !== undefined) {
      if (!Number.isFinite(options.lengthMm) || options.lengthMm / 2 < patternHalf) {
        throw new AnalysisError(`lengthMm must hold the ${bars}-bar pattern at ${frequency} cycles/mm (≥ ${2 * patternHalf} mm), got ${options.lengthMm}`);
      }
      halfWindow = options.lengthMm / 2;
    }
    const half = Math.ceil(halfWindow / step - 1e-9);
    const n = 2 * half + 1;
    if (n > d.maxSamplesPerGroup) {
      throw new AnalysisError(`bar group at ${frequency} cycles/mm would need ${n} samples, more than ${d.maxSamplesPerGroup}; lower samplesPerMm or lengthMm`);
    }
    const position = new Float64Array(n);
    const input = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const x = (i - half) * step;
      position[i] = x;
      let covered = 0;
      for (const c of centres) {
        covered += Math.max(0, Math.min(x + step / 2, c + halfBar) - Math.max(x - step / 2, c - halfBar));
      }
      input[i] = covered / step;
    }
    const output = new Float64Array(n);
    const { weights, kMin } = kernel;
    for (let i = 0; i < n; i++) {
      let acc = 0;
      for (let j = 0; j < weights.length; j++) {
        const src = i - (kMin + j);
        if (src >= 0 && src < n) acc += weights[j]! * input[src]!;
      }
      output[i] = acc;
    }
    // Even bar count: gap at 0, bars at ±period/2. Odd: bar at 0, gaps at ±period/2.
    const atCentre = sampleAt(output, step, half, 0);
    const atSides = (sampleAt(output, step, half, -period / 2) + sampleAt(output, step, half, period / 2)) / 2;
    const modulation = bars % 2 === 0 ? atSides - atCentre : atCentre - atSides;
    return { frequencyCyclesPerMm: frequency, positionMm: Array.from(position), input: Array.from(input), output: Array.from(output), modulation };
  });
  return { samplesPerMm, groups };
}

/**
 * A few bar frequencies around MTF50 (cycles/mm): BAR_PREVIEW_DEFAULTS.frequencyFactors × mtf50, each rounded to
 * two significant digits, ascending. Throws AnalysisError unless mtf50 is a positive finite number.
 */
export function barPreviewFrequencies(mtf50: number): number[] {
  if (!Number.isFinite(mtf50) || mtf50 <= 0) throw new AnalysisError(`MTF50 must be a positive frequency in cycles/mm, got ${mtf50}`);
  const d = BAR_PREVIEW_DEFAULTS;
  return d.frequencyFactors.map((k) => Number((k * mtf50).toPrecision(d.significantDigits)));
}
