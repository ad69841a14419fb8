/**
 * Shared types of the resolution-analysis core. Pure data: no framework imports.
 *
 * Conventions used everywhere in lib/analysis:
 * - Images are row-major: value of pixel (x, y) is data[y * width + x]; x runs along a row (left→right),
 *   y down the rows. Pixel centres sit at integer coordinates.
 * - Distances are in mm, spatial frequencies in cycles/mm (numerically equal to lp/mm).
 * - MTF curves are normalised to 1 at zero frequency.
 */

export type AnalysisMethod = "point" | "line" | "edge" | "disk";
export type MethodChoice = AnalysisMethod | "auto";
export const ANALYSIS_METHODS: readonly AnalysisMethod[] = ["point", "line", "edge", "disk"];

/** Version of the analysis algorithms; bump when any result could change. */
export const ANALYSIS_VERSION = "halfmax-analysis 1.0.0";

export interface PixelSpacingMm {
  /** Distance between neighbouring pixel centres along a row (DICOM column spacing), mm. */
  readonly x: number;
  /** Distance between neighbouring rows (DICOM row spacing), mm. */
  readonly y: number;
}

/** One 2-D greyscale frame, already rescaled to physical values (e.g. HU) and MONOCHROME2 (bright = high). */
export interface GrayImage {
  readonly data: Float64Array;
  readonly width: number;
  readonly height: number;
  readonly pixelSpacingMm: PixelSpacingMm;
}

/** Rectangle in pixel coordinates of the frame: columns x … x+width−1, rows y … y+height−1. */
export interface Roi {
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}

/** A sampled MTF: frequency (cycles/mm) and modulation (1 at f = 0). Plain arrays so results serialise to JSON. */
export interface MtfCurve {
  frequencyCyclesPerMm: number[];
  value: number[];
}

export type SpreadKind = "psf" | "lsf" | "esf";

/** A spread-function profile used by the analysis, positions in mm relative to the fitted centre/edge. */
export interface SpreadCurve {
  /** Stable identifier, e.g. "psf-x", "psf-y", "lsf", "esf". */
  id: string;
  kind: SpreadKind;
  /** Direction of the profile: "x", "y", "normal" (to an edge or line), "radial" (disk, radial average). */
  axis: "x" | "y" | "normal" | "radial";
  positionMm: number[];
  value: number[];
}

export interface AnalysisWarning {
  /** Stable machine-readable code, e.g. "undersampled", "low_snr", "roi_at_image_border", "edge_angle". */
  code: string;
  message: string;
}

export interface GaussianFit2d {
  amplitude: number;
  background: number;
  centreXPx: number;
  centreYPx: number;
  sigmaMajorMm: number;
  sigmaMinorMm: number;
  /** Angle of the major axis from +x towards +y, degrees in (−90, 90]. */
  angleDeg: number;
  fwhmMajorMm: number;
  fwhmMinorMm: number;
  /** Root-mean-square residual relative to the fitted amplitude. */
  relativeRmsResidual: number;
}

export interface AnalysisResult {
  method: AnalysisMethod;
  version: string;
  pixelSpacingMm: PixelSpacingMm;
  /** FWHM, mm (for a point source: the mean of x and y). Null when it cannot be measured (e.g. an edge ESF). */
  fwhmMm: number | null;
  fwtmMm: number | null;
  fwhmXMm?: number | null;
  fwhmYMm?: number | null;
  fwtmXMm?: number | null;
  fwtmYMm?: number | null;
  /** Spatial frequency where the MTF first falls to 0.5 / 0.1, cycles/mm; null when not reached in the curve. */
  mtf50: number | null;
  mtf10: number | null;
  /** Nyquist frequency 1/(2p) along the direction of the primary MTF curve, cycles/mm. */
  nyquist: number;
  mtfAtNyquist: number | null;
  /** Angle of the edge (edge method) or line (line method) to the nearest image axis, degrees. */
  edgeAngleDeg?: number;
  /** Primary MTF curve (point: radial average; line/edge: along the normal; disk: radial). */
  mtf: MtfCurve;
  /** Additional MTF curves, e.g. { x, y } cuts for a point source. */
  mtfCurves?: Record<string, MtfCurve>;
  spread: SpreadCurve[];
  /** ROI actually analysed, pixel coordinates of the frame. */
  roi: Roi;
  warnings: AnalysisWarning[];
  /** Method-specific extras (Gaussian fit, fitted centre, disk radius, edge offset…). JSON-serialisable. */
  details: Record<string, unknown>;
}

export interface AnalysisOptions {
  method?: MethodChoice;
  /** Restrict the analysis to this rectangle; default: chosen automatically around the object. */
  roi?: Roi;
}
