/**
 * Filters of the ESF → LSF → MTF chain and their transfer functions: finite-difference derivatives, the capped
 * derivative correction, the bin-averaging transfer and the LSF windows.
 */

/**
 * "central": [−1, 0, 1]/(2Δ), the kernel of IEC 62220-1-1 (LSF sample i sits on ESF bin i).
 * "two-tap": [−1, 1]/Δ, the ISO 12233 FIR derivative (LSF sample i sits half-way between bins i and i+1).
 */
export type DerivativeKind = "central" | "two-tap";

/**
 * "hamming": w = 0.54 + 0.46·cos(πx/H) for |x| ≤ H (ISO 12233 e-SFR window; 1 at the centre, 0.08 at ±H).
 * "tukey": flat (w = 1) for |x| ≤ (1−α)H, cosine taper ½(1 + cos(π(|x| − (1−α)H)/(αH))) to 0 at ±H. Used where the
 *   analysed range is short compared with the LSF (small disks): a Hamming window's curvature at the centre would
 *   bias the MTF by about 3σ²/H² at MTF50 for a Gaussian LSF of width σ (second-moment estimate, derived).
 * "none": rectangular over ±H.
 * Outside ±H the weight is 0.
 */
export type LsfWindowKind = "hamming" | "tukey" | "none";

/**
 * Finite-difference derivative of an ESF sampled every `spacingMm`.
 * Returns n samples for "central" (one-sided differences at the two ends) or n−1 samples for "two-tap".
 * Units: ESF units per mm. Never throws.
 */
export function differentiateEsf(esf: ArrayLike<number>, spacingMm: number, kind: DerivativeKind): Float64Array {
  const n = esf.length;
  if (kind === "two-tap") {
    const out = new Float64Array(Math.max(0, n - 1));
    for (let i = 0; i < n - 1; i++) out[i] = (esf[i + 1]! - esf[i]!) / spacingMm;
    return out;
  }
  const out = new Float64Array(n);
  if (n < 2) return out;
  for (let i = 1; i < n - 1; i++) out[i] = (esf[i + 1]! - esf[i - 1]!) / (2 * spacingMm);
  out[0] = (esf[1]! - esf[0]!) / spacingMm;
  out[n - 1] = (esf[n - 1]! - esf[n - 2]!) / spacingMm;
  return out;
}

/**
 * Transfer function of the derivative kernel relative to the exact derivative (i2πf), at frequency f (cycles/mm) for
 * sample spacing Δ (mm): central sin(2πfΔ)/(2πfΔ) (zero at f = 1/(2Δ)); two-tap |sin(πfΔ)/(πfΔ)|.
 * Source: closed form of the kernels' DFT; correction practice: Cunningham & Fenster, Med Phys 1987;14:533.
 */
export function derivativeTransfer(frequencyCyclesPerMm: number, spacingMm: number, kind: DerivativeKind): number {
  const x = (kind === "central" ? 2 : 1) * Math.PI * frequencyCyclesPerMm * spacingMm;
  if (x === 0) return 1;
  const t = Math.sin(x) / x;
  return kind === "central" ? t : Math.abs(t);
}

/**
 * Multiplicative correction 1/H(f) for the derivative kernel, capped at `cap` (ISO 12233:2014 Annex D caps the
 * correction at 10, from memory), and equal to `cap` where H(f) ≤ 1/cap (including its zeros and negative lobe).
 */
export function derivativeCorrection(frequencyCyclesPerMm: number, spacingMm: number, kind: DerivativeKind, cap: number): number {
  const h = derivativeTransfer(frequencyCyclesPerMm, spacingMm, kind);
  return h > 1 / cap ? 1 / h : cap;
}

/**
 * Transfer function |sin(πfΔ)/(πfΔ)| of averaging samples spread evenly over a bin of width Δ (mm): each bin mean
 * is the ESF convolved with a Δ-wide boxcar, evaluated at the bin centre (rect → sinc, closed form).
 */
export function binningTransfer(frequencyCyclesPerMm: number, spacingMm: number): number {
  const x = Math.PI * frequencyCyclesPerMm * spacingMm;
  return x === 0 ? 1 : Math.abs(Math.sin(x) / x);
}

/**
 * Window weights for an LSF of n samples, centred on (fractional) sample index `centre`, half-width
 * H = min(centre, n − 1 − centre) samples so the window is symmetric and inside the data. See {@link LsfWindowKind}.
 * Returns all ones for "none" within ±H. Never throws; H ≤ 0 gives a single unit weight at the nearest sample.
 */
export function lsfWindow(n: number, centre: number, kind: LsfWindowKind, tukeyTaper = 0.5): Float64Array {
  const w = new Float64Array(n);
  const half = Math.min(centre, n - 1 - centre);
  if (!(half > 0)) {
    const i = Math.min(n - 1, Math.max(0, Math.round(centre)));
    w[i] = 1;
    return w;
  }
  const flat = (1 - tukeyTaper) * half;
  for (let i = 0; i < n; i++) {
    const x = Math.abs(i - centre);
    if (x > half) continue;
    if (kind === "hamming") w[i] = 0.54 + 0.46 * Math.cos((Math.PI * x) / half);
    else if (kind === "tukey") w[i] = x <= flat ? 1 : 0.5 * (1 + Math.cos((Math.PI * (x - flat)) / (half - flat)));
    else w[i] = 1;
  }
  return w;
}
