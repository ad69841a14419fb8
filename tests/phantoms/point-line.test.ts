import { describe, expect, it } from "vitest";
import { AnalysisError } from "@/lib/analysis/errors";
import { makeGaussianLine, makeLine } from "@/lib/phantoms/line";
import { makeGaussianPoint } from "@/lib/phantoms/point";
import { expectClose } from "../helpers/expect-close";

describe("makeGaussianPoint(options)", () => {
  it.each([0, 35])("conserves the PSF integral 2πσxσy·A/(px·py) with pixel-area sampling at %s°", (angleDeg) => {
    // Closed form: ∫∫ A·exp(−½dᵀΣ⁻¹d) = 2πσ₁σ₂A; pixel averages sum to that divided by the pixel area.
    const { image } = makeGaussianPoint({
      width: 64, height: 64, pixelSpacingMm: { x: 0.5, y: 0.4 }, sigmaXMm: 1.5, sigmaYMm: 0.9, angleDeg,
      centreXPx: 31.3, centreYPx: 32.6, amplitude: 200, background: 0,
    });
    const sum = image.data.reduce((s, v) => s + v, 0);
    expectClose(sum, (2 * Math.PI * 1.5 * 0.9 * 200) / (0.5 * 0.4), { rel: 1e-9 });
  });

  it("gives the exact pixel mean A·(2πσ²/p²)·P² at the centre pixel and the peak with point sampling", () => {
    // Pixel-aperture average of a separable Gaussian = product of erf differences (A&S 7.1; erf(0.5/(σ√2)) here
    // from the normal table: P(|z| < 0.5) = 0.3829249).
    const options = { width: 9, height: 9, pixelSpacingMm: 1, sigmaXMm: 1, centreXPx: 4, centreYPx: 4, amplitude: 10, background: 3 };
    const area = makeGaussianPoint(options);
    expectClose(area.image.data[4 * 9 + 4], 3 + 10 * 2 * Math.PI * 0.3829249225480262 ** 2, { rel: 1e-9 });
    const point = makeGaussianPoint({ ...options, sampling: "point" });
    expect(point.image.data[4 * 9 + 4]).toBe(13);
    expectClose(point.image.data[4 * 9 + 5], 3 + 10 * Math.exp(-0.5), { rel: 1e-12 });
    expectClose(area.truth.fwhmXMm, 2.354820045, { rel: 1e-9 }); // 2√(2 ln 2)σ
    expectClose(area.truth.fwtmXMm, 4.291932053, { rel: 1e-9 }); // 2√(2 ln 10)σ
  });

  it("adds reproducible seeded noise of the requested SD", () => {
    // Sample SD of N(0, 4²) noise over 4096 pixels is within ≈ 3% of 4 (sampling error 1/√(2n) ≈ 1.1%).
    const options = { width: 64, height: 64, pixelSpacingMm: 1, sigmaXMm: 1, centreXPx: 0, centreYPx: 0, amplitude: 0, background: 50, noiseSd: 4, seed: 17 };
    const a = makeGaussianPoint(options).image.data;
    expect(makeGaussianPoint(options).image.data).toEqual(a);
    expect(makeGaussianPoint({ ...options, seed: 18 }).image.data).not.toEqual(a);
    const mean = a.reduce((s, v) => s + v, 0) / a.length;
    const sd = Math.sqrt(a.reduce((s, v) => s + (v - mean) ** 2, 0) / (a.length - 1));
    expectClose(sd, 4, { rel: 0.03 });
    expect(() => makeGaussianPoint({ ...options, sigmaXMm: 0 })).toThrow(AnalysisError);
  });
});

describe("makeLine(options) and makeGaussianLine(options)", () => {
  it("puts σ√(2π)·A/(px·cos θ) into every row of a tilted Gaussian line", () => {
    // Closed form: along a row, ∫A·exp(−(x cos θ)²/2σ²)dx = A·σ√(2π)/cos θ; pixel means sum to that / px.
    const angleDeg = 4;
    const { image } = makeGaussianLine({ width: 96, height: 64, pixelSpacingMm: 0.5, sigmaMm: 1, angleDeg, amplitude: 100, background: 0 });
    const expected = (100 * Math.sqrt(2 * Math.PI)) / (0.5 * Math.cos((angleDeg * Math.PI) / 180));
    for (const row of [0, 20, 63]) {
      let sum = 0;
      for (let x = 0; x < 96; x++) sum += image.data[row * 96 + x]!;
      expectClose(sum, expected, { rel: 1e-7 });
    }
  });

  it("integrates a Lorentzian over each pixel with the arctan antiderivative", () => {
    // ∫ γ²/(n² + γ²) dn = γ·atan(n/γ): pixel mean = (γ/p)·[atan((x + p/2)/γ) − atan((x − p/2)/γ)].
    const gamma = 0.7;
    const { image, truth } = makeLine({
      width: 33, height: 4, pixelSpacingMm: 0.5, angleDeg: 0, centreXPx: 16, profile: { kind: "lorentzian", gammaMm: gamma }, amplitude: 1, background: 0,
    });
    for (const x of [16, 17, 20, 30]) {
      const d = (x - 16) * 0.5;
      expectClose(image.data[2 * 33 + x], (gamma / 0.5) * (Math.atan((d + 0.25) / gamma) - Math.atan((d - 0.25) / gamma)), { rel: 1e-12 });
    }
    expect(truth.fwhmMm).toBe(2 * gamma); // FWHM = 2γ
    expect(truth.fwtmMm).toBe(6 * gamma); // FWTM = 6γ
  });

  it("gives a near-horizontal line (θ near 90°) the same profile along columns", () => {
    // Geometry: rotating the line by 90° swaps the roles of x and y (symmetry of the definition).
    const vertical = makeGaussianLine({ width: 32, height: 32, pixelSpacingMm: 1, sigmaMm: 1.2, angleDeg: 0, amplitude: 1, background: 0 });
    const horizontal = makeGaussianLine({ width: 32, height: 32, pixelSpacingMm: 1, sigmaMm: 1.2, angleDeg: 90, amplitude: 1, background: 0 });
    for (let i = 0; i < 32; i++) expectClose(horizontal.image.data[i * 32 + 5], vertical.image.data[5 * 32 + i]!, { abs: 1e-12 });
  });
});
