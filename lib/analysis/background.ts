/**
 * Background level and noise of an ROI, estimated from a strip of pixels along its border (away from the object at
 * its centre). Two estimators: mean and sample standard deviation, or the robust median and 1.4826 × the median
 * absolute deviation (MAD), which is the SD for normal noise and ignores a few object pixels that reach the border
 * (Hampel 1974; Rousseeuw & Croux, JASA 1993).
 */
import { AnalysisError } from "./errors";
import { medianInPlace } from "./order-statistics";
import type { GrayImage, Roi } from "./types";

export type BackgroundEstimator = "mean" | "median";

/** Which sides of the ROI contribute border strips. */
export interface BorderSides {
  top: boolean;
  bottom: boolean;
  left: boolean;
  right: boolean;
}

export interface BackgroundOptions {
  /** Thickness of the border strip, pixels. */
  borderWidthPx: number;
  estimator: BackgroundEstimator;
  sides: BorderSides;
}

/** Defaults of {@link measureBackground}: a 3-pixel strip on all four sides, median/MAD. */
export const BACKGROUND_DEFAULTS: BackgroundOptions = {
  borderWidthPx: 3,
  estimator: "median",
  sides: { top: true, bottom: true, left: true, right: true },
};

/** 1/Φ⁻¹(3/4): scales the MAD to the standard deviation for normally distributed noise. */
const MAD_TO_SD = 1.482602218505602;

export interface Background {
  /** Background level, image units. */
  level: number;
  /** Noise standard deviation (SD or 1.4826·MAD), image units. */
  noiseSd: number;
  /** Number of border pixels used. */
  pixelCount: number;
  estimator: BackgroundEstimator;
}

/** Checks that the ROI has integer bounds inside the image; throws AnalysisError naming the offending value. */
export function assertRoiInImage(image: GrayImage, roi: Roi): void {
  const { x, y, width, height } = roi;
  if (![x, y, width, height].every(Number.isInteger)) {
    throw new AnalysisError(`ROI bounds must be integers, got x=${x} y=${y} width=${width} height=${height}`);
  }
  if (width < 1 || height < 1 || x < 0 || y < 0 || x + width > image.width || y + height > image.height) {
    throw new AnalysisError(
      `ROI ${width}×${height} at (${x}, ${y}) does not lie inside the ${image.width}×${image.height} image`,
    );
  }
}

/**
 * Background level and noise from the border strip of `roi` (default: the whole image).
 *
 * @param image row-major frame; values in image units.
 * @param roi rectangle in frame pixel coordinates (integers, inside the image).
 * @param options partial {@link BackgroundOptions}; defaults in {@link BACKGROUND_DEFAULTS}.
 * @throws AnalysisError when the ROI is outside the image, the strip is thicker than a third of the ROI's width or
 *   height (it would reach the object), no side is selected, or fewer than 8 border pixels remain.
 */
export function measureBackground(
  image: GrayImage,
  roi: Roi = { x: 0, y: 0, width: image.width, height: image.height },
  options: Partial<BackgroundOptions> = {},
): Background {
  const { borderWidthPx: b, estimator, sides } = { ...BACKGROUND_DEFAULTS, ...options };
  assertRoiInImage(image, roi);
  if (!Number.isInteger(b) || b < 1) throw new AnalysisError(`background border width must be an integer ≥ 1, got ${b}`);
  if (3 * b > Math.min(roi.width, roi.height)) {
    throw new AnalysisError(
      `background border of ${b} px needs an ROI at least ${3 * b} px on each side, got ${roi.width}×${roi.height}`,
    );
  }
  if (!sides.top && !sides.bottom && !sides.left && !sides.right) {
    throw new AnalysisError("background estimate needs at least one ROI side");
  }

  const values = collectBorder(image, roi, b, sides);
  if (values.length < 8) throw new AnalysisError(`background estimate needs at least 8 border pixels, got ${values.length}`);

  if (estimator === "mean") {
    let sum = 0;
    for (let i = 0; i < values.length; i++) sum += values[i]!;
    const mean = sum / values.length;
    let squares = 0;
    for (let i = 0; i < values.length; i++) squares += (values[i]! - mean) ** 2;
    return { level: mean, noiseSd: Math.sqrt(squares / (values.length - 1)), pixelCount: values.length, estimator };
  }
  const median = medianInPlace(values);
  for (let i = 0; i < values.length; i++) values[i] = Math.abs(values[i]! - median);
  return { level: median, noiseSd: MAD_TO_SD * medianInPlace(values), pixelCount: values.length, estimator };
}

/** Pixels of the border strip on the chosen sides, each pixel once (corners are not counted twice). */
function collectBorder(image: GrayImage, roi: Roi, b: number, sides: BorderSides): Float64Array {
  const out = new Float64Array(2 * b * (roi.width + roi.height));
  let count = 0;
  for (let row = 0; row < roi.height; row++) {
    const offset = (roi.y + row) * image.width + roi.x;
    if ((sides.top && row < b) || (sides.bottom && row >= roi.height - b)) {
      for (let col = 0; col < roi.width; col++) out[count++] = image.data[offset + col]!;
      continue;
    }
    if (sides.left) for (let col = 0; col < b; col++) out[count++] = image.data[offset + col]!;
    if (sides.right) for (let col = roi.width - b; col < roi.width; col++) out[count++] = image.data[offset + col]!;
  }
  return out.subarray(0, count);
}
