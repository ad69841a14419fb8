/**
 * Sub-pixel centre and radius of a disk insert (circular-edge method):
 * 1. start from the object region (object-region.ts): centroid and equal-area radius R₀;
 * 2. plateau levels: median of raw pixels within 0.5 R₀ of the centre (inside) and in a ring beyond the rim (outside);
 * 3. edge points: along N rays from the centre (N ≈ 2πR₀ in pixels, 32 … 360), the crossing of the mid level in the
 *    5 × 5 box-smoothed image (bilinear samples every ¼ pixel from 0.5 R to 1.5 R, the falling crossing nearest to the
 *    current radius, searched outwards from it: ray-crossing.ts); the smoothing is symmetric, so it moves the
 *    crossings radially but not the centre;
 * 4. algebraic least-squares circle fit (Kåsa, IEEE Trans Instrum Meas 1976): x² + y² + Dx + Ey + F = 0, linear in
 *    D, E, F; repeated once from the new centre.
 * Coordinates in mm from the centre of pixel (0, 0) (x = column·pₓ, y = row·p_y), so non-square pixels are handled.
 */
import { AnalysisError } from "./errors";
import type { ObjectRegion } from "./object-region";
import { upperMedianInPlace } from "./order-statistics";
import { nearestFallingCrossing, rayRadii } from "./ray-crossing";
import type { GrayImage } from "./types";

export interface LocatedDisk {
  centreXMm: number;
  centreYMm: number;
  /** Radius of the smoothed-image mid-level contour, mm (refined later from the radial ESF). */
  radiusMm: number;
  insideValue: number;
  outsideValue: number;
  /** RMS distance of the edge points from the fitted circle, mm. */
  fitRmsMm: number;
  edgePoints: number;
  rays: number;
}

export const DISK_LOCATE_DEFAULTS = { minRays: 32, maxRays: 360, fitPasses: 2 } as const;

export interface CircleFit {
  centreX: number;
  centreY: number;
  radius: number;
  rms: number;
}

/**
 * Kåsa algebraic circle fit through n ≥ 3 points (any unit).
 * @throws AnalysisError for fewer than 3 points or collinear points
 */
export function fitCircle(xs: ArrayLike<number>, ys: ArrayLike<number>, n: number): CircleFit {
  if (n < 3) throw new AnalysisError(`circle fit needs at least 3 edge points, got ${n}`);
  let mx = 0;
  let my = 0;
  for (let i = 0; i < n; i++) {
    mx += xs[i]! / n;
    my += ys[i]! / n;
  }
  let sxx = 0, sxy = 0, syy = 0, sxz = 0, syz = 0, sz = 0, sx = 0, sy = 0;
  for (let i = 0; i < n; i++) {
    const x = xs[i]! - mx;
    const y = ys[i]! - my;
    const z = x * x + y * y;
    sxx += x * x; sxy += x * y; syy += y * y; sxz += x * z; syz += y * z; sz += z; sx += x; sy += y;
  }
  // Normal equations [sxx sxy sx; sxy syy sy; sx sy n]·[D E F]ᵀ = −[sxz syz sz]ᵀ, solved by Cramer's rule.
  const m = [sxx, sxy, sx, sxy, syy, sy, sx, sy, n];
  const rhs = [-sxz, -syz, -sz];
  const det3 = (a: number[]): number =>
    a[0]! * (a[4]! * a[8]! - a[5]! * a[7]!) - a[1]! * (a[3]! * a[8]! - a[5]! * a[6]!) + a[2]! * (a[3]! * a[7]! - a[4]! * a[6]!);
  const det = det3(m);
  if (!(Math.abs(det) > 1e-12 * sxx * syy * n)) throw new AnalysisError("circle fit failed: the edge points are collinear");
  const solve = (col: number): number => {
    const a = m.slice();
    for (let r = 0; r < 3; r++) a[3 * r + col] = rhs[r]!;
    return det3(a) / det;
  };
  const d = solve(0);
  const e = solve(1);
  const f = solve(2);
  const cx = -d / 2;
  const cy = -e / 2;
  const radius = Math.sqrt(Math.max(0, cx * cx + cy * cy - f));
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (Math.hypot(xs[i]! - mx - cx, ys[i]! - my - cy) - radius) ** 2;
  return { centreX: cx + mx, centreY: cy + my, radius, rms: Math.sqrt(ss / n) };
}

/**
 * Steps 2–4 of the file header.
 * @throws AnalysisError when fewer than 3 rays find the rim or the fitted circle is degenerate
 */
export function locateDisk(image: GrayImage, region: ObjectRegion): LocatedDisk {
  const { x: px, y: py } = image.pixelSpacingMm;
  const roi = region.roi;
  let cx = region.centroidXPx * px;
  let cy = region.centroidYPx * py;
  let radius = region.equalAreaRadiusPx * Math.sqrt(px * py);
  const pitch = Math.max(px, py);
  const gap = Math.max(3 * pitch, 0.25 * radius);
  const insideValue = medianInRing(image, roi, cx, cy, 0, 0.5 * radius) ?? region.background + region.polarity * region.peakContrast;
  const outsideValue = medianInRing(image, roi, cx, cy, radius + gap, radius + 2 * gap) ?? region.background;
  const mid = 0.5 * (insideValue + outsideValue);
  const sign = insideValue > outsideValue ? 1 : -1;

  const rays = Math.min(DISK_LOCATE_DEFAULTS.maxRays, Math.max(DISK_LOCATE_DEFAULTS.minRays, Math.round((2 * Math.PI * radius) / pitch)));
  const xs = new Float64Array(rays);
  const ys = new Float64Array(rays);
  const stepMm = 0.25 * Math.min(px, py);
  const smoothedAt = (xMm: number, yMm: number): number => {
    const x = xMm / px - roi.x;
    const y = yMm / py - roi.y;
    if (x < 0 || y < 0 || x > roi.width - 1 || y > roi.height - 1) return NaN;
    const x0 = Math.min(Math.floor(x), roi.width - 2);
    const y0 = Math.min(Math.floor(y), roi.height - 2);
    const fx = x - x0;
    const fy = y - y0;
    const s = region.smoothed;
    const i = y0 * roi.width + x0;
    return (1 - fy) * ((1 - fx) * s[i]! + fx * s[i + 1]!) + fy * ((1 - fx) * s[i + roi.width]! + fx * s[i + roi.width + 1]!);
  };
  let fit: CircleFit = { centreX: cx, centreY: cy, radius, rms: 0 };
  let found = 0;
  for (let pass = 0; pass < DISK_LOCATE_DEFAULTS.fitPasses; pass++) {
    found = 0;
    const radii = rayRadii(0.5 * radius, 1.5 * radius, stepMm);
    for (let k = 0; k < rays; k++) {
      const theta = (2 * Math.PI * k) / rays;
      const ux = Math.cos(theta);
      const uy = Math.sin(theta);
      const best = nearestFallingCrossing((j) => sign * (smoothedAt(cx + radii[j]! * ux, cy + radii[j]! * uy) - mid), radii, stepMm, radius);
      if (Number.isNaN(best)) continue;
      xs[found] = cx + best * ux;
      ys[found] = cy + best * uy;
      found++;
    }
    fit = fitCircle(xs, ys, found);
    cx = fit.centreX;
    cy = fit.centreY;
    radius = fit.radius;
  }
  if (!(radius > 0)) throw new AnalysisError("circle fit failed: zero radius");
  return { centreXMm: cx, centreYMm: cy, radiusMm: radius, insideValue, outsideValue, fitRmsMm: fit.rms, edgePoints: found, rays };
}

/** Upper median of the raw pixels of the ROI whose centres lie at distance [r0, r1] mm from (cx, cy) mm; null if none. */
export function medianInRing(image: GrayImage, roi: { x: number; y: number; width: number; height: number }, cx: number, cy: number, r0: number, r1: number): number | null {
  const { x: px, y: py } = image.pixelSpacingMm;
  const yLo = Math.max(roi.y, Math.ceil((cy - r1) / py));
  const yHi = Math.min(roi.y + roi.height - 1, Math.floor((cy + r1) / py));
  const xLo = Math.max(roi.x, Math.ceil((cx - r1) / px));
  const xHi = Math.min(roi.x + roi.width - 1, Math.floor((cx + r1) / px));
  if (yHi < yLo || xHi < xLo) return null;
  const values = new Float64Array((yHi - yLo + 1) * (xHi - xLo + 1));
  let count = 0;
  for (let y = yLo; y <= yHi; y++) {
    const dy = y * py - cy;
    const row = y * image.width;
    for (let x = xLo; x <= xHi; x++) {
      const dx = x * px - cx;
      const r = Math.sqrt(dx * dx + dy * dy);
      if (r >= r0 && r <= r1) values[count++] = image.data[row + x]!;
    }
  }
  return count === 0 ? null : upperMedianInPlace(values.subarray(0, count));
}
