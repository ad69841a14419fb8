import { describe, expect, it } from "vitest";
import { decodeRaw, parseRawSpec, RAW_SAMPLE_TYPES, type RawSampleType } from "@/lib/imaging/raw";

/** Reference encoding with Node's Buffer writers (independent of the DataView reads in decodeRaw). */
function encode(values: number[], type: RawSampleType, littleEndian = true): Uint8Array {
  const size = { uint8: 1, uint16: 2, int16: 2, uint32: 4, int32: 4, float32: 4, float64: 8 }[type];
  const buf = Buffer.alloc(values.length * size);
  const suffix = littleEndian ? "LE" : "BE";
  values.forEach((v, i) => {
    const o = i * size;
    if (type === "uint8") buf.writeUInt8(v, o);
    else if (type === "uint16") buf[`writeUInt16${suffix}`](v, o);
    else if (type === "int16") buf[`writeInt16${suffix}`](v, o);
    else if (type === "uint32") buf[`writeUInt32${suffix}`](v, o);
    else if (type === "int32") buf[`writeInt32${suffix}`](v, o);
    else if (type === "float32") buf[`writeFloat${suffix}`](v, o);
    else buf[`writeDouble${suffix}`](v, o);
  });
  return new Uint8Array(buf);
}

const SAMPLES: Record<RawSampleType, number[]> = {
  uint8: [0, 1, 127, 255, 3, 9],
  uint16: [0, 1, 65535, 32768, 1234, 9],
  int16: [-32768, -1, 0, 1, 32767, -1234],
  uint32: [0, 1, 4294967295, 2147483648, 5, 6],
  int32: [-2147483648, -1, 0, 1, 2147483647, 7],
  float32: [Math.fround(-1.5), 0, Math.fround(3.1), Math.fround(1e30), Math.fround(-2e-5), 8],
  float64: [-1.5, 0, Math.PI, 1e300, -2e-300, 8],
};

describe("decodeRaw(bytes, layout)", () => {
  it.each(RAW_SAMPLE_TYPES)("decodeRaw(%s little endian, 3 × 2) returns the encoded values row-major", (type) => {
    const decoded = decodeRaw(encode(SAMPLES[type], type), { width: 3, height: 2, type });
    expect(Array.from(decoded.data)).toEqual(SAMPLES[type]);
    expect([decoded.width, decoded.height, decoded.frames, decoded.format]).toEqual([3, 2, 1, "raw"]);
    expect(decoded.pixelSpacingMm).toBeNull();
  });

  it("decodeRaw(int16 big endian, 3 frames of 1 × 2) honours littleEndian false and frames", () => {
    const values = [-1, 2, -3, 4, -5, 6];
    const decoded = decodeRaw(encode(values, "int16", false), { width: 1, height: 2, frames: 3, type: "int16", littleEndian: false });
    expect(Array.from(decoded.data)).toEqual(values);
    expect(decoded.frames).toBe(3);
  });

  it("decodeRaw(byte length ≠ width × height × frames × size) throws size_mismatch naming both sizes", () => {
    expect(() => decodeRaw(new Uint8Array(10), { width: 3, height: 2, type: "uint16" })).toThrowError(
      expect.objectContaining({ code: "size_mismatch", message: expect.stringContaining("need 12") }),
    );
  });

  it("decodeRaw(zero width, unknown type, too many pixels, NaN) throws the matching code", () => {
    expect(() => decodeRaw(new Uint8Array(0), { width: 0, height: 2, type: "uint8" })).toThrowError(expect.objectContaining({ code: "invalid_options" }));
    expect(() => decodeRaw(new Uint8Array(4), { width: 2, height: 2, type: "uint12" as RawSampleType })).toThrowError(expect.objectContaining({ code: "invalid_options" }));
    expect(() => decodeRaw(new Uint8Array(4), { width: 2, height: 2, type: "uint8" }, { maxPixels: 3 })).toThrowError(expect.objectContaining({ code: "too_many_pixels" }));
    expect(() => decodeRaw(encode([1, Number.NaN], "float32"), { width: 2, height: 1, type: "float32" })).toThrowError(expect.objectContaining({ code: "malformed" }));
  });
});

describe("parseRawSpec(text)", () => {
  it("parseRawSpec('512x256:uint16') and '4x3x2:float32' give the layout", () => {
    expect(parseRawSpec("512x256:uint16")).toEqual({ width: 512, height: 256, frames: 1, type: "uint16" });
    expect(parseRawSpec("4x3x2:float32")).toEqual({ width: 4, height: 3, frames: 2, type: "float32" });
  });

  it.each(["512:uint16", "512x512", "512x512:int64", "axb:uint8"])("parseRawSpec(%s) throws invalid_options", (spec) => {
    expect(() => parseRawSpec(spec)).toThrowError(expect.objectContaining({ code: "invalid_options" }));
  });
});
