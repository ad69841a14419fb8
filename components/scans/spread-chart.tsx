"use client";

import { useMemo } from "react";
import { CartesianGrid, Legend, Line, LineChart, ReferenceDot, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { formatMetric } from "@/components/ui";
import { ChartDataTable, type ChartDataColumn } from "./chart-data-table";
import { AXIS_TICK, CHART_COLOURS, interpolateAt, levelCrossings, niceTicks, tickDigits } from "./chart-utils";
import type { SpreadCurveJson } from "./scan-types";

export interface SpreadChartProps {
  /** Spread profiles of the analysis (positions in mm from the centre or edge). */
  spread: SpreadCurveJson[];
  /** Measured widths for the caption, mm (from the NEMA-style measurement, not from this drawing). */
  widths?: { fwhmMm: number | null; fwhmXMm?: number | null; fwhmYMm?: number | null };
  height?: number;
}

const KIND_TITLES: Record<SpreadCurveJson["kind"], string> = {
  psf: "Point spread function (profiles through the peak)",
  lsf: "Line spread function",
  esf: "Edge spread function",
};

const SERIES_COLOURS = [CHART_COLOURS.primary, CHART_COLOURS.second, CHART_COLOURS.third];

function seriesName(curve: SpreadCurveJson): string {
  const kind = curve.kind.toUpperCase();
  if (curve.axis === "x" || curve.axis === "y") return `${kind} ${curve.axis}`;
  if (curve.axis === "radial") return `${kind} (radial)`;
  return kind;
}

/**
 * Spread-function profiles against position in mm, one chart per kind (PSF x/y together, LSF, ESF). PSF and LSF
 * charts show the half-maximum level and where each profile crosses it; the FWHM values in the caption are the
 * measured ones (interpolated NEMA method), which the crossings drawn here approximate.
 */
export function SpreadChart({ spread, widths, height = 260 }: SpreadChartProps) {
  // ESF before LSF: the LSF is derived from it.
  const kinds = (["psf", "esf", "lsf"] as const).filter((k) => spread.some((c) => c.kind === k));
  if (kinds.length === 0) return <p className="text-body text-ink-muted">This analysis stored no spread-function profile.</p>;
  return (
    <div className="flex flex-col gap-6" data-testid="spread-chart">
      {kinds.map((kind) => (
        <SpreadKindChart key={kind} kind={kind} curves={spread.filter((c) => c.kind === kind)} widths={widths} height={height} />
      ))}
    </div>
  );
}

function SpreadKindChart({ kind, curves, widths, height }: { kind: SpreadCurveJson["kind"]; curves: SpreadCurveJson[]; widths: SpreadChartProps["widths"]; height: number }) {
  const showHalfMax = kind !== "esf";
  const { rows, chartRows, crossings, xDomain, xTicks, yTicks, yDomain } = useMemo(() => {
    // PSF/LSF are shown relative to their own peak (edge LSFs are stored with unit area, point/line ones peak = 1).
    const shown = curves.map((c) => {
      if (!showHalfMax) return c;
      const top = Math.max(...c.value);
      return top > 0 ? { ...c, value: c.value.map((v) => v / top) } : c;
    });
    const positions = [...new Set(shown.flatMap((c) => c.positionMm))].sort((a, b) => a - b);
    const table = positions.map((p) => {
      const row: Record<string, number | null> = { p };
      for (const c of shown) row[c.id] = interpolateAt(c.positionMm, c.value, p);
      return row;
    });
    const top = Math.max(...shown.map((c) => Math.max(...c.value)));
    const bottom = Math.min(...shown.map((c) => Math.min(...c.value)));
    const cross = shown.map((c) => ({ id: c.id, at: showHalfMax ? levelCrossings(c.positionMm, c.value, 0.5) : null }));
    const first = positions[0] ?? 0;
    const last = positions[positions.length - 1] ?? 1;
    // PSF/LSF: zoom on the peak, not the whole ROI of flat, noisy background. From the peak, walk out to the first
    // sample below 2 % of it on each side, and show 2.5 × that reach (tails stay visible).
    let lo = first;
    let hi = last;
    if (showHalfMax) {
      let reach = 0;
      for (const c of shown) {
        let peak = 0;
        for (let i = 1; i < c.value.length; i++) if (c.value[i]! > c.value[peak]!) peak = i;
        let l = peak;
        while (l > 0 && c.value[l]! >= 0.02) l--;
        let r = peak;
        while (r < c.value.length - 1 && c.value[r]! >= 0.02) r++;
        reach = Math.max(reach, Math.abs(c.positionMm[l]! - c.positionMm[peak]!), Math.abs(c.positionMm[r]! - c.positionMm[peak]!), Math.abs(c.positionMm[peak]!));
      }
      if (reach > 0) {
        lo = Math.max(first, -2.5 * reach);
        hi = Math.min(last, 2.5 * reach);
      }
    }
    const ticks = niceTicks(lo, hi, 6);
    const yTicks = showHalfMax ? [...(bottom < -0.05 ? [-0.25] : []), 0, 0.25, 0.5, 0.75, 1] : niceTicks(bottom, top, 5);
    const yDomain: [number, number] = showHalfMax ? [bottom < -0.05 ? Math.max(-0.3, bottom) : -0.02, 1.05] : [yTicks[0]! > bottom ? bottom : yTicks[0]!, top];
    return { rows: table, chartRows: table.filter((r) => r.p! >= lo && r.p! <= hi), peak: top, crossings: cross, xDomain: [lo, hi] as [number, number], xTicks: ticks, yTicks, yDomain };
  }, [curves, showHalfMax]);

  const widthText =
    kind === "psf" && widths
      ? `Measured FWHM: x ${formatMetric(widths.fwhmXMm ?? null, 2)} mm, y ${formatMetric(widths.fwhmYMm ?? null, 2)} mm.`
      : kind === "lsf" && widths
        ? `Measured FWHM ${formatMetric(widths.fwhmMm, 2)} mm.`
        : "";
  const columns: ChartDataColumn[] = [{ key: "p", label: "Position (mm)", digits: 3 }, ...curves.map((c) => ({ key: c.id, label: seriesName(c), digits: 4 }))];
  const headingId = `spread-${kind}`;

  return (
    <figure className="flex flex-col gap-2" aria-labelledby={headingId}>
      <h3 id={headingId} className="text-body font-semibold text-ink">
        {KIND_TITLES[kind]}
      </h3>
      <div aria-hidden="true">
        <ResponsiveContainer width="100%" height={height}>
          <LineChart data={chartRows} margin={{ top: 8, right: 20, bottom: 24, left: 4 }}>
            <CartesianGrid stroke={CHART_COLOURS.grid} strokeDasharray="2 3" />
            <XAxis
              dataKey="p"
              type="number"
              domain={xDomain}
              ticks={xTicks}
              allowDataOverflow
              tick={AXIS_TICK}
              tickFormatter={(v: number) => formatMetric(v, tickDigits(xTicks))}
              label={{ value: kind === "esf" ? "Distance from the edge (mm)" : "Position (mm)", position: "insideBottom", offset: -14, fill: CHART_COLOURS.axis, fontSize: 12 }}
            />
            <YAxis
              type="number"
              domain={yDomain}
              ticks={yTicks}
              allowDataOverflow
              tick={AXIS_TICK}
              width={kind === "esf" ? 64 : 52}
              tickFormatter={(v: number) => formatMetric(v, tickDigits(yTicks))}
              label={{ value: kind === "esf" ? "Signal" : "Relative to peak", angle: -90, position: "insideLeft", offset: kind === "esf" ? 0 : 10, fill: CHART_COLOURS.axis, fontSize: 12 }}
            />
            <Tooltip
              formatter={(value, name) => [typeof value === "number" ? formatMetric(value, 3) : "—", name]}
              labelFormatter={(label) => `${typeof label === "number" ? formatMetric(label, 3) : label} mm`}
            />
            {curves.length > 1 ? <Legend verticalAlign="top" height={24} iconType="plainline" wrapperStyle={{ fontSize: 12 }} /> : null}
            {showHalfMax ? (
              <ReferenceLine y={0.5} stroke={CHART_COLOURS.reference} strokeDasharray="4 3" label={{ value: "half maximum", position: "insideTopRight", fill: CHART_COLOURS.axis, fontSize: 11 }} />
            ) : null}
            {curves.map((c, i) => (
              <Line key={c.id} dataKey={c.id} name={seriesName(c)} stroke={SERIES_COLOURS[i % SERIES_COLOURS.length]} strokeWidth={i === 0 ? 2 : 1.6} strokeDasharray={i === 0 ? undefined : "5 3"} dot={false} isAnimationActive={false} connectNulls />
            ))}
            {showHalfMax
              ? crossings.flatMap((c, i) =>
                  c.at
                    ? [
                        <ReferenceDot key={`${c.id}-l`} x={c.at.left} y={0.5} r={3.5} fill={SERIES_COLOURS[i % SERIES_COLOURS.length]} stroke="#fff" />,
                        <ReferenceDot key={`${c.id}-r`} x={c.at.right} y={0.5} r={3.5} fill={SERIES_COLOURS[i % SERIES_COLOURS.length]} stroke="#fff" />,
                      ]
                    : [],
                )
              : null}
          </LineChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="text-caption text-ink-muted">
        {kind === "esf"
          ? "Signal across the edge; its derivative is the line spread function."
          : `Profiles normalised to their peak; dots mark where each crosses half its maximum. ${widthText}`}
      </figcaption>
      <ChartDataTable caption={`${KIND_TITLES[kind]} samples`} columns={columns} rows={rows} />
    </figure>
  );
}
