/**
 * Thin, allocation-aware wrappers around fft.js (radix-4 FFT). Plans are cached per size and reused.
 * No FFT is hand-written in Halfmax: fft.js does the transform.
 */
import FFT from "fft.js";
import { AnalysisError } from "./errors";

const plans = new Map<number, FFT>();

/** Smallest power of two ≥ n (and ≥ 2, the smallest size fft.js accepts). */
export function nextPowerOfTwo(n: number): number {
  let size = 2;
  while (size < n) size *= 2;
  return size;
}

/** Cached fft.js plan for a power-of-two size. */
export function fftPlan(size: number): FFT {
  if (!Number.isInteger(size) || size < 2 || (size & (size - 1)) !== 0) {
    throw new AnalysisError(`FFT size must be a power of two ≥ 2, got ${size}`);
  }
  let plan = plans.get(size);
  if (!plan) {
    plan = new FFT(size);
    plans.set(size, plan);
  }
  return plan;
}

/**
 * |DFT| of a real signal, zero-padded at the end to `paddedLength` (a power of two, default the next one ≥ length).
 * Returns magnitudes for bins k = 0 … paddedLength/2; bin k is frequency k / (paddedLength · sampleSpacing).
 */
export function realAmplitudeSpectrum(signal: ArrayLike<number>, paddedLength = nextPowerOfTwo(signal.length)): Float64Array {
  if (paddedLength < signal.length) {
    throw new AnalysisError(`padded FFT length ${paddedLength} is shorter than the signal (${signal.length} samples)`);
  }
  const plan = fftPlan(paddedLength);
  const input = new Float64Array(paddedLength);
  for (let i = 0; i < signal.length; i++) input[i] = signal[i]!;
  const out = plan.createComplexArray() as number[];
  plan.realTransform(out, input);
  const half = paddedLength / 2;
  const magnitude = new Float64Array(half + 1);
  for (let k = 0; k <= half; k++) {
    const re = out[2 * k]!;
    const im = out[2 * k + 1]!;
    magnitude[k] = Math.hypot(re, im);
  }
  return magnitude;
}

/**
 * In-place style complex DFT of interleaved [re0, im0, re1, im1, …] data of power-of-two length n (complex samples).
 * Returns a new interleaved array.
 */
export function complexTransform(interleaved: ArrayLike<number>, inverse = false): Float64Array {
  const n = interleaved.length / 2;
  const plan = fftPlan(n);
  const out = plan.createComplexArray() as number[];
  if (inverse) plan.inverseTransform(out, interleaved);
  else plan.transform(out, interleaved);
  return Float64Array.from(out);
}
