/**
 * Finding a point source and choosing the ROI around it.
 * - Detection: the maximum of the 3×3 box-smoothed image (a lone noise spike does not win against a real source).
 * - Rough width: walk from that pixel along its row and column to half of the peak above the background.
 * - Sub-pixel centre: centroid of the pixels above a fraction of the peak, weighted by their excess over that
 *   threshold (the weights fall to zero at the cut, which keeps the centroid stable against sub-pixel shifts), in a
 *   window of ±max(2, rough FWHM) px; the window is recentred and the centroid recomputed (common practice).
 */
import { AnalysisError } from "./errors";
import { assertRoiInImage, measureBackground, type Background } from "./background";
import type { GrayImage, Roi } from "./types";

export interface LocateOptions {
  /** Pixels above this fraction of the peak (above background) enter the centroid. */
  thresholdFraction: number;
  /** Centroid passes, each recentring the window. */
  refinementPasses: number;
}

/** Defaults of {@link locatePointSource}. */
export const LOCATE_DEFAULTS: LocateOptions = { thresholdFraction: 0.5, refinementPasses: 2 };

export interface LocatedSource {
  /** Sub-pixel centre, frame pixel coordinates. */
  centreXPx: number;
  centreYPx: number;
  /** Pixel with the largest 3×3 mean. */
  peakPixelX: number;
  peakPixelY: number;
  /** Largest raw value in the centroid window, image units. */
  peakValue: number;
  /** Background of the search region's border (median/MAD), used for detection only. */
  background: Background;
  /** Rough FWHM along x and y from the half-maximum walk, pixels (≥ 1). */
  roughFwhmXPx: number;
  roughFwhmYPx: number;
}

/**
 * Locates the brightest compact object in `searchRoi`.
 * @param image row-major frame.
 * @param searchRoi region searched (default the whole image); its border gives the detection background.
 * @throws AnalysisError when the search ROI is outside the image or smaller than 9×9 pixels.
 */
export function locatePointSource(
  image: GrayImage,
  searchRoi: Roi = { x: 0, y: 0, width: image.width, height: image.height },
  options: Partial<LocateOptions> = {},
): LocatedSource {
  const { thresholdFraction, refinementPasses } = { ...LOCATE_DEFAULTS, ...options };
  assertRoiInImage(image, searchRoi);
  if (searchRoi.width < 9 || searchRoi.height < 9) {
    throw new AnalysisError(`point-source search region must be at least 9×9 px, got ${searchRoi.width}×${searchRoi.height}`);
  }
  const background = measureBackground(image, searchRoi);
  const { x: peakPixelX, y: peakPixelY } = argmaxOfBoxMean(image, searchRoi);
  const value = (x: number, y: number): number => image.data[y * image.width + x]! - background.level;

  const peakAbove = value(peakPixelX, peakPixelY);
  const roughFwhmXPx = roughWidth(peakAbove, (i) => value(peakPixelX + i, peakPixelY), peakPixelX - searchRoi.x, searchRoi.x + searchRoi.width - 1 - peakPixelX);
  const roughFwhmYPx = roughWidth(peakAbove, (i) => value(peakPixelX, peakPixelY + i), peakPixelY - searchRoi.y, searchRoi.y + searchRoi.height - 1 - peakPixelY);

  const half = Math.max(2, Math.ceil(Math.max(roughFwhmXPx, roughFwhmYPx)));
  let centreX = peakPixelX;
  let centreY = peakPixelY;
  let peakValue = image.data[peakPixelY * image.width + peakPixelX]!;
  for (let pass = 0; pass < refinementPasses; pass++) {
    const x0 = Math.max(searchRoi.x, Math.round(centreX) - half);
    const x1 = Math.min(searchRoi.x + searchRoi.width - 1, Math.round(centreX) + half);
    const y0 = Math.max(searchRoi.y, Math.round(centreY) - half);
    const y1 = Math.min(searchRoi.y + searchRoi.height - 1, Math.round(centreY) + half);
    let maxAbove = -Infinity;
    for (let y = y0; y <= y1; y++) for (let x = x0; x <= x1; x++) maxAbove = Math.max(maxAbove, value(x, y));
    peakValue = maxAbove + background.level;
    const threshold = thresholdFraction * maxAbove;
    let weight = 0;
    let sumX = 0;
    let sumY = 0;
    for (let y = y0; y <= y1; y++) {
      for (let x = x0; x <= x1; x++) {
        const w = value(x, y) - threshold;
        if (w <= 0) continue;
        weight += w;
        sumX += w * x;
        sumY += w * y;
      }
    }
    if (!(weight > 0)) break; // flat window: keep the brightest pixel as the centre
    centreX = sumX / weight;
    centreY = sumY / weight;
  }

  return { centreXPx: centreX, centreYPx: centreY, peakPixelX, peakPixelY, peakValue, background, roughFwhmXPx, roughFwhmYPx };
}

/**
 * Pixel with the largest 3×3 box mean inside the ROI (the box is clipped at the ROI edge). One pass with a single
 * row buffer of vertical 3-sums, so a 512×512 frame costs no large allocation.
 */
function argmaxOfBoxMean(image: GrayImage, roi: Roi): { x: number; y: number } {
  const { width: w, height: h } = roi;
  const data = image.data;
  const columnSums = new Float64Array(w);
  let best = -Infinity;
  let bestX = roi.x;
  let bestY = roi.y;
  for (let row = 0; row < h; row++) {
    const r0 = Math.max(0, row - 1);
    const r1 = Math.min(h - 1, row + 1);
    for (let col = 0; col < w; col++) {
      let sum = 0;
      for (let r = r0; r <= r1; r++) sum += data[(roi.y + r) * image.width + roi.x + col]!;
      columnSums[col] = sum;
    }
    const rows = r1 - r0 + 1;
    for (let col = 0; col < w; col++) {
      const c0 = col > 0 ? col - 1 : col;
      const c1 = col < w - 1 ? col + 1 : col;
      let sum = columnSums[c0]! + columnSums[c1]!;
      if (c1 - c0 === 2) sum += columnSums[col]!;
      const mean = sum / (rows * (c1 - c0 + 1));
      if (mean > best) {
        best = mean;
        bestX = roi.x + col;
        bestY = roi.y + row;
      }
    }
  }
  return { x: bestX, y: bestY };
}

/** Distance between the half-peak crossings found by walking both ways from offset 0, pixels (at least 1). */
function roughWidth(peak: number, at: (offset: number) => number, maxLeft: number, maxRight: number): number {
  const half = peak / 2;
  const crossing = (direction: 1 | -1, limit: number): number => {
    for (let i = 1; i <= limit; i++) {
      const v = at(direction * i);
      if (v < half) {
        const previous = at(direction * (i - 1));
        return i - 1 + (previous - half) / (previous - v);
      }
    }
    return limit;
  };
  return Math.max(1, crossing(-1, maxLeft) + crossing(1, maxRight));
}

export interface RoiAroundSourceOptions {
  /** Half-size of the ROI in multiples of the FWHM along that axis. */
  halfSizePerFwhm: number;
  /** Smallest half-size, pixels. */
  minHalfSizePx: number;
}

/** Defaults of {@link roiAroundSource}: ±4 FWHM, at least ±16 px (a 33×33 ROI). */
export const ROI_AROUND_SOURCE_DEFAULTS: RoiAroundSourceOptions = { halfSizePerFwhm: 4, minHalfSizePx: 16 };

export interface RoiChoice {
  roi: Roi;
  /** True when the wanted ROI reached past the image and was cut back. */
  clippedByImage: boolean;
}

/**
 * Square-ish ROI centred on the source, half-size max(minHalfSizePx, ⌈halfSizePerFwhm·FWHM⌉) per axis, clipped to
 * `bounds` (default the image). Never throws.
 */
export function roiAroundSource(
  image: GrayImage,
  centre: { xPx: number; yPx: number },
  fwhmPx: { x: number; y: number },
  bounds: Roi = { x: 0, y: 0, width: image.width, height: image.height },
  options: Partial<RoiAroundSourceOptions> = {},
): RoiChoice {
  const { halfSizePerFwhm, minHalfSizePx } = { ...ROI_AROUND_SOURCE_DEFAULTS, ...options };
  const halfX = Math.max(minHalfSizePx, Math.ceil(halfSizePerFwhm * fwhmPx.x));
  const halfY = Math.max(minHalfSizePx, Math.ceil(halfSizePerFwhm * fwhmPx.y));
  const cx = Math.round(centre.xPx);
  const cy = Math.round(centre.yPx);
  const wanted = { x0: cx - halfX, x1: cx + halfX, y0: cy - halfY, y1: cy + halfY };
  const clippedByImage = wanted.x0 < 0 || wanted.y0 < 0 || wanted.x1 > image.width - 1 || wanted.y1 > image.height - 1;
  const x0 = Math.max(wanted.x0, bounds.x);
  const y0 = Math.max(wanted.y0, bounds.y);
  const x1 = Math.min(wanted.x1, bounds.x + bounds.width - 1);
  const y1 = Math.min(wanted.y1, bounds.y + bounds.height - 1);
  return { roi: { x: x0, y: y0, width: x1 - x0 + 1, height: y1 - y0 + 1 }, clippedByImage };
}
