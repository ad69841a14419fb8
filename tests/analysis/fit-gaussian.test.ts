import { describe, expect, it } from "vitest";
import { AnalysisError } from "@/lib/analysis/errors";
import { fitGaussian1d, fitGaussian2d } from "@/lib/analysis/fit-gaussian";
import { makeGaussianPoint } from "@/lib/phantoms/point";
import { createRandom } from "@/lib/phantoms/random";
import { expectClose } from "../helpers/expect-close";

/** Smallest angular difference between two axis orientations (180°-periodic), degrees. */
function axisAngleDifference(a: number, b: number): number {
  const d = (((a - b) % 180) + 180) % 180;
  return Math.min(d, 180 - d);
}

describe("fitGaussian2d(image, window, initial)", () => {
  it.each([
    { angleDeg: 30, spacing: { x: 0.4, y: 0.5 } },
    { angleDeg: -60, spacing: { x: 0.4, y: 0.5 } },
    { angleDeg: 85, spacing: { x: 0.3, y: 0.3 } },
  ])("recovers σ major/minor, angle and centre of a rotated anisotropic Gaussian at $angleDeg°", ({ angleDeg, spacing }) => {
    // Model identity: the phantom is point-sampled from the same Gaussian family (closed form), so the least-squares
    // optimum is the generating parameters; FWHM = 2√(2 ln 2)σ (closed form).
    const { image } = makeGaussianPoint({
      width: 56, height: 48, pixelSpacingMm: spacing, sigmaXMm: 2, sigmaYMm: 1, angleDeg,
      centreXPx: 27.6, centreYPx: 24.2, amplitude: 500, background: 20, sampling: "point",
    });
    const fit = fitGaussian2d(image, { x: 6, y: 6, width: 44, height: 36 }, {
      centreXPx: 28, centreYPx: 24, sigmaMm: 1.5, amplitude: 400, background: 0,
    });
    expectClose(fit.sigmaMajorMm, 2, { rel: 1e-6 });
    expectClose(fit.sigmaMinorMm, 1, { rel: 1e-6 });
    expect(axisAngleDifference(fit.angleDeg, angleDeg)).toBeLessThan(1e-4);
    expect(fit.angleDeg).toBeGreaterThan(-90);
    expect(fit.angleDeg).toBeLessThanOrEqual(90);
    expectClose(fit.centreXPx, 27.6, { abs: 1e-6 });
    expectClose(fit.centreYPx, 24.2, { abs: 1e-6 });
    expectClose(fit.amplitude, 500, { rel: 1e-6 });
    expectClose(fit.background, 20, { abs: 1e-5 });
    expectClose(fit.fwhmMajorMm, 2 * 2.35482, { rel: 1e-5 });
    expect(fit.relativeRmsResidual).toBeLessThan(1e-8);
  });

  it("recovers the parameters within noise from a seeded noisy image", () => {
    // Same closed-form model with additive N(0, 10²) noise (peak/noise 50); tolerances common practice.
    const { image } = makeGaussianPoint({
      width: 48, height: 48, pixelSpacingMm: 0.5, sigmaXMm: 1.6, sigmaYMm: 1.1, angleDeg: 40,
      centreXPx: 23.3, centreYPx: 24.8, amplitude: 500, background: 100, sampling: "point", noiseSd: 10, seed: 11,
    });
    const fit = fitGaussian2d(image, { x: 10, y: 10, width: 28, height: 28 }, {
      centreXPx: 23, centreYPx: 25, sigmaMm: 1.3, amplitude: 450, background: 100,
    });
    expectClose(fit.sigmaMajorMm, 1.6, { rel: 0.02 });
    expectClose(fit.sigmaMinorMm, 1.1, { rel: 0.02 });
    expect(axisAngleDifference(fit.angleDeg, 40)).toBeLessThan(2);
    expectClose(fit.centreXPx, 23.3, { abs: 0.05 });
    expectClose(fit.relativeRmsResidual, 10 / 500, { rel: 0.15 }); // residual ≈ noise SD / amplitude
  });

  it("measures σ² + a²/12 on a pixel-integrated Gaussian (presampled PSF)", () => {
    // A square aperture of width a adds variance a²/12 (uniform distribution; domain notes §6). The sum of a Gaussian
    // and a box is not exactly Gaussian, hence the 0.5% tolerance.
    const a = 0.8;
    const { image } = makeGaussianPoint({
      width: 40, height: 40, pixelSpacingMm: a, sigmaXMm: 1.2, centreXPx: 19.7, centreYPx: 20.1, amplitude: 100, background: 0,
    });
    const fit = fitGaussian2d(image, { x: 8, y: 8, width: 24, height: 24 }, {
      centreXPx: 20, centreYPx: 20, sigmaMm: 1, amplitude: 90, background: 0,
    });
    const expected = Math.sqrt(1.2 ** 2 + (a * a) / 12);
    expectClose(fit.sigmaMajorMm, expected, { rel: 5e-3 });
    expectClose(fit.sigmaMinorMm, expected, { rel: 5e-3 });
  });

  it("throws AnalysisError for a window with too few pixels", () => {
    const { image } = makeGaussianPoint({ width: 16, height: 16, pixelSpacingMm: 1, sigmaXMm: 1, centreXPx: 8, centreYPx: 8, amplitude: 1, background: 0 });
    expect(() =>
      fitGaussian2d(image, { x: 6, y: 6, width: 5, height: 5 }, { centreXPx: 8, centreYPx: 8, sigmaMm: 1, amplitude: 1, background: 0 }),
    ).toThrow(AnalysisError);
  });
});

describe("fitGaussian1d(profile, sampleSpacingMm)", () => {
  it("recovers amplitude, background, centre and σ of a sampled Gaussian", () => {
    // Closed-form model sampled at 0.2 mm; FWHM = 2√(2 ln 2)σ.
    const profile = Float64Array.from({ length: 40 }, (_, i) => 3 + 10 * Math.exp(-((i * 0.2 - 3.7) ** 2) / (2 * 0.6 ** 2)));
    const fit = fitGaussian1d(profile, 0.2);
    expectClose(fit.amplitude, 10, { rel: 1e-8 });
    expectClose(fit.background, 3, { abs: 1e-8 });
    expectClose(fit.centreMm, 3.7, { abs: 1e-8 });
    expectClose(fit.sigmaMm, 0.6, { rel: 1e-8 });
    expectClose(fit.fwhmMm, 0.6 * 2.354820045, { rel: 1e-8 });
  });

  it("stays within 2% on a seeded noisy profile and throws AnalysisError on a flat one", () => {
    // Same model with N(0, 0.2²) noise (peak/noise 50); tolerance common practice.
    const random = createRandom(5);
    const profile = Float64Array.from({ length: 80 }, (_, i) => 1 + 10 * Math.exp(-((i - 41.3) ** 2) / (2 * 4 ** 2)) + 0.2 * random.normal());
    expectClose(fitGaussian1d(profile, 1).sigmaMm, 4, { rel: 0.02 });
    expect(() => fitGaussian1d(new Float64Array(20).fill(2), 1)).toThrow(AnalysisError);
  });
});
