/**
 * Starting tolerances per modality and metric, offered when a test is first set up. They are defaults to be
 * reviewed by the department's medical physicist, not standards: no universal numeric tolerance is published for
 * resolution constancy tests (domain notes §4, §5). Every default is relative to the baseline (percent, in the bad
 * direction) and its `source` says honestly where the numbers come from.
 */
import { METRIC_KEYS, type MetricKey } from "./metrics";
import type { Tolerance } from "./tolerance";

/** DICOM Modality (0008,0060) values Halfmax handles; OT = other (e.g. light microscopy, industrial). */
export type Modality = "CT" | "PT" | "NM" | "DX" | "MG" | "CR" | "RF" | "US" | "MR" | "OT";
export const MODALITIES: readonly Modality[] = ["CT", "PT", "NM", "DX", "MG", "CR", "RF", "US", "MR", "OT"];

interface Levels {
  warning: number;
  action: number;
}

const MTF_PRACTICE =
  "Common practice (from memory): MTF50/MTF10 within ±10–15 % of baseline. No universal numeric MTF tolerance is " +
  "published; IEC 61223-3-5:2019 asks for baseline values and constancy tests but no numeric MTF tolerance was found " +
  "in it. Set locally.";
const NYQUIST_CHOICE =
  "Halfmax default, no published source: the MTF value at Nyquist is small, so the same absolute change is a larger " +
  "percentage than for MTF50; levels set looser than MTF50 (10/15 %) for that reason. Set locally.";
const FWHM_PRACTICE =
  "Common practice (no published source): widths held to the same ±10–15 % of baseline as MTF50, since for a " +
  "Gaussian-like spread function MTF50 = 0.441/FWHM. Compare with the manufacturer's specification at acceptance.";
const FWTM_CHOICE =
  "Halfmax default, no published source: FWTM depends on the tails (scatter, septal penetration, noise), so it varies " +
  "more than FWHM between repeats; levels set looser than FWHM. Set locally.";

/** Levels (percent worse than baseline) used for every modality unless an override below applies. */
export const BASE_DEFAULT_LEVELS: Readonly<Record<MetricKey, Levels & { source: string }>> = {
  fwhmMm: { warning: 10, action: 15, source: FWHM_PRACTICE },
  fwhmXMm: { warning: 10, action: 15, source: FWHM_PRACTICE },
  fwhmYMm: { warning: 10, action: 15, source: FWHM_PRACTICE },
  fwtmMm: { warning: 15, action: 25, source: FWTM_CHOICE },
  fwtmXMm: { warning: 15, action: 25, source: FWTM_CHOICE },
  fwtmYMm: { warning: 15, action: 25, source: FWTM_CHOICE },
  mtf50: { warning: 10, action: 15, source: MTF_PRACTICE },
  mtf10: { warning: 10, action: 15, source: MTF_PRACTICE },
  mtfAtNyquist: { warning: 15, action: 25, source: NYQUIST_CHOICE },
};

interface Override {
  metrics: readonly MetricKey[];
  levels: Levels;
  reason: string;
}

const WIDTHS: readonly MetricKey[] = ["fwhmMm", "fwhmXMm", "fwhmYMm", "fwtmMm", "fwtmXMm", "fwtmYMm"];

/** Per-modality departures from BASE_DEFAULT_LEVELS, each with its reason (all Halfmax choices, no published source). */
export const MODALITY_OVERRIDES: Readonly<Partial<Record<Modality, readonly Override[]>>> = {
  PT: [
    {
      metrics: ["fwhmMm", "fwhmXMm", "fwhmYMm"],
      levels: { warning: 15, action: 20 },
      reason:
        "Clinical PET voxels (often 2–4 mm, from memory) give only a few samples per FWHM; at 2–3 samples per FWHM " +
        "the NEMA width estimate moves by 2–10 % with the source's sub-voxel position, and the projection window also " +
        "changes the FWHM (domain notes §1, §6). Looser by Halfmax choice, no published source.",
    },
  ],
  US: [
    {
      metrics: [...WIDTHS, "mtf50", "mtf10", "mtfAtNyquist"],
      levels: { warning: 15, action: 25 },
      reason:
        "Ultrasound PSF width depends on depth, focus and the phantom's wire targets, so repeats vary more than for " +
        "X-ray edge tests (from memory). Looser by Halfmax choice, no published source; no tolerance is taken from " +
        "IEC 61391-1.",
    },
  ],
};

/**
 * Default tolerance for one modality and metric (relative mode). The source text combines the general basis with
 * any modality-specific reason. Returns a fresh object the caller may edit.
 */
export function defaultTolerance(modality: Modality, metric: MetricKey): Tolerance {
  const base = BASE_DEFAULT_LEVELS[metric];
  const override = MODALITY_OVERRIDES[modality]?.find((o) => o.metrics.includes(metric));
  if (override) {
    return { metric, mode: "relative", ...override.levels, source: `${modality}: ${override.reason}` };
  }
  return { metric, mode: "relative", warning: base.warning, action: base.action, source: base.source };
}

/** Default tolerances for every metric of a modality, in METRIC_KEYS order. */
export function defaultTolerances(modality: Modality): Tolerance[] {
  return METRIC_KEYS.map((metric) => defaultTolerance(modality, metric));
}

/**
 * Metrics evaluated against a default tolerance when the physicist has set none: the widths and MTF50/MTF10, which
 * are the usual constancy indicators (common practice). FWTM and MTF at Nyquist are recorded and trended but only
 * evaluated once a tolerance is set for them: FWTM is dominated by tails and noise, and MTF at Nyquist is often
 * close to zero, where a relative tolerance is meaningless.
 */
export const DEFAULT_EVALUATED_METRICS: readonly MetricKey[] = ["fwhmMm", "fwhmXMm", "fwhmYMm", "mtf50", "mtf10"];
