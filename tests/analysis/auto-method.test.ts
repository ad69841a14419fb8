import { describe, expect, it } from "vitest";
import { detectMethod } from "@/lib/analysis/auto-method";
import { AnalysisError } from "@/lib/analysis/errors";
import type { GrayImage } from "@/lib/analysis/types";
import { makeDisk } from "@/lib/phantoms/disk";
import { makeSlantedEdge } from "@/lib/phantoms/edge";
import { makeGaussianLine } from "@/lib/phantoms/line";
import { makeGaussianPoint } from "@/lib/phantoms/point";

// The reference for each case is how the phantom was generated (its known kind); the rules themselves are common
// practice (auto-method.ts). Each kind is tried noiseless and with seeded noise, at several sizes and positions.

const P = 0.1;
const size = { width: 128, height: 128, pixelSpacingMm: P };

describe("detectMethod(image)", () => {
  for (const noiseSd of [0, 8]) {
    const noise = { noiseSd, seed: 11 };

    it(`chooses "point" for Gaussian blobs of σ = 1, 3 and 10 px (noise SD ${noiseSd})`, () => {
      for (const sigmaXMm of [0.1, 0.3, 1]) {
        const { image } = makeGaussianPoint({ ...size, ...noise, sigmaXMm, centreXPx: 60.3, centreYPx: 70.6, amplitude: 1000, background: 100 });
        expect(detectMethod(image).method).toBe("point");
      }
    });

    it(`chooses "line" for Gaussian ridges at 0°, 10°, 45° and 80° (noise SD ${noiseSd})`, () => {
      for (const angleDeg of [0, 10, 45, 80]) {
        const { image } = makeGaussianLine({ ...size, ...noise, sigmaMm: 0.15, angleDeg, amplitude: 1000, background: 100 });
        const choice = detectMethod(image);
        expect(choice.method).toBe("line");
        expect(choice.reason).toMatch(/elongated ridge/);
      }
    });

    it(`chooses "edge" for vertical and horizontal edges, either polarity, centred or near a side (noise SD ${noiseSd})`, () => {
      const variants = [
        { angleDeg: 5, orientation: "vertical" as const, low: 100, high: 1100, edgeOffsetPx: 0 },
        { angleDeg: -3, orientation: "horizontal" as const, low: 1100, high: 100, edgeOffsetPx: 50 },
        { angleDeg: 8, orientation: "vertical" as const, low: 100, high: 1100, edgeOffsetPx: -55 },
      ];
      for (const v of variants) {
        const { image } = makeSlantedEdge({ ...size, ...noise, ...v, sigmaMm: 0.1 });
        expect(detectMethod(image).method).toBe("edge");
      }
    });

    it(`chooses "disk" for brighter and darker inserts of radius 5–40 px (noise SD ${noiseSd})`, () => {
      for (const [radiusMm, insideValue] of [[0.5, 1000], [1.5, -500], [4, 1000]] as const) {
        const { image } = makeDisk({ ...size, ...noise, radiusMm, centreXPx: 62.3, centreYPx: 65.1, sigmaMm: 0.1, insideValue, outsideValue: 0 });
        const choice = detectMethod(image);
        expect(choice.method).toBe("disk");
        expect(choice.reason).toMatch(/flat interior/);
      }
    });
  }

  it("chooses \"edge\" for a half-plane that fills only a corner (not a bimodal border)", () => {
    // A 45° edge through a point near the corner: the bright side covers a small share of the border.
    const { image } = makeSlantedEdge({ ...size, angleDeg: 40, sigmaMm: 0.1, low: 0, high: 1000, edgeOffsetPx: 75 });
    const choice = detectMethod(image);
    expect(choice.method).toBe("edge");
    expect(choice.reason).toMatch(/reaching the image border .* half-plane/);
  });

  it("throws AnalysisError when nothing stands out from the background", () => {
    const uniform: GrayImage = { data: new Float64Array(64 * 64).fill(5), width: 64, height: 64, pixelSpacingMm: { x: P, y: P } };
    expect(() => detectMethod(uniform)).toThrow(AnalysisError);
    expect(() => detectMethod(uniform)).toThrow(/cannot choose a method: no object found/);
    const tiny: GrayImage = { data: new Float64Array(25), width: 5, height: 5, pixelSpacingMm: { x: P, y: P } };
    expect(() => detectMethod(tiny)).toThrow(/at least 9×9 px, got 5×5/);
  });
});
