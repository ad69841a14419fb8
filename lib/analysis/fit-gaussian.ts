/**
 * Least-squares Gaussian fits, a second estimate of the spread beside the direct NEMA width:
 * - 2-D: f(x, y) = B + A·exp(−(a·dx² + 2b·dx·dy + c·dy²)), dx = x − x0, dy = y − y0 in mm, from which the covariance
 *   Σ = ½·[[a, b], [b, c]]⁻¹ gives σ major/minor (√ of its eigenvalues) and the major-axis angle. The quadratic-form
 *   parameters stay identifiable for a round spot, where an angle would not.
 * - 1-D: f(x) = B + A·exp(−(x − x0)²/(2σ²)).
 * Solver: Levenberg–Marquardt with Marquardt's diagonal scaling (Marquardt, J SIAM 1963; Press et al., Numerical
 * Recipes 3rd ed. §15.5.2), analytic Jacobian, normal equations solved with mathjs `lusolve`.
 * The model is point-sampled: fitted to pixel-integrated data it estimates the presampled spread (PSF ∗ pixel
 * aperture), as the direct NEMA width does.
 */
import { lusolve } from "mathjs";
import { AnalysisError } from "./errors";
import type { GaussianFit2d, GrayImage, Roi } from "./types";

/** 2√(2 ln 2): FWHM of a Gaussian in units of σ. */
export const FWHM_PER_SIGMA = 2 * Math.sqrt(2 * Math.LN2);

export interface GaussianFitOptions {
  maxIterations: number;
  /** Stop when an accepted step lowers the sum of squares by less than this fraction. */
  relativeTolerance: number;
}

/** Defaults of the Gaussian fits. */
export const GAUSSIAN_FIT_DEFAULTS: GaussianFitOptions = { maxIterations: 200, relativeTolerance: 1e-12 };

/**
 * Fills the normal equations JᵀJ (n×n, row-major) and Jᵀr for `params` when the arrays are given, and returns the sum
 * of squared residuals; returns NaN when the parameters are outside the model's domain.
 */
type Accumulate = (params: Float64Array, jtj: Float64Array | null, jtr: Float64Array | null) => number;

interface LmSolution {
  params: Float64Array;
  sumOfSquares: number;
  iterations: number;
}

function levenbergMarquardt(initial: Float64Array, accumulate: Accumulate, options: GaussianFitOptions): LmSolution {
  const n = initial.length;
  let params = Float64Array.from(initial);
  const jtj = new Float64Array(n * n);
  const jtr = new Float64Array(n);
  let cost = accumulate(params, jtj, jtr);
  if (!Number.isFinite(cost)) throw new AnalysisError("Gaussian fit: the initial guess is outside the model's domain");
  let lambda = 1e-3;
  for (let iteration = 1; iteration <= options.maxIterations; iteration++) {
    const matrix: number[][] = [];
    for (let i = 0; i < n; i++) {
      const row: number[] = [];
      for (let j = 0; j < n; j++) row.push(jtj[i * n + j]! * (i === j ? 1 + lambda : 1));
      matrix.push(row);
    }
    let step: number[] | null = null;
    try {
      const solved = lusolve(matrix, Array.from(jtr, (g) => -g)) as number[][];
      step = solved.map((row) => row[0]!);
    } catch {
      step = null; // singular damped matrix: treat as a rejected step and raise the damping
    }
    const trial = step ? params.map((p, i) => p + step[i]!) : params;
    const trialCost = step ? accumulate(trial, null, null) : NaN;
    if (Number.isFinite(trialCost) && trialCost <= cost) {
      const improvement = (cost - trialCost) / Math.max(cost, Number.MIN_VALUE);
      params = trial;
      cost = accumulate(params, jtj, jtr);
      lambda = Math.max(lambda / 3, 1e-12);
      if (improvement < options.relativeTolerance) return { params, sumOfSquares: cost, iterations: iteration };
    } else {
      lambda *= 4;
      if (lambda > 1e14) return { params, sumOfSquares: cost, iterations: iteration }; // no downhill step left
    }
  }
  throw new AnalysisError(`Gaussian fit did not converge in ${options.maxIterations} iterations`);
}

export interface GaussianFit2dInitial {
  /** Centre guess, frame pixel coordinates. */
  centreXPx: number;
  centreYPx: number;
  /** Isotropic σ guess, mm. */
  sigmaMm: number;
  amplitude: number;
  background: number;
}

/**
 * Least-squares fit of a rotated elliptical 2-D Gaussian plus constant background to the pixels of `window`.
 *
 * @param image row-major frame with pixel spacing (mm); coordinates are converted to mm so that σ and the angle are
 *   physical for non-square pixels.
 * @param window fit rectangle in frame pixels (keep it small, e.g. ±2–3 FWHM around the peak).
 * @param initial starting values; the centre and amplitude matter most.
 * @returns {@link GaussianFit2d}: centre in frame pixels, σ and FWHM (= 2√(2 ln 2)σ) in mm, major-axis angle from +x
 *   towards +y in (−90°, 90°] (meaningless for a round spot, where σ major = σ minor), RMS residual relative to the
 *   amplitude.
 * @throws AnalysisError when the window has fewer pixels than 4× the 7 parameters, the fit does not converge, or it
 *   ends with a non-positive amplitude.
 */
export function fitGaussian2d(
  image: GrayImage,
  window: Roi,
  initial: GaussianFit2dInitial,
  options: Partial<GaussianFitOptions> = {},
): GaussianFit2d {
  const resolved = { ...GAUSSIAN_FIT_DEFAULTS, ...options };
  const pixelCount = window.width * window.height;
  if (pixelCount < 28) throw new AnalysisError(`Gaussian fit window needs at least 28 pixels, got ${pixelCount}`);
  const { x: px, y: py } = image.pixelSpacingMm;
  // Coordinates relative to the initial centre keep the normal equations well scaled.
  const originX = initial.centreXPx;
  const originY = initial.centreYPx;
  const q0 = 1 / (2 * initial.sigmaMm * initial.sigmaMm);
  const start = Float64Array.from([initial.amplitude, initial.background, 0, 0, q0, 0, q0]);
  const derivative = new Float64Array(7);

  const accumulate: Accumulate = (p, jtj, jtr) => {
    const [amplitude, background, x0, y0, a, b, c] = p;
    if (!(a > 0 && c > 0 && a * c - b * b > 0)) return NaN;
    if (jtj) jtj.fill(0);
    if (jtr) jtr.fill(0);
    let sum = 0;
    for (let row = 0; row < window.height; row++) {
      const dy = (window.y + row - originY) * py - y0;
      const offset = (window.y + row) * image.width + window.x;
      for (let col = 0; col < window.width; col++) {
        const dx = (window.x + col - originX) * px - x0;
        const e = Math.exp(-(a * dx * dx + 2 * b * dx * dy + c * dy * dy));
        const g = amplitude * e;
        const residual = background + g - image.data[offset + col]!;
        sum += residual * residual;
        if (!jtj || !jtr) continue;
        derivative[0] = e;
        derivative[1] = 1;
        derivative[2] = 2 * g * (a * dx + b * dy);
        derivative[3] = 2 * g * (b * dx + c * dy);
        derivative[4] = -g * dx * dx;
        derivative[5] = -2 * g * dx * dy;
        derivative[6] = -g * dy * dy;
        accumulateNormalEquations(derivative, residual, jtj, jtr);
      }
    }
    return sum;
  };

  const { params, sumOfSquares } = levenbergMarquardt(start, accumulate, resolved);
  const [amplitude, background, x0, y0, a, b, c] = params;
  if (!(amplitude > 0)) throw new AnalysisError(`Gaussian fit ended with a non-positive amplitude ${amplitude}`);

  // Σ = ½·Q⁻¹ with Q = [[a, b], [b, c]].
  const det = a * c - b * b;
  const sxx = c / (2 * det);
  const syy = a / (2 * det);
  const sxy = -b / (2 * det);
  const mean = (sxx + syy) / 2;
  const half = Math.hypot((sxx - syy) / 2, sxy);
  const sigmaMajorMm = Math.sqrt(mean + half);
  const sigmaMinorMm = Math.sqrt(Math.max(mean - half, 0));
  let angleDeg = (0.5 * Math.atan2(2 * sxy, sxx - syy) * 180) / Math.PI;
  if (angleDeg <= -90) angleDeg += 180;

  return {
    amplitude: amplitude,
    background: background,
    centreXPx: originX + x0 / px,
    centreYPx: originY + y0 / py,
    sigmaMajorMm,
    sigmaMinorMm,
    angleDeg,
    fwhmMajorMm: FWHM_PER_SIGMA * sigmaMajorMm,
    fwhmMinorMm: FWHM_PER_SIGMA * sigmaMinorMm,
    relativeRmsResidual: Math.sqrt(sumOfSquares / pixelCount) / amplitude,
  };
}

/** Adds one residual's contribution J_iᵀJ_i and J_iᵀr_i to the normal equations (upper and lower triangle). */
function accumulateNormalEquations(derivative: Float64Array, residual: number, jtj: Float64Array, jtr: Float64Array): void {
  const n = derivative.length;
  for (let i = 0; i < n; i++) {
    const di = derivative[i]!;
    jtr[i] += di * residual;
    for (let j = 0; j <= i; j++) {
      const v = di * derivative[j]!;
      jtj[i * n + j] += v;
      if (j !== i) jtj[j * n + i] += v;
    }
  }
}

export interface GaussianFit1d {
  amplitude: number;
  background: number;
  /** Centre, mm from the first sample. */
  centreMm: number;
  sigmaMm: number;
  /** 2√(2 ln 2)·σ, mm. */
  fwhmMm: number;
  relativeRmsResidual: number;
}

/**
 * Least-squares fit of B + A·exp(−(x − x0)²/(2σ²)) to a uniformly sampled profile; starting values from the largest
 * sample, the smallest sample and the second moment of the profile above its minimum.
 *
 * @param profile samples, sample i at position i·sampleSpacingMm.
 * @throws AnalysisError when the profile has fewer than 8 samples, is flat, or the fit does not converge.
 */
export function fitGaussian1d(
  profile: ArrayLike<number>,
  sampleSpacingMm: number,
  options: Partial<GaussianFitOptions> = {},
): GaussianFit1d {
  const resolved = { ...GAUSSIAN_FIT_DEFAULTS, ...options };
  const n = profile.length;
  if (n < 8) throw new AnalysisError(`Gaussian fit needs at least 8 profile samples, got ${n}`);
  let maxIndex = 0;
  let minValue = Infinity;
  for (let i = 0; i < n; i++) {
    if (profile[i]! > profile[maxIndex]!) maxIndex = i;
    minValue = Math.min(minValue, profile[i]!);
  }
  const peak = profile[maxIndex]! - minValue;
  if (!(peak > 0)) throw new AnalysisError("Gaussian fit: the profile is flat");
  let weight = 0;
  let moment = 0;
  for (let i = 0; i < n; i++) {
    const w = profile[i]! - minValue;
    weight += w;
    moment += w * (i - maxIndex) ** 2;
  }
  const sigmaGuessPx = Math.max(0.5, Math.min(Math.sqrt(moment / weight), n / 4));
  const start = Float64Array.from([peak, minValue, maxIndex * sampleSpacingMm, sigmaGuessPx * sampleSpacingMm]);
  const derivative = new Float64Array(4);

  const accumulate: Accumulate = (p, jtj, jtr) => {
    const [amplitude, background, centre, sigma] = p;
    if (!(sigma > 0)) return NaN;
    if (jtj) jtj.fill(0);
    if (jtr) jtr.fill(0);
    let sum = 0;
    for (let i = 0; i < n; i++) {
      const d = i * sampleSpacingMm - centre;
      const e = Math.exp((-d * d) / (2 * sigma * sigma));
      const g = amplitude * e;
      const residual = background + g - profile[i]!;
      sum += residual * residual;
      if (!jtj || !jtr) continue;
      derivative[0] = e;
      derivative[1] = 1;
      derivative[2] = (g * d) / (sigma * sigma);
      derivative[3] = (g * d * d) / (sigma * sigma * sigma);
      accumulateNormalEquations(derivative, residual, jtj, jtr);
    }
    return sum;
  };

  const { params, sumOfSquares } = levenbergMarquardt(start, accumulate, resolved);
  const [amplitude, background, centreMm, sigmaMm] = params;
  return {
    amplitude: amplitude,
    background: background,
    centreMm: centreMm,
    sigmaMm: sigmaMm,
    fwhmMm: FWHM_PER_SIGMA * sigmaMm,
    relativeRmsResidual: Math.sqrt(sumOfSquares / n) / Math.abs(amplitude),
  };
}
