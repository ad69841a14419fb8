"use client";

import { Tab, TabList, TabPanel, Tabs } from "@/components/ui";
import { MtfChart, type MtfSeries } from "./mtf-chart";
import { ResolutionPreview } from "./resolution-preview";
import { SpreadChart } from "./spread-chart";
import type { MethodKey, SpreadCurveJson } from "./scan-types";
import { useScannerBaselines, type BaselineLoad } from "./use-scanner-baselines";

export interface ScanCurvesPanelProps {
  scannerId: number;
  testId: number | null;
  method: MethodKey;
  mtf: MtfSeries;
  cuts: { x?: MtfSeries; y?: MtfSeries };
  spread: SpreadCurveJson[];
  nyquist: number;
  mtf50: number | null;
  mtf10: number | null;
  mtfAtNyquist: number | null;
  widths: { fwhmMm: number | null; fwhmXMm?: number | null; fwhmYMm?: number | null };
}

const PRIMARY_LABELS: Record<MethodKey, string> = {
  point: "MTF (radial average)",
  line: "MTF",
  edge: "MTF (presampled)",
  disk: "TTF (radial)",
};

function baselineStatus(load: BaselineLoad): string {
  if (load.state === "loading") return "Loading the baseline curve…";
  if (load.state === "unavailable") return "The baseline curve could not be loaded; the chart shows this result only.";
  if (!load.baseline) return "No baseline set for this test yet.";
  if (!load.baseline.mtfCurve) return "The baseline has no stored MTF curve.";
  return "";
}

/** MTF and spread-function charts of a result, in tabs, with the scanner's baseline MTF overlaid when available. */
export function ScanCurvesPanel(props: ScanCurvesPanelProps) {
  const load = useScannerBaselines(props.scannerId, props.testId);
  const status = baselineStatus(load);
  const spreadTab = props.spread.some((c) => c.kind === "esf") ? "ESF and LSF" : props.spread.some((c) => c.kind === "psf") ? "PSF profiles" : "LSF";
  return (
    <Tabs defaultValue="mtf">
      <TabList label="Result curves">
        <Tab value="mtf">MTF</Tab>
        <Tab value="spread">{spreadTab}</Tab>
      </TabList>
      <TabPanel value="mtf">
        <MtfChart
          mtf={props.mtf}
          cuts={props.cuts}
          baseline={load.baseline?.mtfCurve ?? null}
          nyquist={props.nyquist}
          mtf50={props.mtf50}
          mtf10={props.mtf10}
          mtfAtNyquist={props.mtfAtNyquist}
          primaryLabel={PRIMARY_LABELS[props.method]}
        />
        {status ? (
          <p className="mt-2 text-caption text-ink-subtle" role="status">
            {status}
          </p>
        ) : null}
      </TabPanel>
      <TabPanel value="spread">
        <SpreadChart spread={props.spread} widths={props.widths} />
      </TabPanel>
    </Tabs>
  );
}

export interface ResolutionPreviewPanelProps {
  scannerId: number;
  testId: number | null;
  lsf: { positionMm: number[]; value: number[] } | null;
  lsfNote: string;
  mtf50: number | null;
}

/** The resolution preview with the baseline comparison column once the scanner's baseline MTF50 is known. */
export function ResolutionPreviewPanel({ scannerId, testId, lsf, lsfNote, mtf50 }: ResolutionPreviewPanelProps) {
  const load = useScannerBaselines(scannerId, testId);
  const baselineMtf50 = load.baseline?.means.mtf50 ?? null;
  const note =
    load.state === "loading"
      ? "Loading the baseline…"
      : load.state === "unavailable"
        ? "The baseline could not be loaded, so there is no comparison column."
        : "No baseline MTF50 for this test yet, so there is no comparison column.";
  return <ResolutionPreview lsf={lsf} lsfNote={lsfNote} mtf50={mtf50} baselineMtf50={baselineMtf50} baselineNote={note} />;
}

