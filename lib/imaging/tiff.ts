/**
 * Greyscale TIFF decoding (TIFF 6.0 baseline plus LZW, Deflate, PackBits, horizontal predictor and tiles via utif):
 * one sample per pixel, 8/16-bit unsigned or signed integers, 32-bit integers or IEEE floats. First page only.
 * TIFF resolution tags are print resolutions, so `pixelSpacingMm` is null (the caller supplies the spacing).
 */
import UTIF from "utif";
import { DEFAULT_MAX_PIXELS, checkFiniteSamples, checkPixelLimit, headerlessImage, type DecodeLimits, type DecodedImage } from "./decoded-image";
import { ImageDecodeError, type DecodeWarning } from "./image-decode-error";
import { checkSegments, readFirstIfd, type TiffIfd } from "./tiff-ifd";

/** Compression (259) codes decoded here (TIFF 6.0 §3, §9, §13; Adobe Deflate 8 and its old code 32946). */
const COMPRESSION: Record<number, string> = { 1: "none", 5: "LZW", 8: "Deflate", 32946: "Deflate", 32773: "PackBits" };

const first = (ifd: TiffIfd, tag: number, fallback?: number): number | undefined => ifd[`t${tag}`]?.[0] ?? fallback;

function checkSupported(ifd: TiffIfd, warnings: DecodeWarning[]): { bits: number; format: number; photometric: number } {
  const samples = first(ifd, 277, 1)!;
  const photometric = first(ifd, 262);
  if (samples !== 1 || (photometric !== undefined && photometric > 1)) {
    throw new ImageDecodeError(
      "unsupported_pixel_format",
      `the TIFF image is not greyscale (${samples} samples per pixel, Photometric Interpretation ${photometric}); save it as a single-channel greyscale TIFF`,
    );
  }
  if (photometric === undefined) {
    warnings.push({ code: "photometric_missing", message: "the TIFF has no PhotometricInterpretation tag: read as BlackIsZero" });
  }
  const bits = first(ifd, 258, 1)!;
  const format = first(ifd, 339, 1)!; // SampleFormat: 1 unsigned, 2 signed, 3 IEEE float
  const integerOk = (bits === 8 || bits === 16 || bits === 32) && (format === 1 || format === 2);
  if (!integerOk && !(bits === 32 && format === 3)) {
    throw new ImageDecodeError(
      "unsupported_pixel_format",
      `TIFF samples of ${bits} bits with SampleFormat ${format} are not supported; use 8- or 16-bit integer or 32-bit float greyscale`,
    );
  }
  const compression = first(ifd, 259, 1)!;
  if (!(compression in COMPRESSION)) {
    const lossy = compression === 6 || compression === 7 || compression === 34892;
    throw new ImageDecodeError(
      "unsupported_pixel_format",
      lossy
        ? `the TIFF is JPEG-compressed (Compression ${compression}); lossy compression alters the MTF — save it uncompressed`
        : `TIFF Compression ${compression} is not supported; save it uncompressed, LZW or Deflate`,
    );
  }
  if (first(ifd, 317, 1) === 3) {
    throw new ImageDecodeError("unsupported_pixel_format", "the TIFF floating-point predictor (Predictor 3) is not supported; save without a predictor");
  }
  return { bits, format, photometric: photometric ?? 1 };
}

/**
 * Decodes the first page of a greyscale TIFF.
 * @throws ImageDecodeError "truncated" / "malformed" for damaged files, "too_many_pixels", "unsupported_pixel_format"
 *   for colour, palette, bilevel, JPEG-compressed or otherwise unsupported layouts.
 */
export function decodeTiff(bytes: Uint8Array, options: DecodeLimits = {}): DecodedImage {
  const warnings: DecodeWarning[] = [];
  const { littleEndian, ifd, morePages } = readFirstIfd(bytes);
  const width = first(ifd, 256);
  const height = first(ifd, 257);
  if (!width || !height) throw new ImageDecodeError("malformed", "the TIFF image has no ImageWidth/ImageLength");
  checkPixelLimit(width, height, 1, options.maxPixels ?? DEFAULT_MAX_PIXELS);
  const { bits, format, photometric } = checkSupported(ifd, warnings);
  checkSegments(ifd, bytes.length);
  if (morePages) warnings.push({ code: "tiff_first_page_only", message: "the TIFF has several pages; only the first was read" });

  // utif reads from an ArrayBuffer that must hold exactly the file, starting at offset 0.
  const fileBuffer = bytes.byteOffset === 0 && bytes.byteLength === bytes.buffer.byteLength ? bytes.buffer : new Uint8Array(bytes).buffer;
  const target: Record<string, unknown> = { ...ifd, t262: [photometric] };
  if (first(ifd, 259) === 32946) target.t259 = [8];
  try {
    UTIF.decodeImage(fileBuffer as ArrayBuffer, target);
  } catch (e) {
    throw new ImageDecodeError("malformed", `the TIFF image data cannot be decompressed (${e instanceof Error ? e.message : String(e)})`);
  }
  const raw = target.data as Uint8Array | undefined;
  const bytesPerSample = bits >> 3;
  const n = width * height;
  if (!raw || raw.length < n * bytesPerSample) {
    throw new ImageDecodeError("truncated", `the TIFF image data are incomplete: ${raw?.length ?? 0} bytes decoded, ${n * bytesPerSample} needed`);
  }

  const view = new DataView(raw.buffer, raw.byteOffset, raw.byteLength);
  // utif converts 16-bit samples to little endian; 32-bit samples stay in the file's byte order.
  const le32 = littleEndian;
  const data = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    if (bits === 8) data[i] = format === 2 ? view.getInt8(i) : raw[i];
    else if (bits === 16) data[i] = format === 2 ? view.getInt16(2 * i, true) : view.getUint16(2 * i, true);
    else if (format === 3) data[i] = view.getFloat32(4 * i, le32);
    else data[i] = format === 2 ? view.getInt32(4 * i, le32) : view.getUint32(4 * i, le32);
  }
  if (format === 3) checkFiniteSamples(data, "the TIFF float image");
  if (photometric === 0) {
    // WhiteIsZero (TIFF 6.0 §3): invert so that bright is high.
    const top = format === 1 ? 2 ** bits - 1 : 0;
    for (let i = 0; i < n; i++) data[i] = top - data[i];
    warnings.push({ code: "white_is_zero_inverted", message: "the TIFF is WhiteIsZero; values were inverted so that bright is high" });
  }

  return headerlessImage({
    width,
    height,
    frames: 1,
    data,
    format: "tiff",
    attributes: { BitsStored: bits },
    warnings,
  });
}
