/**
 * Synthetic disk (rod or insert) phantom for the circular-edge method: a uniform disk of radius R on a uniform
 * background, blurred by an isotropic 2-D Gaussian of σ, averaged over each pixel's area, with optional seeded noise.
 *
 * The blurred disk's profile is computed exactly (no local straight-edge approximation): the 2-D Gaussian is separable,
 * so the fraction of its mass inside the disk when centred at distance r from the disk centre is
 *   P(r) = ∫ g_σ(y)·[Φ((√(R² − y²) − r)/σ) − Φ((−√(R² − y²) − r)/σ)] dy  over |y| ≤ R,
 * evaluated with composite Simpson's rule and tabulated finely in r. Pixels near the edge average P over S × S
 * sub-pixel points (midpoint rule), pixels far from it take the plateau values.
 *
 * Truth: the circular-edge (TTF) method measures the Gaussian MTF times the pixel aperture projected on the radius,
 * averaged over the edge directions θ: e^(−2π²σ²f²)·(2/π)∫₀^{π/2} sinc(pₓ cos θ·f)·sinc(p_y sin θ·f) dθ (rect → sinc).
 * Curvature changes the radial LSF by O(σ²/R²), ignored in the truth.
 */
import { AnalysisError } from "../analysis/errors";
import { normalIntervalProbability } from "../analysis/special-functions";
import type { MtfCurve, PixelSpacingMm } from "../analysis/types";
import { blurredStepLsf, blurredStepMtf, symmetricWidthMm } from "./blurred-step";
import { tabulateMtf } from "./edge";
import { addPhantomNoise, assertPhantomSize, resolvePixelSpacing, type PhantomNoiseOptions } from "./point";
import type { Phantom } from "./types";

export interface DiskOptions extends PhantomNoiseOptions {
  width: number;
  height: number;
  /** Pixel pitch, mm: one number for square pixels or { x, y }. */
  pixelSpacingMm: number | PixelSpacingMm;
  radiusMm: number;
  /** Disk centre, pixel coordinates (pixel centres at integers; sub-pixel values allowed). */
  centreXPx: number;
  centreYPx: number;
  /** σ of the isotropic Gaussian blur, mm, ≥ 0. */
  sigmaMm: number;
  insideValue: number;
  outsideValue: number;
  /** Sub-pixel points per axis for pixels near the edge (default 16). */
  supersampling?: number;
}

export const DISK_PHANTOM_DEFAULTS = {
  supersampling: 16,
  /** Simpson intervals of the P(r) integral (see blurredDiskFraction). */
  profileIntervals: 64,
  /** Points of the tabulated truth MTF between 0 and 2 × Nyquist. */
  truthMtfSamples: 129,
  /** Edge directions averaged for the truth MTF and LSF. */
  truthAngles: 90,
} as const;

export interface DiskTruth {
  radiusMm: number;
  centreXPx: number;
  centreYPx: number;
  sigmaMm: number;
  insideValue: number;
  outsideValue: number;
  /** insideValue − outsideValue. */
  contrast: number;
  /** 1/(2p) for the coarser pixel pitch p, cycles/mm. */
  nyquistCyclesPerMm: number;
  /** Expected circular-edge MTF (see file header) from 0 to 2 × Nyquist. */
  mtf: MtfCurve;
  /** FWHM / FWTM of the direction-averaged presampled radial LSF, mm. */
  lsfFwhmMm: number;
  lsfFwtmMm: number;
  gaussianFwhmMm: number;
}

/**
 * Fraction (0 … 1) of a 2-D Gaussian of σ (mm) centred at distance r (mm) from the centre of a disk of radius R (mm)
 * that lies inside the disk (see file header). σ = 0 gives the indicator (½ on the rim). Never throws.
 */
export function blurredDiskFraction(rMm: number, radiusMm: number, sigmaMm: number, intervals: number = DISK_PHANTOM_DEFAULTS.profileIntervals): number {
  if (sigmaMm === 0) return rMm < radiusMm ? 1 : rMm > radiusMm ? 0 : 0.5;
  const norm = 1 / (sigmaMm * Math.sqrt(2 * Math.PI));
  const strip = (y: number, c: number): number => norm * Math.exp((-0.5 * y * y) / (sigmaMm * sigmaMm)) * normalIntervalProbability(-c, c, rMm, sigmaMm);
  // Wide disk: y ∈ [0, 8σ]. Narrow disk (R ≤ 8σ): y = R sin φ, φ ∈ [0, π/2], which removes the √ end-point singularity.
  const wide = radiusMm > 8 * sigmaMm;
  const upper = wide ? 8 * sigmaMm : Math.PI / 2;
  const integrand = wide
    ? (y: number): number => strip(y, Math.sqrt(radiusMm * radiusMm - y * y))
    : (phi: number): number => strip(radiusMm * Math.sin(phi), radiusMm * Math.cos(phi)) * radiusMm * Math.cos(phi);
  const n = intervals + (intervals % 2);
  const h = upper / n;
  let sum = integrand(0) + integrand(upper);
  for (let i = 1; i < n; i++) sum += (i % 2 === 1 ? 4 : 2) * integrand(i * h);
  return (2 * sum * h) / 3; // even integrand: twice the integral over the half range
}

/** Direction-averaged presampled MTF of the disk truth at f (cycles/mm); see the file header. */
export function diskPresampledMtf(frequencyCyclesPerMm: number, sigmaMm: number, spacing: PixelSpacingMm, angles: number = DISK_PHANTOM_DEFAULTS.truthAngles): number {
  let sum = 0;
  for (let k = 0; k < angles; k++) {
    const theta = ((k + 0.5) / angles) * (Math.PI / 2);
    sum += blurredStepMtf(frequencyCyclesPerMm, sigmaMm, spacing.x * Math.cos(theta), spacing.y * Math.sin(theta));
  }
  return Math.abs(sum / angles);
}

/**
 * Generates a disk phantom (row-major Float64Array) and its truth.
 * @throws AnalysisError for non-positive sizes, spacing or radius, σ < 0, supersampling < 1, or invalid noise settings
 */
export function makeDisk(options: DiskOptions): Phantom<DiskTruth> {
  const o = { ...DISK_PHANTOM_DEFAULTS, ...options };
  const { width, height, radiusMm: radius, sigmaMm: sigma, insideValue, outsideValue } = o;
  assertPhantomSize(width, height);
  const spacing = resolvePixelSpacing(o.pixelSpacingMm);
  if (!(radius > 0)) throw new AnalysisError(`radiusMm must be positive, got ${radius}`);
  if (!(sigma >= 0)) throw new AnalysisError(`sigmaMm must be ≥ 0, got ${sigma}`);
  if (!(Number.isInteger(o.supersampling) && o.supersampling >= 1)) {
    throw new AnalysisError(`supersampling must be an integer ≥ 1, got ${o.supersampling}`);
  }

  // Tabulate P(r) on [rLo, rHi]; outside, P is 1 or 0 to double precision (10σ).
  const halfDiagonal = 0.5 * Math.hypot(spacing.x, spacing.y);
  const rLo = Math.max(0, radius - 10 * sigma - halfDiagonal);
  const rHi = radius + 10 * sigma + halfDiagonal;
  const step = sigma > 0 ? Math.min(sigma, spacing.x, spacing.y) / 32 : 1;
  const points = sigma > 0 ? Math.ceil((rHi - rLo) / step) + 1 : 0;
  const table = new Float64Array(points);
  for (let i = 0; i < points; i++) table[i] = blurredDiskFraction(rLo + i * step, radius, sigma);
  const fraction = (r: number): number => {
    if (sigma === 0) return r < radius ? 1 : r > radius ? 0 : 0.5;
    if (r <= rLo) return rLo === 0 ? table[0]! : 1;
    const t = (r - rLo) / step;
    const i = Math.floor(t);
    if (i >= points - 1) return 0;
    return table[i]! + (t - i) * (table[i + 1]! - table[i]!);
  };

  const data = new Float64Array(width * height);
  const contrast = insideValue - outsideValue;
  const s = o.supersampling;
  for (let y = 0; y < height; y++) {
    const dy = (y - o.centreYPx) * spacing.y;
    for (let x = 0; x < width; x++) {
      const dx = (x - o.centreXPx) * spacing.x;
      const r = Math.hypot(dx, dy);
      let value: number;
      if (r + halfDiagonal <= rLo && rLo > 0) value = 1;
      else if (r - halfDiagonal >= rHi) value = 0;
      else {
        let sum = 0;
        for (let j = 0; j < s; j++) {
          const sy = dy + ((j + 0.5) / s - 0.5) * spacing.y;
          for (let i = 0; i < s; i++) sum += fraction(Math.hypot(dx + ((i + 0.5) / s - 0.5) * spacing.x, sy));
        }
        value = sum / (s * s);
      }
      data[y * width + x] = outsideValue + contrast * value;
    }
  }
  addPhantomNoise(data, o);

  const pitch = Math.max(spacing.x, spacing.y);
  const nyquist = 1 / (2 * pitch);
  const lsf = (d: number): number => {
    let sum = 0;
    for (let k = 0; k < o.truthAngles; k++) {
      const theta = ((k + 0.5) / o.truthAngles) * (Math.PI / 2);
      sum += blurredStepLsf(d, sigma, spacing.x * Math.cos(theta), spacing.y * Math.sin(theta));
    }
    return sum / o.truthAngles;
  };
  const scale = Math.max(sigma, pitch);
  return {
    image: { data, width, height, pixelSpacingMm: spacing },
    truth: {
      radiusMm: radius,
      centreXPx: o.centreXPx,
      centreYPx: o.centreYPx,
      sigmaMm: sigma,
      insideValue,
      outsideValue,
      contrast,
      nyquistCyclesPerMm: nyquist,
      mtf: tabulateMtf((f) => diskPresampledMtf(f, sigma, spacing, o.truthAngles), 2 * nyquist, o.truthMtfSamples),
      lsfFwhmMm: symmetricWidthMm(lsf, 0.5, scale),
      lsfFwtmMm: symmetricWidthMm(lsf, 0.1, scale),
      gaussianFwhmMm: 2 * Math.sqrt(2 * Math.LN2) * sigma,
    },
  };
}
