/**
 * Entry point of lib/imaging: sniff the format from the bytes and dispatch to the right decoder.
 */
import type { PixelSpacingMm } from "../analysis/types";
import { checkPixelSpacing, type DecodedImage } from "./decoded-image";
import { ImageDecodeError } from "./image-decode-error";
import { decodeDicom } from "./dicom";
import { decodePng } from "./png";
import { decodeRaw, type RawOptions } from "./raw";
import { sniffImageFormat } from "./sniff";
import { decodeTiff } from "./tiff";

export interface DecodeImageOptions {
  /** Headerless raw data with this layout; without it the format is detected from the bytes. */
  raw?: RawOptions;
  /** Reject images with more pixels than this (default DEFAULT_MAX_PIXELS). */
  maxPixels?: number;
  /** Pixel spacing to use instead of (or in the absence of) the file's; source becomes "caller". */
  pixelSpacingMm?: PixelSpacingMm;
}

/**
 * Decodes DICOM, PNG, TIFF (detected from the bytes, never the file name) or raw data (when `options.raw` is given).
 * A caller-supplied spacing replaces the file's, with a warning when the file had a different one.
 * @throws ImageDecodeError — "not_an_image" for empty or unrecognised bytes; otherwise the decoders' codes.
 */
export function decodeImage(bytes: Uint8Array, options: DecodeImageOptions = {}): DecodedImage {
  const limits = { maxPixels: options.maxPixels };
  const override = options.pixelSpacingMm ? checkPixelSpacing(options.pixelSpacingMm, "pixel spacing") : undefined;
  let decoded: DecodedImage;
  if (options.raw) {
    decoded = decodeRaw(bytes, options.raw, limits);
  } else {
    if (bytes.length === 0) throw new ImageDecodeError("not_an_image", "the file is empty");
    const format = sniffImageFormat(bytes);
    if (format === "dicom") decoded = decodeDicom(bytes, limits);
    else if (format === "png") decoded = decodePng(bytes, limits);
    else if (format === "tiff") decoded = decodeTiff(bytes, limits);
    else {
      throw new ImageDecodeError(
        "not_an_image",
        "unrecognised file format: expected DICOM, PNG or TIFF (for headerless raw data give its layout, e.g. --raw 512x512:uint16)",
      );
    }
  }
  if (override) {
    const own = decoded.pixelSpacingMm;
    if (own && (Math.abs(own.x - override.x) > 1e-9 * own.x || Math.abs(own.y - override.y) > 1e-9 * own.y)) {
      decoded.warnings.push({
        code: "pixel_spacing_overridden",
        message: `the supplied pixel spacing (${override.y}\\${override.x} mm) replaces the file's ${decoded.pixelSpacingSource} (${own.y}\\${own.x} mm)`,
      });
    }
    decoded.pixelSpacingMm = override;
    decoded.pixelSpacingSource = "caller";
  }
  return decoded;
}
