/**
 * Plain-text report of one analysis, as printed by the `analyze` CLI: a table of the results (lengths in mm,
 * frequencies in lp/mm = cycles/mm), the warnings, and a compact MTF table at tenths of the Nyquist frequency.
 */
import { valueAtFrequency } from "../analysis/mtf-metrics";
import type { AnalysisResult } from "../analysis/types";
import type { DecodedImage } from "../imaging/decoded-image";
import type { AnalysisTimingMs } from "./analysis-json";

export interface AnalysisReportInput {
  result: AnalysisResult;
  decoded: DecodedImage;
  fileName: string;
  /** 0-based frame that was analysed. */
  frameIndex: number;
  timing: AnalysisTimingMs;
}

const METHOD_NAMES = { point: "point source (PSF)", line: "line source (LSF)", edge: "slanted edge (ESF)", disk: "circular edge / disk (ESF)" };

const mm = (v: number | null | undefined) => (v == null ? "—" : `${v.toFixed(3)} mm`);
const lpmm = (v: number | null | undefined) => (v == null ? "not reached" : `${v.toFixed(3)} lp/mm`);
const row = (label: string, value: string) => `  ${label.padEnd(16)}${value}`;

function perAxis(x: number | null | undefined, y: number | null | undefined): string {
  return x === undefined && y === undefined ? "" : `   (x ${mm(x)}, y ${mm(y)})`;
}

/** The report as lines of text ending in a newline. */
export function formatAnalysisReport({ result, decoded, fileName, frameIndex, timing }: AnalysisReportInput): string {
  const p = result.pixelSpacingMm;
  const lines = [
    `Halfmax analysis (${result.version})`,
    row("File", `${fileName} — ${decoded.format.toUpperCase()}, ${decoded.width} × ${decoded.height} px, frame ${frameIndex + 1} of ${decoded.frames}`),
    row("Method", METHOD_NAMES[result.method]),
    row("Pixel spacing", `${p.y.toFixed(4)} mm (row) × ${p.x.toFixed(4)} mm (column)${decoded.pixelSpacingSource ? `, from ${decoded.pixelSpacingSource}` : ""}`),
    row("FWHM", `${mm(result.fwhmMm)}${perAxis(result.fwhmXMm, result.fwhmYMm)}`),
    row("FWTM", `${mm(result.fwtmMm)}${perAxis(result.fwtmXMm, result.fwtmYMm)}`),
    row("MTF50", lpmm(result.mtf50)),
    row("MTF10", lpmm(result.mtf10)),
    row("MTF at Nyquist", `${result.mtfAtNyquist == null ? "—" : result.mtfAtNyquist.toFixed(3)}   (Nyquist ${lpmm(result.nyquist)})`),
  ];
  if (result.edgeAngleDeg !== undefined) lines.push(row("Edge angle", `${result.edgeAngleDeg.toFixed(2)}°`));
  lines.push(row("Timing", `decode ${timing.decode.toFixed(1)} ms, analysis ${timing.analysis.toFixed(1)} ms`));
  const warnings = [...decoded.warnings, ...result.warnings];
  if (warnings.length === 0) lines.push(row("Warnings", "none"));
  else {
    lines.push("  Warnings");
    for (const w of warnings) lines.push(`    - ${w.code}: ${w.message}`);
  }
  lines.push("", "  MTF", `    ${"f (lp/mm)".padEnd(12)}${"f/Nyquist".padEnd(12)}MTF`);
  for (let k = 0; k <= 10; k++) {
    const f = (k / 10) * result.nyquist;
    const v = valueAtFrequency(result.mtf, f);
    lines.push(`    ${f.toFixed(3).padEnd(12)}${(k / 10).toFixed(1).padEnd(12)}${v == null ? "—" : v.toFixed(3)}`);
  }
  return `${lines.join("\n")}\n`;
}
