/**
 * Synthetic point-source phantom: a 2-D Gaussian PSF (optionally elliptical and rotated) on a flat background,
 * integrated over each square pixel aperture, with optional seeded noise. The truth records σ, FWHM/FWTM and the
 * parameters of the MTF formula, so tests can compare measurements with closed forms.
 *
 * Pixel value (sampling "pixel-area") = background + amplitude · mean over the pixel of exp(−½ dᵀΣ⁻¹d); the mean is
 * exact (erf differences) along x, and along y too for an unrotated PSF; a rotated PSF is integrated along y with
 * composite 4-point Gauss–Legendre (2 panels). Sampling "point" takes the PSF at the pixel centre instead.
 * MTF of the continuous PSF: exp(−2π²(σ_u²u² + σ_v²v²)) in its principal axes; pixel-area sampling multiplies it by
 * |sinc(px·u)·sinc(py·v)| (the presampled MTF).
 */
import { AnalysisError } from "../analysis/errors";
import { normalIntervalProbability } from "../analysis/special-functions";
import type { PixelSpacingMm } from "../analysis/types";
import { createRandom } from "./random";
import type { Phantom } from "./types";

export type PixelSampling = "pixel-area" | "point";

export interface PhantomNoiseOptions {
  /** SD of additive Gaussian noise, image units (0 = none). */
  noiseSd?: number;
  /** Replace each pixel by a Poisson deviate of its value (values are then counts; applied before noiseSd). */
  poisson?: boolean;
  /** Seed of the noise generator. */
  seed?: number;
}

export interface GaussianPointOptions extends PhantomNoiseOptions {
  width: number;
  height: number;
  /** Square pixels (a number) or { x, y } spacing, mm. */
  pixelSpacingMm: number | PixelSpacingMm;
  /** σ along the PSF's first principal axis (the x axis when angleDeg = 0), mm. */
  sigmaXMm: number;
  /** σ along the second principal axis, mm; default sigmaXMm. */
  sigmaYMm?: number;
  /** Rotation of the first principal axis from +x towards +y, degrees; default 0. */
  angleDeg?: number;
  /** Centre of the PSF, pixel coordinates (pixel centres at integers). */
  centreXPx: number;
  centreYPx: number;
  /** Peak of the continuous PSF above the background, image units. */
  amplitude: number;
  background: number;
  sampling?: PixelSampling;
}

export interface GaussianPointTruth {
  sigmaXMm: number;
  sigmaYMm: number;
  angleDeg: number;
  centreXPx: number;
  centreYPx: number;
  /** FWHM = 2√(2 ln 2)σ and FWTM = 2√(2 ln 10)σ of the continuous PSF along its principal axes, mm. */
  fwhmXMm: number;
  fwhmYMm: number;
  fwtmXMm: number;
  fwtmYMm: number;
  amplitude: number;
  background: number;
  sampling: PixelSampling;
  /** Pixel aperture widths (the pixel spacing for "pixel-area", 0 for "point"), mm. */
  pixelApertureMm: PixelSpacingMm;
  /** MTF(u, v) = exp(−2π²(σx²u² + σy²v²)) in the principal axes, × |sinc(ax·u)·sinc(ay·v)| for the aperture a. */
  mtfModel: "gaussian";
}

/** Defaults of the optional phantom settings. */
export const POINT_PHANTOM_DEFAULTS = { angleDeg: 0, sampling: "pixel-area" as PixelSampling, noiseSd: 0, poisson: false, seed: 1 };

/** Beyond this many σ the PSF (< e^(−72)) is left out. */
const CUTOFF_SIGMAS = 12;
/** 4-point Gauss–Legendre nodes and weights on [−1, 1] (Abramowitz & Stegun Table 25.4). */
export const GAUSS_LEGENDRE_4 = {
  nodes: [-0.8611363115940526, -0.3399810435848563, 0.3399810435848563, 0.8611363115940526],
  weights: [0.3478548451374538, 0.6521451548625461, 0.6521451548625461, 0.3478548451374538],
};

const FWHM_PER_SIGMA = 2 * Math.sqrt(2 * Math.LN2);
const FWTM_PER_SIGMA = 2 * Math.sqrt(2 * Math.LN10);

/** Converts a scalar spacing to { x, y }; throws AnalysisError for non-positive spacing. */
export function resolvePixelSpacing(spacing: number | PixelSpacingMm): PixelSpacingMm {
  const resolved = typeof spacing === "number" ? { x: spacing, y: spacing } : spacing;
  if (!(resolved.x > 0 && resolved.y > 0)) {
    throw new AnalysisError(`pixel spacing must be positive, got ${resolved.x}×${resolved.y} mm`);
  }
  return resolved;
}

/** Checks phantom dimensions; throws AnalysisError naming the bad value. */
export function assertPhantomSize(width: number, height: number): void {
  if (!Number.isInteger(width) || !Number.isInteger(height) || width < 1 || height < 1) {
    throw new AnalysisError(`phantom size must be positive integers, got ${width}×${height}`);
  }
}

/**
 * Adds seeded noise in place: Poisson resampling of each value (when `poisson`) then additive N(0, noiseSd²).
 * @throws AnalysisError for a negative noiseSd, or a negative mean under Poisson noise.
 */
export function addPhantomNoise(data: Float64Array, options: PhantomNoiseOptions): void {
  const noiseSd = options.noiseSd ?? POINT_PHANTOM_DEFAULTS.noiseSd;
  const poisson = options.poisson ?? POINT_PHANTOM_DEFAULTS.poisson;
  if (!(noiseSd >= 0)) throw new AnalysisError(`noise SD must be ≥ 0, got ${noiseSd}`);
  if (!poisson && noiseSd === 0) return;
  const random = createRandom(options.seed ?? POINT_PHANTOM_DEFAULTS.seed);
  for (let i = 0; i < data.length; i++) {
    let value = data[i]!;
    if (poisson) {
      if (value < 0) throw new AnalysisError(`Poisson noise needs non-negative pixel values, got ${value}`);
      value = random.poisson(value);
    }
    if (noiseSd > 0) value += noiseSd * random.normal();
    data[i] = value;
  }
}

/**
 * Image of a Gaussian point source with known truth (see the file header for the sampling model).
 * @throws AnalysisError for non-positive sizes, spacing or σ, or invalid noise settings.
 */
export function makeGaussianPoint(options: GaussianPointOptions): Phantom<GaussianPointTruth> {
  const { width, height, centreXPx, centreYPx, amplitude, background } = options;
  assertPhantomSize(width, height);
  const spacing = resolvePixelSpacing(options.pixelSpacingMm);
  const sigmaX = options.sigmaXMm;
  const sigmaY = options.sigmaYMm ?? sigmaX;
  if (!(sigmaX > 0 && sigmaY > 0)) throw new AnalysisError(`PSF σ must be positive, got ${sigmaX}×${sigmaY} mm`);
  const angleDeg = options.angleDeg ?? POINT_PHANTOM_DEFAULTS.angleDeg;
  const sampling = options.sampling ?? POINT_PHANTOM_DEFAULTS.sampling;

  // Quadratic form of the exponent in mm: a·dx² + 2b·dx·dy + c·dy².
  const t = (angleDeg * Math.PI) / 180;
  const cos = Math.cos(t);
  const sin = Math.sin(t);
  const p1 = 1 / (2 * sigmaX * sigmaX);
  const p2 = 1 / (2 * sigmaY * sigmaY);
  const a = cos * cos * p1 + sin * sin * p2;
  const c = sin * sin * p1 + cos * cos * p2;
  const b = cos * sin * (p1 - p2);
  const rotated = Math.abs(b) > 1e-15 * Math.max(a, c);

  const data = new Float64Array(width * height).fill(background);
  const reachMm = CUTOFF_SIGMAS * Math.max(sigmaX, sigmaY);
  const x0 = Math.max(0, Math.floor(centreXPx - reachMm / spacing.x));
  const x1 = Math.min(width - 1, Math.ceil(centreXPx + reachMm / spacing.x));
  const y0 = Math.max(0, Math.floor(centreYPx - reachMm / spacing.y));
  const y1 = Math.min(height - 1, Math.ceil(centreYPx + reachMm / spacing.y));

  for (let y = y0; y <= y1; y++) {
    const dyMm = (y - centreYPx) * spacing.y;
    for (let x = x0; x <= x1; x++) {
      const dxMm = (x - centreXPx) * spacing.x;
      let value: number;
      if (sampling === "point") {
        value = Math.exp(-(a * dxMm * dxMm + 2 * b * dxMm * dyMm + c * dyMm * dyMm));
      } else if (!rotated) {
        // Separable: exact product of erf differences, ∫exp(−d²/2σ²) = σ√(2π)·P(interval).
        const px = normalIntervalProbability(dxMm - spacing.x / 2, dxMm + spacing.x / 2, 0, Math.sqrt(1 / (2 * a)));
        const py = normalIntervalProbability(dyMm - spacing.y / 2, dyMm + spacing.y / 2, 0, Math.sqrt(1 / (2 * c)));
        value = (Math.PI / Math.sqrt(a * c) / (spacing.x * spacing.y)) * px * py;
      } else {
        value = rotatedPixelMean(a, b, c, dxMm, dyMm, spacing);
      }
      data[y * width + x] = background + amplitude * value;
    }
  }
  addPhantomNoise(data, options);

  return {
    image: { data, width, height, pixelSpacingMm: spacing },
    truth: {
      sigmaXMm: sigmaX,
      sigmaYMm: sigmaY,
      angleDeg,
      centreXPx,
      centreYPx,
      fwhmXMm: FWHM_PER_SIGMA * sigmaX,
      fwhmYMm: FWHM_PER_SIGMA * sigmaY,
      fwtmXMm: FWTM_PER_SIGMA * sigmaX,
      fwtmYMm: FWTM_PER_SIGMA * sigmaY,
      amplitude,
      background,
      sampling,
      pixelApertureMm: sampling === "point" ? { x: 0, y: 0 } : spacing,
      mtfModel: "gaussian",
    },
  };
}

/**
 * Mean of exp(−(a·dx² + 2b·dx·dy + c·dy²)) over the pixel centred at (dxMm, dyMm): exact along x for each y
 * (completing the square: a(dx + b·dy/a)² + (c − b²/a)dy²), composite 4-point Gauss–Legendre along y (2 panels).
 */
function rotatedPixelMean(a: number, b: number, c: number, dxMm: number, dyMm: number, spacing: PixelSpacingMm): number {
  const sigmaAlongX = Math.sqrt(1 / (2 * a));
  const residualCurvature = c - (b * b) / a;
  const panels = 2;
  const panelHeight = spacing.y / panels;
  let integral = 0;
  for (let panel = 0; panel < panels; panel++) {
    const panelCentre = dyMm - spacing.y / 2 + (panel + 0.5) * panelHeight;
    for (let k = 0; k < 4; k++) {
      const dy = panelCentre + (GAUSS_LEGENDRE_4.nodes[k]! * panelHeight) / 2;
      const shift = (b * dy) / a;
      const alongX = normalIntervalProbability(dxMm - spacing.x / 2, dxMm + spacing.x / 2, -shift, sigmaAlongX);
      integral += (GAUSS_LEGENDRE_4.weights[k]! * panelHeight) / 2 * Math.exp(-residualCurvature * dy * dy) * alongX;
    }
  }
  // ∫exp(−a(dx + s)²)dx over the pixel = √(π/a)·P(interval).
  return (Math.sqrt(Math.PI / a) * integral) / (spacing.x * spacing.y);
}
