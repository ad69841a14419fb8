"use client";

import { useEffect, useMemo, useRef } from "react";
import { Callout, Table, TBody, Td, Th, THead, Tr, formatMetric } from "@/components/ui";
import { BAR_PREVIEW_DEFAULTS, barPreviewFrequencies, renderBarPreview, type BarPreview } from "@/lib/analysis/bar-preview";
import { CHART_COLOURS, interpolateAt } from "./chart-utils";

/** Gaussian MTF exp(−2π²σ²f²) falls to 0.5 at f50 = √(ln 2 / 2) / (πσ) = 0.187391/σ (closed form; see domain notes §6). */
const GAUSSIAN_F50_SIGMA = Math.sqrt(Math.LN2 / 2) / Math.PI;

export interface ResolutionPreviewProps {
  /** The LSF to blur with: positions in mm (ascending), any scale (normalised to unit area). Null: no preview. */
  lsf: { positionMm: number[]; value: number[] } | null;
  /** Where the LSF comes from, shown under the preview (e.g. the PSF-as-LSF approximation for a point source). */
  lsfNote: string;
  /** Measured MTF50, cycles/mm: the bar frequencies are chosen around it. */
  mtf50: number | null;
  /** Baseline MTF50, cycles/mm: the comparison column uses a Gaussian LSF with this MTF50. Null: no comparison. */
  baselineMtf50: number | null;
  /** Why there is no comparison column (shown when baselineMtf50 is null). */
  baselineNote?: string;
}

/** Gaussian LSF with the given MTF50, sampled over ±6σ (positions in mm, peak 1). */
export function gaussianLsfForMtf50(mtf50: number): { positionMm: number[]; value: number[] } {
  const sigma = GAUSSIAN_F50_SIGMA / mtf50;
  const n = 241;
  const positionMm: number[] = [];
  const value: number[] = [];
  for (let i = 0; i < n; i++) {
    const x = -6 * sigma + (12 * sigma * i) / (n - 1);
    positionMm.push(x);
    value.push(Math.exp(-(x * x) / (2 * sigma * sigma)));
  }
  return { positionMm, value };
}

function modulationText(m: number): string {
  if (m < 0) return `${formatMetric(m, 2)} (contrast reversed)`;
  return formatMetric(m, 2);
}

/**
 * The "resolution preview": bar patterns at a few frequencies around the measured MTF50, blurred by the measured LSF
 * (linear shift-invariant model, lib/analysis/bar-preview.ts), beside the ideal pattern and — when a baseline MTF50
 * is known — the same pattern through a Gaussian LSF with the baseline's MTF50. Every strip is drawn at one scale
 * (mm per pixel), so finer patterns look finer.
 */
export function ResolutionPreview({ lsf, lsfNote, mtf50, baselineMtf50, baselineNote }: ResolutionPreviewProps) {
  const computed = useMemo((): { measured: BarPreview; baseline: BarPreview | null; frequencies: number[] } | { error: string } | null => {
    if (!lsf || mtf50 === null || !(mtf50 > 0)) return null;
    try {
      const frequencies = barPreviewFrequencies(mtf50);
      const measured = renderBarPreview({ lsf, frequenciesCyclesPerMm: frequencies });
      const baseline =
        baselineMtf50 !== null && baselineMtf50 > 0
          ? renderBarPreview({ lsf: gaussianLsfForMtf50(baselineMtf50), frequenciesCyclesPerMm: frequencies, samplesPerMm: measured.samplesPerMm })
          : null;
      return { measured, baseline, frequencies };
    } catch (err) {
      return { error: err instanceof Error ? err.message : "The preview could not be computed." };
    }
  }, [lsf, mtf50, baselineMtf50]);

  if (computed === null) {
    return (
      <p className="text-body text-ink-muted">
        {mtf50 === null ? "No preview: the MTF did not fall to 0.5 within the measured range, so there is no MTF50 to centre the bar patterns on." : "No preview: this analysis stored no line spread function."}
      </p>
    );
  }
  if ("error" in computed) return <Callout tone="error" role="note" title="Preview not available">{computed.error}</Callout>;

  const { measured, baseline, frequencies } = computed;
  const bars = BAR_PREVIEW_DEFAULTS.barsPerGroup;
  // Window: the widest pattern ((bars − ½) periods at the lowest frequency) plus one period each side.
  const lengthMm = (bars + 1.5) / Math.min(...frequencies);

  return (
    <div className="flex flex-col gap-3" data-testid="resolution-preview">
      <Table caption="Bar patterns through the measured and baseline blur" captionHidden density="compact">
        <THead>
          <Tr>
            <Th>Frequency</Th>
            <Th>Object (ideal bars)</Th>
            <Th>Through this result</Th>
            {baseline ? <Th>Through the baseline</Th> : null}
          </Tr>
        </THead>
        <TBody>
          {measured.groups.map((group, i) => {
            const f = group.frequencyCyclesPerMm;
            const b = baseline?.groups[i];
            return (
              <Tr key={i}>
                <th scope="row" className="px-4 py-2 text-left align-top text-body font-semibold text-ink">
                  <span className="tnum">{formatMetric(f, f < 1 ? 2 : 1)} lp/mm</span>
                  <span className="block text-caption font-normal text-ink-subtle tnum">
                    {formatMetric(BAR_PREVIEW_DEFAULTS.frequencyFactors[i] ?? f / (mtf50 ?? f), 2)} × MTF50
                  </span>
                </th>
                <Td className="align-top">
                  <BarStrip positionMm={group.positionMm} values={group.input} lengthMm={lengthMm} label={`Ideal bar pattern at ${formatMetric(f, 2)} lp/mm`} />
                </Td>
                <Td className="align-top">
                  <BarStrip
                    positionMm={group.positionMm}
                    values={group.output}
                    lengthMm={lengthMm}
                    label={`Bar pattern at ${formatMetric(f, 2)} lp/mm through this result: modulation ${modulationText(group.modulation)}`}
                  />
                  <p className="mt-1 text-caption text-ink-muted tnum">modulation {modulationText(group.modulation)}</p>
                </Td>
                {b ? (
                  <Td className="align-top">
                    <BarStrip
                      positionMm={b.positionMm}
                      values={b.output}
                      lengthMm={lengthMm}
                      label={`Bar pattern at ${formatMetric(f, 2)} lp/mm through the baseline: modulation ${modulationText(b.modulation)}`}
                    />
                    <p className="mt-1 text-caption text-ink-muted tnum">modulation {modulationText(b.modulation)}</p>
                  </Td>
                ) : null}
              </Tr>
            );
          })}
        </TBody>
      </Table>
      <div className="flex flex-col gap-1 px-4 text-caption text-ink-muted">
        <p>
          Each group is {bars} bright bars on a dark background, blurred by the line spread function (linear, shift-invariant model). Modulation is the
          bar-minus-gap contrast at the centre: 1 = perfectly sharp, 0 = the bars merge. {lsfNote}
        </p>
        <p>
          {baseline
            ? `Baseline column: a Gaussian line spread function with the baseline's MTF50 (${formatMetric(baselineMtf50, 3)} cycles/mm), an approximation — the baseline's own LSF is not stored.`
            : (baselineNote ?? "No baseline to compare with.")}
        </p>
      </div>
    </div>
  );
}

const STRIP_WIDTH = 220;
const BAR_HEIGHT = 40;
const PROFILE_HEIGHT = 26;

/** One bar group as grey levels (value 0 → black, 1 → white) over a profile line of the same values. */
function BarStrip({ positionMm, values, lengthMm, label }: { positionMm: number[]; values: number[]; lengthMm: number; label: string }) {
  const ref = useRef<HTMLCanvasElement>(null);
  useEffect(() => {
    const canvas = ref.current;
    const ctx = canvas?.getContext("2d");
    if (!canvas || !ctx) return;
    const dpr = Math.max(1, Math.min(3, window.devicePixelRatio || 1));
    const width = STRIP_WIDTH;
    const height = BAR_HEIGHT + PROFILE_HEIGHT;
    canvas.width = Math.round(width * dpr);
    canvas.height = Math.round(height * dpr);
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    ctx.clearRect(0, 0, width, height);
    const valueAt = (x: number) => interpolateAt(positionMm, values, x) ?? 0; // outside the window: background (0)
    const columns = Math.round(width * dpr);
    for (let c = 0; c < columns; c++) {
      const x = -lengthMm / 2 + ((c + 0.5) / columns) * lengthMm;
      const grey = Math.round(Math.min(1, Math.max(0, valueAt(x))) * 255);
      ctx.fillStyle = `rgb(${grey},${grey},${grey})`;
      ctx.fillRect(c / dpr, 0, 1 / dpr + 0.01, BAR_HEIGHT);
    }
    // Profile: 0 at the bottom, 1 at the top of its band.
    const top = BAR_HEIGHT + 3;
    const bottom = height - 2;
    ctx.fillStyle = "#F4F4F0";
    ctx.fillRect(0, BAR_HEIGHT, width, PROFILE_HEIGHT);
    ctx.strokeStyle = CHART_COLOURS.grid;
    ctx.lineWidth = 1;
    ctx.beginPath();
    ctx.moveTo(0, bottom + 0.5);
    ctx.lineTo(width, bottom + 0.5);
    ctx.stroke();
    ctx.strokeStyle = CHART_COLOURS.primary;
    ctx.lineWidth = 1.4;
    ctx.beginPath();
    for (let c = 0; c <= width; c++) {
      const x = -lengthMm / 2 + (c / width) * lengthMm;
      const v = Math.min(1.05, Math.max(-0.05, valueAt(x)));
      const y = bottom - v * (bottom - top);
      if (c === 0) ctx.moveTo(c, y);
      else ctx.lineTo(c, y);
    }
    ctx.stroke();
  }, [positionMm, values, lengthMm]);
  return <canvas ref={ref} role="img" aria-label={label} style={{ width: STRIP_WIDTH, height: BAR_HEIGHT + PROFILE_HEIGHT }} className="block rounded-chip border border-line" />;
}
