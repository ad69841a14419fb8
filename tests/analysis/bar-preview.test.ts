import { describe, expect, it } from "vitest";
import { BAR_PREVIEW_DEFAULTS, barPreviewFrequencies, renderBarPreview } from "@/lib/analysis/bar-preview";
import { AnalysisError } from "@/lib/analysis/errors";
import { complexTransform, nextPowerOfTwo } from "@/lib/analysis/fft";
import { normalIntervalProbability } from "@/lib/analysis/special-functions";
import { expectClose } from "../helpers/expect-close";

/** Gaussian LSF sampled every σ/50 over ±8σ, deliberately not normalised (scale 3.7). */
function gaussianLsf(sigma: number, offsetMm = 0) {
  const positionMm: number[] = [];
  const value: number[] = [];
  for (let i = -400; i <= 400; i++) {
    const x = (i * sigma) / 50;
    positionMm.push(x + offsetMm);
    value.push(3.7 * Math.exp(-(x * x) / (2 * sigma * sigma)));
  }
  return { positionMm, value };
}
const gaussianMtf = (sigma: number, f: number) => Math.exp(-2 * Math.PI ** 2 * sigma ** 2 * f ** 2);
/** Coltman's square-wave response series: C(f) = (4/π) Σ_{k odd} (−1)^((k−1)/2) M(kf)/k. */
const coltman = (mtf: (f: number) => number, f: number) => {
  let sum = 0;
  for (let k = 1; k <= 201; k += 2) sum += (((k - 1) / 2) % 2 === 0 ? 1 : -1) * (mtf(k * f) / k);
  return (4 / Math.PI) * sum;
};

describe("renderBarPreview", () => {
  it("renderBarPreview with a delta-like LSF returns the input pattern and modulation 1", () => {
    // Impulse response: convolution with a unit impulse is the identity (any signal-processing text).
    const lsf = { positionMm: [-0.001, 0, 0.001], value: [0, 5, 0] }; // much narrower than one preview sample
    for (const barsPerGroup of [4, 3]) {
      const { groups } = renderBarPreview({ lsf, frequenciesCyclesPerMm: [0.5, 1, 2], barsPerGroup, samplesPerMm: 64 });
      for (const g of groups) {
        g.output.forEach((v, i) => expectClose(v, g.input[i]!, { abs: 1e-12 }));
        expectClose(g.modulation, 1, { abs: 1e-12 });
        expect(Math.max(...g.input)).toBe(1);
      }
    }
  });

  it("renderBarPreview(Gaussian σ) at high frequency gives (4/π)·exp(−2π²σ²f²) (Coltman 1954)", () => {
    // Where M(3f) ≈ 0 only the fundamental survives: square-wave response = (4/π)·M(f)
    // (Coltman, J. Opt. Soc. Am. 44 (1954) 468 — citation from memory). Here M(f) = e^−1.2 ≈ 0.301, M(3f) = e^−10.8.
    const sigma = 0.2;
    const f = Math.sqrt(1.2 / (2 * Math.PI ** 2 * sigma ** 2));
    const { groups } = renderBarPreview({ lsf: gaussianLsf(sigma), frequenciesCyclesPerMm: [f], samplesPerMm: 128 * f });
    expectClose(groups[0]!.modulation, (4 / Math.PI) * gaussianMtf(sigma, f), { rel: 2e-3 });
  });

  it("renderBarPreview(Gaussian σ) at mid frequency follows Coltman's full odd-harmonic series", () => {
    // M(f) = e^−0.15, M(3f) = e^−1.35, M(5f) = e^−3.75: the harmonics matter, so (4/π)M(f) alone would be 5 % off.
    const sigma = 0.25;
    const f = Math.sqrt(0.15 / (2 * Math.PI ** 2 * sigma ** 2));
    const { groups } = renderBarPreview({ lsf: gaussianLsf(sigma), frequenciesCyclesPerMm: [f], samplesPerMm: 256 * f });
    const expected = coltman((x) => gaussianMtf(sigma, x), f);
    expect(Math.abs(expected - (4 / Math.PI) * gaussianMtf(sigma, f))).toBeGreaterThan(0.03);
    expectClose(groups[0]!.modulation, expected, { rel: 2e-3 });
  });

  it("renderBarPreview of a coarse pattern through a narrow LSF has modulation 1 (Leibniz: 1 − 1/3 + 1/5 − … = π/4)", () => {
    const { groups } = renderBarPreview({ lsf: gaussianLsf(0.02), frequenciesCyclesPerMm: [0.2] });
    expectClose(groups[0]!.modulation, 1, { abs: 1e-9 });
  });

  it("renderBarPreview preserves the mean: Σ output = Σ input for an asymmetric LSF (unit area)", () => {
    // ∫(s ∗ h) = ∫s · ∫h = ∫s when ∫h = 1 (Fubini); the default window holds the whole blurred pattern.
    const positionMm = Array.from({ length: 300 }, (_, i) => i * 0.01);
    const lsf = { positionMm, value: positionMm.map((x) => Math.exp(-x / 0.4)) }; // one-sided exponential tail
    const { groups } = renderBarPreview({ lsf, frequenciesCyclesPerMm: [0.3, 0.8, 1.4], barsPerGroup: 5 });
    for (const g of groups) {
      const sumIn = g.input.reduce((a, b) => a + b, 0);
      const sumOut = g.output.reduce((a, b) => a + b, 0);
      expectClose(sumOut, sumIn, { rel: 1e-12 });
    }
  });

  it("renderBarPreview output equals an fft.js circular convolution with the exact Gaussian cell integrals", () => {
    // Independent path: kernel from the Gaussian CDF over each cell (normal interval probability), convolution via
    // fft.js with zero padding (convolution theorem).
    const sigma = 0.3;
    const samplesPerMm = 20;
    const step = 1 / samplesPerMm;
    const { groups } = renderBarPreview({ lsf: gaussianLsf(sigma), frequenciesCyclesPerMm: [0.6], samplesPerMm });
    const g = groups[0]!;
    const reach = Math.ceil((8 * sigma) / step) + 1;
    const size = nextPowerOfTwo(g.input.length + 2 * reach + 1);
    const a = new Float64Array(2 * size);
    const h = new Float64Array(2 * size);
    g.input.forEach((v, i) => (a[2 * i] = v));
    for (let k = -reach; k <= reach; k++) {
      h[2 * ((k + size) % size)] = normalIntervalProbability((k - 0.5) * step, (k + 0.5) * step, 0, sigma);
    }
    const A = complexTransform(a);
    const H = complexTransform(h);
    const P = new Float64Array(2 * size);
    for (let k = 0; k < size; k++) {
      P[2 * k] = A[2 * k]! * H[2 * k]! - A[2 * k + 1]! * H[2 * k + 1]!;
      P[2 * k + 1] = A[2 * k]! * H[2 * k + 1]! + A[2 * k + 1]! * H[2 * k]!;
    }
    const conv = complexTransform(P, true);
    // The preview integrates the piecewise-linear interpolant of the LSF samples (spacing h = σ/50), whose error is
    // O(h²) (trapezoid-rule bound h²/12·|g''|, ≈ 1.4e-5 here on outputs ≤ 1): allow 3e-5.
    g.output.forEach((v, i) => expectClose(v, conv[2 * i]!, { abs: 3e-5 }));
    // An off-by-one in the kernel offset would move the output by a full sample: far beyond the tolerance.
    expect(Math.max(...g.output.map((v, i) => Math.abs(v - (conv[2 * i + 2] ?? 0))))).toBeGreaterThan(1e-3);
  });

  it("renderBarPreview ignores the LSF's scale and position (unit area, centroid re-centred)", () => {
    const a = renderBarPreview({ lsf: gaussianLsf(0.3), frequenciesCyclesPerMm: [0.8], samplesPerMm: 40 });
    const shifted = gaussianLsf(0.3, 0.37);
    const b = renderBarPreview({
      lsf: { positionMm: shifted.positionMm, value: shifted.value.map((v) => 11 * v) },
      frequenciesCyclesPerMm: [0.8],
      samplesPerMm: 40,
    });
    a.groups[0]!.output.forEach((v, i) => expectClose(b.groups[0]!.output[i], v, { abs: 1e-9 }));
  });

  it("renderBarPreview of a symmetric LSF gives a symmetric output about 0 mm", () => {
    const g = renderBarPreview({ lsf: gaussianLsf(0.25), frequenciesCyclesPerMm: [1.1], barsPerGroup: 4 }).groups[0]!;
    const n = g.output.length;
    expectClose(g.positionMm[(n - 1) / 2], 0, { abs: 1e-12 });
    for (let i = 0; i < n; i++) expectClose(g.output[i], g.output[n - 1 - i]!, { abs: 1e-9 });
  });

  it("renderBarPreview honours lengthMm and refuses one too short for the pattern", () => {
    const g = renderBarPreview({ lsf: gaussianLsf(0.1), frequenciesCyclesPerMm: [1], samplesPerMm: 20, lengthMm: 10 }).groups[0]!;
    expectClose(g.positionMm[0], -5, { abs: 1e-12 });
    expectClose(g.positionMm[g.positionMm.length - 1], 5, { abs: 1e-12 });
    // 4 bars at 1 cycle/mm span 3.5 mm.
    expect(() => renderBarPreview({ lsf: gaussianLsf(0.1), frequenciesCyclesPerMm: [1], lengthMm: 3 })).toThrow(/≥ 3.5 mm/);
  });

  it("renderBarPreview throws AnalysisError for bad LSFs, bar counts and sampling", () => {
    const lsf = gaussianLsf(0.2);
    expect(() => renderBarPreview({ lsf: { positionMm: [0, 1], value: [-1, -1] }, frequenciesCyclesPerMm: [1] })).toThrow(/area must be positive/);
    expect(() => renderBarPreview({ lsf: { positionMm: [0, 0, 1], value: [1, 1, 1] }, frequenciesCyclesPerMm: [1] })).toThrow(/increase strictly/);
    expect(() => renderBarPreview({ lsf, frequenciesCyclesPerMm: [1], barsPerGroup: 1 })).toThrow(/integer ≥ 2/);
    expect(() => renderBarPreview({ lsf, frequenciesCyclesPerMm: [2], samplesPerMm: 10 })).toThrow(/at least 8 samples per period/);
    expect(() => renderBarPreview({ lsf, frequenciesCyclesPerMm: [] })).toThrow(AnalysisError);
    expect(() => renderBarPreview({ lsf, frequenciesCyclesPerMm: [0] })).toThrow(/positive/);
  });
});

describe("barPreviewFrequencies", () => {
  it("barPreviewFrequencies(mtf50) gives 0.5×, 0.75×, 1×, 1.25×, 1.5× MTF50 to two significant digits", () => {
    // Hand arithmetic: 0.4413 × factors = 0.22065, 0.330975, 0.4413, 0.551625, 0.66195.
    expect(barPreviewFrequencies(0.4413)).toEqual([0.22, 0.33, 0.44, 0.55, 0.66]);
    // 1.234 × factors = 0.617, 0.9255, 1.234, 1.5425, 1.851.
    expect(barPreviewFrequencies(1.234)).toEqual([0.62, 0.93, 1.2, 1.5, 1.9]);
    expect(BAR_PREVIEW_DEFAULTS.frequencyFactors).toEqual([0.5, 0.75, 1, 1.25, 1.5]);
  });

  it("barPreviewFrequencies throws AnalysisError for a non-positive MTF50", () => {
    expect(() => barPreviewFrequencies(0)).toThrow(AnalysisError);
    expect(() => barPreviewFrequencies(Number.NaN)).toThrow(/positive frequency/);
  });
});
