import { mean as mjMean, std as mjStd } from "mathjs";
import { describe, expect, it } from "vitest";
import { averageMtfCurves, computeBaseline } from "@/lib/qa/baseline";
import { QaError } from "@/lib/qa/qa-error";
import { createRandom } from "@/lib/phantoms/random";
import { expectClose } from "../helpers/expect-close";

const mathjsSd = (xs: number[]): number => mjStd(xs, "unbiased") as unknown as number;

describe("computeBaseline", () => {
  it("computeBaseline(values) matches mathjs mean and unbiased std on seeded data", () => {
    const rng = createRandom(20240601);
    for (const n of [2, 3, 7, 25, 200]) {
      const values = Array.from({ length: n }, () => 0.45 + 0.02 * rng.normal());
      const b = computeBaseline(values);
      // Independent reference: mathjs mean and std(…, "unbiased") (n − 1 normalisation).
      expectClose(b.mean, mjMean(values), { rel: 1e-12 });
      expectClose(b.sd, mathjsSd(values), { rel: 1e-10 });
      expect(b.n).toBe(n);
      expect(b.min).toBe(Math.min(...values));
      expect(b.max).toBe(Math.max(...values));
    }
  });

  it("computeBaseline(values) stays accurate for a small spread on a large offset", () => {
    // Values 1e6 + {1, 2, 3}: sample SD is exactly 1 (closed form); a one-pass Σx² formula loses digits here.
    const b = computeBaseline([1e6 + 1, 1e6 + 2, 1e6 + 3]);
    expectClose(b.sd, 1, { rel: 1e-9 });
    expectClose(b.mean, 1e6 + 2, { rel: 1e-15 });
  });

  it("computeBaseline([x]) has SD null", () => {
    expect(computeBaseline([3.2])).toEqual({ mean: 3.2, sd: null, n: 1, min: 3.2, max: 3.2 });
  });

  it("computeBaseline([]) and non-finite values throw QaError", () => {
    expect(() => computeBaseline([])).toThrow(QaError);
    expect(() => computeBaseline([])).toThrow(/at least 1 result, got 0/);
    expect(() => computeBaseline([1, Number.NaN])).toThrow(/baseline value 1/);
  });
});

describe("averageMtfCurves", () => {
  const gaussianMtf = (sigma: number, f: number) => Math.exp(-2 * Math.PI ** 2 * sigma ** 2 * f ** 2);
  const sample = (sigma: number, step: number, fMax: number) => {
    const frequencyCyclesPerMm: number[] = [];
    const value: number[] = [];
    for (let k = 0; k * step <= fMax + 1e-12; k++) {
      frequencyCyclesPerMm.push(k * step);
      value.push(gaussianMtf(sigma, k * step));
    }
    return { frequencyCyclesPerMm, value };
  };

  it("averageMtfCurves(curves) of linear MTFs on different grids is exact (linear interpolation of a line)", () => {
    // MTF(f) = 1 − f/fc on [0, 2]: linear interpolation reproduces a straight line exactly (closed form).
    const a = { frequencyCyclesPerMm: [0, 0.3, 0.9, 1.5, 2.0], value: [0, 0.3, 0.9, 1.5, 2.0].map((f) => 1 - f / 4) };
    const b = { frequencyCyclesPerMm: [0, 0.25, 0.5, 1, 2.5], value: [0, 0.25, 0.5, 1, 2.5].map((f) => 1 - f / 5) };
    const avg = averageMtfCurves([a, b], 0.1);
    expect(avg.frequencyCyclesPerMm.length).toBe(21); // 0, 0.1, …, 2.0 (shared range ends at 2.0)
    avg.frequencyCyclesPerMm.forEach((f, i) => {
      const va = 1 - f / 4;
      const vb = 1 - f / 5;
      expectClose(avg.value[i], (va + vb) / 2, { abs: 1e-12 });
      expectClose(avg.sd![i], mathjsSd([va, vb]), { abs: 1e-12 }); // mathjs std, unbiased
    });
    expect(avg.curveCount).toBe(2);
  });

  it("averageMtfCurves(gaussians) matches the mean of the closed-form MTFs exp(−2π²σ²f²)", () => {
    const curves = [sample(0.30, 0.01, 2), sample(0.32, 0.0125, 2.2), sample(0.35, 0.008, 2.1)];
    const avg = averageMtfCurves(curves, 0.05, 1.5);
    expect(avg.frequencyCyclesPerMm[avg.frequencyCyclesPerMm.length - 1]).toBeCloseTo(1.5, 12);
    avg.frequencyCyclesPerMm.forEach((f, i) => {
      const exact = [0.3, 0.32, 0.35].map((s) => gaussianMtf(s, f));
      // Linear-interpolation error ≤ h²/8·max|MTF''| ≈ 1e-4 for h ≤ 0.0125 cycles/mm (textbook bound).
      expectClose(avg.value[i], mjMean(exact), { abs: 2e-4 });
      expectClose(avg.sd![i], mathjsSd(exact), { abs: 2e-4 });
    });
  });

  it("averageMtfCurves(curves) defaults to the finest median spacing and the shared range", () => {
    const avg = averageMtfCurves([sample(0.3, 0.02, 1), sample(0.3, 0.05, 1.2)]);
    expect(avg.frequencyCyclesPerMm.length).toBe(51); // 0 … 1.0 in steps of 0.02
    expectClose(avg.frequencyCyclesPerMm[50], 1, { abs: 1e-12 });
  });

  it("averageMtfCurves([one]) has SD null and reproduces the curve at its own samples", () => {
    const c = sample(0.25, 0.05, 2);
    const avg = averageMtfCurves([c]);
    expect(avg.sd).toBeNull();
    avg.value.forEach((v, i) => expectClose(v, c.value[i]!, { abs: 1e-12 }));
  });

  it("averageMtfCurves refuses extrapolation, bad grids and malformed curves with QaError", () => {
    const a = sample(0.3, 0.05, 1);
    expect(() => averageMtfCurves([])).toThrow(/at least 1 curve/);
    expect(() => averageMtfCurves([a], 0.05, 1.5)).toThrow(/exceeds the range/);
    expect(() => averageMtfCurves([a], 0)).toThrow(/must be positive/);
    expect(() => averageMtfCurves([a], 1e-5)).toThrow(/more than 4096/);
    expect(() => averageMtfCurves([{ frequencyCyclesPerMm: [0, 0.2, 0.1], value: [1, 0.9, 0.8] }])).toThrow(/increase strictly/);
    expect(() => averageMtfCurves([{ frequencyCyclesPerMm: [0, 0.1], value: [1] }])).toThrow(QaError);
  });
});
