/**
 * Oversampled ESF: (distance, value) samples averaged into bins of width Δ centred on k·Δ, so that distance 0 (the
 * fitted edge) is a bin centre (IEC 62220-1-1 / ISO 12233 4× binning; Buhr et al., Med Phys 2003). Distances in mm.
 */
import { AnalysisError } from "./errors";

/** An ESF sampled on the uniform grid x_i = (firstBin + i)·binWidthMm. */
export interface BinnedEsf {
  /** ESF values at the bin centres (mean of the samples, moved to the centre; empty bins interpolated). */
  value: Float64Array;
  /** Number of samples that fell in each bin. */
  count: Int32Array;
  /** Index k of the first bin (its centre is k·binWidthMm, k ≤ 0). */
  firstBin: number;
  binWidthMm: number;
  /** Number of bins without samples, filled by linear interpolation (or the nearest bin at the ends). */
  emptyBins: number;
}

/**
 * Accumulates (distance, value) samples into bins of width Δ centred on k·Δ for k = kMin … kMax. No allocation per
 * sample: call {@link EsfAccumulator.add} in the pixel loop, then {@link EsfAccumulator.finish} once.
 */
export class EsfAccumulator {
  readonly binWidthMm: number;
  readonly firstBin: number;
  readonly bins: number;
  private readonly sum: Float64Array;
  private readonly sumDistance: Float64Array;
  private readonly n: Int32Array;

  /**
   * @param minMm lowest distance kept (mm); bins start at round(minMm/Δ)
   * @param maxMm highest distance kept (mm)
   * @param binWidthMm Δ, mm (> 0)
   * @throws AnalysisError when the range holds fewer than 8 bins
   */
  constructor(minMm: number, maxMm: number, binWidthMm: number) {
    if (!(binWidthMm > 0)) throw new AnalysisError(`ESF bin width must be positive, got ${binWidthMm} mm`);
    const kMin = Math.ceil(minMm / binWidthMm - 0.5);
    const kMax = Math.floor(maxMm / binWidthMm + 0.5);
    if (kMax - kMin + 1 < 8) {
      throw new AnalysisError(
        `ESF range ${minMm.toFixed(3)}…${maxMm.toFixed(3)} mm holds ${kMax - kMin + 1} bins of ${binWidthMm} mm, at least 8 needed`,
      );
    }
    this.binWidthMm = binWidthMm;
    this.firstBin = kMin;
    this.bins = kMax - kMin + 1;
    this.sum = new Float64Array(this.bins);
    this.sumDistance = new Float64Array(this.bins);
    this.n = new Int32Array(this.bins);
  }

  /** Adds one sample; samples outside the binned range are ignored. */
  add(distanceMm: number, value: number): void {
    const i = Math.round(distanceMm / this.binWidthMm) - this.firstBin;
    if (i < 0 || i >= this.bins) return;
    this.sum[i] += value;
    this.sumDistance[i] += distanceMm;
    this.n[i]++;
  }

  /** Mean value of bin i (NaN when empty); valid before and after finish(). */
  binMean(i: number): number {
    return this.n[i]! > 0 ? this.sum[i]! / this.n[i]! : NaN;
  }

  /** Bin index of a distance, or −1 outside the range. */
  binIndex(distanceMm: number): number {
    const i = Math.round(distanceMm / this.binWidthMm) - this.firstBin;
    return i >= 0 && i < this.bins ? i : -1;
  }

  /**
   * Builds the ESF on the bin centres. Each bin mean sits at the mean distance of its samples; it is moved to the bin
   * centre along the slope between the neighbouring bins (first-order correction for unevenly filled bins, which
   * matters for the radial bins of small disks). Empty bins are interpolated linearly.
   * @throws AnalysisError when fewer than half the bins hold samples
   */
  finish(): BinnedEsf {
    const { bins, binWidthMm: dx, firstBin } = this;
    const filled: number[] = [];
    for (let i = 0; i < bins; i++) if (this.n[i]! > 0) filled.push(i);
    if (filled.length < bins / 2) {
      throw new AnalysisError(`only ${filled.length} of ${bins} ESF bins received samples; the edge region is too small`);
    }
    const meanValue = new Float64Array(bins);
    const meanPos = new Float64Array(bins);
    for (const i of filled) {
      meanValue[i] = this.sum[i]! / this.n[i]!;
      meanPos[i] = this.sumDistance[i]! / this.n[i]!;
    }
    const value = new Float64Array(bins);
    for (let j = 0; j < filled.length; j++) {
      const i = filled[j]!;
      const lo = filled[Math.max(0, j - 1)]!;
      const hi = filled[Math.min(filled.length - 1, j + 1)]!;
      const span = meanPos[hi]! - meanPos[lo]!;
      const slope = span > 0 ? (meanValue[hi]! - meanValue[lo]!) / span : 0;
      value[i] = meanValue[i]! + slope * ((firstBin + i) * dx - meanPos[i]!);
    }
    fillGaps(value, filled);
    return { value, count: this.n.slice(), firstBin, binWidthMm: dx, emptyBins: bins - filled.length };
  }
}

/** Linear interpolation over the indices missing from `filled` (sorted); constant extrapolation at the ends. */
function fillGaps(value: Float64Array, filled: number[]): void {
  const first = filled[0]!;
  const last = filled[filled.length - 1]!;
  for (let i = 0; i < first; i++) value[i] = value[first]!;
  for (let i = last + 1; i < value.length; i++) value[i] = value[last]!;
  for (let j = 1; j < filled.length; j++) {
    const a = filled[j - 1]!;
    const b = filled[j]!;
    for (let i = a + 1; i < b; i++) value[i] = value[a]! + ((value[b]! - value[a]!) * (i - a)) / (b - a);
  }
}
