/**
 * Orientation of a straight edge and the working frame of the slanted-edge method: a copy of the analysed region
 * laid out so that frame columns (u) run across the edge and frame rows (v) along it, whatever the edge's
 * orientation in the image.
 */
import { AnalysisError } from "./errors";
import type { GrayImage, Roi } from "./types";

export type EdgeOrientation = "vertical" | "horizontal";

export interface EdgeFrame {
  /** Row-major values, rows × cols: frame (u, v) = data[v·cols + u]. */
  data: Float64Array;
  rows: number;
  cols: number;
  /** "vertical": u = image x, v = image y; "horizontal": u = image y, v = image x. */
  orientation: EdgeOrientation;
  /** Image coordinate (across the edge) of frame column 0, and (along the edge) of frame row 0. */
  acrossOrigin: number;
  alongOrigin: number;
  /** Pixel pitch across / along the edge, mm. */
  acrossPitchMm: number;
  alongPitchMm: number;
  /** Image extent across / along the edge, pixels. */
  imageAcross: number;
  imageAlong: number;
}

/** Largest number of samples per image axis that {@link edgeOrientation} reads (it subsamples larger regions). */
const ORIENTATION_SAMPLES_PER_AXIS = 512;

/**
 * Orientation of the edge inside `roi` from the difference of half-plane means: a vertical edge separates the left
 * and right halves (|mean(right) − mean(left)| ≈ contrast), while the top and bottom halves differ only by the tilt
 * (≤ tan α of the contrast). Noise averages out over the halves. Subsamples large regions. Never throws.
 */
export function edgeOrientation(image: GrayImage, roi: Roi): EdgeOrientation {
  const step = Math.max(1, Math.floor(Math.max(roi.width, roi.height) / ORIENTATION_SAMPLES_PER_AXIS));
  const midX = roi.x + roi.width / 2;
  const midY = roi.y + roi.height / 2;
  let left = 0;
  let right = 0;
  let top = 0;
  let bottom = 0;
  let nLeft = 0;
  let nRight = 0;
  let nTop = 0;
  let nBottom = 0;
  for (let y = roi.y; y < roi.y + roi.height; y += step) {
    const offset = y * image.width;
    const isTop = y + 0.5 < midY;
    for (let x = roi.x; x < roi.x + roi.width; x += step) {
      const value = image.data[offset + x]!;
      if (x + 0.5 < midX) {
        left += value;
        nLeft++;
      } else {
        right += value;
        nRight++;
      }
      if (isTop) {
        top += value;
        nTop++;
      } else {
        bottom += value;
        nBottom++;
      }
    }
  }
  const across = Math.abs(right / Math.max(1, nRight) - left / Math.max(1, nLeft));
  const along = Math.abs(bottom / Math.max(1, nBottom) - top / Math.max(1, nTop));
  return across >= along ? "vertical" : "horizontal";
}

export interface FrameLimits {
  /** Automatic ROI: keep only the central `bandRows` rows along the edge … */
  bandRows?: number;
  /** … and ±`bandHalfCols` columns across it around the steepest step of the band's mean profile. */
  bandHalfCols?: number;
  minAcrossPx: number;
  minAlongPx: number;
}

/**
 * Copies `region` of the image into an {@link EdgeFrame}. With `bandRows`, only the central `bandRows` rows along
 * the edge are kept, and with `bandHalfCols` only the columns within that distance of the steepest step of their
 * mean profile (the automatic ROI; keeps the work independent of the image width).
 * @throws AnalysisError when the frame would be smaller than `minAcrossPx` across or `minAlongPx` along the edge
 */
export function extractEdgeFrame(image: GrayImage, region: Roi, limits: FrameLimits): EdgeFrame {
  const orientation = edgeOrientation(image, region);
  const vertical = orientation === "vertical";
  const acrossExtent = vertical ? region.width : region.height;
  const alongExtent = vertical ? region.height : region.width;
  if (acrossExtent < limits.minAcrossPx) {
    throw new AnalysisError(`edge ROI must be at least ${limits.minAcrossPx} px across the edge, got ${acrossExtent}`);
  }
  if (alongExtent < limits.minAlongPx) {
    throw new AnalysisError(`edge ROI must be at least ${limits.minAlongPx} px along the edge, got ${alongExtent}`);
  }
  const rows = limits.bandRows ? Math.min(limits.bandRows, alongExtent) : alongExtent;
  const alongOrigin = (vertical ? region.y : region.x) + Math.floor((alongExtent - rows) / 2);
  let acrossOrigin = vertical ? region.x : region.y;
  let cols = acrossExtent;
  if (limits.bandHalfCols !== undefined && 2 * limits.bandHalfCols + 1 < cols) {
    const step = edgeCentreColumn(image, vertical, acrossOrigin, cols, alongOrigin, rows, limits.bandHalfCols);
    const start = Math.min(Math.max(0, step - limits.bandHalfCols), cols - (2 * limits.bandHalfCols + 1));
    acrossOrigin += start;
    cols = 2 * limits.bandHalfCols + 1;
  }
  const data = new Float64Array(rows * cols);
  const w = image.width;
  if (vertical) {
    for (let v = 0; v < rows; v++) {
      const src = (alongOrigin + v) * w + acrossOrigin;
      data.set(image.data.subarray(src, src + cols), v * cols);
    }
  } else {
    for (let u = 0; u < cols; u++) {
      const src = (acrossOrigin + u) * w + alongOrigin;
      for (let v = 0; v < rows; v++) data[v * cols + u] = image.data[src + v]!;
    }
  }
  return {
    data,
    rows,
    cols,
    orientation,
    acrossOrigin,
    alongOrigin,
    acrossPitchMm: vertical ? image.pixelSpacingMm.x : image.pixelSpacingMm.y,
    alongPitchMm: vertical ? image.pixelSpacingMm.y : image.pixelSpacingMm.x,
    imageAcross: vertical ? image.width : image.height,
    imageAlong: vertical ? image.height : image.width,
  };
}

/**
 * Rough edge column (0 … cols−1, relative to acrossOrigin) on the mean profile across the edge of the band (every
 * ⌈rows/64⌉-th row): the largest |difference| of the 9-px moving averages either side locates the step; a tilted edge
 * makes the mean profile a ramp whose every point steps alike, so the result is the centroid of |derivative| (minus
 * its median, the noise floor) within ±reach of that point.
 */
function edgeCentreColumn(
  image: GrayImage,
  vertical: boolean,
  acrossOrigin: number,
  cols: number,
  alongOrigin: number,
  rows: number,
  reach: number,
): number {
  const mean = new Float64Array(cols);
  const w = image.width;
  const rowStep = Math.max(1, Math.floor(rows / 64));
  for (let v = 0; v < rows; v += rowStep) {
    for (let u = 0; u < cols; u++) {
      mean[u] += vertical ? image.data[(alongOrigin + v) * w + acrossOrigin + u]! : image.data[(acrossOrigin + u) * w + alongOrigin + v]!;
    }
  }
  const h = 9;
  let best = cols >> 1;
  let bestStep = -1;
  let left = 0;
  let right = 0;
  for (let u = 0; u < h; u++) left += mean[u]!;
  for (let u = h; u < 2 * h && u < cols; u++) right += mean[u]!;
  for (let u = h; u + h <= cols; u++) {
    const step = Math.abs(right - left);
    if (step > bestStep) {
      bestStep = step;
      best = u;
    }
    if (u + h >= cols) break;
    left += mean[u]! - mean[u - h]!;
    right += mean[u + h]! - mean[u]!;
  }
  const lo = Math.max(1, best - reach);
  const hi = Math.min(cols - 2, best + reach);
  const slope = new Float64Array(hi - lo + 1);
  for (let u = lo; u <= hi; u++) slope[u - lo] = Math.abs(mean[u + 1]! - mean[u - 1]!);
  const floor = slope.slice().sort()[slope.length >> 1]!;
  let weight = 0;
  let moment = 0;
  for (let u = lo; u <= hi; u++) {
    const w = Math.max(0, slope[u - lo]! - floor);
    weight += w;
    moment += w * u;
  }
  return weight > 0 ? Math.round(moment / weight) : best;
}

/** Image-coordinate ROI of frame columns [u0, u1] and rows [v0, v1] (inclusive). */
export function frameRegionToRoi(frame: EdgeFrame, u0: number, u1: number, v0: number, v1: number): Roi {
  const across = { start: frame.acrossOrigin + u0, size: u1 - u0 + 1 };
  const along = { start: frame.alongOrigin + v0, size: v1 - v0 + 1 };
  return frame.orientation === "vertical"
    ? { x: across.start, y: along.start, width: across.size, height: along.size }
    : { x: along.start, y: across.start, width: along.size, height: across.size };
}
