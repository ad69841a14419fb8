/**
 * k × k moving average of an ROI (the smoothing of the object search, object-region.ts), by separable running sums.
 */
import type { GrayImage, Roi } from "./types";

/**
 * k × k moving average (k odd) of the ROI, clipped and renormalised at the ROI border: each output is the mean of the
 * row means (over the clipped horizontal window) of the rows in the clipped vertical window.
 * @returns row-major roi.width × roi.height values in image units. Never throws (expects an ROI inside the image).
 */
export function boxSmooth(image: GrayImage, roi: Roi, k: number): Float64Array {
  const w = roi.width;
  const h = roi.height;
  const r = k >> 1;
  const rowWindow = new Float64Array(w);
  for (let x = 0; x < w; x++) rowWindow[x] = Math.min(w - 1, x + r) - Math.max(0, x - r) + 1;
  // Row means of the last k + 1 rows only: the vertical pass adds row y + r and removes row y − r − 1.
  const ringRows = 2 * r + 2;
  const ring = new Float64Array(ringRows * w);
  const rowMeansInto = (row: number): number => {
    const target = (row % ringRows) * w;
    rowMeans(image.data, (roi.y + row) * image.width + roi.x, w, r, rowWindow, ring, target);
    return target;
  };
  const out = new Float64Array(w * h);
  const column = new Float64Array(w);
  for (let y = 0; y < Math.min(r, h); y++) {
    const at = rowMeansInto(y);
    for (let x = 0; x < w; x++) column[x] += ring[at + x]!;
  }
  for (let y = 0; y < h; y++) {
    const added = y + r < h ? rowMeansInto(y + r) : -1;
    const removed = y - r - 1 >= 0 ? ((y - r - 1) % ringRows) * w : -1;
    const count = Math.min(h - 1, y + r) - Math.max(0, y - r) + 1;
    const o = y * w;
    if (added >= 0 && removed >= 0) {
      // Interior rows: one fused pass (same operations in the same order as the three border passes below).
      for (let x = 0; x < w; x++) {
        const sum = column[x]! + ring[added + x]! - ring[removed + x]!;
        column[x] = sum;
        out[o + x] = sum / count;
      }
      continue;
    }
    if (added >= 0) for (let x = 0; x < w; x++) column[x] += ring[added + x]!;
    if (removed >= 0) for (let x = 0; x < w; x++) column[x] -= ring[removed + x]!;
    for (let x = 0; x < w; x++) out[o + x] = column[x]! / count;
  }
  return out;
}

/** Running mean over ±r samples (clipped; window sizes in `window`) of w values from data[src …] into out[dst …]. */
function rowMeans(data: ArrayLike<number>, src: number, w: number, r: number, window: Float64Array, out: Float64Array, dst: number): void {
  let sum = 0;
  for (let x = 0; x < Math.min(r, w); x++) sum += data[src + x]!;
  for (let x = 0; x < w; x++) {
    if (x + r < w) sum += data[src + x + r]!;
    if (x - r - 1 >= 0) sum -= data[src + x - r - 1]!;
    out[dst + x] = sum / window[x]!;
  }
}
