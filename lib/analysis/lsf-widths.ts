/**
 * FWHM and FWTM of an oversampled LSF (edge and disk methods), NEMA-style (NEMA NU 2 / NU 1 direct method: peak from a
 * parabola, linear interpolation at 50 % / 10 % of the peak; profile-width.ts), adapted to an LSF sampled at a
 * fraction of the pixel pitch whose samples each carry noise:
 * - a rough FWHM comes from the ESF (cumulative sum of the LSF): 1.746 × its 25 %–75 % rise distance, exact for a
 *   Gaussian (FWHM/IQR = 2.3548/1.3490) and insensitive to the noise of single LSF samples;
 * - below 8 samples the NEMA procedure of {@link measureProfileWidth} is applied as it is;
 * - otherwise the LSF is smoothed by a boxcar of round(FWHM/8) samples (it broadens a Gaussian's FWHM by < 0.4 %:
 *   var = w²/12) and the peak is the vertex of a least-squares parabola through the samples within ±¼ FWHM of the
 *   smoothed maximum — the three-point parabola on the single largest noisy sample overestimates the peak, which
 *   narrows the measured width;
 * - crossings are interpolated linearly between the bracketing samples, walking out from the peak.
 */
import { AnalysisError } from "./errors";
import { measureProfileWidth } from "./profile-width";
import type { AnalysisWarning } from "./types";

export interface LsfWidths {
  /** Width at half / tenth of the peak, mm; null when the LSF does not fall to that level on both sides. */
  fwhmMm: number | null;
  fwtmMm: number | null;
  /** "lsf_width" warnings for the widths that could not be measured. */
  warnings: AnalysisWarning[];
}

/** Thresholds (in samples of rough FWHM) of the adaptations described in the file header. */
export const LSF_WIDTH_DEFAULTS = { fitPeakFromSamples: 8, smoothingPerFwhm: 1 / 8, fitHalfWindowPerFwhm: 1 / 4 } as const;

/** FWHM / interquartile range of a Gaussian: 2√(2 ln 2) / (2 × 0.6744898). */
const GAUSSIAN_FWHM_PER_IQR = 2.3548200450309493 / 1.3489795003921634;

/**
 * @param lsf positive-peaked LSF samples (any scale), spacing `sampleSpacingMm` (mm).
 * Never throws for an unmeasurable width (it becomes null with a warning); rethrows other errors.
 */
export function lsfWidths(lsf: ArrayLike<number>, sampleSpacingMm: number): LsfWidths {
  const warnings: AnalysisWarning[] = [];
  const fail = (name: string, message: string): null => {
    warnings.push({ code: "lsf_width", message: `${name} of the LSF not measured: ${message}` });
    return null;
  };
  const roughSamples = GAUSSIAN_FWHM_PER_IQR * interquartileSamples(lsf);
  if (!(roughSamples >= LSF_WIDTH_DEFAULTS.fitPeakFromSamples)) {
    const nema = (level: number, name: string): number | null => {
      try {
        return measureProfileWidth(lsf, level, sampleSpacingMm).widthMm;
      } catch (error) {
        if (!(error instanceof AnalysisError)) throw error;
        return fail(name, error.message);
      }
    };
    return { fwhmMm: nema(0.5, "FWHM"), fwtmMm: nema(0.1, "FWTM"), warnings };
  }
  const profile = smooth(lsf, Math.max(1, Math.round(roughSamples * LSF_WIDTH_DEFAULTS.smoothingPerFwhm)));
  const halfFit = Math.max(1, Math.floor(roughSamples * LSF_WIDTH_DEFAULTS.fitHalfWindowPerFwhm));
  const centre = argmax(smooth(profile, 2 * halfFit + 1));
  const peak = leastSquaresVertex(profile, centre, halfFit);
  const width = (level: number, name: string): number | null => {
    const crossings = levelCrossings(profile, centre, level * peak);
    return crossings ? (crossings.right - crossings.left) * sampleSpacingMm : fail(name, `it does not fall below ${level * 100}% of its peak on both sides`);
  };
  return { fwhmMm: width(0.5, "FWHM"), fwtmMm: width(0.1, "FWTM"), warnings };
}

/**
 * Distance (samples) between the points where the running sum of the profile reaches 25 % and 75 % of its total,
 * interpolated linearly; NaN for a profile with no positive total.
 */
function interquartileSamples(values: ArrayLike<number>): number {
  let total = 0;
  for (let i = 0; i < values.length; i++) total += values[i]!;
  if (!(total > 0)) return NaN;
  const at = (fraction: number): number => {
    const target = fraction * total;
    let sum = 0;
    for (let i = 0; i < values.length; i++) {
      const next = sum + values[i]!;
      if (next >= target) return i + (values[i]! > 0 ? (target - sum) / values[i]! : 0);
      sum = next;
    }
    return values.length;
  };
  return at(0.75) - at(0.25);
}

/** Moving average of length k (samples i − ⌊k/2⌋ … i − ⌊k/2⌋ + k − 1; shorter at the ends). */
function smooth(values: ArrayLike<number>, k: number): Float64Array {
  const n = values.length;
  const out = new Float64Array(n);
  const h = k >> 1;
  for (let i = 0; i < n; i++) {
    let s = 0;
    let c = 0;
    for (let j = Math.max(0, i - h); j <= Math.min(n - 1, i - h + k - 1); j++) {
      s += values[j]!;
      c++;
    }
    out[i] = s / c;
  }
  return out;
}

function argmax(values: ArrayLike<number>): number {
  let best = 0;
  for (let i = 1; i < values.length; i++) if (values[i]! > values[best]!) best = i;
  return best;
}

/** Vertex value of the least-squares parabola y = a + b·t + c·t² through samples centre−h … centre+h (t = i − centre). */
function leastSquaresVertex(values: ArrayLike<number>, centre: number, h: number): number {
  const lo = Math.max(0, centre - h);
  const hi = Math.min(values.length - 1, centre + h);
  // Normal equations in t; solved by Cramer's rule (3 × 3).
  let s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, y0 = 0, y1 = 0, y2 = 0;
  for (let i = lo; i <= hi; i++) {
    const t = i - centre;
    const y = values[i]!;
    s0 += 1; s1 += t; s2 += t * t; s3 += t ** 3; s4 += t ** 4;
    y0 += y; y1 += y * t; y2 += y * t * t;
  }
  const det = s0 * (s2 * s4 - s3 * s3) - s1 * (s1 * s4 - s3 * s2) + s2 * (s1 * s3 - s2 * s2);
  if (!(Math.abs(det) > 0)) return values[centre]!;
  const a = (y0 * (s2 * s4 - s3 * s3) - s1 * (y1 * s4 - s3 * y2) + s2 * (y1 * s3 - s2 * y2)) / det;
  const b = (s0 * (y1 * s4 - y2 * s3) - y0 * (s1 * s4 - s3 * s2) + s2 * (s1 * y2 - y1 * s2)) / det;
  const c = (s0 * (s2 * y2 - s3 * y1) - s1 * (s1 * y2 - s3 * y0) + y0 * (s1 * s3 - s2 * s2)) / det;
  if (!(c < 0)) return Math.max(values[centre]!, a);
  const vertex = -b / (2 * c);
  if (Math.abs(vertex) > h) return values[centre]!;
  return a - (b * b) / (4 * c);
}

/** Fractional sample positions where the profile first falls below `level` walking out from `centre`; null if not. */
function levelCrossings(values: ArrayLike<number>, centre: number, level: number): { left: number; right: number } | null {
  let l = centre - 1;
  while (l >= 0 && values[l]! >= level) l--;
  let r = centre + 1;
  while (r < values.length && values[r]! >= level) r++;
  if (l < 0 || r >= values.length || values[centre]! < level) return null;
  const left = l + (level - values[l]!) / (values[l + 1]! - values[l]!);
  const right = r - 1 + (values[r - 1]! - level) / (values[r - 1]! - values[r]!);
  return { left, right };
}
