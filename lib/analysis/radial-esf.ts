/**
 * Pixel loops of the circular-edge method (circular-edge.ts) over the annulus around the rim: radial ESF binning and
 * the plateau noise estimate. Distances in mm from the pixel centres (x = column·pₓ, y = row·p_y) to the disk centre.
 */
import type { EsfAccumulator } from "./esf-accumulator";
import type { GrayImage } from "./types";

/**
 * The analysed pixels: those whose centres lie at distance R − innerMm … R + outerMm (mm) from the disk centre, within
 * columns x0 … x1 and rows y0 … y1 (frame pixels, inclusive).
 */
export interface Annulus {
  centreXMm: number;
  centreYMm: number;
  radiusMm: number;
  innerMm: number;
  outerMm: number;
  x0: number;
  x1: number;
  y0: number;
  y1: number;
}

/**
 * Adds every annulus pixel to the ESF at its distance from the rim (mm, positive outwards); returns how many were
 * added. Math.sqrt rather than Math.hypot: hypot's overflow guard costs about ten times more per pixel. Never throws.
 */
export function binAnnulus(image: GrayImage, annulus: Annulus, accumulator: EsfAccumulator): number {
  const { centreXMm: cx, centreYMm: cy, radiusMm: radius, innerMm, outerMm, x0, x1, y0, y1 } = annulus;
  const { x: px, y: py } = image.pixelSpacingMm;
  let pixelsUsed = 0;
  for (let y = y0; y <= y1; y++) {
    const dy2 = (y * py - cy) ** 2;
    const offset = y * image.width;
    for (let x = x0; x <= x1; x++) {
      const dx = x * px - cx;
      const d = Math.sqrt(dx * dx + dy2) - radius;
      if (d < -innerMm || d > outerMm) continue;
      accumulator.add(d, image.data[offset + x]!);
      pixelsUsed++;
    }
  }
  return pixelsUsed;
}

/**
 * Pixel noise SD from the plateaus: RMS deviation of the annulus pixels farther than `plateauMm` from the rim (at
 * `rimOffsetMm`) from the mean of their ESF bin, image units; NaN when fewer than 16 such pixels. Never throws.
 */
export function plateauNoiseSd(image: GrayImage, annulus: Annulus, accumulator: EsfAccumulator, rimOffsetMm: number, plateauMm: number): number {
  const { centreXMm: cx, centreYMm: cy, radiusMm: radius, innerMm, outerMm, x0, x1, y0, y1 } = annulus;
  const { x: px, y: py } = image.pixelSpacingMm;
  let residualSum = 0;
  let residualCount = 0;
  for (let y = y0; y <= y1; y++) {
    const dy2 = (y * py - cy) ** 2;
    for (let x = x0; x <= x1; x++) {
      const dx = x * px - cx;
      const d = Math.sqrt(dx * dx + dy2) - radius;
      if (d < -innerMm || d > outerMm || Math.abs(d - rimOffsetMm) < plateauMm) continue;
      const bin = accumulator.binIndex(d);
      if (bin < 0) continue;
      residualSum += (image.data[y * image.width + x]! - accumulator.binMean(bin)) ** 2;
      residualCount++;
    }
  }
  return residualCount >= 16 ? Math.sqrt(residualSum / residualCount) : NaN;
}
