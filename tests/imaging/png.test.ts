import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { PNG } from "pngjs";
import { afterAll, describe, expect, it } from "vitest";
import { decodePng } from "@/lib/imaging/png";
import { ImageDecodeError } from "@/lib/imaging/image-decode-error";
import { createRandom } from "@/lib/phantoms/random";
import { runPythonJson } from "./helpers/python-reference";

const dir = mkdtempSync(path.join(tmpdir(), "halfmax-png-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

// Pillow (an independent PNG encoder) writes the files; numpy's view of Pillow's re-read image is the reference.
const WRITE_WITH_PILLOW = `
import sys, json, os, numpy as np
from PIL import Image
d = sys.argv[1]
rng = np.random.default_rng(7)
g16 = rng.integers(0, 65536, size=(11, 13)).astype(np.uint16)
g8 = (g16 >> 8).astype(np.uint8)
files = {}
def save(name, im, expected, **kw):
    p = os.path.join(d, name); im.save(p, **kw); files[name] = {"path": p, "values": [int(v) for v in np.asarray(expected).ravel()]}
save("grey8.png", Image.fromarray(g8, "L"), g8)
save("grey16.png", Image.fromarray(g16), g16)
save("rgb-grey.png", Image.fromarray(np.stack([g8, g8, g8], -1), "RGB"), g8)
pal = Image.fromarray(g8 // 16, "P"); pal.putpalette([v for i in range(256) for v in (i * 16 % 256,) * 3])
save("palette-grey.png", pal, (g8 // 16) * 16 % 256)
save("grey-alpha.png", Image.fromarray(np.stack([g8, (g8 // 2)], -1), "LA"), g8)
save("grey8-trns.png", Image.fromarray(g8, "L"), g8, transparency=int(g8[0, 0]))
rgb = np.stack([g8, g8, 255 - g8], -1)
save("colour.png", Image.fromarray(rgb, "RGB"), g8)
print(json.dumps(files))
`;
const files = runPythonJson<Record<string, { path: string; values: number[] }>>(WRITE_WITH_PILLOW, [dir]);
const load = (name: string) => new Uint8Array(readFileSync(files[name].path));

describe("decodePng(greyscale PNG written by Pillow)", () => {
  it.each(["grey8.png", "grey16.png"])("decodePng(%s) returns the sample values unscaled", (name) => {
    const decoded = decodePng(load(name));
    expect([decoded.width, decoded.height, decoded.frames]).toEqual([13, 11, 1]);
    expect(Array.from(decoded.data)).toEqual(files[name].values);
    expect(decoded.pixelSpacingMm).toBeNull();
    expect(decoded.format).toBe("png");
    expect(decoded.warnings).toEqual([]);
  });

  it("decodePng(RGB PNG with R = G = B) returns the grey value with a warning", () => {
    const decoded = decodePng(load("rgb-grey.png"));
    expect(Array.from(decoded.data)).toEqual(files["rgb-grey.png"].values);
    expect(decoded.warnings.map((w) => w.code)).toEqual(["colour_png_grey"]);
  });

  it("decodePng(palette PNG with a grey palette) returns the palette's grey levels", () => {
    expect(Array.from(decodePng(load("palette-grey.png")).data)).toEqual(files["palette-grey.png"].values);
  });

  it("decodePng(grey + alpha) returns the grey channel and warns that alpha was ignored", () => {
    const decoded = decodePng(load("grey-alpha.png"));
    expect(Array.from(decoded.data)).toEqual(files["grey-alpha.png"].values);
    expect(decoded.warnings.map((w) => w.code)).toContain("alpha_ignored");
  });

  it("decodePng(greyscale with a tRNS key colour) keeps the keyed pixels' grey value", () => {
    expect(Array.from(decodePng(load("grey8-trns.png")).data)).toEqual(files["grey8-trns.png"].values);
  });

  it("decodePng(colour PNG) throws unsupported_pixel_format asking for greyscale", () => {
    expect(() => decodePng(load("colour.png"))).toThrowError(expect.objectContaining({ code: "unsupported_pixel_format", message: expect.stringContaining("greyscale") }));
  });
});

describe("decodePng(PNG written by pngjs)", () => {
  it("decodePng(16-bit greyscale from pngjs) keeps all 16 bits", () => {
    const random = createRandom(8);
    const width = 10;
    const height = 6;
    const values = Array.from({ length: width * height }, () => Math.floor(65536 * random.uniform()));
    const png = new PNG({ width, height, bitDepth: 16, colorType: 0, inputColorType: 0, inputHasAlpha: false });
    png.data = Buffer.from(new Uint16Array(values).buffer);
    const bytes = PNG.sync.write(png, { bitDepth: 16, colorType: 0, inputColorType: 0, inputHasAlpha: false });
    expect(Array.from(decodePng(new Uint8Array(bytes)).data)).toEqual(values);
  });
});

describe("decodePng(damaged or oversized PNG) throws ImageDecodeError", () => {
  const bytes = load("grey16.png");
  it.each([10, 30, 40, Math.floor(bytes.length / 2), bytes.length - 13])("decodePng(file cut after %i bytes) throws truncated or malformed", (cut) => {
    let error: unknown;
    try {
      decodePng(bytes.subarray(0, cut));
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(ImageDecodeError);
    expect(["truncated", "malformed"]).toContain((error as ImageDecodeError).code);
  });

  it("decodePng(13 × 11 image, maxPixels 100) throws too_many_pixels", () => {
    expect(() => decodePng(bytes, { maxPixels: 100 })).toThrowError(expect.objectContaining({ code: "too_many_pixels" }));
  });
});
