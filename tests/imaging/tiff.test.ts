import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { decodeTiff } from "@/lib/imaging/tiff";
import { ImageDecodeError } from "@/lib/imaging/image-decode-error";
import { runPythonJson } from "./helpers/python-reference";

const dir = mkdtempSync(path.join(tmpdir(), "halfmax-tiff-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

// Pillow (an independent TIFF writer, libtiff for the compressed variants) writes the files; the reference values
// are numpy's view of Pillow's re-read image.
const WRITE_WITH_PILLOW = `
import sys, json, os, numpy as np
from PIL import Image
d = sys.argv[1]
rng = np.random.default_rng(11)
g16 = rng.integers(0, 65536, size=(9, 14)).astype(np.uint16)
images = {
  "uint8": Image.fromarray((g16 >> 8).astype(np.uint8), "L"),
  "uint16": Image.fromarray(g16),
  "uint16-big-endian": Image.frombytes("I;16B", (14, 9), g16.astype(">u2").tobytes()),
  "float32": Image.fromarray((g16.astype(np.float32) - 30000) / 7, "F"),
  "int32": Image.fromarray(g16.astype(np.int32) - 40000, "I"),
}
files = {}
for name, im in images.items():
    for comp in ["raw", "tiff_lzw", "tiff_adobe_deflate", "tiff_deflate", "packbits"]:
        if name == "uint16-big-endian" and comp != "raw": continue  # Pillow writes big endian only uncompressed
        p = os.path.join(d, f"{name}-{comp}.tif")
        im.save(p, compression=comp)
        back = np.asarray(Image.open(p)).astype(np.float64)
        files[f"{name}-{comp}"] = {"path": p, "values": [float(v) for v in back.ravel()], "order": open(p, "rb").read(2).decode()}
rgb = Image.fromarray(np.stack([(g16 >> 8).astype(np.uint8)] * 3, -1), "RGB"); p = os.path.join(d, "rgb.tif"); rgb.save(p); files["rgb"] = {"path": p, "values": [], "order": "II"}
bw = Image.fromarray(g16 > 30000).convert("1"); p = os.path.join(d, "bilevel.tif"); bw.save(p); files["bilevel"] = {"path": p, "values": [], "order": "II"}
jp = Image.fromarray((g16 >> 8).astype(np.uint8), "L"); p = os.path.join(d, "jpeg.tif"); jp.save(p, compression="jpeg"); files["jpeg"] = {"path": p, "values": [], "order": "II"}
pages = [Image.fromarray((g16 >> 8).astype(np.uint8), "L"), Image.fromarray((g16 >> 4).astype(np.uint8) , "L")]
p = os.path.join(d, "two-pages.tif"); pages[0].save(p, save_all=True, append_images=pages[1:])
files["two-pages"] = {"path": p, "values": [float(v) for v in np.asarray(pages[0]).ravel()], "order": "II"}
print(json.dumps(files))
`;
const files = runPythonJson<Record<string, { path: string; values: number[]; order: string }>>(WRITE_WITH_PILLOW, [dir]);
const load = (name: string) => new Uint8Array(readFileSync(files[name].path));
const readable = Object.keys(files).filter((k) => /^(uint|float|int)/.test(k));

describe("decodeTiff(greyscale TIFF written by Pillow)", () => {
  it.each(readable)("decodeTiff(%s) equals Pillow's pixel values", (name) => {
    const decoded = decodeTiff(load(name));
    expect([decoded.width, decoded.height]).toEqual([14, 9]);
    expect(Array.from(decoded.data)).toEqual(files[name].values);
    expect(decoded.pixelSpacingMm).toBeNull();
    expect(decoded.format).toBe("tiff");
  });

  it("the Pillow set includes a big-endian (MM) file", () => {
    expect(files["uint16-big-endian-raw"].order).toBe("MM");
  });

  it("decodeTiff(two-page TIFF) reads the first page and warns", () => {
    const decoded = decodeTiff(load("two-pages"));
    expect(Array.from(decoded.data)).toEqual(files["two-pages"].values);
    expect(decoded.warnings.map((w) => w.code)).toContain("tiff_first_page_only");
  });

  it.each([
    ["rgb", "greyscale"],
    ["bilevel", "bits"],
    ["jpeg", "MTF"],
  ])("decodeTiff(%s TIFF) throws unsupported_pixel_format mentioning %s", (name, word) => {
    expect(() => decodeTiff(load(name))).toThrowError(expect.objectContaining({ code: "unsupported_pixel_format", message: expect.stringContaining(word) }));
  });
});

/**
 * A minimal baseline TIFF written by hand per TIFF 6.0 (§2 header and IFD, §8 baseline fields; SampleFormat §19):
 * one uncompressed strip, entries in ascending tag order, values ≤ 4 bytes inline.
 */
function handTiff(o: { littleEndian: boolean; width: number; height: number; bits: number; sampleFormat: number; photometric: number; samples: number[] }): Uint8Array {
  const bytesPerSample = o.bits / 8;
  const entries: [number, number, number][] = [
    [256, 3, o.width], [257, 3, o.height], [258, 3, o.bits], [259, 3, 1], [262, 3, o.photometric],
    [273, 4, 0 /* patched below */], [277, 3, 1], [278, 3, o.height], [279, 4, o.width * o.height * bytesPerSample], [339, 3, o.sampleFormat],
  ];
  const ifdSize = 2 + 12 * entries.length + 4;
  const dataOffset = 8 + ifdSize;
  const out = new Uint8Array(dataOffset + o.width * o.height * bytesPerSample);
  const v = new DataView(out.buffer);
  const le = o.littleEndian;
  out.set(le ? [0x49, 0x49] : [0x4d, 0x4d]);
  v.setUint16(2, 42, le);
  v.setUint32(4, 8, le);
  v.setUint16(8, entries.length, le);
  entries.forEach(([tag, type, value], k) => {
    const at = 10 + 12 * k;
    v.setUint16(at, tag, le);
    v.setUint16(at + 2, type, le);
    v.setUint32(at + 4, 1, le);
    const val = tag === 273 ? dataOffset : value;
    if (type === 3) v.setUint16(at + 8, val, le); // a SHORT sits in the first 2 bytes of the value field
    else v.setUint32(at + 8, val, le);
  });
  o.samples.forEach((s, i) => {
    const at = dataOffset + i * bytesPerSample;
    if (o.sampleFormat === 3) v.setFloat32(at, s, le);
    else if (o.bits === 8) v.setUint8(at, s);
    else if (o.bits === 16) v.setUint16(at, s, le);
    else v.setUint32(at, s, le);
  });
  return out;
}

describe("decodeTiff(hand-written baseline TIFF)", () => {
  it("decodeTiff(big-endian 32-bit float) reads the IEEE values in file byte order", () => {
    const samples = [-1.5, 0, 3.25, 1e6, -2.75e-3, 42];
    const decoded = decodeTiff(handTiff({ littleEndian: false, width: 3, height: 2, bits: 32, sampleFormat: 3, photometric: 1, samples }));
    expect(Array.from(decoded.data)).toEqual(samples.map((s) => Math.fround(s)));
  });

  it("decodeTiff(8-bit WhiteIsZero) inverts to bright-is-high (TIFF 6.0 §3 PhotometricInterpretation 0)", () => {
    const decoded = decodeTiff(handTiff({ littleEndian: true, width: 2, height: 2, bits: 8, sampleFormat: 1, photometric: 0, samples: [0, 10, 200, 255] }));
    expect(Array.from(decoded.data)).toEqual([255, 245, 55, 0]);
    expect(decoded.warnings.map((w) => w.code)).toContain("white_is_zero_inverted");
  });

  it("decodeTiff(float TIFF containing NaN) throws malformed", () => {
    const bytes = handTiff({ littleEndian: true, width: 2, height: 1, bits: 32, sampleFormat: 3, photometric: 1, samples: [1, Number.NaN] });
    expect(() => decodeTiff(bytes)).toThrowError(expect.objectContaining({ code: "malformed" }));
  });

  it("decodeTiff(IFD entry announcing 2³² − 1 values) throws truncated at once", () => {
    const bytes = handTiff({ littleEndian: true, width: 2, height: 2, bits: 8, sampleFormat: 1, photometric: 1, samples: [1, 2, 3, 4] });
    new DataView(bytes.buffer).setUint32(10 + 4, 0xffffffff, true); // count of the ImageWidth entry
    expect(() => decodeTiff(bytes)).toThrowError(expect.objectContaining({ code: "truncated" }));
  });
});

describe("decodeTiff(damaged or oversized TIFF) throws ImageDecodeError", () => {
  const bytes = load("uint16-tiff_lzw");
  it.each([4, 9, 40, Math.floor(bytes.length / 2), bytes.length - 3])("decodeTiff(file cut after %i bytes) throws truncated or malformed", (cut) => {
    let error: unknown;
    try {
      decodeTiff(bytes.subarray(0, cut));
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(ImageDecodeError);
    expect(["truncated", "malformed"]).toContain((error as ImageDecodeError).code);
  });

  it("decodeTiff(14 × 9 image, maxPixels 100) throws too_many_pixels", () => {
    expect(() => decodeTiff(bytes, { maxPixels: 100 })).toThrowError(expect.objectContaining({ code: "too_many_pixels" }));
  });
});
