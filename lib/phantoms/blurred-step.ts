/**
 * Closed forms for a Gaussian-blurred straight edge seen through a tilted square (or rectangular) pixel aperture.
 *
 * A pixel of pitch (pₓ, p_y) whose edge normal makes angle α with the x axis averages the blurred step over the
 * projection of the pixel onto the normal: a uniform distribution of width a = pₓ|cos α| convolved with one of width
 * b = p_y|sin α| (a trapezoid). Hence, with Φ_σ the blurred step (normal CDF of width σ):
 *   pixel value  E(d) = (Φ_σ ∗ rect_a ∗ rect_b)(d)                      (exact, no supersampling)
 *   presampled LSF L(d) = E′(d),  presampled MTF = e^(−2π²σ²f²)·sinc(af)·sinc(bf)   (rect → sinc, Gaussian → Gaussian).
 * E uses the first and second antiderivatives of Φ: with z = t/σ, φ the normal density,
 *   F₁(t) = σ(zΦ(z) + φ(z)),  F₂(t) = σ²((z² + 1)Φ(z)/2 + zφ(z)/2)   (checked by differentiation), and
 *   E(d) = [F₂(d + (a+b)/2) − F₂(d + (a−b)/2) − F₂(d − (a−b)/2) + F₂(d − (a+b)/2)]/(ab).
 * σ = 0 (ideal edge) uses Φ = step, F₁ = max(t, 0), F₂ = max(t, 0)²/2. All lengths in mm.
 */
import { AnalysisError } from "../analysis/errors";
import { normalCdf } from "../analysis/special-functions";

const INV_SQRT_2PI = 1 / Math.sqrt(2 * Math.PI);

function f0(t: number, sigma: number): number {
  if (sigma === 0) return t > 0 ? 1 : t < 0 ? 0 : 0.5;
  return normalCdf(t / sigma);
}

function f1(t: number, sigma: number): number {
  if (sigma === 0) return t > 0 ? t : 0;
  const z = t / sigma;
  return sigma * (z * normalCdf(z) + INV_SQRT_2PI * Math.exp(-0.5 * z * z));
}

function f2(t: number, sigma: number): number {
  if (sigma === 0) return t > 0 ? 0.5 * t * t : 0;
  const z = t / sigma;
  return sigma * sigma * (0.5 * (z * z + 1) * normalCdf(z) + 0.5 * z * INV_SQRT_2PI * Math.exp(-0.5 * z * z));
}

/** Relative size below which the narrower aperture is treated as zero (avoids a 0/0 second difference). */
const THIN_APERTURE = 1e-6;

/**
 * Pixel value (0 … 1) of a unit step blurred by a Gaussian of σ (mm) at signed normal distance d (mm) of the pixel
 * centre from the edge, averaged over a trapezoidal aperture rect_a ∗ rect_b (a, b ≥ 0, mm). Rises from 0 (d → −∞)
 * to 1. Never throws; needs σ > 0 or a > 0.
 */
export function blurredStepValue(distanceMm: number, sigmaMm: number, aMm: number, bMm: number): number {
  // E(d) = 1 − E(−d) (symmetric aperture and blur): evaluate on the dark side, where the antiderivatives are small.
  if (distanceMm > 0) return 1 - blurredStepValue(-distanceMm, sigmaMm, aMm, bMm);
  const wide = Math.max(aMm, bMm);
  const thin = Math.min(aMm, bMm);
  const d = distanceMm;
  if (wide === 0) return f0(d, sigmaMm);
  if (thin < THIN_APERTURE * wide) return (f1(d + wide / 2, sigmaMm) - f1(d - wide / 2, sigmaMm)) / wide;
  const s = (wide + thin) / 2;
  const r = (wide - thin) / 2;
  return (f2(d + s, sigmaMm) - f2(d + r, sigmaMm) - f2(d - r, sigmaMm) + f2(d - s, sigmaMm)) / (wide * thin);
}

/** Presampled LSF L(d) = dE/dd (1/mm, unit area), symmetric in d. Same arguments as {@link blurredStepValue}. */
export function blurredStepLsf(distanceMm: number, sigmaMm: number, aMm: number, bMm: number): number {
  const d = -Math.abs(distanceMm);
  const wide = Math.max(aMm, bMm);
  const thin = Math.min(aMm, bMm);
  if (wide === 0) return INV_SQRT_2PI * Math.exp((-0.5 * d * d) / (sigmaMm * sigmaMm)) / sigmaMm;
  if (thin < THIN_APERTURE * wide) return (f0(d + wide / 2, sigmaMm) - f0(d - wide / 2, sigmaMm)) / wide;
  const s = (wide + thin) / 2;
  const r = (wide - thin) / 2;
  return (f1(d + s, sigmaMm) - f1(d + r, sigmaMm) - f1(d - r, sigmaMm) + f1(d - s, sigmaMm)) / (wide * thin);
}

function sinc(x: number): number {
  return x === 0 ? 1 : Math.sin(Math.PI * x) / (Math.PI * x);
}

/** Presampled MTF e^(−2π²σ²f²)·sinc(af)·sinc(bf) (signed; take |·| for a modulation), f in cycles/mm. */
export function blurredStepMtf(frequencyCyclesPerMm: number, sigmaMm: number, aMm: number, bMm: number): number {
  const f = frequencyCyclesPerMm;
  return Math.exp(-2 * Math.PI * Math.PI * sigmaMm * sigmaMm * f * f) * sinc(aMm * f) * sinc(bMm * f);
}

/**
 * Full width (mm) at `level` × peak of a symmetric, unimodal profile peaking at 0, by bisection on d ≥ 0 to 1e-9 of
 * `scaleMm`. The profile must fall below the level before 100·scaleMm.
 */
export function symmetricWidthMm(profile: (d: number) => number, level: number, scaleMm: number): number {
  const target = level * profile(0);
  let lo = 0;
  let hi = scaleMm;
  while (profile(hi) > target) {
    hi *= 2;
    if (hi > 100 * scaleMm) throw new AnalysisError(`profile does not fall to ${level} of its peak within ${100 * scaleMm} mm`);
  }
  for (let i = 0; i < 200 && hi - lo > 1e-9 * scaleMm; i++) {
    const mid = 0.5 * (lo + hi);
    if (profile(mid) > target) lo = mid;
    else hi = mid;
  }
  return lo + hi;
}
