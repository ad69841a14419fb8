import { describe, expect, it } from "vitest";
import {
  binningTransfer,
  derivativeCorrection,
  derivativeTransfer,
  differentiateEsf,
  EsfAccumulator,
  esfToMtf,
  lsfWindow,
  type BinnedEsf,
} from "@/lib/analysis/edge-spread";
import { AnalysisError } from "@/lib/analysis/errors";
import { normalCdf } from "@/lib/analysis/special-functions";
import { expectClose } from "../helpers/expect-close";

/** ESF sampled at bin centres k·Δ, k = −half … half. */
function sampledEsf(esf: (xMm: number) => number, binWidthMm: number, half: number): BinnedEsf {
  const value = new Float64Array(2 * half + 1);
  for (let i = 0; i < value.length; i++) value[i] = esf((i - half) * binWidthMm);
  return { value, count: new Int32Array(value.length).fill(1), firstBin: -half, binWidthMm, emptyBins: 0 };
}

describe("differentiateEsf(esf, Δ, kind) and derivativeTransfer(f, Δ, kind)", () => {
  const dx = 0.025;
  // Source for both checks: closed form of the kernels on a cosine (trigonometric identities):
  // [cos(ω(x+Δ)) − cos(ω(x−Δ))]/(2Δ) = −ω·sin(ωx)·sin(ωΔ)/(ωΔ) and [cos(ω(x+Δ)) − cos(ωx)]/Δ = −ω·sin(ω(x+Δ/2))·sin(ωΔ/2)/(ωΔ/2);
  // correction practice: Cunningham & Fenster, Med Phys 1987;14:533.
  for (const f of [1, 5, 10, 17.3]) {
    it(`central difference of cos(2πfx) at f = ${f} cycles/mm is the exact derivative times sin(2πfΔ)/(2πfΔ)`, () => {
      const omega = 2 * Math.PI * f;
      const esf = Float64Array.from({ length: 64 }, (_, i) => Math.cos(omega * i * dx));
      const lsf = differentiateEsf(esf, dx, "central");
      const h = derivativeTransfer(f, dx, "central");
      expectClose(h, Math.sin(2 * Math.PI * f * dx) / (2 * Math.PI * f * dx), { abs: 1e-15 });
      for (let i = 1; i < 63; i++) expectClose(lsf[i], -omega * Math.sin(omega * i * dx) * h, { abs: 1e-9 });
    });

    it(`two-tap difference of cos(2πfx) at f = ${f} cycles/mm is the exact derivative half a sample later times |sin(πfΔ)/(πfΔ)|`, () => {
      const omega = 2 * Math.PI * f;
      const esf = Float64Array.from({ length: 64 }, (_, i) => Math.cos(omega * i * dx));
      const lsf = differentiateEsf(esf, dx, "two-tap");
      expect(lsf.length).toBe(63);
      const h = derivativeTransfer(f, dx, "two-tap");
      expectClose(h, Math.abs(Math.sin(Math.PI * f * dx) / (Math.PI * f * dx)), { abs: 1e-15 });
      for (let i = 0; i < 63; i++) expectClose(lsf[i], -omega * Math.sin(omega * (i + 0.5) * dx) * h, { abs: 1e-9 });
    });
  }

  it("derivativeCorrection is 1/H(f) below the cap and the cap at the central kernel's zero f = 1/(2Δ)", () => {
    // Cap of 10 as in ISO 12233:2014 Annex D (from memory); zero of sin(2πfΔ) at f = 1/(2Δ) (closed form).
    expectClose(derivativeCorrection(5, dx, "central", 10), 1 / derivativeTransfer(5, dx, "central"), { rel: 1e-15 });
    expect(derivativeCorrection(1 / (2 * dx), dx, "central", 10)).toBe(10);
    expect(derivativeCorrection(0, dx, "two-tap", 10)).toBe(1);
  });
});

describe("EsfAccumulator", () => {
  it("bin means of samples spread evenly over each bin equal the ESF averaged over the bin (transfer sinc(fΔ))", () => {
    // Mean of cos(2πfx) over [c − Δ/2, c + Δ/2] = cos(2πfc)·sin(πfΔ)/(πfΔ) (closed form, rect → sinc).
    const dx = 0.05;
    const f = 7;
    const acc = new EsfAccumulator(-1, 1, dx);
    const perBin = 400;
    for (let k = -20; k <= 20; k++) {
      for (let j = 0; j < perBin; j++) {
        const x = (k - 0.5 + (j + 0.5) / perBin) * dx;
        acc.add(x, Math.cos(2 * Math.PI * f * x));
      }
    }
    const esf = acc.finish();
    expect(esf.firstBin).toBe(-20);
    expect(esf.emptyBins).toBe(0);
    for (let i = 0; i < esf.value.length; i++) {
      const centre = (esf.firstBin + i) * dx;
      expectClose(esf.value[i], Math.cos(2 * Math.PI * f * centre) * binningTransfer(f, dx), { abs: 2e-6 });
    }
  });

  it("fills empty bins by linear interpolation and counts them", () => {
    // A linear ESF is reproduced exactly by linear interpolation (common practice).
    const acc = new EsfAccumulator(-1, 1, 0.1);
    for (let k = -10; k <= 10; k++) if (k !== -3 && k !== 4 && k !== 5) acc.add(k * 0.1, 2 * k * 0.1 + 1);
    const esf = acc.finish();
    expect(esf.emptyBins).toBe(3);
    expect(Array.from(esf.count.slice(7, 8))).toEqual([0]); // bin k = −3
    for (let i = 0; i < esf.value.length; i++) expectClose(esf.value[i], 2 * (esf.firstBin + i) * 0.1 + 1, { abs: 1e-12 });
  });

  it("moves a bin mean from the samples' mean position to the bin centre along the neighbouring slope", () => {
    // All samples of each bin sit 0.3 Δ right of its centre on the line y = 3x: after the first-order move the
    // values are exactly 3·centre (linear function, closed form).
    const dx = 0.1;
    const acc = new EsfAccumulator(-1, 1, dx);
    for (let k = -10; k <= 10; k++) acc.add((k + 0.3) * dx, 3 * (k + 0.3) * dx);
    const esf = acc.finish();
    for (let i = 0; i < esf.value.length; i++) expectClose(esf.value[i], 3 * (esf.firstBin + i) * dx, { abs: 1e-12 });
  });

  it("throws AnalysisError when fewer than half the bins receive samples", () => {
    const acc = new EsfAccumulator(-1, 1, 0.1);
    acc.add(0, 1);
    expect(() => acc.finish()).toThrow(AnalysisError);
    expect(() => new EsfAccumulator(0, 0.2, 0.1)).toThrow(/at least 8 needed/);
  });
});

describe("lsfWindow(n, centre, kind)", () => {
  it("Hamming is 0.54 + 0.46·cos(πx/H): 1 at the centre and 0.08 at ±H", () => {
    // ISO 12233 e-SFR Hamming window (from memory), w(n) = 0.54 − 0.46·cos(2πn/(N−1)) written about the centre.
    const w = lsfWindow(101, 50, "hamming");
    expectClose(w[50], 1, { abs: 1e-15 });
    expectClose(w[0], 0.08, { abs: 1e-15 });
    expectClose(w[100], 0.08, { abs: 1e-15 });
    expectClose(w[75], 0.54, { abs: 1e-15 });
  });

  it("Tukey is flat over the central (1 − α) of the half-width and ½(1 + cos) in the taper", () => {
    // Tukey (tapered cosine) window, Harris, Proc IEEE 1978;66:51.
    const w = lsfWindow(101, 50, "tukey", 0.5);
    for (let i = 25; i <= 75; i++) expect(w[i]).toBe(1);
    expectClose(w[0], 0, { abs: 1e-15 });
    expectClose(w[88], 0.5 * (1 + Math.cos((Math.PI * (38 - 25)) / 25)), { abs: 1e-15 });
  });

  it("is symmetric about a fractional centre and zero beyond the nearer end", () => {
    const w = lsfWindow(40, 12.5, "hamming");
    for (let k = 0; k <= 12; k++) expectClose(w[12 - k], w[13 + k]!, { abs: 1e-15 });
    for (let i = 26; i < 40; i++) expect(w[i]).toBe(0);
  });
});

describe("esfToMtf(esf, options)", () => {
  const sigma = 0.12;
  const dx = 0.025;
  const gaussianEsf = (x: number): number => 100 + 900 * normalCdf(x / sigma);
  const gaussianMtf = (f: number): number => Math.exp(-2 * Math.PI ** 2 * sigma ** 2 * f ** 2);

  for (const derivative of ["central", "two-tap"] as const) {
    it(`${derivative}: a point-sampled Gaussian ESF gives exp(−2π²σ²f²) after the derivative correction`, () => {
      // Gaussian LSF ↔ Gaussian MTF (closed form; domain notes §6). Point samples: no bin averaging to correct.
      const result = esfToMtf(sampledEsf(gaussianEsf, dx, 256), { derivative, binCorrection: false, maxFrequencyCyclesPerMm: 20 });
      expect(result.mtf.value[0]).toBe(1);
      expect(result.polarity).toBe(1);
      for (let k = 0; k < result.mtf.frequencyCyclesPerMm.length; k++) {
        const f = result.mtf.frequencyCyclesPerMm[k]!;
        expectClose(result.mtf.value[k], gaussianMtf(f), { abs: 2e-3 });
      }
      expectClose(result.mtf.frequencyCyclesPerMm[1]! - result.mtf.frequencyCyclesPerMm[0]!, 1 / (result.fftLength * dx), { rel: 1e-12 });
    });
  }

  it("without the derivative correction the central-difference MTF is lower by sin(2πfΔ)/(2πfΔ)", () => {
    // Transfer function of [−1, 0, 1]/(2Δ), closed form.
    const esf = sampledEsf(gaussianEsf, dx, 256);
    const corrected = esfToMtf(esf, { derivative: "central", binCorrection: false, maxFrequencyCyclesPerMm: 15 });
    const raw = esfToMtf(esf, { derivative: "central", binCorrection: false, correctionCap: 1, maxFrequencyCyclesPerMm: 15 });
    for (let k = 1; k < raw.mtf.value.length; k++) {
      const f = raw.mtf.frequencyCyclesPerMm[k]!;
      expectClose(raw.mtf.value[k], corrected.mtf.value[k]! * derivativeTransfer(f, dx, "central"), { abs: 1e-12 });
    }
  });

  it("a ramp ESF (uniform LSF of width a) gives |sin(πaf)/(πaf)| up to beyond the first zero", () => {
    // rect → sinc (closed form; domain notes §6, uniform slit). ESF = clamp(x/a + ½, 0, 1).
    const a = 0.5;
    const esf = sampledEsf((x) => Math.min(1, Math.max(0, x / a + 0.5)), 0.01, 1024);
    const result = esfToMtf(esf, { window: "none", binCorrection: false, maxFrequencyCyclesPerMm: 3 });
    for (let k = 0; k < result.mtf.value.length; k++) {
      const f = result.mtf.frequencyCyclesPerMm[k]!;
      const x = Math.PI * a * f;
      expectClose(result.mtf.value[k], f === 0 ? 1 : Math.abs(Math.sin(x) / x), { abs: 2e-3 });
    }
  });

  it("a falling ESF gives the same MTF and a positive unit-area LSF (polarity −1)", () => {
    // Invariance under ESF → −ESF: |FFT| of −LSF equals |FFT| of LSF (linearity of the DFT).
    const rising = esfToMtf(sampledEsf(gaussianEsf, dx, 200), { maxFrequencyCyclesPerMm: 20 });
    const falling = esfToMtf(sampledEsf((x) => -gaussianEsf(x), dx, 200), { maxFrequencyCyclesPerMm: 20 });
    expect(falling.polarity).toBe(-1);
    for (let k = 0; k < rising.mtf.value.length; k++) expectClose(falling.mtf.value[k], rising.mtf.value[k]!, { abs: 1e-12 });
    let area = 0;
    for (let i = 0; i < falling.lsf.length; i++) area += falling.lsf[i]! * dx;
    expectClose(area, 1, { abs: 1e-12 });
    expect(Math.max(...falling.lsf)).toBeGreaterThan(0);
  });

  it("throws AnalysisError for a flat ESF", () => {
    expect(() => esfToMtf(sampledEsf(() => 5, dx, 20), { maxFrequencyCyclesPerMm: 10 })).toThrow(AnalysisError);
  });
});
