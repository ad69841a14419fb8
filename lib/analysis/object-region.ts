/**
 * The most conspicuous object in an ROI and the shape of its region, for choosing the method (auto-method.ts) and for
 * finding the insert of the circular-edge method:
 * 1. background and noise: median and 1.4826·MAD of a 3-px border strip (background.ts);
 * 2. the image is smoothed by a 5 × 5 box (noise SD / 5) and the pixel deviating most from the background, either
 *    sign, is the seed; its smoothed deviation is the peak contrast (sign = polarity);
 * 3. the region: pixels 4-connected to the seed whose smoothed deviation (times the polarity) exceeds half the peak;
 * 4. shape: area, centroid, second moments (axis ratio and direction of the principal axes), whether it reaches the
 *    ROI border, and its flatness = median raw deviation over the region / median raw deviation in its core
 *    (r ≤ 0.3 × the equal-area radius): ≈ 0.73 for a Gaussian blob (median of a Gaussian over its half-maximum disk
 *    is 1/√2 of the peak), → 1 for a disk with a sharp rim.
 */
import { measureBackground } from "./background";
import { boxSmooth } from "./box-smooth";
import { AnalysisError } from "./errors";
import { upperMedianInPlace } from "./order-statistics";
import type { GrayImage, Roi } from "./types";

export interface ObjectRegion {
  roi: Roi;
  background: number;
  noiseSd: number;
  polarity: 1 | -1;
  /** |smoothed deviation| at the seed, image units. */
  peakContrast: number;
  /** Peak contrast over the noise SD of the smoothed image (noise SD / 5). */
  peakCnr: number;
  seedXPx: number;
  seedYPx: number;
  areaPx: number;
  centroidXPx: number;
  centroidYPx: number;
  /** √(area/π), pixels. */
  equalAreaRadiusPx: number;
  /** √(λ_max/λ_min) of the region's second-moment matrix (1 for a disk, large for a line). */
  axisRatio: number;
  /** Direction of the major axis from +x towards +y, degrees in (−90, 90]. */
  majorAxisDeg: number;
  touchesRoiBorder: boolean;
  /** Region area / ROI area. */
  roiFraction: number;
  flatness: number;
  /** 5 × 5 box-smoothed ROI, row-major roi.width × roi.height (reused by callers). */
  smoothed: Float64Array;
}

/** Defaults of {@link findObjectRegion}. */
export const OBJECT_REGION_DEFAULTS = {
  boxPx: 5,
  /** The seed must exceed this multiple of the smoothed noise SD. */
  minPeakCnr: 8,
} as const;

/**
 * @throws AnalysisError when the ROI is outside the image or smaller than 9 × 9, or when no object stands out from
 *   the background (peak below minPeakCnr × the smoothed noise, or a uniform ROI)
 */
export function findObjectRegion(image: GrayImage, roi: Roi = { x: 0, y: 0, width: image.width, height: image.height }): ObjectRegion {
  const { boxPx, minPeakCnr } = OBJECT_REGION_DEFAULTS;
  const bg = measureBackground(image, roi);
  const w = roi.width;
  const h = roi.height;
  const smoothed = boxSmooth(image, roi, boxPx);
  let seed = 0;
  let peak = 0;
  for (let i = 0; i < smoothed.length; i++) {
    const d = Math.abs(smoothed[i]! - bg.level);
    if (d > peak) {
      peak = d;
      seed = i;
    }
  }
  const smoothedNoise = bg.noiseSd / boxPx;
  if (!(peak > 0) || peak < minPeakCnr * smoothedNoise) {
    throw new AnalysisError(
      `no object found: the largest smoothed deviation from the background, ${peak.toPrecision(3)}, is below ${minPeakCnr}× the smoothed noise SD ${smoothedNoise.toPrecision(3)}`,
    );
  }
  const polarity: 1 | -1 = smoothed[seed]! > bg.level ? 1 : -1;
  const threshold = peak / 2;

  const inRegion = new Uint8Array(w * h);
  const stack = new Int32Array(w * h);
  let top = 0;
  stack[top++] = seed;
  inRegion[seed] = 1;
  let area = 0;
  let sx = 0, sy = 0, sxx = 0, syy = 0, sxy = 0;
  let touches = false;
  // Depth-first flood fill over every region pixel: the neighbour test is created once, not once per pixel.
  const above = (j: number): boolean => !inRegion[j] && polarity * (smoothed[j]! - bg.level) > threshold;
  while (top > 0) {
    const i = stack[--top]!;
    const x = i % w;
    const y = (i - x) / w;
    area++;
    sx += x; sy += y; sxx += x * x; syy += y * y; sxy += x * y;
    if (x === 0 || y === 0 || x === w - 1 || y === h - 1) touches = true;
    if (x > 0 && above(i - 1)) { inRegion[i - 1] = 1; stack[top++] = i - 1; }
    if (x < w - 1 && above(i + 1)) { inRegion[i + 1] = 1; stack[top++] = i + 1; }
    if (y > 0 && above(i - w)) { inRegion[i - w] = 1; stack[top++] = i - w; }
    if (y < h - 1 && above(i + w)) { inRegion[i + w] = 1; stack[top++] = i + w; }
  }
  const cx = sx / area;
  const cy = sy / area;
  const vxx = sxx / area - cx * cx + 1 / 12; // + 1/12: each pixel is a unit square, not a point
  const vyy = syy / area - cy * cy + 1 / 12;
  const vxy = sxy / area - cx * cy;
  const mean = (vxx + vyy) / 2;
  const spread = Math.hypot((vxx - vyy) / 2, vxy);
  const axisRatio = Math.sqrt((mean + spread) / Math.max(mean - spread, 1e-12));
  const majorAxisDeg = (0.5 * Math.atan2(2 * vxy, vxx - vyy) * 180) / Math.PI;
  const radius = Math.sqrt(area / Math.PI);

  return {
    roi,
    background: bg.level,
    noiseSd: bg.noiseSd,
    polarity,
    peakContrast: peak,
    peakCnr: smoothedNoise > 0 ? peak / smoothedNoise : Infinity,
    seedXPx: roi.x + (seed % w),
    seedYPx: roi.y + Math.floor(seed / w),
    areaPx: area,
    centroidXPx: roi.x + cx,
    centroidYPx: roi.y + cy,
    equalAreaRadiusPx: radius,
    axisRatio,
    majorAxisDeg: majorAxisDeg <= -90 ? majorAxisDeg + 180 : majorAxisDeg,
    touchesRoiBorder: touches,
    roiFraction: area / (w * h),
    flatness: flatness(image, roi, inRegion, area, cx, cy, radius, bg.level, polarity),
    smoothed,
  };
}

/** Median raw deviation over the region / over its core (see file header); at most ~65 k region pixels are sampled. */
function flatness(image: GrayImage, roi: Roi, inRegion: Uint8Array, area: number, cx: number, cy: number, radius: number, level: number, polarity: 1 | -1): number {
  const w = roi.width;
  const step = Math.max(1, Math.floor(inRegion.length / 65536));
  const all = new Float64Array(area);
  const core = new Float64Array(area);
  let allCount = 0;
  let coreCount = 0;
  const coreRadius = Math.max(0.75, 0.3 * radius);
  for (let i = 0; i < inRegion.length; i++) {
    if (!inRegion[i]) continue;
    const x = i % w;
    const y = (i - x) / w;
    const d = polarity * (image.data[(roi.y + y) * image.width + roi.x + x]! - level);
    if (i % step === 0) all[allCount++] = d;
    if ((x - cx) ** 2 + (y - cy) ** 2 <= coreRadius * coreRadius) core[coreCount++] = d;
  }
  const coreMedian = upperMedianInPlace(core.subarray(0, coreCount));
  return coreMedian > 0 ? upperMedianInPlace(all.subarray(0, allCount)) / coreMedian : NaN;
}

/**
 * A region found by {@link findObjectRegion} in a crop of the frame (its whole ROI being the crop), re-expressed in
 * frame coordinates for the crop's position `roi`: the same numbers {@link findObjectRegion}(frame, roi) gives.
 * @throws AnalysisError when `roi` is not the size of the crop the region was found in
 */
export function regionInFrame(region: ObjectRegion, roi: Roi): ObjectRegion {
  const crop = region.roi;
  if (crop.x !== 0 || crop.y !== 0 || crop.width !== roi.width || crop.height !== roi.height) {
    throw new AnalysisError(
      `object region of a ${crop.width}×${crop.height} crop at (${crop.x}, ${crop.y}) cannot be placed as the ${roi.width}×${roi.height} ROI at (${roi.x}, ${roi.y})`,
    );
  }
  return {
    ...region,
    roi,
    seedXPx: roi.x + region.seedXPx,
    seedYPx: roi.y + region.seedYPx,
    centroidXPx: roi.x + region.centroidXPx,
    centroidYPx: roi.y + region.centroidYPx,
  };
}
