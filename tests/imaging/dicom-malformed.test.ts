import { describe, expect, it } from "vitest";
import { decodeDicom } from "@/lib/imaging/dicom";
import { writeDicom } from "@/lib/imaging/dicom-writer";
import { ImageDecodeError } from "@/lib/imaging/image-decode-error";
import { createRandom } from "@/lib/phantoms/random";

function codeOf(run: () => unknown): string {
  try {
    run();
  } catch (e) {
    if (!(e instanceof ImageDecodeError)) throw new Error(`expected ImageDecodeError, got ${String(e)}`);
    expect(e.message.length).toBeGreaterThan(20); // a sentence, not a bare code
    return e.code;
  }
  throw new Error("expected an ImageDecodeError, nothing was thrown");
}

const image = (width = 64, height = 48, frames = 1) => ({
  width,
  height,
  frames,
  data: Float64Array.from({ length: width * height * frames }, (_, i) => (i * 7919) % 4096),
  pixelSpacingMm: { x: 0.2, y: 0.2 },
});
const file = writeDicom(image(), { transferSyntax: "explicit-le", bitsAllocated: 16, signed: false, modality: "OT" });

/** Offset of the Pixel Data value: the last element of writer output (explicit VR, 12-byte header). */
const pixelValueOffset = (bytes: Uint8Array, pixelBytes: number) => bytes.length - pixelBytes;

describe("decodeDicom(malformed input) throws a typed ImageDecodeError and never hangs", () => {
  it.each([0, 100, 131, 140, 200, 400, Math.floor(file.length / 2), file.length - 1])(
    "decodeDicom(writer output cut after %i bytes) throws truncated or not_an_image",
    (cut) => {
      const code = codeOf(() => decodeDicom(file.subarray(0, cut)));
      // Before byte 132 the "DICM" marker is missing, so the bytes are no longer recognisable as DICOM (PS3.10 §7.1).
      expect(cut < 132 ? ["not_an_image"] : ["truncated"]).toContain(code);
    },
  );

  it("decodeDicom(seeded random bytes) throws not_an_image", () => {
    const random = createRandom(99);
    for (let trial = 0; trial < 20; trial++) {
      const bytes = Uint8Array.from({ length: 64 + trial * 97 }, () => Math.floor(256 * random.uniform()));
      expect(codeOf(() => decodeDicom(bytes))).toBe("not_an_image");
    }
  });

  it("decodeDicom(DICM marker followed by seeded random bytes) throws truncated or malformed", () => {
    const random = createRandom(100);
    for (let trial = 0; trial < 20; trial++) {
      const bytes = Uint8Array.from({ length: 400 + trial * 53 }, () => Math.floor(256 * random.uniform()));
      bytes.set([0x44, 0x49, 0x43, 0x4d], 128);
      expect(["truncated", "malformed", "unsupported_transfer_syntax"]).toContain(codeOf(() => decodeDicom(bytes)));
    }
  });

  it("decodeDicom(file without Pixel Data) throws no_pixel_data", () => {
    // Cut the file just before the Pixel Data element: a complete data set without (7FE0,0010).
    const withoutPixels = file.subarray(0, pixelValueOffset(file, 64 * 48 * 2) - 12);
    expect(codeOf(() => decodeDicom(withoutPixels))).toBe("no_pixel_data");
  });

  it("decodeDicom(Rows × Columns larger than the Pixel Data) throws size_mismatch", () => {
    // Same pixel bytes, header claims 50 rows instead of 48: Rows (0028,0010) patched in place.
    const patched = writeDicom(image(64, 50), { transferSyntax: "explicit-le", bitsAllocated: 16, signed: false, modality: "OT" });
    const bytes = new Uint8Array([...patched.subarray(0, patched.length - 64 * 50 * 2 - 12), ...file.subarray(file.length - 64 * 48 * 2 - 12)]);
    expect(codeOf(() => decodeDicom(bytes))).toBe("size_mismatch");
  });

  it("decodeDicom(Pixel Data with room for more frames than Number of Frames) throws size_mismatch", () => {
    const three = writeDicom(image(64, 48, 3), { transferSyntax: "explicit-le", bitsAllocated: 16, signed: false, modality: "OT" });
    const oneHeader = file.subarray(0, file.length - 64 * 48 * 2 - 12);
    const bytes = new Uint8Array([...oneHeader, ...three.subarray(three.length - 64 * 48 * 3 * 2 - 12)]);
    expect(codeOf(() => decodeDicom(bytes))).toBe("size_mismatch");
  });

  it("decodeDicom(image above maxPixels) throws too_many_pixels before decoding", () => {
    expect(codeOf(() => decodeDicom(file, { maxPixels: 64 * 48 - 1 }))).toBe("too_many_pixels");
    expect(decodeDicom(file, { maxPixels: 64 * 48 }).width).toBe(64);
  });

  it("decodeDicom(unsupported transfer syntax UID in the meta header) names the syntax", () => {
    // Replace Explicit VR LE "1.2.840.10008.1.2.1\0" with JPEG-LS "1.2.840.10008.1.2.4.80" would change lengths;
    // RLE Lossless "1.2.840.10008.1.2.5\0" has the same 20-byte length.
    const text = new TextDecoder("latin1").decode(file);
    const at = text.indexOf("1.2.840.10008.1.2.1\0");
    const bytes = file.slice();
    bytes.set(new TextEncoder().encode("1.2.840.10008.1.2.5\0"), at);
    let message = "";
    try {
      decodeDicom(bytes);
    } catch (e) {
      message = (e as Error).message;
      expect((e as ImageDecodeError).code).toBe("unsupported_transfer_syntax");
    }
    expect(message).toContain("RLE Lossless (1.2.840.10008.1.2.5)");
    expect(message).toContain("uncompressed");
  });
});

describe("decodeDicom pixel-cell rules (PS3.5 §8.1.1, PS3.3 C.7.6.3.1)", () => {
  it("decodeDicom(12 of 16 bits stored, garbage in the top 4 bits) ignores the unused bits", () => {
    const values = Float64Array.from({ length: 16 }, (_, i) => i * 250);
    const bytes = writeDicom({ width: 4, height: 4, data: values, pixelSpacingMm: { x: 1, y: 1 } }, {
      transferSyntax: "explicit-le", bitsAllocated: 16, bitsStored: 12, signed: false, modality: "OT",
    });
    const start = pixelValueOffset(bytes, 32);
    for (let i = 0; i < 16; i++) bytes[start + 2 * i + 1] |= 0xf0; // set bits 12–15 (old overlay bits)
    expect(Array.from(decodeDicom(bytes).data)).toEqual(Array.from(values));
  });

  it("decodeDicom(signed 12 of 16 bits, sign bit 11 set, top bits zero) sign-extends from bit 11", () => {
    const bytes = writeDicom({ width: 2, height: 1, data: [-1, -2048], pixelSpacingMm: { x: 1, y: 1 } }, {
      transferSyntax: "explicit-le", bitsAllocated: 16, bitsStored: 12, signed: true, modality: "OT",
    });
    const start = pixelValueOffset(bytes, 4);
    for (let i = 0; i < 2; i++) bytes[start + 2 * i + 1] &= 0x0f; // clear bits 12–15: only the 12-bit pattern remains
    // 0xFFF and 0x800 in 12-bit two's complement are −1 and −2048.
    expect(Array.from(decodeDicom(bytes).data)).toEqual([-1, -2048]);
  });
});

describe("decodeDicom header rules", () => {
  it("decodeDicom(Imager Pixel Spacing only) uses it and warns that it is at the detector plane", () => {
    const bytes = writeDicom({ ...image(8, 8), pixelSpacingMm: { x: 0.139, y: 0.14 } }, {
      transferSyntax: "explicit-le", bitsAllocated: 16, signed: false, modality: "DX", useImagerPixelSpacing: true,
      attributes: { EstimatedRadiographicMagnificationFactor: 1.08 },
    });
    const decoded = decodeDicom(bytes);
    expect(decoded.pixelSpacingMm).toEqual({ x: 0.139, y: 0.14 });
    expect(decoded.pixelSpacingSource).toBe("ImagerPixelSpacing");
    const warning = decoded.warnings.find((w) => w.code === "imager_pixel_spacing");
    expect(warning?.message).toContain("detector");
    expect(warning?.message).toContain("1.08");
  });

  it("decodeDicom(multi-frame without Spacing Between Slices) falls back to Slice Thickness with a warning", () => {
    const bytes = writeDicom(image(8, 8, 3), {
      transferSyntax: "explicit-le", bitsAllocated: 16, signed: false, modality: "NM", attributes: { SliceThickness: 2.5 },
    });
    const decoded = decodeDicom(bytes);
    expect(decoded.sliceSpacingMm).toBe(2.5);
    expect(decoded.warnings.map((w) => w.code)).toContain("slice_spacing_from_thickness");
    const withSpacing = decodeDicom(writeDicom({ ...image(8, 8, 3), sliceSpacingMm: 3.27 }, {
      transferSyntax: "explicit-le", bitsAllocated: 16, signed: false, modality: "NM", attributes: { SliceThickness: 2.5 },
    }));
    expect(withSpacing.sliceSpacingMm).toBe(3.27);
    expect(withSpacing.warnings.map((w) => w.code)).not.toContain("slice_spacing_from_thickness");
  });

  it("decodeDicom(file without pixel spacing) returns pixelSpacingMm null", () => {
    const decoded = decodeDicom(writeDicom({ ...image(8, 8), pixelSpacingMm: null }, {
      transferSyntax: "implicit-le", bitsAllocated: 8, signed: false, modality: "OT",
    }));
    expect(decoded.pixelSpacingMm).toBeNull();
    expect(decoded.pixelSpacingSource).toBeNull();
  });

  it.each(["implicit-le", "explicit-le", "explicit-be"] as const)("decodeDicom(bare %s data set without File Meta) infers the syntax and warns", (transferSyntax) => {
    const full = writeDicom(image(6, 5), { transferSyntax, bitsAllocated: 16, signed: false, modality: "OT" });
    const groupLength = new DataView(full.buffer).getUint32(140, true); // (0002,0000) value, PS3.10 §7.1
    const decoded = decodeDicom(full.subarray(132 + 12 + groupLength));
    expect(Array.from(decoded.data)).toEqual(Array.from(image(6, 5).data));
    expect(decoded.transferSyntaxUid).toBe({ "implicit-le": "1.2.840.10008.1.2", "explicit-le": "1.2.840.10008.1.2.1", "explicit-be": "1.2.840.10008.1.2.2" }[transferSyntax]);
    expect(decoded.warnings.map((w) => w.code)).toContain("no_file_meta");
  });

  it("decodeDicom(Part 10 file with the 128-byte preamble and DICM removed) still reads it", () => {
    const decoded = decodeDicom(file.subarray(132));
    expect(decoded.width).toBe(64);
    expect(Array.from(decoded.data.subarray(0, 5))).toEqual(Array.from(image().data.subarray(0, 5)));
  });
});

describe("decodeDicom(corrupted files) never throws anything but ImageDecodeError", () => {
  const small = writeDicom(image(16, 12, 2), { transferSyntax: "explicit-le", bitsAllocated: 16, signed: true, modality: "CT", attributes: { KVP: 120 } });

  it("decodeDicom(every cut point in steps of 7 bytes) throws not_an_image, truncated or no_pixel_data", () => {
    for (let cut = 0; cut < small.length; cut += 7) {
      // A cut that falls exactly between two elements before Pixel Data leaves a complete data set without pixels.
      expect(["not_an_image", "truncated", "no_pixel_data"], `cut at ${cut}`).toContain(codeOf(() => decodeDicom(small.subarray(0, cut))));
    }
  });

  it("decodeDicom(seeded random byte changes in the header) decodes or throws ImageDecodeError", () => {
    const random = createRandom(4242);
    const headerEnd = small.length - 16 * 12 * 2 * 2;
    for (let trial = 0; trial < 300; trial++) {
      const bytes = small.slice();
      for (let k = 0; k < 3; k++) bytes[132 + Math.floor(random.uniform() * (headerEnd - 132))] = Math.floor(256 * random.uniform());
      try {
        decodeDicom(bytes);
      } catch (e) {
        if (!(e instanceof ImageDecodeError)) throw new Error(`trial ${trial}: ${String(e)}`);
      }
    }
  });
});
