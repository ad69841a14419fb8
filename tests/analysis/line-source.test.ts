import { describe, expect, it } from "vitest";
import { AnalysisError } from "@/lib/analysis/errors";
import { analyseLineSource } from "@/lib/analysis/line-source";
import type { GrayImage } from "@/lib/analysis/types";
import { makeGaussianLine, makeLine, type GaussianLineOptions } from "@/lib/phantoms/line";
import { makeGaussianPoint } from "@/lib/phantoms/point";
import { bisect } from "../helpers/bisect";
import { expectClose } from "../helpers/expect-close";

const FWHM_PER_SIGMA = 2 * Math.sqrt(2 * Math.LN2);
const sinc = (x: number): number => (x === 0 ? 1 : Math.sin(Math.PI * x) / (Math.PI * x));
const rad = (deg: number): number => (deg * Math.PI) / 180;

/**
 * MTF of the pixel aperture along the normal of a line tilted by θ: the square pixel projected onto the normal is
 * box(px·cos θ) ∗ box(py·sin θ), so |sinc(px·f·cos θ)·sinc(py·f·sin θ)| (domain notes §6, rect → sinc).
 */
function apertureMtf(f: number, angleDeg: number, px: number, py = px): number {
  return Math.abs(sinc(px * f * Math.cos(rad(angleDeg))) * sinc(py * f * Math.sin(rad(angleDeg))));
}

/**
 * Width at `level` of a Lorentzian with half-width γ (in pixels) averaged over a 1-pixel aperture, from its arctan
 * antiderivative: h(x) = atan((x + ½)/γ) − atan((x − ½)/γ); solved by bisection. Returns pixels.
 */
function pixelIntegratedLorentzianWidthPx(gammaPx: number, level: number): number {
  const h = (x: number) => Math.atan((x + 0.5) / gammaPx) - Math.atan((x - 0.5) / gammaPx);
  return 2 * bisect(h, level * h(0), 0, 100 * gammaPx);
}

const P = 0.5;
const SIGMA = (5 * P) / FWHM_PER_SIGMA; // 5 px per FWHM
const BASE: GaussianLineOptions = {
  width: 128, height: 128, pixelSpacingMm: P, sigmaMm: SIGMA, angleDeg: 0,
  centreXPx: 63.3, centreYPx: 64.1, amplitude: 1000, background: 100,
};

describe("analyseLineSource(image)", () => {
  it.each([
    { angleDeg: 0, orientation: "vertical", tilt: 0 },
    { angleDeg: 2.5, orientation: "vertical", tilt: 2.5 },
    { angleDeg: -4, orientation: "vertical", tilt: -4 },
    { angleDeg: 88, orientation: "horizontal", tilt: 2 },
    { angleDeg: -93, orientation: "horizontal", tilt: 3 },
  ])("of a Gaussian line at $angleDeg° finds its tilt and its presampled FWHM within 1%", ({ angleDeg, orientation, tilt }) => {
    // FWHM = 2√(2 ln 2)σ (closed form) widened by the pixel aperture projected on the normal, whose variance is
    // p²(cos²θ + sin²θ)/12 = p²/12: √(FWHM² + 0.4621p²) (domain notes §6). FWTM likewise with 8 ln 10·p²/12.
    // Tilt: the phantom's geometry (x grows by tan θ per row), measured to the nearest axis.
    const { image, truth } = makeGaussianLine({ ...BASE, angleDeg });
    const result = analyseLineSource(image);
    expect(result.method).toBe("line");
    expect(result.details.orientation).toBe(orientation);
    expectClose(result.edgeAngleDeg, tilt, { abs: 0.01 });
    expectClose(result.fwhmMm, Math.sqrt(truth.fwhmMm ** 2 + 8 * Math.LN2 * (P * P) / 12), { rel: 0.01 });
    expectClose(result.fwtmMm, Math.sqrt(truth.fwtmMm ** 2 + 8 * Math.LN10 * (P * P) / 12), { rel: 0.02 });
    expect(result.warnings).toEqual([]);
  });

  it.each([0, 2.5, -6])("of a Gaussian line at %s° gives MTF within 0.02 of exp(−2π²σ²f²)·aperture up to Nyquist", (angleDeg) => {
    // Gaussian LSF → MTF exp(−2π²σ²f²) (closed form), times the projected square-aperture MTF (presampled MTF);
    // f50 from the same product by bisection; accuracy targets 0.02 abs and 2%.
    const result = analyseLineSource(makeGaussianLine({ ...BASE, angleDeg }).image);
    const expected = (f: number) => Math.exp(-2 * Math.PI ** 2 * SIGMA ** 2 * f * f) * apertureMtf(f, angleDeg, P);
    expectClose(result.nyquist, 1 / (2 * P), { rel: 1e-12 });
    expect(result.mtf.value[0]).toBe(1); // MTF(0) = 1
    result.mtf.frequencyCyclesPerMm.forEach((f, i) => {
      if (f <= result.nyquist) expectClose(result.mtf.value[i], expected(f), { abs: 0.02 });
    });
    expectClose(result.mtf50, bisect(expected, 0.5, 0, 1), { rel: 0.02 });
    expectClose(result.mtf10, bisect(expected, 0.1, 0, 1), { rel: 0.02 });
  });

  it("measures the normal FWHM and tilt in mm on non-square pixels", () => {
    // Tilt θ is geometric (mm); the projected aperture has variance (px²cos²θ + py²sin²θ)/12 (rect variance a²/12).
    const angleDeg = 3;
    const { image, truth } = makeGaussianLine({ ...BASE, pixelSpacingMm: { x: 0.4, y: 0.6 }, angleDeg });
    const result = analyseLineSource(image);
    expectClose(result.edgeAngleDeg, angleDeg, { abs: 0.01 });
    const variance = (0.4 ** 2 * Math.cos(rad(angleDeg)) ** 2 + 0.6 ** 2 * Math.sin(rad(angleDeg)) ** 2) / 12;
    expectClose(result.fwhmMm, Math.sqrt(truth.fwhmMm ** 2 + 8 * Math.LN2 * variance), { rel: 0.01 });
    expectClose(result.nyquist, 1 / 0.8, { rel: 1e-12 }); // 1/(2p) with p the spacing across the line
  });

  it("of a Lorentzian line (arctan-integrated pixels) gives FWHM ≈ 2γ widened by the aperture and MTF exp(−2πγ|f|)", () => {
    // Lorentzian (γ/π)/(x² + γ²): FWHM = 2γ, FWTM = 6γ, MTF = exp(−2πγ|f|) (domain notes §6); the pixel-integrated
    // widths come from the arctan antiderivative. The heavy tails are cut at ±256 mm and partly taken into the
    // background estimate, which biases the MTF by < 1% of its value: within the 0.02 target.
    const gamma = 1.5;
    const angleDeg = 2;
    const { image } = makeLine({
      width: 1024, height: 64, pixelSpacingMm: P, angleDeg, profile: { kind: "lorentzian", gammaMm: gamma }, amplitude: 1000, background: 100,
    });
    const result = analyseLineSource(image);
    expectClose(result.fwhmMm, P * pixelIntegratedLorentzianWidthPx(gamma / P, 0.5), { rel: 0.01 });
    expectClose(result.fwtmMm, P * pixelIntegratedLorentzianWidthPx(gamma / P, 0.1), { rel: 0.01 });
    expectClose(result.fwtmMm! / result.fwhmMm!, 3, { rel: 0.03 }); // ratio 3 for a Lorentzian, aperture lowers it slightly
    const expected = (f: number) => Math.exp(-2 * Math.PI * gamma * f) * apertureMtf(f, angleDeg, P);
    result.mtf.frequencyCyclesPerMm.forEach((f, i) => {
      if (f <= result.nyquist) expectClose(result.mtf.value[i], expected(f), { abs: 0.02 });
    });
    // f50 of exp(−2πγf) alone is ln2/(2πγ) (f50·FWHM = ln2/π = 0.220636); with the aperture, solve the product.
    expectClose(result.mtf50, bisect(expected, 0.5, 0, 1), { rel: 0.02 });
  });

  it("of a thin tilted slit gives the pixel-aperture MTF |sinc(pf)|, 2/π at Nyquist", () => {
    // Square aperture MTF |sinc(a·f)| = 2/π = 0.6366 at f = 1/(2a) (domain notes §6); the 0.05 mm slit contributes
    // sinc(0.05·f) and the tilt the projected aperture. At 3.5° the line drifts over whole pixel phases, which
    // cancels the aliases (ISO 12233 oversampling principle).
    const angleDeg = 3.5;
    const { image } = makeLine({
      width: 128, height: 256, pixelSpacingMm: P, angleDeg, profile: { kind: "slit", widthMm: 0.05 }, amplitude: 1000, background: 100,
    });
    const result = analyseLineSource(image);
    const expected = (f: number) => Math.abs(sinc(0.05 * f)) * apertureMtf(f, angleDeg, P);
    expectClose(result.mtfAtNyquist, expected(1), { abs: 0.01 });
    expectClose(result.mtfAtNyquist, 2 / Math.PI, { abs: 0.01 });
    result.mtf.frequencyCyclesPerMm.forEach((f, i) => {
      if (f <= result.nyquist) expectClose(result.mtf.value[i], expected(f), { abs: 0.02 });
    });
    expect(result.warnings.map((w) => w.code)).toContain("undersampled");
  });

  it("turns a one-pixel-wide untilted line into a flat MTF of 1 and a 1-pixel FWHM", () => {
    // Impulse across the line → flat spectrum (Bracewell); NEMA width of [0, 1, 0] is 1 sample (hand-worked).
    const data = new Float64Array(64 * 48).fill(20);
    for (let y = 0; y < 48; y++) data[y * 64 + 30] = 220;
    const result = analyseLineSource({ data, width: 64, height: 48, pixelSpacingMm: { x: 0.3, y: 0.3 } });
    for (const m of result.mtf.value) expectClose(m, 1, { abs: 1e-9 });
    expectClose(result.fwhmMm, 0.3, { rel: 1e-9 });
    expectClose(result.edgeAngleDeg, 0, { abs: 1e-9 });
  });

  it("is linear and shift-invariant: scaling changes nothing, sub-pixel offsets change FWHM by < 1%", () => {
    // Invariants (common practice): k·image gives the same FWHM/MTF; sub-pixel line positions change the FWHM only
    // by the NEMA phase bias (≤ 0.2% at 5 px per FWHM, domain notes §6), target < 1%.
    const { image } = makeGaussianLine({ ...BASE, angleDeg: 1.5 });
    const scaled: GrayImage = { ...image, data: image.data.map((v) => 3.5 * v) };
    const a = analyseLineSource(image);
    const b = analyseLineSource(scaled);
    expectClose(b.fwhmMm, a.fwhmMm!, { rel: 1e-9 });
    expectClose(b.mtf50, a.mtf50!, { rel: 1e-9 });
    const widths = [0, 0.25, 0.5, 0.75].map((shift) => analyseLineSource(makeGaussianLine({ ...BASE, centreXPx: 60 + shift }).image).fwhmMm!);
    expect((Math.max(...widths) - Math.min(...widths)) / Math.min(...widths)).toBeLessThan(0.01);
  });

  it("stays within 3% in FWHM and 0.1° in tilt under seeded Poisson noise", () => {
    // Poisson counts: line peak 500 on 100 background; expected values as in the noiseless case; targets 3%, 0.1°.
    const expected = Math.sqrt((5 * P) ** 2 + 8 * Math.LN2 * (P * P) / 12);
    for (let seed = 1; seed <= 6; seed++) {
      const result = analyseLineSource(makeGaussianLine({ ...BASE, angleDeg: 3, amplitude: 500, poisson: true, seed }).image);
      expectClose(result.fwhmMm, expected, { rel: 0.03 });
      expectClose(result.edgeAngleDeg, 3, { abs: 0.1 });
    }
  });

  it("warns undersampled for a 2-px FWHM and roi_at_image_border for a line near the edge", () => {
    // Documented thresholds: FWHM < 3 px; line within 3 FWHM of the ROI edge (common practice).
    const narrow = analyseLineSource(makeGaussianLine({ ...BASE, sigmaMm: (2 * P) / FWHM_PER_SIGMA, angleDeg: 2 }).image);
    expect(narrow.warnings.map((w) => w.code)).toContain("undersampled");
    const nearEdge = analyseLineSource(makeGaussianLine({ ...BASE, centreXPx: 8 }).image);
    expect(nearEdge.warnings.map((w) => w.code)).toContain("roi_at_image_border");
  });

  it("analyses only options.roi", () => {
    // Two parallel lines; the ROI holds the second one only (behaviour of options.roi).
    const first = makeGaussianLine({ ...BASE, centreXPx: 30 });
    const second = makeGaussianLine({ ...BASE, centreXPx: 96.4, background: 0, amplitude: 400 });
    const data = first.image.data.map((v, i) => v + second.image.data[i]!);
    const result = analyseLineSource({ ...first.image, data }, { roi: { x: 64, y: 0, width: 64, height: 128 } });
    expectClose((result.details.lineCentrePx as { x: number }).x, 96.4, { abs: 0.02 });
    expect(result.roi).toEqual({ x: 64, y: 0, width: 64, height: 128 });
  });

  it("throws AnalysisError with code no_line for pure noise and for a point source", () => {
    // Rejection rules (documented settings): the line must carry signal in most rows and stand out from the noise.
    const noise = makeGaussianLine({ ...BASE, amplitude: 0, noiseSd: 5, seed: 9 }).image;
    const point = makeGaussianPoint({
      width: 96, height: 96, pixelSpacingMm: P, sigmaXMm: SIGMA, centreXPx: 48, centreYPx: 47, amplitude: 1000, background: 100, noiseSd: 2, seed: 3,
    }).image;
    for (const image of [noise, point]) {
      expect(() => analyseLineSource(image)).toThrow(AnalysisError);
      try {
        analyseLineSource(image);
      } catch (error) {
        expect((error as AnalysisError).code).toBe("no_line");
      }
    }
  });
});
