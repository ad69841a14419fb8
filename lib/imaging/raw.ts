/**
 * Headerless raw images: frames × height × width samples, row-major, little endian unless told otherwise. The caller
 * gives the layout; the byte length must match it exactly.
 */
import { DEFAULT_MAX_PIXELS, checkFiniteSamples, checkPixelLimit, headerlessImage, type DecodeLimits, type DecodedImage } from "./decoded-image";
import { ImageDecodeError } from "./image-decode-error";

export type RawSampleType = "uint8" | "uint16" | "int16" | "uint32" | "int32" | "float32" | "float64";

export const RAW_SAMPLE_TYPES: readonly RawSampleType[] = ["uint8", "uint16", "int16", "uint32", "int32", "float32", "float64"];

const BYTES_PER_SAMPLE: Record<RawSampleType, number> = {
  uint8: 1, uint16: 2, int16: 2, uint32: 4, int32: 4, float32: 4, float64: 8,
};

export interface RawOptions {
  width: number;
  height: number;
  /** Default 1. */
  frames?: number;
  type: RawSampleType;
  /** Default true. */
  littleEndian?: boolean;
}

/**
 * Parses the CLI form "WIDTHxHEIGHT:type" or "WIDTHxHEIGHTxFRAMES:type", e.g. "512x512:uint16".
 * @throws ImageDecodeError "invalid_options" for any other form.
 */
export function parseRawSpec(spec: string): RawOptions {
  const m = /^(\d+)x(\d+)(?:x(\d+))?:([a-z0-9]+)$/.exec(spec.trim());
  if (!m || !RAW_SAMPLE_TYPES.includes(m[4] as RawSampleType)) {
    throw new ImageDecodeError(
      "invalid_options",
      `raw layout must look like WIDTHxHEIGHT:type or WIDTHxHEIGHTxFRAMES:type with type one of ${RAW_SAMPLE_TYPES.join(", ")}; got "${spec}"`,
    );
  }
  return { width: Number(m[1]), height: Number(m[2]), frames: m[3] ? Number(m[3]) : 1, type: m[4] as RawSampleType };
}

/**
 * Decodes raw samples. Values are taken as they are (no rescale), pixelSpacingMm is null.
 * @throws ImageDecodeError "invalid_options" for non-positive sizes or an unknown type, "too_many_pixels",
 *   "size_mismatch" when the byte length is not width × height × frames × bytes per sample, "malformed" for NaN or
 *   infinite float samples.
 */
export function decodeRaw(bytes: Uint8Array, raw: RawOptions, options: DecodeLimits = {}): DecodedImage {
  const frames = raw.frames ?? 1;
  for (const [name, v] of [["width", raw.width], ["height", raw.height], ["frames", frames]] as const) {
    if (!(Number.isInteger(v) && v >= 1)) throw new ImageDecodeError("invalid_options", `raw ${name} must be a positive integer, got ${v}`);
  }
  const size = BYTES_PER_SAMPLE[raw.type];
  if (!size) throw new ImageDecodeError("invalid_options", `raw type must be one of ${RAW_SAMPLE_TYPES.join(", ")}, got "${raw.type}"`);
  checkPixelLimit(raw.width, raw.height, frames, options.maxPixels ?? DEFAULT_MAX_PIXELS);
  const n = raw.width * raw.height * frames;
  if (bytes.length !== n * size) {
    throw new ImageDecodeError(
      "size_mismatch",
      `raw data has ${bytes.length} bytes but ${raw.width} × ${raw.height} × ${frames} ${raw.type} samples need ${n * size}; check the raw layout`,
    );
  }
  const le = raw.littleEndian ?? true;
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const data = new Float64Array(n);
  const read: (i: number) => number = {
    uint8: (i: number) => view.getUint8(i),
    uint16: (i: number) => view.getUint16(2 * i, le),
    int16: (i: number) => view.getInt16(2 * i, le),
    uint32: (i: number) => view.getUint32(4 * i, le),
    int32: (i: number) => view.getInt32(4 * i, le),
    float32: (i: number) => view.getFloat32(4 * i, le),
    float64: (i: number) => view.getFloat64(8 * i, le),
  }[raw.type];
  for (let i = 0; i < n; i++) data[i] = read(i);
  if (raw.type.startsWith("float")) checkFiniteSamples(data, "the raw float image");

  return headerlessImage({
    width: raw.width,
    height: raw.height,
    frames,
    data,
    format: "raw",
    attributes: {},
    warnings: [],
  });
}
