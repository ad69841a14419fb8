/**
 * Shared edge-spread machinery of the slanted-edge and circular-edge methods: bin samples by their distance to an
 * edge into an oversampled ESF, differentiate it into an LSF, window, |FFT| and correct the result into an MTF.
 *
 * Conventions: distances in mm along the edge normal (or radius), positive towards the side the caller chooses;
 * bin k is centred on k·Δ (Δ = bin width, mm), so distance 0 (the fitted edge) is a bin centre. Frequencies in
 * cycles/mm; the MTF is 1 at f = 0.
 *
 * Method: oversampled ESF as in IEC 62220-1-1 (Buhr et al., Med Phys 2003, doi 10.1118/1.1598673) and ISO 12233 e-SFR;
 * derivative kernel, its transfer function and the capped correction in edge-spread-filters.ts.
 */
import { AnalysisError } from "./errors";
import { realAmplitudeSpectrum, nextPowerOfTwo } from "./fft";
import type { BinnedEsf } from "./esf-accumulator";
import type { MtfCurve } from "./types";
import {
  binningTransfer,
  derivativeCorrection,
  differentiateEsf,
  lsfWindow,
  type DerivativeKind,
  type LsfWindowKind,
} from "./edge-spread-filters";

export * from "./edge-spread-filters";
export { EsfAccumulator, type BinnedEsf } from "./esf-accumulator";

/** Defaults of {@link esfToMtf}; documented once here. */
export const EDGE_SPREAD_DEFAULTS = {
  /**
   * ISO 12233 two-tap FIR derivative [−1, 1]/Δ. Chosen over the IEC 62220-1-1 central difference [−1, 0, 1]/(2Δ)
   * (also available) because it blurs the LSF less (boxcar Δ instead of 2Δ), which keeps the LSF FWHM within 1 %
   * down to FWHM ≈ 2.5 px; after correction both give the same MTF.
   */
  derivative: "two-tap" as DerivativeKind,
  /** ISO 12233 Hamming window over the LSF. */
  window: "hamming" as LsfWindowKind,
  /** Fraction of the half-width tapered by the Tukey window (ignored by the other windows). */
  tukeyTaper: 0.5,
  /** Upper limit of the derivative correction factor (ISO 12233:2014 Annex D caps it at 10, from memory). */
  correctionCap: 10,
  /** Divide by the bin-averaging transfer function |sinc(fΔ)| (see {@link binningTransfer}). */
  binCorrection: true,
  /** Minimum zero-padded FFT length, so that the frequency step stays fine for short ESFs. */
  minFftLength: 1024,
} as const;

export interface EsfToMtfOptions {
  derivative?: DerivativeKind;
  window?: LsfWindowKind;
  tukeyTaper?: number;
  /** Centre of the LSF window, mm (the fitted edge position; default 0). */
  centreMm?: number;
  /** Highest frequency reported, cycles/mm (clipped to the bin Nyquist frequency 1/(2Δ)). */
  maxFrequencyCyclesPerMm: number;
  correctionCap?: number;
  binCorrection?: boolean;
}

export interface EsfToMtfResult {
  /** LSF (unwindowed), oriented so that its peak is positive and normalised to unit area (1/mm). */
  lsf: Float64Array;
  /** Position of each LSF sample, mm, same axis as the ESF bins. */
  lsfPositionMm: Float64Array;
  /** +1 when the ESF rises along the axis, −1 when it falls. */
  polarity: 1 | -1;
  mtf: MtfCurve;
  /** Zero-padded FFT length used. */
  fftLength: number;
  /** Σw² of the LSF window (for {@link mtfNoiseSd}). */
  windowSumSquares: number;
}

/**
 * ESF → LSF → windowed |FFT| → MTF.
 * 1) derivative ({@link differentiateEsf}); 2) sign so the LSF peak is positive; 3) window centred on `centreMm`
 * ({@link lsfWindow}); 4) |DFT| by fft.js, zero-padded to a power of two ≥ max(2·n, minFftLength); 5) divide by the value
 * at f = 0 (so MTF(0) = 1 exactly); 6) multiply by the capped derivative correction and, optionally, divide by the
 * binning transfer |sinc(fΔ)|.
 * @throws AnalysisError when the ESF has no net contrast (flat) or fewer than 8 samples
 */
export function esfToMtf(esf: BinnedEsf, options: EsfToMtfOptions): EsfToMtfResult {
  const o = { ...EDGE_SPREAD_DEFAULTS, centreMm: 0, ...options };
  const n = esf.value.length;
  if (n < 8) throw new AnalysisError(`ESF must have at least 8 bins, got ${n}`);
  const dx = esf.binWidthMm;
  const raw = differentiateEsf(esf.value, dx, o.derivative);
  const offset = o.derivative === "two-tap" ? 0.5 : 0;
  const lsfPositionMm = new Float64Array(raw.length);
  for (let i = 0; i < raw.length; i++) lsfPositionMm[i] = (esf.firstBin + i + offset) * dx;

  let area = 0;
  for (let i = 0; i < raw.length; i++) area += raw[i]! * dx;
  if (!(Math.abs(area) > 0)) throw new AnalysisError("the ESF has no contrast: its derivative integrates to zero");
  const polarity: 1 | -1 = area > 0 ? 1 : -1;
  const lsf = new Float64Array(raw.length);
  for (let i = 0; i < raw.length; i++) lsf[i] = raw[i]! / area;

  const centreIndex = o.centreMm / dx - esf.firstBin - offset;
  const w = lsfWindow(lsf.length, centreIndex, o.window, o.tukeyTaper);
  const windowed = new Float64Array(lsf.length);
  let windowSumSquares = 0;
  for (let i = 0; i < lsf.length; i++) {
    windowed[i] = lsf[i]! * w[i]!;
    windowSumSquares += w[i]! * w[i]!;
  }

  const fftLength = Math.max(nextPowerOfTwo(2 * lsf.length), o.minFftLength);
  const spectrum = realAmplitudeSpectrum(windowed, fftLength);
  const dc = spectrum[0]!;
  if (!(dc > 0)) throw new AnalysisError("the windowed LSF has no area; the edge is not inside the analysed range");
  const df = 1 / (fftLength * dx);
  const fMax = Math.min(o.maxFrequencyCyclesPerMm, 1 / (2 * dx));
  const count = Math.floor(fMax / df + 1e-9) + 1;
  const frequencyCyclesPerMm: number[] = new Array(count);
  const value: number[] = new Array(count);
  for (let k = 0; k < count; k++) {
    const f = k * df;
    let m = (spectrum[k]! / dc) * derivativeCorrection(f, dx, o.derivative, o.correctionCap);
    if (o.binCorrection) m /= Math.max(binningTransfer(f, dx), 1 / o.correctionCap);
    frequencyCyclesPerMm[k] = f;
    value[k] = m;
  }
  return { lsf, lsfPositionMm, polarity, mtf: { frequencyCyclesPerMm, value }, fftLength, windowSumSquares };
}

export interface MtfNoiseInputs {
  /** Pixel noise SD (image units), assumed white. */
  pixelNoiseSd: number;
  /** Mean number of pixels averaged per ESF bin. */
  samplesPerBin: number;
  /** ESF plateau difference (image units). */
  contrast: number;
  binWidthMm: number;
  /** Σw² of the LSF window. */
  windowSumSquares: number;
}

/**
 * Approximate SD of a corrected MTF value at frequency f caused by white pixel noise. Propagation (derived here, not
 * from a standard): each bin mean carries noise s/√n; either derivative followed by the DFT multiplies it by
 * |2 sin(πfΔ)|/Δ (two-tap) or |sin(2πfΔ)|/Δ (central), the derivative correction divides that back to ≈ 2πf, and the
 * windowed sum and the normalisation by the contrast give SD ≈ 2πfΔ·(s/√n)·√(Σw²)/|contrast|. Ignores noise
 * correlation between pixels (it underestimates for correlated noise). Never throws; Infinity for zero contrast.
 */
export function mtfNoiseSd(frequencyCyclesPerMm: number, inputs: MtfNoiseInputs): number {
  const { pixelNoiseSd, samplesPerBin, contrast, binWidthMm, windowSumSquares } = inputs;
  if (contrast === 0) return Infinity;
  return (
    (2 * Math.PI * frequencyCyclesPerMm * binWidthMm * (pixelNoiseSd / Math.sqrt(Math.max(1, samplesPerBin))) * Math.sqrt(windowSumSquares)) /
    Math.abs(contrast)
  );
}

/** Mean of `value` over indices [from, to) — helper for plateau levels. */
export function meanOver(value: ArrayLike<number>, from: number, to: number): number {
  let s = 0;
  for (let i = from; i < to; i++) s += value[i]!;
  return s / Math.max(1, to - from);
}
