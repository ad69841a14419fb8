import { describe, expect, it } from "vitest";
import { AnalysisError } from "@/lib/analysis/errors";
import { frequencyAtLevel } from "@/lib/analysis/mtf-metrics";
import { analyseSlantedEdge } from "@/lib/analysis/slanted-edge";
import type { AnalysisResult, GrayImage } from "@/lib/analysis/types";
import { makeSlantedEdge, slantedEdgeMtf, type SlantedEdgeOptions, type SlantedEdgeTruth } from "@/lib/phantoms/edge";
import { expectClose } from "../helpers/expect-close";

// Method under test: presampled MTF by the slanted-edge method, IEC 62220-1-1 / Buhr, Günther-Kohfahl & Neitzel,
// Med Phys 2003 (doi 10.1118/1.1598673), with the ISO 12233 e-SFR steps. Truth for a Gaussian-blurred edge seen
// through a square pixel tilted by α: e^(−2π²σ²f²)·|sinc(p cos α f)·sinc(p sin α f)| (Gaussian ↔ Gaussian, rect → sinc;
// pixel aperture projected on the edge normal).

const P = 0.1; // mm
const base: SlantedEdgeOptions = { width: 256, height: 256, pixelSpacingMm: P, angleDeg: 5, sigmaMm: 0.1, low: 100, high: 1100 };

function edge(overrides: Partial<SlantedEdgeOptions> = {}) {
  return makeSlantedEdge({ ...base, ...overrides });
}

/** Largest |measured − truth| of the MTF for f ≤ fMax. */
function maxMtfError(result: AnalysisResult, truth: SlantedEdgeTruth, fMax = result.nyquist): number {
  let worst = 0;
  result.mtf.frequencyCyclesPerMm.forEach((f, k) => {
    if (f <= fMax + 1e-9) worst = Math.max(worst, Math.abs(result.mtf.value[k]! - slantedEdgeMtf(truth, f)));
  });
  return worst;
}

/** MTF50 of the truth by bisection on the closed form. */
function truthMtf50(truth: SlantedEdgeTruth): number {
  let lo = 0;
  let hi = 1 / P;
  for (let i = 0; i < 100; i++) {
    const mid = 0.5 * (lo + hi);
    if (slantedEdgeMtf(truth, mid) > 0.5) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

function maxCurveDifference(a: AnalysisResult, b: AnalysisResult, fMax: number): number {
  let worst = 0;
  a.mtf.frequencyCyclesPerMm.forEach((f, k) => {
    if (f <= fMax) worst = Math.max(worst, Math.abs(a.mtf.value[k]! - b.mtf.value[k]!));
  });
  return worst;
}

describe("analyseSlantedEdge(image) against closed forms", () => {
  for (const sigmaPx of [0.5, 1, 1.5]) {
    it(`a Gaussian-blurred 5° edge (σ = ${sigmaPx} px) matches e^(−2π²σ²f²)·|sinc(af)sinc(bf)| within 0.02 up to Nyquist, MTF50 within 2 %`, () => {
      const { image, truth } = edge({ sigmaMm: sigmaPx * P, edgeOffsetPx: 0.3 });
      const result = analyseSlantedEdge(image);
      expect(result.method).toBe("edge");
      expectClose(result.nyquist, 1 / (2 * P), { rel: 1e-12 }); // Nyquist 1/(2p), domain notes §6
      expect(maxMtfError(result, truth)).toBeLessThan(0.02);
      expectClose(result.mtf50, truthMtf50(truth), { rel: 0.02 });
      expect(result.mtf.frequencyCyclesPerMm.at(-1)).toBeGreaterThanOrEqual(2 * result.nyquist - 1 / (result.details.fftLength as number * 0.025));
    });
  }

  it("an ideal (unblurred) edge gives the square-pixel aperture: MTF(Nyquist) = 2/π within 0.01", () => {
    // |sinc(p f)| at f = 1/(2p) is 2/π = 0.6366 (domain notes §6, uniform aperture); the 3° tilt changes it by < 0.001.
    const { image, truth } = edge({ sigmaMm: 0, angleDeg: 3 });
    const result = analyseSlantedEdge(image);
    expectClose(result.mtfAtNyquist, 2 / Math.PI, { abs: 0.01 });
    expect(maxMtfError(result, truth, 2 * result.nyquist)).toBeLessThan(0.01);
  });

  it("MTF(0) is exactly 1 and the frequency axis starts at 0 in cycles/mm", () => {
    // Normalisation at zero frequency (IEC 62220-1-1; common practice).
    const result = analyseSlantedEdge(edge().image);
    expect(result.mtf.frequencyCyclesPerMm[0]).toBe(0);
    expect(result.mtf.value[0]).toBe(1);
  });

  for (const sigmaPx of [1.5, 3]) {
    it(`FWHM/FWTM of the LSF (σ = ${sigmaPx} px, noiseless) are within 1 % of the presampled LSF's`, () => {
      // Truth: FWHM/FWTM of Gaussian ∗ projected pixel aperture, from the closed-form LSF (phantom truth). The LSF
      // width is measured NEMA-style (parabolic peak, linear interpolation at 50 % / 10 %; NEMA NU 2).
      const { image, truth } = edge({ sigmaMm: sigmaPx * P, angleDeg: 4 });
      const result = analyseSlantedEdge(image);
      expectClose(result.fwhmMm, truth.lsfFwhmMm, { rel: 0.01 });
      expectClose(result.fwtmMm, truth.lsfFwtmMm, { rel: 0.01 });
      // FWHM of a Gaussian is 2.3548σ (domain notes §6); the aperture adds about p²/12 of variance.
      expectClose(result.fwhmMm, Math.sqrt(truth.gaussianFwhmMm ** 2 + 0.4621 * P * P), { rel: 0.015 });
    });
  }

  it("with noise (contrast-to-noise 200, seeds 1–4) the MTF stays within 0.02 up to Nyquist, MTF50 within 2 %, FWHM within 3 %", () => {
    // Same closed-form truth; noise seeded for reproducibility.
    for (const seed of [1, 2, 3, 4]) {
      const { image, truth } = edge({ sigmaMm: 0.15, angleDeg: 4, noiseSd: 5, seed, edgeOffsetPx: 0.2 * seed });
      const result = analyseSlantedEdge(image);
      expect(maxMtfError(result, truth)).toBeLessThan(0.02);
      expectClose(result.mtf50, truthMtf50(truth), { rel: 0.02 });
      expectClose(result.fwhmMm, truth.lsfFwhmMm, { rel: 0.03 });
      expect(result.warnings.map((w) => w.code)).not.toContain("low_snr");
    }
  });
});

describe("analyseSlantedEdge(image) invariants", () => {
  it("edge angles 2°–8° are measured within 0.01° and give MTF50 within 1 % of each other and 2 % of the truth", () => {
    // Angle: the phantom's geometry; agreement across angles is the method's premise (Buhr et al. 2003).
    const mtf50s: number[] = [];
    for (const angleDeg of [2, 3, 5, 8]) {
      const { image, truth } = edge({ angleDeg, sigmaMm: 0.12 });
      const result = analyseSlantedEdge(image);
      expectClose(result.edgeAngleDeg, angleDeg, { abs: 0.01 });
      expectClose(result.details.signedEdgeAngleDeg as number, angleDeg, { abs: 0.01 });
      expectClose(result.mtf50, truthMtf50(truth), { rel: 0.02 });
      mtf50s.push(result.mtf50!);
    }
    const mean = mtf50s.reduce((s, v) => s + v, 0) / mtf50s.length;
    for (const v of mtf50s) expectClose(v, mean, { rel: 0.01 });
  });

  it("vertical and horizontal edges, dark→bright and bright→dark, negative and positive tilts give the same MTF", () => {
    // Symmetry of the method (common practice); the truth is the same closed form for all eight.
    const reference = analyseSlantedEdge(edge({ sigmaMm: 0.08, angleDeg: 4 }).image);
    for (const orientation of ["vertical", "horizontal"] as const) {
      for (const [low, high] of [[100, 1100], [1100, 100]] as const) {
        for (const angleDeg of [-4, 4]) {
          const { image, truth } = edge({ sigmaMm: 0.08, angleDeg, orientation, low, high, edgeOffsetPx: -3.4 });
          const result = analyseSlantedEdge(image);
          expect(result.details.orientation).toBe(orientation);
          expect(result.details.polarity).toBe(low < high ? "dark-to-bright" : "bright-to-dark");
          expectClose(result.details.signedEdgeAngleDeg as number, angleDeg, { abs: 0.01 });
          expectClose(result.details.edgeOffsetPx as number, -3.4, { abs: 0.02 });
          expect(maxMtfError(result, truth)).toBeLessThan(0.01);
          expect(maxCurveDifference(result, reference, result.nyquist)).toBeLessThan(0.005);
        }
      }
    }
  });

  it("is linear: scaling and offsetting the image leaves the MTF unchanged", () => {
    // The MTF is normalised at f = 0, so an affine change of the pixel values cancels (definition).
    const { image } = edge({ sigmaMm: 0.1, noiseSd: 3, seed: 9 });
    const scaled: GrayImage = { ...image, data: image.data.map((v) => 3.7 * v - 250) };
    const a = analyseSlantedEdge(image);
    const b = analyseSlantedEdge(scaled);
    expect(maxCurveDifference(a, b, 2 * a.nyquist)).toBeLessThan(1e-9);
    expectClose(b.details.contrast as number, 3.7 * (a.details.contrast as number), { rel: 1e-9 });
  });

  it("is shift invariant: sub-pixel edge offsets of 0, ¼, ½ and ¾ px give the same MTF within 0.003", () => {
    // Shift theorem: |FFT| does not depend on the edge position (closed form).
    const results = [0, 0.25, 0.5, 0.75].map((edgeOffsetPx) => analyseSlantedEdge(edge({ sigmaMm: 0.07, angleDeg: 3, edgeOffsetPx }).image));
    for (const r of results.slice(1)) expect(maxCurveDifference(r, results[0]!, 2 * r.nyquist)).toBeLessThan(0.003);
    results.forEach((r, i) => expectClose(r.details.edgeOffsetPx as number, 0.25 * i, { abs: 0.01 }));
  });

  it("uses the pixel pitch across the edge for Nyquist and the bins with non-square pixels", () => {
    // Nyquist 1/(2p) along the normal (domain notes §6); truth with apertures p_x cos α and p_y sin α.
    for (const orientation of ["vertical", "horizontal"] as const) {
      const { image, truth } = edge({ pixelSpacingMm: { x: 0.1, y: 0.14 }, orientation, sigmaMm: 0.1, angleDeg: 4 });
      const result = analyseSlantedEdge(image);
      const across = orientation === "vertical" ? 0.1 : 0.14;
      expectClose(result.nyquist, 1 / (2 * across), { rel: 1e-12 });
      expectClose(result.edgeAngleDeg, 4, { abs: 0.01 });
      expect(maxMtfError(result, truth)).toBeLessThan(0.01);
    }
  });

  it("repeats exactly for the same seed and its noise estimate matches the spread over seeds", () => {
    // mtfNoiseSd is a white-noise propagation derived in edge-spread.ts; here it is checked against the empirical SD
    // of MTF(Nyquist) over 12 seeds (agreement within a factor 1.6 either way; common practice for such estimates).
    const first = analyseSlantedEdge(edge({ noiseSd: 20, seed: 1, sigmaMm: 0.05 }).image);
    const again = analyseSlantedEdge(edge({ noiseSd: 20, seed: 1, sigmaMm: 0.05 }).image);
    expect(again.mtf.value).toEqual(first.mtf.value);
    const atNyquist: number[] = [];
    for (let seed = 1; seed <= 12; seed++) atNyquist.push(analyseSlantedEdge(edge({ noiseSd: 20, seed, sigmaMm: 0.05 }).image).mtfAtNyquist!);
    const mean = atNyquist.reduce((s, v) => s + v, 0) / atNyquist.length;
    const sd = Math.sqrt(atNyquist.reduce((s, v) => s + (v - mean) ** 2, 0) / (atNyquist.length - 1));
    const predicted = first.details.mtfNoiseAtNyquist as number;
    expect(sd).toBeGreaterThan(predicted / 1.6);
    expect(sd).toBeLessThan(predicted * 1.6);
    expect(first.warnings.map((w) => w.code)).toContain("low_snr"); // CNR 50: predicted noise > 0.02
  });

  it("analyses only the given ROI and reports the region it used inside it", () => {
    const { image, truth } = edge({ width: 400, height: 300, sigmaMm: 0.1, angleDeg: 6 });
    const roi = { x: 120, y: 40, width: 160, height: 200 };
    const result = analyseSlantedEdge(image, { roi });
    expect(result.roi.x).toBeGreaterThanOrEqual(roi.x);
    expect(result.roi.y).toBeGreaterThanOrEqual(roi.y);
    expect(result.roi.x + result.roi.width).toBeLessThanOrEqual(roi.x + roi.width);
    expect(result.roi.y + result.roi.height).toBeLessThanOrEqual(roi.y + roi.height);
    expect(maxMtfError(result, truth)).toBeLessThan(0.02);
  });
});

describe("analyseSlantedEdge(image) limits", () => {
  it("rejects an edge at 0° with an AnalysisError that states the measured angle", () => {
    const { image } = edge({ angleDeg: 0 });
    expect(() => analyseSlantedEdge(image)).toThrow(AnalysisError);
    expect(() => analyseSlantedEdge(image)).toThrow(/edge angle 0\.00° .* below 1°/);
  });

  it("rejects an edge at 45° with an AnalysisError that states the measured angle", () => {
    const { image } = edge({ angleDeg: 45 });
    expect(() => analyseSlantedEdge(image)).toThrow(/edge angle 45\.00° .* exceeds 20°/);
  });

  it("warns (edge_angle) at 15°, outside the 2°–10° comfort range, and still measures the MTF", () => {
    const { image, truth } = edge({ angleDeg: 15, sigmaMm: 0.1 });
    const result = analyseSlantedEdge(image);
    expect(result.warnings.map((w) => w.code)).toContain("edge_angle");
    expect(maxMtfError(result, truth)).toBeLessThan(0.02);
  });

  it("rejects a uniform image and a pure-noise image (no edge)", () => {
    const uniform: GrayImage = { data: new Float64Array(128 * 128).fill(7), width: 128, height: 128, pixelSpacingMm: { x: 0.1, y: 0.1 } };
    expect(() => analyseSlantedEdge(uniform)).toThrow(/no edge found/);
    const noise = edge({ low: 100, high: 100, noiseSd: 10, seed: 4 }).image;
    expect(() => analyseSlantedEdge(noise)).toThrow(/no edge found/);
  });

  it("rejects an ROI that is too narrow across the edge", () => {
    const { image } = edge();
    expect(() => analyseSlantedEdge(image, { roi: { x: 110, y: 0, width: 20, height: 200 } })).toThrow(/at least 32 px across the edge, got 20/);
  });

  it("warns roi_at_image_border when the analysed range reaches the image side", () => {
    const { image } = edge({ width: 160, edgeOffsetPx: -30 });
    const result = analyseSlantedEdge(image);
    expect(result.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(["roi_at_image_border", "esf_range"]));
  });
});

describe("slanted-edge MTF summaries", () => {
  it("MTF50 and MTF10 agree with frequencyAtLevel on the truth curve", () => {
    // frequencyAtLevel is linear interpolation (mtf-metrics.ts); truth tabulated from the closed form.
    const { image, truth } = edge({ sigmaMm: 0.2, angleDeg: 4 });
    const result = analyseSlantedEdge(image);
    expectClose(result.mtf50, frequencyAtLevel(truth.mtf, 0.5)!, { rel: 0.02 });
    expectClose(result.mtf10, frequencyAtLevel(truth.mtf, 0.1)!, { rel: 0.02 });
    // Gaussian: f50 = 0.187391/σ when the aperture is negligible (domain notes §6); here the aperture lowers it a little.
    expect(result.mtf50!).toBeLessThan(0.187391 / 0.2);
  });
});
