/**
 * Automatic choice of the analysis method from the image content (common practice; thresholds chosen for Halfmax and
 * checked on generated phantoms of each kind).
 */
import { AnalysisError } from "./errors";
import { findObjectRegion, type ObjectRegion } from "./object-region";
import type { AnalysisMethod, GrayImage } from "./types";

/** Thresholds of {@link detectMethod}. */
export const AUTO_METHOD_DEFAULTS = {
  /** Edge: interquartile range of the border pixels above this multiple of the border noise SD … */
  edgeBorderIqrPerNoise: 6,
  /** … and above this fraction of the image's value range (so faint tails of a blob reaching the border do not count). */
  edgeBorderIqrPerRange: 0.25,
  /** Line: region axis ratio at or above this. */
  lineAxisRatio: 3,
  /** Disk: equal-area radius at or above this (pixels) … */
  diskMinRadiusPx: 4,
  /** … and flatness (object-region.ts) at or above this; a Gaussian blob has ≈ 0.73. */
  diskMinFlatness: 0.8,
} as const;

export interface MethodChoiceResult {
  method: AnalysisMethod;
  /** One sentence a user can read: the evidence behind the choice. */
  reason: string;
}

/**
 * Chooses "point", "line", "edge" or "disk" for an image (or a crop of one):
 * 1. **edge** when the pixels of the one-pixel image border split into two levels: their interquartile range exceeds
 *    {@link AUTO_METHOD_DEFAULTS}.edgeBorderIqrPerNoise × the border noise SD (1.4826·MAD of neighbouring differences
 *    /√2) and edgeBorderIqrPerRange × the image's value range (max − min). An edge crossing the image puts each half-plane on a large share of the border; a point, disk or line
 *    leaves the border at the background level, except for the few pixels where a line crosses it.
 * 2. Otherwise the most conspicuous object (object-region.ts: 5 × 5-smoothed extreme, half-peak region) decides:
 *    - region axis ratio ≥ lineAxisRatio → **line** (an elongated ridge);
 *    - region reaching the border but not elongated → **edge** (a half-plane in a corner);
 *    - closed, equal-area radius ≥ diskMinRadiusPx and flat inside (flatness ≥ diskMinFlatness) → **disk**;
 *    - otherwise → **point** (a compact, peaked blob).
 * @param image row-major frame; any polarity.
 * @throws AnalysisError when the image is smaller than 9 × 9 or nothing stands out from the background
 */
export function detectMethod(image: GrayImage): MethodChoiceResult {
  return detectMethodAndRegion(image).choice;
}

/**
 * {@link detectMethod}, also returning the object region it examined (null when the border test chose "edge"), so that
 * a caller running the circular-edge method on the same pixels need not search for the object again.
 * @throws as {@link detectMethod}
 */
export function detectMethodAndRegion(image: GrayImage): { choice: MethodChoiceResult; region: ObjectRegion | null } {
  const o = AUTO_METHOD_DEFAULTS;
  const border = borderSplit(image);
  if (border.iqr > o.edgeBorderIqrPerNoise * border.noiseSd && border.iqr > o.edgeBorderIqrPerRange * valueRange(image)) {
    const reason = `the image border splits into two levels (interquartile range ${border.iqr.toPrecision(3)}, ${border.noiseSd > 0 ? `${(border.iqr / border.noiseSd).toFixed(0)}× the noise` : "noiseless"}): two half-planes meet at an edge`;
    return { choice: { method: "edge", reason }, region: null };
  }
  let region: ObjectRegion;
  try {
    region = findObjectRegion(image);
  } catch (error) {
    if (error instanceof AnalysisError) throw new AnalysisError(`cannot choose a method: ${error.message}`, "no_object");
    throw error;
  }
  return { choice: chooseFromRegion(region), region };
}

/** Step 2 of {@link detectMethod}: the method suggested by the shape of the most conspicuous object. */
function chooseFromRegion(region: ObjectRegion): MethodChoiceResult {
  const o = AUTO_METHOD_DEFAULTS;
  const shape = `axis ratio ${region.axisRatio.toFixed(1)}, radius ${region.equalAreaRadiusPx.toFixed(1)} px, flatness ${region.flatness.toFixed(2)}`;
  if (region.axisRatio >= o.lineAxisRatio) {
    return { method: "line", reason: `the object is an elongated ridge (${shape})` };
  }
  if (region.touchesRoiBorder) {
    return { method: "edge", reason: `the object is a region reaching the image border without being elongated (${shape}): a half-plane` };
  }
  if (region.equalAreaRadiusPx >= o.diskMinRadiusPx && region.flatness >= o.diskMinFlatness) {
    return { method: "disk", reason: `the object is a closed, round region with a flat interior (${shape})` };
  }
  return { method: "point", reason: `the object is a compact peaked blob (${shape})` };
}

function valueRange(image: GrayImage): number {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < image.data.length; i++) {
    const v = image.data[i]!;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return hi - lo;
}

/** Interquartile range of the one-pixel border and its noise SD from neighbouring differences along the border. */
function borderSplit(image: GrayImage): { iqr: number; noiseSd: number } {
  const { width: w, height: h, data } = image;
  if (w < 9 || h < 9) throw new AnalysisError(`method detection needs an image of at least 9×9 px, got ${w}×${h}`);
  const ring: number[] = [];
  for (let x = 0; x < w; x++) ring.push(data[x]!);
  for (let y = 1; y < h; y++) ring.push(data[y * w + w - 1]!);
  for (let x = w - 2; x >= 0; x--) ring.push(data[(h - 1) * w + x]!);
  for (let y = h - 2; y >= 1; y--) ring.push(data[y * w]!);
  // Float64Array sorts numerically without a comparator callback.
  const diffs = Float64Array.from(ring, (v, i) => Math.abs(v - ring[(i + 1) % ring.length]!)).sort();
  const sorted = Float64Array.from(ring).sort();
  const quantile = (q: number): number => sorted[Math.round(q * (sorted.length - 1))]!;
  return { iqr: quantile(0.75) - quantile(0.25), noiseSd: (1.482602218505602 * diffs[diffs.length >> 1]!) / Math.SQRT2 };
}
