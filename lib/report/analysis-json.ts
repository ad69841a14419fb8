/**
 * The JSON form of an analysis result shared by the CLI (`analyze --json`) and the web API, so both use the same keys.
 * Frequencies in cycles/mm (= lp/mm), lengths in mm. Pure data conversion: no framework imports.
 */
import type { AnalysisResult, AnalysisWarning } from "../analysis/types";

export interface AnalysisTimingMs {
  /** Time to decode the file, ms. */
  decode: number;
  /** Time spent in analyse(), ms. */
  analysis: number;
}

/** The result's own metric fields, as they are, plus the CLI/API forms of the spacing, the MTF curve and the timing. */
export type AnalysisJson = Pick<
  AnalysisResult,
  "method" | "fwhmMm" | "fwtmMm" | "fwhmXMm" | "fwhmYMm" | "fwtmXMm" | "fwtmYMm" | "mtf50" | "mtf10" | "nyquist" | "mtfAtNyquist" | "edgeAngleDeg" | "warnings" | "version"
> & {
  /** [row spacing, column spacing] = [y, x], mm — the DICOM Pixel Spacing order. */
  pixelSpacingMm: [number, number];
  /** Frequencies in cycles/mm, MTF normalised to 1 at f = 0. */
  mtf: { frequency: number[]; value: number[] };
  timingMs?: AnalysisTimingMs;
};

/**
 * Converts an AnalysisResult to its JSON form. Per-axis widths appear only when the result has them (point source),
 * edgeAngleDeg only for edge/line results. `extraWarnings` (e.g. from decoding the file) come before the analysis
 * warnings.
 */
export function toAnalysisJson(result: AnalysisResult, timing?: AnalysisTimingMs, extraWarnings: AnalysisWarning[] = []): AnalysisJson {
  const perAxis = (["fwhmXMm", "fwhmYMm", "fwtmXMm", "fwtmYMm"] as const).filter((k) => result[k] !== undefined);
  // Keys in the documented order: per-axis widths after the mean widths, edge angle after the Nyquist value.
  const json: AnalysisJson = {
    method: result.method,
    pixelSpacingMm: [result.pixelSpacingMm.y, result.pixelSpacingMm.x],
    fwhmMm: result.fwhmMm,
    fwtmMm: result.fwtmMm,
    ...Object.fromEntries(perAxis.map((k) => [k, result[k] ?? null])),
    mtf50: result.mtf50,
    mtf10: result.mtf10,
    nyquist: result.nyquist,
    mtfAtNyquist: result.mtfAtNyquist,
    ...(result.edgeAngleDeg !== undefined ? { edgeAngleDeg: result.edgeAngleDeg } : {}),
    mtf: { frequency: [...result.mtf.frequencyCyclesPerMm], value: [...result.mtf.value] },
    warnings: [...extraWarnings, ...result.warnings].map((w) => ({ code: w.code, message: w.message })),
    version: result.version,
    ...(timing ? { timingMs: { decode: timing.decode, analysis: timing.analysis } } : {}),
  };
  return json;
}
