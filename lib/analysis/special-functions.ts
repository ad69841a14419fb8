/**
 * Error function and complementary error function in double precision (absolute error < 1e-15 for erf, relative
 * error < 1e-13 for erfc up to x ≈ 26, where it underflows).
 *
 * Method (Abramowitz & Stegun, Handbook of Mathematical Functions, 1964):
 * - |x| ≤ 2: the series with positive terms erf(x) = (2/√π)·e^(−x²)·Σₙ 2ⁿx^(2n+1)/(1·3·…·(2n+1)) (A&S 7.1.6), which has
 *   no cancellation;
 * - |x| > 2: the continued fraction erfc(x) = (e^(−x²)/√π)·1/(x + (1/2)/(x + 1/(x + (3/2)/(x + …)))) (A&S 7.1.14),
 *   evaluated bottom-up with a fixed depth that converges to double precision for x > 2.
 */

const TWO_OVER_SQRT_PI = 2 / Math.sqrt(Math.PI);
const ONE_OVER_SQRT_PI = 1 / Math.sqrt(Math.PI);
const SERIES_LIMIT = 2;
const CONTINUED_FRACTION_DEPTH = 60;

/** erf(x) for |x| ≤ SERIES_LIMIT by the positive-term series (A&S 7.1.6). */
function erfSeries(x: number): number {
  const twoXSquared = 2 * x * x;
  let term = x;
  let sum = x;
  for (let n = 1; n < 200; n++) {
    term *= twoXSquared / (2 * n + 1);
    sum += term;
    if (term < sum * 1e-17) break;
  }
  return TWO_OVER_SQRT_PI * Math.exp(-x * x) * sum;
}

/** erfc(x) for x > SERIES_LIMIT by the continued fraction (A&S 7.1.14). */
function erfcContinuedFraction(x: number): number {
  let tail = x;
  for (let k = CONTINUED_FRACTION_DEPTH; k >= 1; k--) tail = x + k / 2 / tail;
  return (ONE_OVER_SQRT_PI * Math.exp(-x * x)) / tail;
}

/**
 * Error function erf(x) = (2/√π)∫₀ˣ e^(−t²) dt. Odd, in (−1, 1); NaN for NaN input. Never throws.
 */
export function erf(x: number): number {
  if (Number.isNaN(x)) return NaN;
  const ax = Math.abs(x);
  const value = ax <= SERIES_LIMIT ? erfSeries(ax) : 1 - erfcContinuedFraction(ax);
  return x < 0 ? -value : value;
}

/**
 * Complementary error function erfc(x) = 1 − erf(x), computed without cancellation for large positive x
 * (use it for tail integrals such as ½·erfc(a/(σ√2)) − ½·erfc(b/(σ√2))). In (0, 2); NaN for NaN input. Never throws.
 */
export function erfc(x: number): number {
  if (Number.isNaN(x)) return NaN;
  if (x > SERIES_LIMIT) return erfcContinuedFraction(x);
  if (x < -SERIES_LIMIT) return 2 - erfcContinuedFraction(-x);
  return 1 - erf(x);
}

/**
 * Standard normal cumulative distribution Φ(z) = ½·erfc(−z/√2), accurate in both tails. Never throws.
 */
export function normalCdf(z: number): number {
  return 0.5 * erfc(-z / Math.SQRT2);
}

/**
 * Probability mass of a normal distribution N(mean, σ²) inside [a, b] (a ≤ b), computed from whichever tail keeps
 * precision: exact pixel-aperture integral of a Gaussian, as used by the phantom generators. Never throws; returns 0
 * for a ≥ b.
 */
export function normalIntervalProbability(a: number, b: number, mean: number, sigma: number): number {
  if (!(b > a)) return 0;
  const za = (a - mean) / (sigma * Math.SQRT2);
  const zb = (b - mean) / (sigma * Math.SQRT2);
  // Both in the upper tail: difference of erfc; both in the lower tail: mirror; straddling: erf difference.
  if (za >= 0) return 0.5 * (erfc(za) - erfc(zb));
  if (zb <= 0) return 0.5 * (erfc(-zb) - erfc(-za));
  return 0.5 * (erf(zb) - erf(za));
}
