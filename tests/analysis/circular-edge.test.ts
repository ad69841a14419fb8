import { describe, expect, it } from "vitest";
import { analyseCircularEdge } from "@/lib/analysis/circular-edge";
import { frequencyAtLevel, valueAtFrequency } from "@/lib/analysis/mtf-metrics";
import type { AnalysisResult, GrayImage } from "@/lib/analysis/types";
import { blurredDiskFraction, diskPresampledMtf, makeDisk, type DiskOptions, type DiskTruth } from "@/lib/phantoms/disk";
import { makeSlantedEdge } from "@/lib/phantoms/edge";
import { makeGaussianLine } from "@/lib/phantoms/line";
import { makeGaussianPoint } from "@/lib/phantoms/point";
import { expectClose } from "../helpers/expect-close";

// Method under test: circular-edge (TTF) method, Richard et al., Med Phys 2012;39:4115, AAPM TG-233 (Samei et al., Med
// Phys 2019). Truth: the disk is blurred by a Gaussian of σ, so along the radius the MTF is e^(−2π²σ²f²) (Gaussian ↔
// Gaussian) times the square pixel aperture projected on the radius, averaged over the edge directions:
// (2/π)∫ sinc(p cos θ f)·sinc(p sin θ f) dθ (rect → sinc). Curvature is O(σ²/R²) and ignored.

const P = 0.5;
const base: DiskOptions = {
  width: 96,
  height: 96,
  pixelSpacingMm: P,
  radiusMm: 8,
  centreXPx: 47.3,
  centreYPx: 48.8,
  sigmaMm: 0.6,
  insideValue: 1000,
  outsideValue: 0,
};

function maxMtfError(result: AnalysisResult, truth: DiskTruth): number {
  let worst = 0;
  result.mtf.frequencyCyclesPerMm.forEach((f, k) => {
    if (f <= result.nyquist + 1e-9) worst = Math.max(worst, Math.abs(result.mtf.value[k]! - valueAtFrequency(truth.mtf, f)!));
  });
  return worst;
}

describe("disk phantom (makeDisk) against closed forms", () => {
  it("blurredDiskFraction at the centre is the Rayleigh CDF 1 − e^(−R²/2σ²)", () => {
    // Mass of an isotropic 2-D Gaussian inside radius R about its own centre (Rayleigh distribution, closed form).
    for (const [r, s] of [[2, 1], [1, 0.8], [0.5, 0.4], [10, 0.4]]) expectClose(blurredDiskFraction(0, r!, s!), 1 - Math.exp(-(r! ** 2) / (2 * s! ** 2)), { abs: 1e-12 });
  });

  it("blurring conserves the disk's area: ∫P(r)·2πr dr = πR²", () => {
    // Convolution with a unit-mass kernel preserves the integral (definition). Midpoint rule, step σ/100.
    for (const [radius, sigma] of [[3, 0.4], [0.6, 0.5]]) {
      let mass = 0;
      const h = sigma! / 100;
      for (let r = h / 2; r < radius! + 12 * sigma!; r += h) mass += blurredDiskFraction(r, radius!, sigma!) * 2 * Math.PI * r * h;
      expectClose(mass, Math.PI * radius! ** 2, { rel: 1e-5 });
    }
  });

  it("diskPresampledMtf at Nyquist lies between the axis value 2/π and the diagonal value sinc²(1/(2√2))", () => {
    // σ = 0: the average over θ of sinc(p cos θ f)·sinc(p sin θ f) at f = 1/(2p) (rect → sinc).
    const value = diskPresampledMtf(1 / (2 * P), 0, { x: P, y: P });
    const diagonal = (Math.sin(Math.PI / (2 * Math.SQRT2)) / (Math.PI / (2 * Math.SQRT2))) ** 2;
    expect(value).toBeGreaterThan(2 / Math.PI);
    expect(value).toBeLessThan(diagonal);
  });
});

describe("analyseCircularEdge(image) against closed forms", () => {
  const cases = [
    { radiusMm: 4, centreXPx: 47.3, centreYPx: 48.8 },
    { radiusMm: 8, centreXPx: 48, centreYPx: 47.5 },
    { radiusMm: 12, centreXPx: 47.71, centreYPx: 48.13 },
  ];
  for (const c of cases) {
    it(`a disk of R = ${c.radiusMm} mm at (${c.centreXPx}, ${c.centreYPx}) px matches the Gaussian truth within 0.02 up to Nyquist, MTF50 within 2 %`, () => {
      const { image, truth } = makeDisk({ ...base, ...c });
      const result = analyseCircularEdge(image);
      expect(result.method).toBe("disk");
      expect(result.mtf.value[0]).toBe(1); // normalised at f = 0
      expectClose(result.nyquist, 1 / (2 * P), { rel: 1e-12 });
      expect(maxMtfError(result, truth)).toBeLessThan(0.02);
      expectClose(result.mtf50, frequencyAtLevel(truth.mtf, 0.5)!, { rel: 0.02 });
      // Centre to 0.01 px; radius to 0.05 mm (the blurred rim's 50 % contour moves inwards by about σ²/(2R)).
      expectClose(result.details.centreXPx as number, c.centreXPx, { abs: 0.01 });
      expectClose(result.details.centreYPx as number, c.centreYPx, { abs: 0.01 });
      expectClose(result.details.radiusMm as number, c.radiusMm, { abs: 0.05 });
      // FWHM of the direction-averaged presampled LSF (phantom truth from the closed-form LSF), NEMA-style width;
      // 2 % for the smallest disk, where the rim's curvature (O(σ²/R²), ignored by the truth) widens the radial LSF.
      expectClose(result.fwhmMm, truth.lsfFwhmMm, { rel: c.radiusMm >= 8 ? 0.01 : 0.02 });
    });
  }

  it("a darker insert gives the same MTF as the brighter one, with negative contrast", () => {
    // Linearity: the darker image is an affine map of the brighter one, and the MTF is normalised at f = 0.
    const bright = analyseCircularEdge(makeDisk(base).image);
    const darkPhantom = makeDisk({ ...base, insideValue: -800, outsideValue: 40 });
    const dark = analyseCircularEdge(darkPhantom.image);
    expect(dark.details.polarity).toBe("darker");
    expectClose(dark.details.contrast as number, -840, { abs: 1 });
    dark.mtf.value.forEach((v, k) => expectClose(v, bright.mtf.value[k]!, { abs: 1e-6 }));
    expect(maxMtfError(dark, darkPhantom.truth)).toBeLessThan(0.02);
  });

  it("with seeded noise (contrast-to-noise 100 and 200) the MTF stays within 0.03 up to Nyquist and MTF50 within 2 %", () => {
    for (const [noiseSd, seed] of [[10, 1], [10, 2], [5, 3], [5, 4]]) {
      const { image, truth } = makeDisk({ ...base, noiseSd, seed });
      const result = analyseCircularEdge(image);
      expect(maxMtfError(result, truth)).toBeLessThan(0.03);
      expectClose(result.mtf50, frequencyAtLevel(truth.mtf, 0.5)!, { rel: 0.02 });
    }
  });

  it("with seeded noise at contrast-to-noise 400 the radial LSF FWHM is within 3 %", () => {
    for (const seed of [1, 2, 3, 4]) {
      const { image, truth } = makeDisk({ ...base, noiseSd: 2.5, seed });
      expectClose(analyseCircularEdge(image).fwhmMm, truth.lsfFwhmMm, { rel: 0.03 });
    }
  });

  it("handles non-square pixels (Nyquist from the coarser pitch)", () => {
    // Same truth formula with p_x ≠ p_y; Nyquist 1/(2·max(p_x, p_y)).
    const { image, truth } = makeDisk({ ...base, radiusMm: 7, pixelSpacingMm: { x: 0.5, y: 0.6 } });
    const result = analyseCircularEdge(image);
    expectClose(result.nyquist, 1 / 1.2, { rel: 1e-12 });
    expect(maxMtfError(result, truth)).toBeLessThan(0.02);
  });

  it("analyses the insert inside an ROI and warns small_insert for a radius under 4 FWHM", () => {
    const { image, truth } = makeDisk({ ...base, width: 160, radiusMm: 2.5, centreXPx: 100.4 });
    const result = analyseCircularEdge(image, { roi: { x: 70, y: 20, width: 60, height: 60 } });
    expect(result.roi.x).toBeGreaterThanOrEqual(70);
    expect(result.roi.x + result.roi.width).toBeLessThanOrEqual(130);
    expect(result.warnings.map((w) => w.code)).toContain("small_insert");
    expect(maxMtfError(result, truth)).toBeLessThan(0.03);
  });
});

describe("analyseCircularEdge(image) rejects images without a disk", () => {
  const spacing = { x: P, y: P };
  it("rejects a uniform image", () => {
    const uniform: GrayImage = { data: new Float64Array(64 * 64).fill(3), width: 64, height: 64, pixelSpacingMm: spacing };
    expect(() => analyseCircularEdge(uniform)).toThrow(/no disk found/);
  });

  it("rejects a straight edge (the object reaches the ROI border)", () => {
    const { image } = makeSlantedEdge({ width: 96, height: 96, pixelSpacingMm: P, angleDeg: 5, sigmaMm: 0.5, low: 0, high: 100 });
    expect(() => analyseCircularEdge(image)).toThrow(/no disk found/);
  });

  it("rejects a line source", () => {
    const { image } = makeGaussianLine({ width: 96, height: 96, pixelSpacingMm: P, sigmaMm: 0.6, angleDeg: 20, amplitude: 100, background: 0 });
    expect(() => analyseCircularEdge(image)).toThrow(/no disk found/);
  });

  it("rejects a Gaussian blob (no flat interior)", () => {
    const { image } = makeGaussianPoint({ width: 96, height: 96, pixelSpacingMm: P, sigmaXMm: 3, centreXPx: 48, centreYPx: 48, amplitude: 100, background: 0 });
    expect(() => analyseCircularEdge(image)).toThrow(/no disk found: the object has no flat interior/);
  });
});
