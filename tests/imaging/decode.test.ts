import { PNG } from "pngjs";
import { describe, expect, it } from "vitest";
import { decodeImage } from "@/lib/imaging/decode";
import { frameImage, selectFrameForAnalysis, type DecodedImage } from "@/lib/imaging/decoded-image";
import { writeDicom } from "@/lib/imaging/dicom-writer";
import { ImageDecodeError } from "@/lib/imaging/image-decode-error";
import { createRandom } from "@/lib/phantoms/random";

function greyPng(width: number, height: number, values: number[]): Uint8Array {
  const png = new PNG({ width, height, colorType: 0, inputColorType: 0, inputHasAlpha: false });
  png.data = Buffer.from(values);
  return new Uint8Array(PNG.sync.write(png, { colorType: 0, inputColorType: 0, inputHasAlpha: false }));
}

const dicom = writeDicom({ width: 4, height: 3, data: Array.from({ length: 12 }, (_, i) => i), pixelSpacingMm: { x: 0.5, y: 0.25 } }, {
  transferSyntax: "explicit-le", bitsAllocated: 16, signed: false, modality: "OT",
});

describe("decodeImage(bytes, options)", () => {
  it("decodeImage dispatches on content, not names: DICOM, PNG and raw give their formats", () => {
    expect(decodeImage(dicom).format).toBe("dicom");
    expect(decodeImage(greyPng(2, 2, [1, 2, 3, 4])).format).toBe("png");
    expect(decodeImage(new Uint8Array([1, 0, 2, 0]), { raw: { width: 2, height: 1, type: "uint16" } }).format).toBe("raw");
  });

  it("decodeImage(empty or unrecognised bytes) throws not_an_image suggesting --raw for headerless data", () => {
    expect(() => decodeImage(new Uint8Array(0))).toThrowError(expect.objectContaining({ code: "not_an_image" }));
    expect(() => decodeImage(new Uint8Array(500).fill(7))).toThrowError(expect.objectContaining({ code: "not_an_image", message: expect.stringContaining("--raw") }));
  });

  it("decodeImage(DICOM, pixelSpacingMm) replaces the file's spacing, marks the source 'caller' and warns", () => {
    const decoded = decodeImage(dicom, { pixelSpacingMm: { x: 0.1, y: 0.1 } });
    expect(decoded.pixelSpacingMm).toEqual({ x: 0.1, y: 0.1 });
    expect(decoded.pixelSpacingSource).toBe("caller");
    expect(decoded.warnings.map((w) => w.code)).toContain("pixel_spacing_overridden");
  });

  it("decodeImage(PNG, pixelSpacingMm) supplies the missing spacing without a warning", () => {
    const decoded = decodeImage(greyPng(2, 2, [1, 2, 3, 4]), { pixelSpacingMm: { x: 0.2, y: 0.2 } });
    expect(decoded.pixelSpacingMm).toEqual({ x: 0.2, y: 0.2 });
    expect(decoded.warnings).toEqual([]);
  });

  it("decodeImage(…, pixelSpacingMm ≤ 0) throws invalid_options", () => {
    expect(() => decodeImage(dicom, { pixelSpacingMm: { x: 0, y: 0.1 } })).toThrowError(expect.objectContaining({ code: "invalid_options" }));
  });

  it("decodeImage(…, maxPixels) passes the limit to the decoder", () => {
    expect(() => decodeImage(dicom, { maxPixels: 11 })).toThrowError(expect.objectContaining({ code: "too_many_pixels" }));
  });
});

describe("frameImage(decoded, index, override)", () => {
  const volume = decodeImage(writeDicom({ width: 2, height: 2, frames: 3, data: [0, 1, 2, 3, 10, 11, 12, 13, 20, 21, 22, 23], pixelSpacingMm: { x: 0.3, y: 0.4 } }, {
    transferSyntax: "explicit-le", bitsAllocated: 16, signed: false, modality: "NM",
  }));

  it("frameImage(volume, 1) is the second frame, row-major, with the file's spacing", () => {
    const image = frameImage(volume, 1);
    expect(Array.from(image.data)).toEqual([10, 11, 12, 13]);
    expect([image.width, image.height]).toEqual([2, 2]);
    expect(image.pixelSpacingMm).toEqual({ x: 0.3, y: 0.4 });
  });

  it("frameImage(volume, 0, override) uses the override spacing", () => {
    expect(frameImage(volume, 0, { x: 1, y: 2 }).pixelSpacingMm).toEqual({ x: 1, y: 2 });
  });

  it("frameImage(volume, 3 or −1 or 0.5) throws invalid_options naming the valid range", () => {
    for (const index of [3, -1, 0.5]) {
      expect(() => frameImage(volume, index)).toThrowError(expect.objectContaining({ code: "invalid_options", message: expect.stringContaining("0 to 2") }));
    }
  });

  it("frameImage(PNG without spacing) throws missing_pixel_spacing telling how to supply it", () => {
    const png = decodeImage(greyPng(2, 2, [1, 2, 3, 4]));
    let error: unknown;
    try {
      frameImage(png, 0);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(ImageDecodeError);
    expect((error as ImageDecodeError).code).toBe("missing_pixel_spacing");
    expect((error as Error).message).toContain("--pixel-spacing");
    expect((error as Error).message).toContain("pixelSpacingMm");
  });
});

describe("selectFrameForAnalysis(decoded)", () => {
  const make = (frames: number[][]): DecodedImage => ({
    width: frames[0].length, height: 1, frames: frames.length, data: Float64Array.from(frames.flat()),
    pixelSpacingMm: { x: 1, y: 1 }, pixelSpacingSource: "caller", sliceSpacingMm: null, format: "raw",
    transferSyntaxUid: null, photometricInterpretation: null, modality: null, attributes: {}, warnings: [],
  });

  it("selectFrameForAnalysis(single frame) is 0", () => {
    expect(selectFrameForAnalysis(make([[1, 2, 3]]))).toBe(0);
  });

  it("selectFrameForAnalysis(volume with a point source in frame 2 of 5, seeded noise, HU offset) picks frame 2", () => {
    const random = createRandom(17);
    const frames = Array.from({ length: 5 }, (_, f) =>
      Array.from({ length: 64 }, (_, i) => -1000 + 3 * random.normal() + (f === 2 ? 800 * Math.exp(-((i - 30) ** 2) / 8) : f === 1 || f === 3 ? 200 * Math.exp(-((i - 30) ** 2) / 8) : 0)),
    );
    expect(selectFrameForAnalysis(make(frames))).toBe(2);
  });

  it("selectFrameForAnalysis(identical frames) picks the first (ties → lowest index)", () => {
    expect(selectFrameForAnalysis(make([[1, 5, 1], [1, 5, 1], [1, 5, 1]]))).toBe(0);
  });
});
