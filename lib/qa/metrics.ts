/**
 * Catalogue of the metrics Halfmax trends against a baseline. Keys match the fields of AnalysisResult
 * (lib/analysis/types.ts) so a stored result can be read with `result[key]`.
 */
import type { AnalysisMethod } from "../analysis/types";

export type MetricKey =
  | "fwhmMm"
  | "fwtmMm"
  | "fwhmXMm"
  | "fwhmYMm"
  | "fwtmXMm"
  | "fwtmYMm"
  | "mtf50"
  | "mtf10"
  | "mtfAtNyquist";

/** Which way a change is bad: wider spread functions and lower MTF both mean worse resolution. */
export type MetricDirection = "higher-is-worse" | "lower-is-worse";

/** Unit of a metric: widths in mm, MTF50/MTF10 in cycles/mm (= lp/mm), the MTF value itself is dimensionless (""). */
export type MetricUnit = "mm" | "cycles/mm" | "";

export interface MetricDefinition {
  key: MetricKey;
  /** Short label for tables and charts, e.g. "FWHM (x)". */
  label: string;
  /** One sentence saying what is measured. */
  description: string;
  unit: MetricUnit;
  direction: MetricDirection;
  /** Digits after the decimal point when displayed. */
  digits: number;
  /** Analysis methods whose results carry this metric. */
  methods: readonly AnalysisMethod[];
}

const ALL_METHODS: readonly AnalysisMethod[] = ["point", "line", "edge", "disk"];
const POINT_ONLY: readonly AnalysisMethod[] = ["point"];

/** Every trended metric, keyed by MetricKey. */
export const METRICS: Readonly<Record<MetricKey, MetricDefinition>> = {
  fwhmMm: {
    key: "fwhmMm",
    label: "FWHM",
    description: "Full width at half maximum of the spread function (point source: mean of x and y).",
    unit: "mm",
    direction: "higher-is-worse",
    digits: 2,
    methods: ALL_METHODS,
  },
  fwtmMm: {
    key: "fwtmMm",
    label: "FWTM",
    description: "Full width at tenth maximum of the spread function (point source: mean of x and y).",
    unit: "mm",
    direction: "higher-is-worse",
    digits: 2,
    methods: ALL_METHODS,
  },
  fwhmXMm: {
    key: "fwhmXMm",
    label: "FWHM (x)",
    description: "FWHM of the point-source profile along the image rows.",
    unit: "mm",
    direction: "higher-is-worse",
    digits: 2,
    methods: POINT_ONLY,
  },
  fwhmYMm: {
    key: "fwhmYMm",
    label: "FWHM (y)",
    description: "FWHM of the point-source profile along the image columns.",
    unit: "mm",
    direction: "higher-is-worse",
    digits: 2,
    methods: POINT_ONLY,
  },
  fwtmXMm: {
    key: "fwtmXMm",
    label: "FWTM (x)",
    description: "FWTM of the point-source profile along the image rows.",
    unit: "mm",
    direction: "higher-is-worse",
    digits: 2,
    methods: POINT_ONLY,
  },
  fwtmYMm: {
    key: "fwtmYMm",
    label: "FWTM (y)",
    description: "FWTM of the point-source profile along the image columns.",
    unit: "mm",
    direction: "higher-is-worse",
    digits: 2,
    methods: POINT_ONLY,
  },
  mtf50: {
    key: "mtf50",
    label: "MTF50",
    description: "Spatial frequency where the MTF first falls to 0.5.",
    unit: "cycles/mm",
    direction: "lower-is-worse",
    digits: 3,
    methods: ALL_METHODS,
  },
  mtf10: {
    key: "mtf10",
    label: "MTF10",
    description: "Spatial frequency where the MTF first falls to 0.1.",
    unit: "cycles/mm",
    direction: "lower-is-worse",
    digits: 3,
    methods: ALL_METHODS,
  },
  mtfAtNyquist: {
    key: "mtfAtNyquist",
    label: "MTF at Nyquist",
    description: "MTF value at the Nyquist frequency 1/(2·pixel spacing).",
    unit: "",
    direction: "lower-is-worse",
    digits: 3,
    methods: ALL_METHODS,
  },
};

/** Metric keys in display order. */
export const METRIC_KEYS: readonly MetricKey[] = [
  "fwhmMm",
  "fwtmMm",
  "fwhmXMm",
  "fwhmYMm",
  "fwtmXMm",
  "fwtmYMm",
  "mtf50",
  "mtf10",
  "mtfAtNyquist",
];

/** Type guard for strings coming from URLs, forms or the database. */
export function isMetricKey(value: string): value is MetricKey {
  return Object.prototype.hasOwnProperty.call(METRICS, value);
}

/** The metrics a result of `method` carries, in display order. */
export function metricsForMethod(method: AnalysisMethod): MetricKey[] {
  return METRIC_KEYS.filter((key) => METRICS[key].methods.includes(method));
}

/** Value with the metric's digits and unit, e.g. "1.23 mm", "0.412 cycles/mm", "0.250"; "—" for null. */
export function formatMetric(key: MetricKey, value: number | null): string {
  if (value === null || !Number.isFinite(value)) return "—";
  const { digits, unit } = METRICS[key];
  const text = value.toFixed(digits);
  return unit === "" ? text : `${text} ${unit}`;
}
