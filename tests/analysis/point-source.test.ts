import { describe, expect, it } from "vitest";
import { AnalysisError } from "@/lib/analysis/errors";
import { analysePointSource } from "@/lib/analysis/point-source";
import type { GaussianFit2d, GrayImage } from "@/lib/analysis/types";
import { makeGaussianPoint, type GaussianPointOptions } from "@/lib/phantoms/point";
import { bisect } from "../helpers/bisect";
import { expectClose } from "../helpers/expect-close";

const FWHM_PER_SIGMA = 2 * Math.sqrt(2 * Math.LN2);
const sinc = (x: number): number => (x === 0 ? 1 : Math.sin(Math.PI * x) / (Math.PI * x));

/**
 * FWHM (or FWTM with factor 8 ln 10) of a Gaussian widened by a square aperture a: the aperture adds variance a²/12,
 * so width² + (8 ln k)·a²/12 — for the FWHM √(FWHM² + 0.4621a²) (domain notes §6; uniform distribution variance).
 */
function presampledWidth(width: number, a: number, level: "half" | "tenth"): number {
  const k = level === "half" ? 8 * Math.LN2 : 8 * Math.LN10;
  return Math.sqrt(width * width + (k * a * a) / 12);
}

/** Presampled MTF of a Gaussian PSF on square pixels: exp(−2π²σ²f²)·|sinc(p·u)·sinc(p·v)| (domain notes §6). */
function presampledMtf(u: number, v: number, sigmaMm: number, pixelMm: number): number {
  return Math.exp(-2 * Math.PI ** 2 * sigmaMm ** 2 * (u * u + v * v)) * Math.abs(sinc(pixelMm * u) * sinc(pixelMm * v));
}

/** Angular mean of the presampled MTF at radius f (720-point trapezoid rule over the circle, spectrally accurate). */
function radialPresampledMtf(f: number, sigmaMm: number, pixelMm: number): number {
  let sum = 0;
  for (let k = 0; k < 720; k++) {
    const t = (2 * Math.PI * k) / 720;
    sum += presampledMtf(f * Math.cos(t), f * Math.sin(t), sigmaMm, pixelMm);
  }
  return sum / 720;
}

const BASE: GaussianPointOptions = {
  width: 128, height: 128, pixelSpacingMm: 0.5, sigmaXMm: (5 * 0.5) / FWHM_PER_SIGMA,
  centreXPx: 60.3, centreYPx: 70.7, amplitude: 1000, background: 100,
};

describe("analysePointSource(image)", () => {
  it("measures FWHM within 1% and FWTM within 2% of the presampled Gaussian (5 px per FWHM, noiseless)", () => {
    // Expected: Gaussian FWHM = 2√(2 ln 2)σ, FWTM = 2√(2 ln 10)σ (closed forms), widened by the pixel aperture
    // (variance a²/12): FWHM_meas ≈ √(FWHM² + 0.4621a²) (domain notes §6). The NEMA interpolation adds ≈ +0.6%
    // at 5 px and more at 10% level, hence 2% for the FWTM.
    const { image, truth } = makeGaussianPoint(BASE);
    const result = analysePointSource(image);
    expect(result.method).toBe("point");
    const fwhm = presampledWidth(truth.fwhmXMm, 0.5, "half");
    const fwtm = presampledWidth(truth.fwtmXMm, 0.5, "tenth");
    expectClose(result.fwhmXMm, fwhm, { rel: 0.01 });
    expectClose(result.fwhmYMm, fwhm, { rel: 0.01 });
    expectClose(result.fwhmMm, fwhm, { rel: 0.01 });
    expectClose(result.fwtmMm, fwtm, { rel: 0.02 });
    // FWTM/FWHM = √(ln 10/ln 2) = 1.8226 for a Gaussian (domain notes §6).
    expectClose(result.fwtmMm! / result.fwhmMm!, 1.822616, { rel: 0.02 });
    expect(result.warnings).toEqual([]);
    expectClose(result.details.centreXPx as number, 60.3, { abs: 0.05 });
    expectClose(result.details.centreYPx as number, 70.7, { abs: 0.05 });
  });

  it("gives MTF cuts and radial MTF within 0.02 of exp(−2π²σ²f²)·|sinc(pf)| up to Nyquist and MTF50 within 2%", () => {
    // Gaussian MTF exp(−2π²σ²f²) times the square-aperture MTF |sinc(p·u)·sinc(p·v)| = presampled MTF
    // (domain notes §6). The radial curve is compared with the angular mean of that 2-D function.
    const { image } = makeGaussianPoint(BASE);
    const result = analysePointSource(image);
    const sigma = BASE.sigmaXMm;
    expectClose(result.nyquist, 1, { rel: 1e-12 }); // 1/(2·0.5 mm)
    for (const curve of [result.mtfCurves!.x!, result.mtfCurves!.y!]) {
      expect(curve.value[0]).toBe(1); // MTF(0) = 1
      curve.frequencyCyclesPerMm.forEach((f, i) => {
        if (f <= result.nyquist) expectClose(curve.value[i], presampledMtf(f, 0, sigma, 0.5), { abs: 0.02 });
      });
    }
    expect(result.mtf.value[0]).toBe(1);
    result.mtf.frequencyCyclesPerMm.forEach((f, i) => {
      expectClose(result.mtf.value[i], radialPresampledMtf(f, sigma, 0.5), { abs: 0.02 });
    });
    const expectedMtf50 = bisect((f) => radialPresampledMtf(f, sigma, 0.5), 0.5, 0, 1);
    const expectedMtf10 = bisect((f) => radialPresampledMtf(f, sigma, 0.5), 0.1, 0, 1);
    expectClose(result.mtf50, expectedMtf50, { rel: 0.02 });
    expectClose(result.mtf10, expectedMtf10, { rel: 0.02 });
    expectClose(result.mtfAtNyquist, radialPresampledMtf(1, sigma, 0.5), { abs: 0.02 });
  });

  it("measures x and y separately for an elliptical PSF on non-square pixels", () => {
    // Closed forms per axis as above, with a_x = 0.4 mm and a_y = 0.6 mm; Nyquist = 1/(2·max(px, py)).
    const { image, truth } = makeGaussianPoint({
      ...BASE, pixelSpacingMm: { x: 0.4, y: 0.6 }, sigmaXMm: 1.0, sigmaYMm: 1.6, centreXPx: 64.2, centreYPx: 61.9,
    });
    const result = analysePointSource(image);
    expectClose(result.fwhmXMm, presampledWidth(truth.fwhmXMm, 0.4, "half"), { rel: 0.01 });
    expectClose(result.fwhmYMm, presampledWidth(truth.fwhmYMm, 0.6, "half"), { rel: 0.01 });
    expectClose(result.nyquist, 1 / 1.2, { rel: 1e-12 });
    const cutY = result.mtfCurves!.y!;
    cutY.frequencyCyclesPerMm.forEach((f, i) => expectClose(cutY.value[i], presampledMtf(0, f, 1.6, 0.6), { abs: 0.02 }));
  });

  it("reports a 2-D Gaussian fit of the presampled PSF in details.gaussianFit", () => {
    // Presampled σ² = σ² + a²/12 (uniform aperture variance, domain notes §6), within 1% (box ∗ Gaussian is not
    // exactly Gaussian).
    const { image } = makeGaussianPoint(BASE);
    const fit = analysePointSource(image).details.gaussianFit as GaussianFit2d;
    const expected = Math.sqrt(BASE.sigmaXMm ** 2 + 0.25 / 12);
    expectClose(fit.sigmaMajorMm, expected, { rel: 0.01 });
    expectClose(fit.sigmaMinorMm, expected, { rel: 0.01 });
    expectClose(fit.centreXPx, 60.3, { abs: 0.01 });
    expectClose(fit.background, 100, { abs: 0.5 });
  });

  it("turns a single-pixel impulse into a flat MTF of 1 and a 1-pixel FWHM", () => {
    // Impulse → flat spectrum (Bracewell); NEMA widths of [0, 1, 0]: the parabola peaks at 1, the half-level
    // crossings lie at ±½ sample, so FWHM = 1 px (hand-worked).
    const data = new Float64Array(64 * 64).fill(10);
    data[30 * 64 + 33] = 510;
    const result = analysePointSource({ data, width: 64, height: 64, pixelSpacingMm: { x: 0.2, y: 0.2 } });
    for (const m of result.mtf.value) expectClose(m, 1, { abs: 1e-9 });
    for (const m of result.mtfCurves!.x!.value) expectClose(m, 1, { abs: 1e-9 });
    expectClose(result.fwhmXMm, 0.2, { rel: 1e-9 });
    expect(result.warnings.map((w) => w.code)).toContain("undersampled");
  });

  it("is linear: scaling the image scales the fitted amplitude and leaves FWHM and MTF unchanged", () => {
    // Linearity invariant (common practice): k·image − k·background has the same normalised profiles and MTF.
    const { image } = makeGaussianPoint(BASE);
    const scaled: GrayImage = { ...image, data: image.data.map((v) => 7 * v) };
    const a = analysePointSource(image);
    const b = analysePointSource(scaled);
    expectClose(b.fwhmMm, a.fwhmMm!, { rel: 1e-9 });
    expectClose(b.fwtmMm, a.fwtmMm!, { rel: 1e-9 });
    expectClose(b.mtf50, a.mtf50!, { rel: 1e-9 });
    expectClose((b.details.gaussianFit as GaussianFit2d).amplitude, 7 * (a.details.gaussianFit as GaussianFit2d).amplitude, { rel: 1e-6 });
  });

  it("changes FWHM by less than 1% under sub-pixel shifts of the source", () => {
    // Shift invariance: the measured width should not depend on the sampling phase beyond the NEMA bias spread
    // (≤ 0.2% at 5 px per FWHM; domain notes §6) — accuracy target 1%.
    const widths = [0, 0.25, 0.5, 0.75].map((shift) =>
      analysePointSource(makeGaussianPoint({ ...BASE, centreXPx: 60 + shift, centreYPx: 70 + shift / 2 }).image).fwhmMm!,
    );
    const spread = (Math.max(...widths) - Math.min(...widths)) / Math.min(...widths);
    expect(spread).toBeLessThan(0.01);
  });

  it("stays within 3% of the presampled FWHM under seeded Poisson noise", () => {
    // Poisson counts: peak 5000 on a background of 50 (peak/background noise ≈ 700); expected width as in the
    // noiseless case (closed form + aperture variance). Accuracy target 3%.
    const expected = presampledWidth(5 * 0.5, 0.5, "half");
    for (let seed = 1; seed <= 8; seed++) {
      const { image } = makeGaussianPoint({ ...BASE, amplitude: 5000, background: 50, poisson: true, seed });
      const result = analysePointSource(image);
      expectClose(result.fwhmMm, expected, { rel: 0.03 });
      expectClose((result.details.gaussianFit as GaussianFit2d).fwhmMajorMm, expected, { rel: 0.03 });
      expect(result.warnings).toEqual([]);
    }
  });

  it("warns roi_at_image_border near the edge and low_snr for a faint source", () => {
    // Warning thresholds are the documented settings (common practice): ROI ±max(16 px, 4 FWHM); low_snr below 20.
    const edge = analysePointSource(makeGaussianPoint({ ...BASE, centreXPx: 6.3, centreYPx: 64 }).image);
    expect(edge.warnings.map((w) => w.code)).toContain("roi_at_image_border");
    expect(edge.roi.x).toBe(0);
    const faint = analysePointSource(makeGaussianPoint({ ...BASE, amplitude: 60, noiseSd: 5, seed: 2 }).image);
    expect(faint.warnings.map((w) => w.code)).toContain("low_snr");
  });

  it("throws AnalysisError with code no_source when nothing stands out from the noise", () => {
    // Detection rule: peak must exceed 5 noise SDs above the background (documented setting).
    const { image } = makeGaussianPoint({ ...BASE, amplitude: 0, noiseSd: 5, seed: 4 });
    expect(() => analysePointSource(image)).toThrow(AnalysisError);
    try {
      analysePointSource(image);
    } catch (error) {
      expect((error as AnalysisError).code).toBe("no_source");
      expect((error as AnalysisError).message).toMatch(/noise SDs above the background/);
    }
  });

  it("analyses the source inside options.roi, not the brightest one in the frame", () => {
    // Two sources of different brightness; the ROI picks the fainter one (behaviour of options.roi).
    const bright = makeGaussianPoint({ ...BASE, centreXPx: 30, centreYPx: 30 });
    const faint = makeGaussianPoint({ ...BASE, centreXPx: 95.4, centreYPx: 90.2, amplitude: 300, background: 0 });
    const data = bright.image.data.map((v, i) => v + faint.image.data[i]!);
    const result = analysePointSource({ ...bright.image, data }, { roi: { x: 64, y: 60, width: 64, height: 64 } });
    expectClose(result.details.centreXPx as number, 95.4, { abs: 0.05 });
    expect(result.roi.x).toBeGreaterThanOrEqual(64);
    expectClose(result.fwhmMm, presampledWidth(2.5, 0.5, "half"), { rel: 0.01 });
  });
});
