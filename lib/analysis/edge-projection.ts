/**
 * Step 4 of the slanted-edge method: project the frame's pixels near a fitted edge line onto the edge normal and
 * average them into an oversampled ESF (IEC 62220-1-1; ISO 12233 e-SFR). Also estimates the pixel noise from the
 * plateau pixels' deviations from their bin means.
 */
import type { EdgeFrame } from "./edge-frame";
import type { EdgeLine } from "./edge-locate";
import { EsfAccumulator, type BinnedEsf } from "./esf-accumulator";

export interface EdgeProjectionRange {
  /** Frame rows v0 … v1 (inclusive) along the edge. */
  v0: number;
  v1: number;
  /** ESF range below / above the edge, pixels along the normal. */
  leftPx: number;
  rightPx: number;
  /** cos of the edge angle (pixels along a row → along the normal). */
  cos: number;
  binWidthMm: number;
}

export interface EdgeProjection {
  esf: BinnedEsf;
  pixelsUsed: number;
  /** Frame columns spanned by the projected pixels. */
  uMin: number;
  uMax: number;
  /** RMS deviation of plateau pixels (|d| ≥ half the shorter side range) from their bin means; null below 16 pixels. */
  plateauNoiseSd: number | null;
}

/**
 * Distance of frame pixel (u, v) from the edge along the normal: d = (u − u_edge(v))·p_u·cos α (mm), positive towards
 * larger u. Pixels with −leftPx ≤ d/p_u ≤ rightPx are binned.
 * @throws AnalysisError (from EsfAccumulator) when the range holds fewer than 8 bins or half of them stay empty
 */
export function projectEdge(frame: EdgeFrame, line: EdgeLine, range: EdgeProjectionRange): EdgeProjection {
  const { v0, v1, leftPx, rightPx, cos, binWidthMm } = range;
  const pu = frame.acrossPitchMm;
  const mmPerPx = pu * cos;
  const accumulator = new EsfAccumulator(-leftPx * pu, rightPx * pu, binWidthMm);
  const columns = (v: number): { ue: number; c0: number; c1: number } => {
    const ue = line.intercept + line.slope * v;
    return { ue, c0: Math.max(0, Math.ceil(ue - leftPx / cos)), c1: Math.min(frame.cols - 1, Math.floor(ue + rightPx / cos)) };
  };
  let uMin = frame.cols;
  let uMax = -1;
  let pixelsUsed = 0;
  for (let v = v0; v <= v1; v++) {
    const { ue, c0, c1 } = columns(v);
    const offset = v * frame.cols;
    for (let c = c0; c <= c1; c++) accumulator.add((c - ue) * mmPerPx, frame.data[offset + c]!);
    pixelsUsed += c1 - c0 + 1;
    uMin = Math.min(uMin, c0);
    uMax = Math.max(uMax, c1);
  }
  const esf = accumulator.finish();

  const plateauMm = 0.5 * Math.min(leftPx, rightPx) * pu;
  let sum = 0;
  let n = 0;
  for (let v = v0; v <= v1; v++) {
    const { ue, c0, c1 } = columns(v);
    const offset = v * frame.cols;
    for (let c = c0; c <= c1; c++) {
      const d = (c - ue) * mmPerPx;
      if (Math.abs(d) < plateauMm) continue;
      const bin = accumulator.binIndex(d);
      if (bin < 0) continue;
      const r = frame.data[offset + c]! - accumulator.binMean(bin);
      sum += r * r;
      n++;
    }
  }
  return { esf, pixelsUsed, uMin, uMax, plateauNoiseSd: n >= 16 ? Math.sqrt(sum / n) : null };
}
