/**
 * Width of a peaked 1-D profile at a fraction of its maximum (FWHM at 0.5, FWTM at 0.1) by the direct procedure of
 * NEMA NU 2 (PET spatial resolution) and NEMA NU 1 (gamma-camera resolution):
 * 1. the peak value is the maximum of the parabola through the largest sample and its two neighbours;
 * 2. the level is that fraction of the peak value;
 * 3. on each side, walking outwards from the largest sample, the level crossing is interpolated linearly between the
 *    two samples that bracket it;
 * 4. the width is the distance between the two crossings, times the sample spacing.
 * No model is fitted: this is the direct method, which differs from a Gaussian-fit FWHM (Cecchin et al., PeerJ 2015).
 */
import { AnalysisError } from "./errors";

export interface ProfileWidth {
  /** Width at the level, mm. */
  widthMm: number;
  /** Interpolated left crossing, in samples from the start of the profile (fractional). */
  leftPx: number;
  /** Interpolated right crossing, in samples from the start of the profile (fractional). */
  rightPx: number;
  /** Maximum of the parabola through the largest sample and its neighbours (same unit as the profile). */
  peakValue: number;
  /** Position of the parabola's vertex, in samples from the start of the profile (fractional). */
  peakPositionPx: number;
}

export interface ParabolicPeak {
  /** Vertex value. */
  value: number;
  /** Vertex offset from the middle sample, in samples, within [−½, ½] when the middle sample is the largest. */
  offset: number;
}

/**
 * Vertex of the parabola through (−1, y0), (0, y1), (1, y2): offset δ = (y0 − y2) / (2(y0 − 2y1 + y2)) and value
 * y1 − (y0 − y2)·δ/4. For three collinear samples (zero curvature) returns the middle sample with δ = 0.
 * Never throws.
 */
export function parabolicPeak(y0: number, y1: number, y2: number): ParabolicPeak {
  const curvature = y0 - 2 * y1 + y2;
  if (curvature === 0) return { value: y1, offset: 0 };
  const offset = (y0 - y2) / (2 * curvature);
  return { value: y1 - ((y0 - y2) * offset) / 4, offset };
}

/**
 * Width of `profile` at `level` × its peak, NEMA NU 2 / NU 1 procedure (see the file header).
 *
 * @param profile samples at uniform spacing, already background-subtracted (the level is taken relative to zero).
 * @param level fraction of the peak, in (0, 1): 0.5 for the FWHM, 0.1 for the FWTM.
 * @param sampleSpacingMm distance between neighbouring samples, mm (> 0).
 * @returns the width in mm, both crossings and the parabolic peak (positions in samples, fractional).
 * @throws AnalysisError when the profile has fewer than 3 samples, the spacing or level is out of range, the largest
 *   sample is not positive or lies on the first/last sample, or the profile does not fall below the level on one side.
 */
export function measureProfileWidth(profile: ArrayLike<number>, level: number, sampleSpacingMm: number): ProfileWidth {
  const n = profile.length;
  if (n < 3) throw new AnalysisError(`profile must have at least 3 samples, got ${n}`);
  if (!(level > 0 && level < 1)) throw new AnalysisError(`profile width level must be in (0, 1), got ${level}`);
  if (!(sampleSpacingMm > 0)) throw new AnalysisError(`sample spacing must be positive, got ${sampleSpacingMm} mm`);

  let maxIndex = 0;
  for (let i = 1; i < n; i++) if (profile[i]! > profile[maxIndex]!) maxIndex = i;
  if (!(profile[maxIndex]! > 0)) {
    throw new AnalysisError(`profile maximum must be positive after background subtraction, got ${profile[maxIndex]}`);
  }
  if (maxIndex === 0 || maxIndex === n - 1) {
    throw new AnalysisError(`profile maximum lies on its ${maxIndex === 0 ? "first" : "last"} sample; centre the ROI on the source`);
  }

  const peak = parabolicPeak(profile[maxIndex - 1]!, profile[maxIndex]!, profile[maxIndex + 1]!);
  const threshold = level * peak.value;
  const percent = Math.round(level * 100);

  let left = maxIndex - 1;
  while (left >= 0 && profile[left]! >= threshold) left--;
  if (left < 0) throw new AnalysisError(`profile does not fall below ${percent}% of its peak on the left side; widen the ROI`);
  let right = maxIndex + 1;
  while (right < n && profile[right]! >= threshold) right++;
  if (right >= n) throw new AnalysisError(`profile does not fall below ${percent}% of its peak on the right side; widen the ROI`);

  // Linear interpolation between the bracketing samples (left, left+1) and (right−1, right).
  const yl0 = profile[left]!;
  const yl1 = profile[left + 1]!;
  const leftPx = left + (threshold - yl0) / (yl1 - yl0);
  const yr0 = profile[right - 1]!;
  const yr1 = profile[right]!;
  const rightPx = right - 1 + (yr0 - threshold) / (yr0 - yr1);

  return {
    widthMm: (rightPx - leftPx) * sampleSpacingMm,
    leftPx,
    rightPx,
    peakValue: peak.value,
    peakPositionPx: maxIndex + peak.offset,
  };
}

export interface FwhmAndFwtm {
  fwhm: ProfileWidth;
  fwtm: ProfileWidth;
}

/**
 * FWHM (level 0.5) and FWTM (level 0.1) of a background-subtracted profile by {@link measureProfileWidth}.
 * @throws AnalysisError as measureProfileWidth, e.g. when the profile does not fall to 10% of its peak on both sides.
 */
export function fwhmAndFwtm(profile: ArrayLike<number>, sampleSpacingMm: number): FwhmAndFwtm {
  return {
    fwhm: measureProfileWidth(profile, 0.5, sampleSpacingMm),
    fwtm: measureProfileWidth(profile, 0.1, sampleSpacingMm),
  };
}
