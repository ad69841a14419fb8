"use client";

import { useMemo } from "react";
import { CartesianGrid, Legend, Line, LineChart, ReferenceDot, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { formatMetric } from "@/components/ui";
import { ChartDataTable, type ChartDataColumn } from "./chart-data-table";
import { AXIS_TICK, CHART_COLOURS, interpolateAt, niceTicks, tickDigits } from "./chart-utils";

/** A sampled MTF: frequencies in cycles/mm (ascending), values normalised to 1 at f = 0. */
export interface MtfSeries {
  frequency: number[];
  value: number[];
}

export interface MtfChartProps {
  /** The primary curve (point: radial average; line/edge: along the normal; disk: radial). */
  mtf: MtfSeries;
  /** Axis cuts of a point-source MTF. */
  cuts?: { x?: MtfSeries; y?: MtfSeries };
  /** The scanner's baseline MTF for this test, drawn dashed. */
  baseline?: MtfSeries | null;
  /** Nyquist frequency 1/(2p), cycles/mm. */
  nyquist: number;
  mtf50: number | null;
  mtf10: number | null;
  mtfAtNyquist: number | null;
  /** Name of the primary curve in the legend, e.g. "MTF (radial average)". */
  primaryLabel?: string;
  height?: number;
}

type Row = { f: number; mtf: number | null; x: number | null; y: number | null; baseline: number | null };

const Y_MAX = 1.05;

/** The frequency range worth showing: to 1.25 × the larger of Nyquist and MTF10, within the measured curve. */
function xLimit(mtf: MtfSeries, nyquist: number, mtf10: number | null): number {
  const last = mtf.frequency[mtf.frequency.length - 1] ?? nyquist;
  const wanted = 1.25 * Math.max(nyquist, mtf10 ?? 0);
  return Math.max(Math.min(last, wanted), Math.min(last, nyquist));
}

/**
 * MTF against spatial frequency with reference lines at MTF 0.5 and 0.1, the Nyquist frequency, and the baseline
 * curve for comparison. All series are put on the primary curve's frequency grid (others linearly interpolated) so
 * the tooltip and the data table read one frequency per row.
 */
export function MtfChart({ mtf, cuts, baseline, nyquist, mtf50, mtf10, mtfAtNyquist, primaryLabel = "MTF", height = 320 }: MtfChartProps) {
  const limit = xLimit(mtf, nyquist, mtf10);
  const rows = useMemo<Row[]>(() => {
    const out: Row[] = [];
    for (let i = 0; i < mtf.frequency.length; i++) {
      const f = mtf.frequency[i]!;
      if (f > limit * 1.0001) break;
      out.push({
        f,
        mtf: mtf.value[i] ?? null,
        x: cuts?.x ? interpolateAt(cuts.x.frequency, cuts.x.value, f) : null,
        y: cuts?.y ? interpolateAt(cuts.y.frequency, cuts.y.value, f) : null,
        baseline: baseline ? interpolateAt(baseline.frequency, baseline.value, f) : null,
      });
    }
    return out;
  }, [mtf, cuts, baseline, limit]);

  const xTicks = niceTicks(0, limit, 6);
  const hasX = Boolean(cuts?.x);
  const hasY = Boolean(cuts?.y);
  const hasBaseline = Boolean(baseline && rows.some((r) => r.baseline !== null));

  const summary = [
    `MTF50 ${mtf50 === null ? "not reached" : `${formatMetric(mtf50, 3)} cycles/mm`}`,
    `MTF10 ${mtf10 === null ? "not reached" : `${formatMetric(mtf10, 3)} cycles/mm`}`,
    `MTF at the Nyquist frequency (${formatMetric(nyquist, 3)} cycles/mm) ${formatMetric(mtfAtNyquist, 3)}`,
  ].join("; ");

  const columns: ChartDataColumn[] = [
    { key: "f", label: "Frequency (cycles/mm)", digits: 3 },
    { key: "mtf", label: primaryLabel, digits: 3 },
    ...(hasX ? [{ key: "x", label: "MTF, x cut", digits: 3 }] : []),
    ...(hasY ? [{ key: "y", label: "MTF, y cut", digits: 3 }] : []),
    ...(hasBaseline ? [{ key: "baseline", label: "Baseline MTF", digits: 3 }] : []),
  ];

  return (
    <figure className="flex flex-col gap-3" data-testid="mtf-chart">
      <div className="h-full w-full" aria-hidden="true">
        <ResponsiveContainer width="100%" height={height}>
          <LineChart data={rows} margin={{ top: 18, right: 20, bottom: 24, left: 4 }}>
            <CartesianGrid stroke={CHART_COLOURS.grid} strokeDasharray="2 3" />
            <XAxis
              dataKey="f"
              type="number"
              domain={[0, limit]}
              ticks={xTicks}
              allowDataOverflow
              tick={AXIS_TICK}
              tickFormatter={(v: number) => formatMetric(v, tickDigits(xTicks))}
              label={{ value: "Spatial frequency (cycles/mm)", position: "insideBottom", offset: -14, fill: CHART_COLOURS.axis, fontSize: 12 }}
            />
            <YAxis
              type="number"
              domain={[0, Y_MAX]}
              allowDataOverflow
              ticks={[0, 0.2, 0.4, 0.6, 0.8, 1]}
              tick={AXIS_TICK}
              width={48}
              label={{ value: "MTF", angle: -90, position: "insideLeft", offset: 12, fill: CHART_COLOURS.axis, fontSize: 12 }}
            />
            <Tooltip
              formatter={(value, name) => [typeof value === "number" ? formatMetric(value, 3) : "—", name]}
              labelFormatter={(label) => `${typeof label === "number" ? formatMetric(label, 3) : label} cycles/mm`}
            />
            <Legend verticalAlign="top" height={28} iconType="plainline" wrapperStyle={{ fontSize: 12 }} />
            <ReferenceLine y={0.5} stroke={CHART_COLOURS.reference} strokeDasharray="4 3" label={{ value: "0.5", position: "right", fill: CHART_COLOURS.axis, fontSize: 11 }} />
            <ReferenceLine y={0.1} stroke={CHART_COLOURS.reference} strokeDasharray="4 3" label={{ value: "0.1", position: "right", fill: CHART_COLOURS.axis, fontSize: 11 }} />
            <ReferenceLine
              x={nyquist}
              stroke={CHART_COLOURS.axis}
              strokeDasharray="6 3"
              label={{ value: `Nyquist ${formatMetric(nyquist, 2)} cycles/mm`, position: "insideTopRight", fill: CHART_COLOURS.axis, fontSize: 11 }}
            />
            {hasBaseline ? (
              <Line dataKey="baseline" name="Baseline" stroke={CHART_COLOURS.baseline} strokeWidth={1.8} strokeDasharray="7 4" dot={false} isAnimationActive={false} connectNulls />
            ) : null}
            {hasX ? <Line dataKey="x" name="x cut" stroke={CHART_COLOURS.second} strokeWidth={1.3} strokeDasharray="2 2" dot={false} isAnimationActive={false} connectNulls /> : null}
            {hasY ? <Line dataKey="y" name="y cut" stroke={CHART_COLOURS.third} strokeWidth={1.3} strokeDasharray="5 2 1 2" dot={false} isAnimationActive={false} connectNulls /> : null}
            <Line dataKey="mtf" name={primaryLabel} stroke={CHART_COLOURS.primary} strokeWidth={2.2} dot={false} isAnimationActive={false} />
            {mtf50 !== null && mtf50 <= limit ? <ReferenceDot x={mtf50} y={0.5} r={4} fill={CHART_COLOURS.primary} stroke="#fff" /> : null}
            {mtf10 !== null && mtf10 <= limit ? <ReferenceDot x={mtf10} y={0.1} r={4} fill={CHART_COLOURS.primary} stroke="#fff" /> : null}
          </LineChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="text-caption text-ink-muted">
        {summary}.{hasBaseline ? " The dashed grey curve is the baseline." : ""} Dots mark MTF50 and MTF10 on the measured curve.
      </figcaption>
      <ChartDataTable caption="MTF samples" columns={columns} rows={rows} />
    </figure>
  );
}
