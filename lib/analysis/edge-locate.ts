/**
 * Locating a straight edge in an {@link EdgeFrame} (u across, v along the edge), in two stages:
 * 1) coarse: rows averaged in blocks; in each block the 50 % crossing of the ESF nearest to the steepest rise;
 *    robust line fit through the block crossings;
 * 2) fine (ISO 12233 e-SFR, from memory): per row, centroid of the derivative [−1, 0, 1] weighted by a Hamming window
 *    of half-width W centred on the predicted position; least-squares line fit of centroid versus row. Run twice, each
 *    time re-centring the windows on the last line.
 * Positions in frame pixels; the line is u = intercept + slope·v.
 */
import { AnalysisError } from "./errors";
import type { EdgeFrame } from "./edge-frame";

export interface EdgeLine {
  intercept: number;
  slope: number;
  /** RMS residual of the kept points, pixels. */
  rmsPx: number;
  /** Points kept after outlier rejection / points offered. */
  pointsUsed: number;
  pointsOffered: number;
}

export interface CoarseEdge {
  line: EdgeLine;
  /** +1 when values rise with u (dark → bright across the frame), −1 otherwise. */
  polarity: 1 | -1;
  /** 5th and 95th percentiles of the row-averaged profile: the two plateau levels. */
  lowLevel: number;
  highLevel: number;
  /** Median 10–90 % rise distance of the block profiles, pixels across (includes the smear of the tilt within a block). */
  riseWidthPx: number;
  /** Pixel noise SD from the median absolute difference of neighbouring pixels along u (1.4826·MAD/√2). */
  noiseSd: number;
}

const MAD_TO_SD = 1.482602218505602;

/**
 * Robust least-squares line u = intercept + slope·v: fit, drop points whose residual exceeds
 * max(3 × 1.4826·MAD, minRejectPx), refit (twice).
 * @throws AnalysisError when fewer than 3 points are offered or kept
 */
export function fitEdgeLine(v: ArrayLike<number>, u: ArrayLike<number>, count: number, minRejectPx = 0.25): EdgeLine {
  if (count < 3) throw new AnalysisError(`the edge was found in only ${count} rows; at least 3 needed`);
  let keep = new Uint8Array(count).fill(1);
  let line = leastSquares(v, u, keep);
  for (let pass = 0; pass < 2; pass++) {
    const residuals = new Float64Array(count);
    for (let i = 0; i < count; i++) residuals[i] = Math.abs(u[i]! - line.intercept - line.slope * v[i]!);
    const sorted = residuals.slice().sort();
    const limit = Math.max(3 * MAD_TO_SD * sorted[count >> 1]!, minRejectPx);
    keep = new Uint8Array(count);
    for (let i = 0; i < count; i++) keep[i] = residuals[i]! <= limit ? 1 : 0;
    line = leastSquares(v, u, keep);
  }
  return { ...line, pointsOffered: count };
}

function leastSquares(v: ArrayLike<number>, u: ArrayLike<number>, keep: Uint8Array): Omit<EdgeLine, "pointsOffered"> {
  let n = 0;
  let sv = 0;
  let su = 0;
  for (let i = 0; i < keep.length; i++) {
    if (!keep[i]) continue;
    n++;
    sv += v[i]!;
    su += u[i]!;
  }
  if (n < 3) throw new AnalysisError(`the edge line fit kept only ${n} rows; at least 3 needed`);
  const mv = sv / n;
  const mu = su / n;
  let svv = 0;
  let svu = 0;
  for (let i = 0; i < keep.length; i++) {
    if (!keep[i]) continue;
    svv += (v[i]! - mv) ** 2;
    svu += (v[i]! - mv) * (u[i]! - mu);
  }
  const slope = svv > 0 ? svu / svv : 0;
  const intercept = mu - slope * mv;
  let ss = 0;
  for (let i = 0; i < keep.length; i++) if (keep[i]) ss += (u[i]! - intercept - slope * v[i]!) ** 2;
  return { intercept, slope, rmsPx: Math.sqrt(ss / n), pointsUsed: n };
}

/** Crossing of `level` by the rising profile e (nearest to `near`), interpolated linearly; NaN when absent. */
function risingCrossing(e: Float64Array, level: number, near: number): number {
  let best = NaN;
  let bestDistance = Infinity;
  for (let c = 0; c < e.length - 1; c++) {
    if (e[c]! <= level && e[c + 1]! > level) {
      const position = c + (level - e[c]!) / (e[c + 1]! - e[c]!);
      const distance = Math.abs(position - near);
      if (distance < bestDistance) {
        bestDistance = distance;
        best = position;
      }
    }
  }
  return best;
}

/**
 * Stage 1 (see file header).
 * @param minCnr plateau difference must exceed minCnr × pixel noise SD
 * @throws AnalysisError when the frame is uniform, the contrast-to-noise ratio is below minCnr, or the edge is found
 *   in fewer than 3 blocks
 */
export function locateEdgeCoarse(frame: EdgeFrame, minCnr: number): CoarseEdge {
  const { data, rows, cols } = frame;
  const mean = new Float64Array(cols);
  for (let v = 0; v < rows; v++) for (let u = 0; u < cols; u++) mean[u] += data[v * cols + u]!;
  for (let u = 0; u < cols; u++) mean[u] /= rows;
  const sorted = mean.slice().sort();
  const lowLevel = sorted[Math.floor(0.05 * (cols - 1))]!;
  const highLevel = sorted[Math.ceil(0.95 * (cols - 1))]!;
  const half = cols >> 1;
  let leftMean = 0;
  let rightMean = 0;
  for (let u = 0; u < half; u++) leftMean += mean[u]! / half;
  for (let u = cols - half; u < cols; u++) rightMean += mean[u]! / half;
  const noiseSd = neighbourNoiseSd(frame);
  const contrast = highLevel - lowLevel;
  if (!(contrast > 0) || rightMean === leftMean) throw new AnalysisError("no edge found: the ROI is uniform");
  if (contrast < minCnr * noiseSd) {
    throw new AnalysisError(
      `no edge found: plateau difference ${contrast.toPrecision(3)} is ${(contrast / noiseSd).toFixed(1)}× the pixel noise SD ${noiseSd.toPrecision(3)} (minimum ${minCnr}×)`,
    );
  }
  const polarity: 1 | -1 = rightMean > leftMean ? 1 : -1;

  const blockRows = rows >= 32 ? 8 : Math.max(1, Math.floor(rows / 4));
  const blocks = Math.floor(rows / blockRows);
  const vs = new Float64Array(blocks);
  const us = new Float64Array(blocks);
  const widths: number[] = [];
  const e = new Float64Array(cols);
  let found = 0;
  for (let b = 0; b < blocks; b++) {
    e.fill(0);
    for (let v = b * blockRows; v < (b + 1) * blockRows; v++) for (let u = 0; u < cols; u++) e[u] += data[v * cols + u]!;
    for (let u = 0; u < cols; u++) {
      const p = e[u]! / blockRows;
      e[u] = polarity === 1 ? (p - lowLevel) / contrast : (highLevel - p) / contrast;
    }
    let steepest = 2;
    let steepestRise = -Infinity;
    for (let u = 2; u < cols - 2; u++) {
      const rise = e[u + 1]! + e[u + 2]! - e[u - 1]! - e[u - 2]!;
      if (rise > steepestRise) {
        steepestRise = rise;
        steepest = u;
      }
    }
    const x50 = risingCrossing(e, 0.5, steepest);
    if (Number.isNaN(x50)) continue;
    vs[found] = b * blockRows + (blockRows - 1) / 2;
    us[found] = x50;
    found++;
    const x10 = risingCrossing(e, 0.1, x50);
    const x90 = risingCrossing(e, 0.9, x50);
    if (x90 > x10) widths.push(x90 - x10);
  }
  const line = fitEdgeLine(vs, us, found, 0.5);
  widths.sort((p, q) => p - q);
  const riseWidthPx = widths.length > 0 ? widths[widths.length >> 1]! : cols / 4;
  return { line, polarity, lowLevel, highLevel, riseWidthPx, noiseSd };
}

/** 1.4826·MAD/√2 of differences of neighbouring pixels along u, over evenly spaced rows (≤ ~16 k differences). */
function neighbourNoiseSd(frame: EdgeFrame): number {
  const { data, rows, cols } = frame;
  const rowStep = Math.max(1, Math.floor(rows / Math.max(1, Math.floor(16384 / cols))));
  const usedRows = Math.ceil(rows / rowStep);
  const diffs = new Float64Array(usedRows * (cols - 1));
  let n = 0;
  for (let v = 0; v < rows; v += rowStep) {
    const offset = v * cols;
    for (let u = 0; u < cols - 1; u++) diffs[n++] = Math.abs(data[offset + u + 1]! - data[offset + u]!);
  }
  const sorted = diffs.subarray(0, n).sort();
  return (MAD_TO_SD * sorted[n >> 1]!) / Math.SQRT2;
}

/**
 * Stage 2 (see file header): one pass of windowed derivative centroids around `line`, then a robust line fit.
 * @param halfWindowPx half-width W of the Hamming window, pixels across
 * @throws AnalysisError when fewer than 3 rows give a centroid
 */
export function refineEdgeLine(frame: EdgeFrame, line: EdgeLine, polarity: 1 | -1, halfWindowPx: number): EdgeLine {
  const { data, rows, cols } = frame;
  const vs = new Float64Array(rows);
  const us = new Float64Array(rows);
  let found = 0;
  for (let v = 0; v < rows; v++) {
    const predicted = line.intercept + line.slope * v;
    const c0 = Math.max(1, Math.ceil(predicted - halfWindowPx));
    const c1 = Math.min(cols - 2, Math.floor(predicted + halfWindowPx));
    if (c1 - c0 < 4) continue;
    const offset = v * cols;
    let weight = 0;
    let moment = 0;
    for (let c = c0; c <= c1; c++) {
      const derivative = polarity * (data[offset + c + 1]! - data[offset + c - 1]!);
      const w = (0.54 + 0.46 * Math.cos((Math.PI * (c - predicted)) / halfWindowPx)) * derivative;
      weight += w;
      moment += w * c;
    }
    if (!(weight > 0)) continue;
    vs[found] = v;
    us[found] = moment / weight;
    found++;
  }
  return fitEdgeLine(vs, us, found);
}
