/**
 * The JSON shape of a scan as the API sends it (lib/scans/scan-json.ts scanToJson, after JSON serialisation: dates are
 * ISO strings). The result page passes exactly this to its client components, so they can also take an API response.
 * Frequencies in cycles/mm (= lp/mm), lengths in mm, ROI in pixels of the analysed frame.
 */
import type { AnalysisMethod, MethodChoice } from "@/lib/analysis/types";
import type { MetricKey } from "@/lib/qa/metrics";
import type { AnalysisJson } from "@/lib/report/analysis-json";

export type ResultStatus = "pass" | "warning" | "action" | "no-baseline";
export type MethodKey = AnalysisMethod;
export type MethodChoiceKey = MethodChoice;

export interface RoiJson {
  x: number;
  y: number;
  width: number;
  height: number;
}

/** The primary MTF uses `frequency` (CLI JSON keys); extra curves keep the analysis' `frequencyCyclesPerMm`. */
export interface MtfCurveJson {
  frequency?: number[];
  frequencyCyclesPerMm?: number[];
  value: number[];
}

export interface SpreadCurveJson {
  id: string;
  kind: "psf" | "lsf" | "esf";
  axis: "x" | "y" | "normal" | "radial";
  positionMm: number[];
  value: number[];
}

export interface ToleranceJson {
  mode: "relative" | "absolute";
  warning: number;
  action: number;
  source: string;
  isDefault: boolean;
}

export interface MetricEvaluationJson {
  metric: MetricKey;
  value: number | null;
  status: ResultStatus;
  deviationPercent: number | null;
  message: string;
  baselineMean: number | null;
  tolerance: ToleranceJson | null;
}

export interface EvaluationJson {
  status: ResultStatus;
  metrics: MetricEvaluationJson[];
  headline: string;
}

export interface DriftFlagJson {
  rule: string;
  description: string;
  side?: string;
  isBadSide?: boolean;
}

/** The analysis JSON (lib/report/analysis-json.ts, the same keys as the CLI) plus what the API adds around it. */
export interface AnalysisJsonView extends Omit<AnalysisJson, "mtf"> {
  id: number;
  revision: number;
  status: ResultStatus;
  createdAt: string;
  createdBy: string | null;
  options: Record<string, unknown> | null;
  mtf: MtfCurveJson;
  roi: RoiJson;
  spread: SpreadCurveJson[];
  mtfCurves: Record<string, MtfCurveJson | undefined>;
  details: Record<string, unknown>;
  evaluation: EvaluationJson | null;
  driftFlags: DriftFlagJson[];
}

export interface HistoryEntryJson {
  id: number;
  revision: number;
  isCurrent: boolean;
  method: MethodKey;
  status: ResultStatus;
  options: Record<string, unknown> | null;
  analysisVersion: string;
  createdAt: string;
  createdByName: string;
}

export interface ScanRecordJson {
  id: number;
  scannerId: number;
  scannerName: string;
  siteName: string;
  testId: number | null;
  testName: string | null;
  fileName: string;
  fileSize: number;
  fileSha256: string;
  format: string;
  acquiredAt: string;
  uploadedAt: string;
  uploadedBy: string;
  note: string | null;
  attributes: Record<string, string | number | null>;
  signOff: { by: string | null; at: string; note: string | null } | null;
}

export interface ScanJsonView {
  scan: ScanRecordJson;
  analysis: AnalysisJsonView | null;
  history: HistoryEntryJson[];
}

/** Readable names of the analysis methods, as offered in the method selects. */
export const METHOD_LABELS: Record<MethodChoiceKey, string> = {
  auto: "Automatic",
  point: "Point source",
  line: "Line source",
  edge: "Slanted edge",
  disk: "Disk insert",
};

export const METHOD_CHOICES: readonly MethodChoiceKey[] = ["auto", "point", "line", "edge", "disk"];

/** Frequencies of a curve in cycles/mm, whichever key it carries. */
export function curveFrequencies(curve: MtfCurveJson): number[] {
  return curve.frequency ?? curve.frequencyCyclesPerMm ?? [];
}
