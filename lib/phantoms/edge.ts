/**
 * Synthetic slanted-edge phantom: a straight edge between two uniform half-planes, blurred by a Gaussian LSF of σ and
 * integrated exactly over each pixel's area (see blurred-step.ts), with optional seeded Gaussian noise.
 *
 * Geometry: the edge passes through the image centre ((W−1)/2 + edgeOffsetPx, (H−1)/2) for a vertical edge (or
 * ((W−1)/2, (H−1)/2 + edgeOffsetPx) for a horizontal one). A vertical edge tilted by angleDeg runs
 * x_edge(y) = x₀ + tan(angle)·(y − y₀) in mm, so a positive angle moves it to larger columns further down; a
 * horizontal edge runs y_edge(x) = y₀ + tan(angle)·(x − x₀). `low` fills the side of smaller column (vertical) or
 * row (horizontal) index, `high` the other side; low > high gives a bright-to-dark edge.
 */
import { AnalysisError } from "../analysis/errors";
import type { MtfCurve, PixelSpacingMm } from "../analysis/types";
import { addPhantomNoise, assertPhantomSize, resolvePixelSpacing, type PhantomNoiseOptions } from "./point";
import type { Phantom } from "./types";
import { blurredStepLsf, blurredStepMtf, blurredStepValue, symmetricWidthMm } from "./blurred-step";

export interface SlantedEdgeOptions extends PhantomNoiseOptions {
  width: number;
  height: number;
  /** Pixel pitch, mm: one number for square pixels or { x, y }. */
  pixelSpacingMm: number | PixelSpacingMm;
  /** Signed angle of the edge to the nearest image axis (column axis for "vertical"), degrees, |angle| < 90. */
  angleDeg: number;
  /** σ of the Gaussian LSF (system blur before the pixel aperture), mm, ≥ 0 (0 = ideal edge). */
  sigmaMm: number;
  /** Value on the side of smaller column (vertical) or row (horizontal) index. */
  low: number;
  /** Value on the other side. */
  high: number;
  /** "vertical" (default): the edge runs along the columns; "horizontal": along the rows. */
  orientation?: "vertical" | "horizontal";
  /** Shift of the edge from the image centre across the edge, pixels (default 0). */
  edgeOffsetPx?: number;
}

export const SLANTED_EDGE_PHANTOM_DEFAULTS = {
  orientation: "vertical" as "vertical" | "horizontal",
  edgeOffsetPx: 0,
  /** Points of the tabulated truth MTF between 0 and 2 × Nyquist. */
  truthMtfSamples: 129,
} as const;

export interface SlantedEdgeTruth {
  sigmaMm: number;
  angleDeg: number;
  orientation: "vertical" | "horizontal";
  /** Edge position at the centre row (vertical: column) or centre column (horizontal: row), pixels. */
  edgePositionPx: number;
  low: number;
  high: number;
  /** Widths of the pixel aperture projected on the edge normal: trapezoid rect(a) ∗ rect(b), mm. */
  apertureMm: { a: number; b: number };
  /** 1/(2p) for the pixel pitch p across the edge, cycles/mm. */
  nyquistCyclesPerMm: number;
  /** Presampled MTF e^(−2π²σ²f²)·|sinc(af)·sinc(bf)| from 0 to 2 × Nyquist. */
  mtf: MtfCurve;
  /** FWHM / FWTM of the presampled LSF (Gaussian ∗ aperture), mm. */
  lsfFwhmMm: number;
  lsfFwtmMm: number;
  /** FWHM of the Gaussian blur alone, 2√(2 ln 2)·σ, mm. */
  gaussianFwhmMm: number;
}

/** Tabulates |f(ν)| on `samples` points from 0 to `maxFrequency` (cycles/mm). */
export function tabulateMtf(mtf: (f: number) => number, maxFrequency: number, samples: number): MtfCurve {
  const frequencyCyclesPerMm: number[] = [];
  const value: number[] = [];
  for (let i = 0; i < samples; i++) {
    const f = (maxFrequency * i) / (samples - 1);
    frequencyCyclesPerMm.push(f);
    value.push(Math.abs(mtf(f)));
  }
  return { frequencyCyclesPerMm, value };
}

/**
 * Generates a slanted-edge phantom (row-major Float64Array, width × height) and its truth.
 * Noise (optional, seeded): Poisson resampling and/or additive N(0, noiseSd²) as in point.ts (addPhantomNoise).
 * @throws AnalysisError for non-positive sizes or spacing, σ < 0, |angle| ≥ 90°, or invalid noise settings
 */
export function makeSlantedEdge(options: SlantedEdgeOptions): Phantom<SlantedEdgeTruth> {
  const o = { ...SLANTED_EDGE_PHANTOM_DEFAULTS, ...options };
  const { width, height, sigmaMm, low, high } = o;
  assertPhantomSize(width, height);
  if (!(sigmaMm >= 0)) throw new AnalysisError(`sigmaMm must be ≥ 0, got ${sigmaMm}`);
  if (!(Math.abs(o.angleDeg) < 90)) throw new AnalysisError(`angleDeg must be in (−90, 90), got ${o.angleDeg}`);
  const spacing = resolvePixelSpacing(o.pixelSpacingMm);
  const vertical = o.orientation === "vertical";
  // u runs across the edge, v along it (pixel index and pitch).
  const pu = vertical ? spacing.x : spacing.y;
  const pv = vertical ? spacing.y : spacing.x;
  const alpha = (o.angleDeg * Math.PI) / 180;
  const cos = Math.cos(alpha);
  const sin = Math.sin(alpha);
  const u0 = ((vertical ? width : height) - 1) / 2 + o.edgeOffsetPx;
  const v0 = ((vertical ? height : width) - 1) / 2;
  const a = pu * Math.abs(cos);
  const b = pv * Math.abs(sin);

  // Signed normal distance (mm) of pixel (u, v): d = (u − u₀)·pu·cos α − (v − v₀)·pv·sin α.
  const reach = 10 * sigmaMm + a + b; // beyond this the value is the plateau to double precision
  const data = new Float64Array(width * height);
  const contrast = high - low;
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const u = vertical ? x : y;
      const v = vertical ? y : x;
      const d = (u - u0) * pu * cos - (v - v0) * pv * sin;
      const e = d <= -reach ? 0 : d >= reach ? 1 : blurredStepValue(d, sigmaMm, a, b);
      data[y * width + x] = low + contrast * e;
    }
  }
  addPhantomNoise(data, o);

  const nyquist = 1 / (2 * pu);
  const lsf = (d: number): number => blurredStepLsf(d, sigmaMm, a, b);
  const scale = Math.max(sigmaMm, a, 1e-6);
  return {
    image: { data, width, height, pixelSpacingMm: spacing },
    truth: {
      sigmaMm,
      angleDeg: o.angleDeg,
      orientation: o.orientation,
      edgePositionPx: u0,
      low,
      high,
      apertureMm: { a, b },
      nyquistCyclesPerMm: nyquist,
      mtf: tabulateMtf((f) => blurredStepMtf(f, sigmaMm, a, b), 2 * nyquist, o.truthMtfSamples),
      lsfFwhmMm: symmetricWidthMm(lsf, 0.5, scale),
      lsfFwtmMm: symmetricWidthMm(lsf, 0.1, scale),
      gaussianFwhmMm: 2 * Math.sqrt(2 * Math.LN2) * sigmaMm,
    },
  };
}

/**
 * Truth presampled MTF of a slanted-edge phantom at frequency f (cycles/mm): e^(−2π²σ²f²)·|sinc(af)·sinc(bf)|.
 */
export function slantedEdgeMtf(truth: Pick<SlantedEdgeTruth, "sigmaMm" | "apertureMm">, frequencyCyclesPerMm: number): number {
  return Math.abs(blurredStepMtf(frequencyCyclesPerMm, truth.sigmaMm, truth.apertureMm.a, truth.apertureMm.b));
}
