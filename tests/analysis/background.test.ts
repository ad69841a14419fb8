import { describe, expect, it } from "vitest";
import { measureBackground } from "@/lib/analysis/background";
import { AnalysisError } from "@/lib/analysis/errors";
import type { GrayImage } from "@/lib/analysis/types";
import { createRandom } from "@/lib/phantoms/random";
import { expectClose } from "../helpers/expect-close";

function image(width: number, height: number, value: (x: number, y: number) => number): GrayImage {
  const data = new Float64Array(width * height);
  for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) data[y * width + x] = value(x, y);
  return { data, width, height, pixelSpacingMm: { x: 1, y: 1 } };
}

/** Border pixels (3-px strip) of the whole image, listed directly. */
function borderValues(img: GrayImage): number[] {
  const out: number[] = [];
  for (let y = 0; y < img.height; y++) {
    for (let x = 0; x < img.width; x++) {
      if (y < 3 || y >= img.height - 3 || x < 3 || x >= img.width - 3) out.push(img.data[y * img.width + x]!);
    }
  }
  return out;
}

const median = (v: number[]): number => {
  const s = [...v].sort((a, b) => a - b);
  const n = s.length;
  return n % 2 ? s[n >> 1]! : (s[n / 2 - 1]! + s[n / 2]!) / 2;
};

describe("measureBackground(image, roi, options)", () => {
  it("returns the median and 1.4826·MAD of the border strip, ties included", () => {
    // Reference: sort-based median and MAD (definition; Rousseeuw & Croux, JASA 1993, for the 1.4826 factor).
    const random = createRandom(8);
    for (const [w, h] of [[20, 17], [33, 12], [9, 40]] as const) {
      const img = image(w, h, () => Math.floor(random.uniform() * 6));
      const values = borderValues(img);
      const m = median(values);
      const result = measureBackground(img);
      expect(result.pixelCount).toBe(values.length);
      expect(result.level).toBe(m);
      expectClose(result.noiseSd, 1.482602218505602 * median(values.map((v) => Math.abs(v - m))), { abs: 1e-12 });
    }
  });

  it("estimates the SD of normal noise with either estimator and ignores a few bright border pixels with the median", () => {
    // For N(μ, σ²) noise both the sample SD and 1.4826·MAD estimate σ (sampling error ≈ 2–3% at n ≈ 2300).
    const random = createRandom(21);
    const img = image(200, 200, () => 40 + 3 * random.normal());
    for (const estimator of ["mean", "median"] as const) {
      const result = measureBackground(img, undefined, { estimator });
      expectClose(result.level, 40, { abs: 0.2 });
      expectClose(result.noiseSd, 3, { rel: 0.05 });
    }
    // 20 hot pixels on the top edge (an object reaching the border): the median barely moves, the mean does.
    for (let x = 90; x < 110; x++) img.data[x] = 10_000;
    expectClose(measureBackground(img).level, 40, { abs: 0.3 });
    expect(measureBackground(img, undefined, { estimator: "mean" }).level).toBeGreaterThan(100);
  });

  it("uses only the requested sides and throws AnalysisError for a strip too thick for the ROI", () => {
    // Behaviour of the options: left/right strips of a vertical gradient image hold the values of every row.
    const img = image(30, 30, (x) => (x < 3 ? 1 : x >= 27 ? 1 : 5));
    const sides = measureBackground(img, undefined, { sides: { top: false, bottom: false, left: true, right: true } });
    expect(sides.level).toBe(1);
    expect(sides.pixelCount).toBe(2 * 3 * 30);
    expect(() => measureBackground(img, { x: 0, y: 0, width: 8, height: 30 })).toThrow(AnalysisError);
    expect(() => measureBackground(img, { x: 25, y: 0, width: 8, height: 30 })).toThrow(/does not lie inside/);
  });
});
