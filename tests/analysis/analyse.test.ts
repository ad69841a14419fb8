import { describe, expect, it } from "vitest";
import { analyse, analyseCircularEdge, analyseSlantedEdge, AnalysisError, ANALYSIS_VERSION, type GrayImage } from "@/lib/analysis";
import { makeDisk } from "@/lib/phantoms/disk";
import { makeSlantedEdge, slantedEdgeMtf } from "@/lib/phantoms/edge";
import { makeGaussianLine } from "@/lib/phantoms/line";
import { makeGaussianPoint } from "@/lib/phantoms/point";
import { expectClose } from "../helpers/expect-close";

// Dispatch tests: the reference is the phantom's known kind and the result of calling the method directly; numerical
// accuracy of each method is tested in its own file against closed forms.

const P = 0.1;
const edgePhantom = () => makeSlantedEdge({ width: 256, height: 256, pixelSpacingMm: P, angleDeg: 4, sigmaMm: 0.1, low: 100, high: 1100 });
const diskPhantom = () => makeDisk({ width: 128, height: 128, pixelSpacingMm: P, radiusMm: 2, centreXPx: 63.4, centreYPx: 64.2, sigmaMm: 0.12, insideValue: 500, outsideValue: 0 });

/** Places `right` to the right of `left` (same height) in one image. */
function sideBySide(left: GrayImage, right: GrayImage): GrayImage {
  const width = left.width + right.width;
  const data = new Float64Array(width * left.height);
  for (let y = 0; y < left.height; y++) {
    data.set(left.data.subarray(y * left.width, (y + 1) * left.width), y * width);
    data.set(right.data.subarray(y * right.width, (y + 1) * right.width), y * width + left.width);
  }
  return { data, width, height: left.height, pixelSpacingMm: left.pixelSpacingMm };
}

describe("analyse(image, options) dispatch", () => {
  it("method \"edge\" returns what analyseSlantedEdge returns, marked as requested", () => {
    const { image, truth } = edgePhantom();
    const viaAnalyse = analyse(image, { method: "edge" });
    const direct = analyseSlantedEdge(image);
    expect(viaAnalyse.method).toBe("edge");
    expect(viaAnalyse.version).toBe(ANALYSIS_VERSION);
    expect(viaAnalyse.mtf).toEqual(direct.mtf);
    expect(viaAnalyse.details.methodChoice).toBe("requested");
    expectClose(viaAnalyse.mtfAtNyquist, slantedEdgeMtf(truth, 1 / (2 * P)), { abs: 0.02 }); // closed form, see slanted-edge tests
  });

  it("method \"disk\" returns what analyseCircularEdge returns", () => {
    const { image } = diskPhantom();
    expect(analyse(image, { method: "disk" }).mtf).toEqual(analyseCircularEdge(image).mtf);
  });

  it("\"auto\" (the default) picks edge, disk, point and line from the content and records why", () => {
    const cases = [
      { image: edgePhantom().image, method: "edge" },
      { image: diskPhantom().image, method: "disk" },
      {
        image: makeGaussianPoint({ width: 96, height: 96, pixelSpacingMm: P, sigmaXMm: 0.2, centreXPx: 47.3, centreYPx: 48.6, amplitude: 1000, background: 10 }).image,
        method: "point",
      },
      {
        image: makeGaussianLine({ width: 128, height: 128, pixelSpacingMm: P, sigmaMm: 0.2, angleDeg: 7, amplitude: 1000, background: 10 }).image,
        method: "line",
      },
    ];
    for (const c of cases) {
      const result = analyse(c.image);
      expect(result.method).toBe(c.method);
      expect(result.details.methodChoice).toBe("auto");
      expect(typeof result.details.autoMethodReason).toBe("string");
      expect((result.details.autoMethodReason as string).length).toBeGreaterThan(10);
    }
  });

  it("\"auto\" with an ROI decides from the ROI's content and the method analyses inside it", () => {
    const disk = diskPhantom().image;
    const point = makeGaussianPoint({ width: 128, height: 128, pixelSpacingMm: P, sigmaXMm: 0.2, centreXPx: 64.2, centreYPx: 63.7, amplitude: 1000, background: 0 }).image;
    const image = sideBySide(disk, point);
    const left = analyse(image, { roi: { x: 0, y: 0, width: 128, height: 128 } });
    expect(left.method).toBe("disk");
    expect(left.roi.x + left.roi.width).toBeLessThanOrEqual(128);
    const right = analyse(image, { roi: { x: 128, y: 0, width: 128, height: 128 } });
    expect(right.method).toBe("point");
    expect(right.roi.x).toBeGreaterThanOrEqual(128);
  });
});

describe("analyse(image, options) validation", () => {
  const { image } = edgePhantom();

  it("rejects ROIs outside the image, too small, negative or fractional, naming the values", () => {
    expect(() => analyse(image, { roi: { x: 200, y: 0, width: 100, height: 100 } })).toThrow(/reaches \(299, 99\), outside the 256×256 image/);
    expect(() => analyse(image, { roi: { x: 0, y: 0, width: 5, height: 100 } })).toThrow(/at least 9×9 px, got 5×100/);
    expect(() => analyse(image, { roi: { x: -1, y: 0, width: 50, height: 50 } })).toThrow(/must not be negative, got \(-1, 0\)/);
    expect(() => analyse(image, { roi: { x: 0.5, y: 0, width: 50, height: 50 } })).toThrow(/must be integers/);
    expect(() => analyse(image, { roi: { x: 0, y: 0, width: 50, height: 50 }, method: "edge" })).toThrow(AnalysisError);
  });

  it("rejects inconsistent images: data length, spacing, non-finite values, size", () => {
    const good = { data: new Float64Array(100), width: 10, height: 10, pixelSpacingMm: { x: 1, y: 1 } };
    expect(() => analyse({ ...good, data: new Float64Array(99) })).toThrow(/holds 99 values, expected 10×10 = 100/);
    expect(() => analyse({ ...good, pixelSpacingMm: { x: 0, y: 1 } })).toThrow(/pixel spacing must be finite and positive, got 0×1 mm/);
    const withNaN = new Float64Array(100);
    withNaN[23] = NaN;
    expect(() => analyse({ ...good, data: withNaN })).toThrow(/pixel \(3, 2\) is not finite: NaN/);
    expect(() => analyse({ ...good, width: 4, height: 25 })).toThrow(/at least 9×9 px/);
  });

  it("rejects an unknown method name", () => {
    expect(() => analyse(image, { method: "bars" as never })).toThrow(/unknown analysis method "bars"; expected auto, point, line, edge, disk/);
  });

  it("passes the method's own rejection through (edge at 0°)", () => {
    const flat = makeSlantedEdge({ width: 128, height: 128, pixelSpacingMm: P, angleDeg: 0, sigmaMm: 0.1, low: 0, high: 1 }).image;
    expect(() => analyse(flat, { method: "edge" })).toThrow(/edge angle 0\.00°/);
  });
});
