import type { GrayImage, PixelSpacingMm } from "../analysis/types";
import { ImageDecodeError, type DecodeWarning } from "./image-decode-error";

export { ImageDecodeError } from "./image-decode-error";
export type { DecodeWarning, ImageDecodeErrorCode } from "./image-decode-error";

/** Largest Rows × Columns × Frames a decoder accepts unless the caller says otherwise (≈ 400 MB as Float64). */
export const DEFAULT_MAX_PIXELS = 50_000_000;

export type ImageFormat = "dicom" | "png" | "tiff" | "raw";

/** Where `pixelSpacingMm` came from. */
export type PixelSpacingSource = "PixelSpacing" | "ImagerPixelSpacing" | "caller" | null;

/**
 * A decoded greyscale image or volume, in physical values.
 *
 * - `data` holds frames × height × width samples, row-major: sample (x, y) of frame f is
 *   `data[(f * height + y) * width + x]`.
 * - Values are rescaled to physical units (DICOM Rescale Slope/Intercept applied, e.g. HU for CT) and follow the
 *   MONOCHROME2 convention (bright = high): MONOCHROME1 data are inverted within the stored range (see decodeDicom).
 * - `pixelSpacingMm` is null when the file carries no spacing (PNG, TIFF, raw, some DICOM secondary captures);
 *   `frameImage` then needs the spacing from the caller.
 */
export interface DecodedImage {
  width: number;
  height: number;
  frames: number;
  data: Float64Array;
  pixelSpacingMm: PixelSpacingMm | null;
  pixelSpacingSource: PixelSpacingSource;
  /** Distance between frame centres of a volume, mm (Spacing Between Slices, else Slice Thickness with a warning). */
  sliceSpacingMm: number | null;
  format: ImageFormat;
  transferSyntaxUid: string | null;
  photometricInterpretation: string | null;
  modality: string | null;
  /** Selected header attributes by DICOM keyword (AcquisitionDate, Manufacturer, KVP, SOPInstanceUID …); null when absent. */
  attributes: Record<string, string | number | null>;
  warnings: DecodeWarning[];
}

/**
 * A DecodedImage for a format without a DICOM header (PNG, TIFF, raw): no pixel spacing, transfer syntax,
 * photometric interpretation or modality, so the caller must supply the spacing (see frameImage).
 */
export function headerlessImage(
  fields: Pick<DecodedImage, "width" | "height" | "frames" | "data" | "format" | "attributes" | "warnings">,
): DecodedImage {
  return {
    width: fields.width,
    height: fields.height,
    frames: fields.frames,
    data: fields.data,
    pixelSpacingMm: null,
    pixelSpacingSource: null,
    sliceSpacingMm: null,
    format: fields.format,
    transferSyntaxUid: null,
    photometricInterpretation: null,
    modality: null,
    attributes: fields.attributes,
    warnings: fields.warnings,
  };
}

/** Options shared by every decoder. */
export interface DecodeLimits {
  /** Reject images with more than this many pixels (Rows × Columns × Frames). Default DEFAULT_MAX_PIXELS. */
  maxPixels?: number;
}

/**
 * Throws ImageDecodeError "too_many_pixels" when width × height × frames exceeds the limit. Called by every decoder
 * before it allocates the sample buffer.
 */
export function checkPixelLimit(width: number, height: number, frames: number, maxPixels = DEFAULT_MAX_PIXELS): void {
  const total = width * height * frames;
  if (total > maxPixels) {
    throw new ImageDecodeError(
      "too_many_pixels",
      `image has ${width} × ${height} × ${frames} = ${total} pixels, above the limit of ${maxPixels}; crop the image or analyse a single frame`,
    );
  }
}

/**
 * Throws ImageDecodeError "malformed" when a floating-point image holds NaN or ±Infinity (the analysis needs finite
 * values everywhere).
 */
export function checkFiniteSamples(data: Float64Array, what: string): void {
  for (let i = 0; i < data.length; i++) {
    if (!Number.isFinite(data[i])) {
      throw new ImageDecodeError("malformed", `${what} contains a non-finite value (${data[i]}) at sample ${i}; replace NaN/Infinity before analysis`);
    }
  }
}

/** Throws ImageDecodeError "invalid_options" unless both spacings are finite and > 0. */
export function checkPixelSpacing(spacing: PixelSpacingMm, what: string): PixelSpacingMm {
  if (!(Number.isFinite(spacing.x) && spacing.x > 0 && Number.isFinite(spacing.y) && spacing.y > 0)) {
    throw new ImageDecodeError(
      "invalid_options",
      `${what} must be positive finite numbers in mm, got x = ${spacing.x}, y = ${spacing.y}`,
    );
  }
  return { x: spacing.x, y: spacing.y };
}

/**
 * One frame of a decoded image as the GrayImage the analysis takes.
 *
 * `data` is a view into `decoded.data` (no copy): do not modify it. The spacing is `pixelSpacingOverride` when given,
 * else the file's spacing.
 * @throws ImageDecodeError "invalid_options" for a frame index outside 0 … frames−1 or a non-positive override;
 *   "missing_pixel_spacing" when neither the file nor the caller gives a spacing.
 */
export function frameImage(decoded: DecodedImage, index: number, pixelSpacingOverride?: PixelSpacingMm): GrayImage {
  if (!Number.isInteger(index) || index < 0 || index >= decoded.frames) {
    throw new ImageDecodeError(
      "invalid_options",
      `frame index must be an integer from 0 to ${decoded.frames - 1}, got ${index}`,
    );
  }
  let spacing: PixelSpacingMm;
  if (pixelSpacingOverride) spacing = checkPixelSpacing(pixelSpacingOverride, "pixel spacing");
  else if (decoded.pixelSpacingMm) spacing = decoded.pixelSpacingMm;
  else {
    throw new ImageDecodeError(
      "missing_pixel_spacing",
      `the ${decoded.format.toUpperCase()} image carries no pixel spacing; supply it (CLI: --pixel-spacing <mm>; API: the pixelSpacingMm field)`,
    );
  }
  const size = decoded.width * decoded.height;
  return {
    data: decoded.data.subarray(index * size, (index + 1) * size),
    width: decoded.width,
    height: decoded.height,
    pixelSpacingMm: spacing,
  };
}

/**
 * Index of the frame to analyse when the caller does not name one.
 *
 * Rule: the frame with the largest variance of its values (ties → the lowest index); a single frame → 0.
 * For a point or line source in a volume this is the frame through the source (the peak dominates the variance),
 * for an edge or disk phantom the frame where the object is sharpest / present. Cost: one pass over the data.
 */
export function selectFrameForAnalysis(decoded: DecodedImage): number {
  if (decoded.frames <= 1) return 0;
  const size = decoded.width * decoded.height;
  let best = 0;
  let bestVariance = -Infinity;
  for (let f = 0; f < decoded.frames; f++) {
    const start = f * size;
    // Shifted data (first sample as origin) keeps the one-pass variance accurate for large offsets such as HU.
    const origin = decoded.data[start];
    let sum = 0;
    let sumSq = 0;
    for (let i = start; i < start + size; i++) {
      const d = decoded.data[i] - origin;
      sum += d;
      sumSq += d * d;
    }
    const variance = sumSq / size - (sum / size) ** 2;
    if (variance > bestVariance) {
      bestVariance = variance;
      best = f;
    }
  }
  return best;
}
