/**
 * Scalar summaries of an MTF curve: the frequencies where it falls to 50 % and 10 % (MTF50, MTF10) and its value at
 * Nyquist. Linear interpolation between samples (common practice).
 */
import type { MtfCurve } from "./types";

/**
 * Frequency (same unit as the curve) of the first downward crossing of `level`, interpolated linearly between the two
 * bracketing samples; null when the curve never falls to the level.
 */
export function frequencyAtLevel(curve: MtfCurve, level: number): number | null {
  const f = curve.frequencyCyclesPerMm;
  const m = curve.value;
  for (let i = 1; i < m.length; i++) {
    const prev = m[i - 1]!;
    const cur = m[i]!;
    if (prev >= level && cur < level) {
      const t = (prev - level) / (prev - cur);
      return f[i - 1]! + t * (f[i]! - f[i - 1]!);
    }
  }
  return null;
}

/** MTF interpolated linearly at frequency `frequency`; null outside the sampled range. */
export function valueAtFrequency(curve: MtfCurve, frequency: number): number | null {
  const f = curve.frequencyCyclesPerMm;
  const m = curve.value;
  if (f.length === 0 || frequency < f[0]! || frequency > f[f.length - 1]!) return null;
  for (let i = 1; i < f.length; i++) {
    if (f[i]! >= frequency) {
      const span = f[i]! - f[i - 1]!;
      const t = span > 0 ? (frequency - f[i - 1]!) / span : 0;
      return m[i - 1]! + t * (m[i]! - m[i - 1]!);
    }
  }
  return m[0] ?? null;
}

export interface MtfSummary {
  mtf50: number | null;
  mtf10: number | null;
  mtfAtNyquist: number | null;
}

export function summariseMtf(curve: MtfCurve, nyquistCyclesPerMm: number): MtfSummary {
  return {
    mtf50: frequencyAtLevel(curve, 0.5),
    mtf10: frequencyAtLevel(curve, 0.1),
    mtfAtNyquist: valueAtFrequency(curve, nyquistCyclesPerMm),
  };
}
