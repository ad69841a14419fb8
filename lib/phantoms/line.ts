/**
 * Synthetic line-source (wire, capillary or slit) phantom: a straight line through (centreXPx, centreYPx), tilted by
 * angleDeg from the +y (vertical) axis, with a known profile across it, on a flat background, integrated over each
 * square pixel aperture, with optional seeded noise.
 *
 * Geometry: the line runs along (sin θ, cos θ) in (x, y), i.e. x grows by tan θ per row; the signed normal distance of
 * a point is n = (X − Xc)·cos θ − (Y − Yc)·sin θ in mm. Near-horizontal lines have θ near ±90°.
 * Pixel value ("pixel-area") = background + amplitude · mean over the pixel of L(n), with L the unit-peak profile:
 * the integral along the axis on which n changes faster is exact (from the profile's antiderivative: erf for the
 * Gaussian, arctan for the Lorentzian, a clamped ramp for the slit); the other axis uses composite 4-point
 * Gauss–Legendre (exact when the line is parallel to an axis). Sampling "point" takes L at the pixel centre.
 * Presampled MTF along the normal: MTF_profile(f)·|sinc(px·f·cos θ)·sinc(py·f·sin θ)| (the square aperture projected
 * onto the normal), with MTF_profile = exp(−2π²σ²f²) (Gaussian), exp(−2πγ|f|) (Lorentzian), |sinc(w·f)| (slit).
 */
import { AnalysisError } from "../analysis/errors";
import { normalIntervalProbability } from "../analysis/special-functions";
import type { PixelSpacingMm } from "../analysis/types";
import {
  addPhantomNoise,
  assertPhantomSize,
  GAUSS_LEGENDRE_4,
  resolvePixelSpacing,
  type PhantomNoiseOptions,
  type PixelSampling,
} from "./point";
import type { Phantom } from "./types";

/** Unit-peak profile across the line. */
export type LineProfile =
  | { kind: "gaussian"; sigmaMm: number }
  | { kind: "lorentzian"; gammaMm: number }
  | { kind: "slit"; widthMm: number };

export interface LineOptions extends PhantomNoiseOptions {
  width: number;
  height: number;
  pixelSpacingMm: number | PixelSpacingMm;
  /** Tilt of the line from the +y axis towards +x, degrees. */
  angleDeg: number;
  profile: LineProfile;
  /** A point on the line, pixel coordinates; default the image centre. */
  centreXPx?: number;
  centreYPx?: number;
  /** Peak of the continuous profile above the background, image units. */
  amplitude: number;
  background: number;
  sampling?: PixelSampling;
}

export interface LineTruth {
  angleDeg: number;
  profile: LineProfile;
  centreXPx: number;
  centreYPx: number;
  /** FWHM/FWTM of the continuous profile, mm: Gaussian 2√(2 ln 2)σ / 2√(2 ln 10)σ; Lorentzian 2γ / 6γ; slit w / w. */
  fwhmMm: number;
  fwtmMm: number;
  amplitude: number;
  background: number;
  sampling: PixelSampling;
  /** Pixel aperture widths (spacing for "pixel-area", 0 for "point"), mm. */
  pixelApertureMm: PixelSpacingMm;
}

/** Defaults of the optional line-phantom settings. */
export const LINE_PHANTOM_DEFAULTS = { sampling: "pixel-area" as PixelSampling };

/** Options of {@link makeGaussianLine}: {@link LineOptions} with a Gaussian profile given by its σ. */
export type GaussianLineOptions = Omit<LineOptions, "profile"> & { sigmaMm: number };

/** Gaussian line source, see {@link makeLine}. */
export function makeGaussianLine(options: GaussianLineOptions): Phantom<LineTruth> {
  const { sigmaMm, ...rest } = options;
  return makeLine({ ...rest, profile: { kind: "gaussian", sigmaMm } });
}

/**
 * Image of a straight line source with a known profile (see the file header for geometry and sampling).
 * @throws AnalysisError for non-positive sizes, spacing or profile width, or invalid noise settings.
 */
export function makeLine(options: LineOptions): Phantom<LineTruth> {
  const { width, height, amplitude, background, profile } = options;
  assertPhantomSize(width, height);
  const spacing = resolvePixelSpacing(options.pixelSpacingMm);
  const scale = profileScaleMm(profile);
  if (!(scale > 0)) throw new AnalysisError(`line profile width must be positive, got ${scale} mm`);
  const sampling = options.sampling ?? LINE_PHANTOM_DEFAULTS.sampling;
  const centreXPx = options.centreXPx ?? (width - 1) / 2;
  const centreYPx = options.centreYPx ?? (height - 1) / 2;
  const t = (options.angleDeg * Math.PI) / 180;
  const cos = Math.cos(t);
  const sin = Math.sin(t);
  // dn/dX = cos θ, dn/dY = −sin θ: integrate exactly along the faster-changing axis.
  const exactAlongX = Math.abs(cos) >= Math.abs(sin);
  const slopeExact = exactAlongX ? cos : -sin;
  const slopeOther = exactAlongX ? -sin : cos;
  const widthExact = exactAlongX ? spacing.x : spacing.y;
  const widthOther = exactAlongX ? spacing.y : spacing.x;
  const panels = Math.abs(slopeOther) < 1e-12 ? 1 : profile.kind === "slit" ? 32 : 2;

  // A Gaussian profile is < e^(−72) beyond 12σ: those pixels stay at the background.
  const reachMm = profile.kind === "gaussian" ? 12 * profile.sigmaMm + spacing.x + spacing.y : Infinity;
  const data = new Float64Array(width * height);
  for (let y = 0; y < height; y++) {
    const dyMm = (y - centreYPx) * spacing.y;
    for (let x = 0; x < width; x++) {
      const dxMm = (x - centreXPx) * spacing.x;
      const n = dxMm * cos - dyMm * sin;
      let value: number;
      if (Math.abs(n) > reachMm) {
        value = 0;
      } else if (sampling === "point") {
        value = profileValue(profile, n);
      } else {
        let integral = 0;
        const panelWidth = widthOther / panels;
        for (let panel = 0; panel < panels; panel++) {
          const panelCentre = -widthOther / 2 + (panel + 0.5) * panelWidth;
          for (let k = 0; k < 4; k++) {
            const offset = panelCentre + (GAUSS_LEGENDRE_4.nodes[k]! * panelWidth) / 2;
            const nCentre = n + slopeOther * offset;
            const half = (slopeExact * widthExact) / 2;
            const across = profileIntegral(profile, Math.min(nCentre - half, nCentre + half), Math.max(nCentre - half, nCentre + half));
            integral += ((GAUSS_LEGENDRE_4.weights[k]! * panelWidth) / 2) * across;
          }
        }
        // ∫L(n)dX over the pixel = ∫L(n)dn / |dn/dX|.
        value = integral / Math.abs(slopeExact) / (spacing.x * spacing.y);
      }
      data[y * width + x] = background + amplitude * value;
    }
  }
  addPhantomNoise(data, options);

  const { fwhmMm, fwtmMm } = profileWidths(profile);
  return {
    image: { data, width, height, pixelSpacingMm: spacing },
    truth: {
      angleDeg: options.angleDeg,
      profile,
      centreXPx,
      centreYPx,
      fwhmMm,
      fwtmMm,
      amplitude,
      background,
      sampling,
      pixelApertureMm: sampling === "point" ? { x: 0, y: 0 } : spacing,
    },
  };
}

function profileScaleMm(profile: LineProfile): number {
  switch (profile.kind) {
    case "gaussian":
      return profile.sigmaMm;
    case "lorentzian":
      return profile.gammaMm;
    case "slit":
      return profile.widthMm;
  }
}

/** Unit-peak profile value at normal distance n (mm). */
function profileValue(profile: LineProfile, n: number): number {
  switch (profile.kind) {
    case "gaussian":
      return Math.exp((-n * n) / (2 * profile.sigmaMm * profile.sigmaMm));
    case "lorentzian":
      return (profile.gammaMm * profile.gammaMm) / (n * n + profile.gammaMm * profile.gammaMm);
    case "slit":
      return Math.abs(n) < profile.widthMm / 2 ? 1 : Math.abs(n) === profile.widthMm / 2 ? 0.5 : 0;
  }
}

/** ∫ₐᵇ L(n) dn for a ≤ b, from the profile's antiderivative. */
function profileIntegral(profile: LineProfile, a: number, b: number): number {
  switch (profile.kind) {
    case "gaussian":
      return profile.sigmaMm * Math.sqrt(2 * Math.PI) * normalIntervalProbability(a, b, 0, profile.sigmaMm);
    case "lorentzian":
      return profile.gammaMm * (Math.atan(b / profile.gammaMm) - Math.atan(a / profile.gammaMm));
    case "slit": {
      const half = profile.widthMm / 2;
      return Math.max(0, Math.min(b, half) - Math.max(a, -half));
    }
  }
}

function profileWidths(profile: LineProfile): { fwhmMm: number; fwtmMm: number } {
  switch (profile.kind) {
    case "gaussian":
      return { fwhmMm: 2 * Math.sqrt(2 * Math.LN2) * profile.sigmaMm, fwtmMm: 2 * Math.sqrt(2 * Math.LN10) * profile.sigmaMm };
    case "lorentzian":
      return { fwhmMm: 2 * profile.gammaMm, fwtmMm: 6 * profile.gammaMm };
    case "slit":
      return { fwhmMm: profile.widthMm, fwtmMm: profile.widthMm };
  }
}
