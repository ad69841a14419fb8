"use client";

import { useRouter } from "next/navigation";
import { useMemo } from "react";
import { CartesianGrid, ComposedChart, Line, ReferenceArea, ReferenceLine, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis } from "recharts";
import { StatusBadge } from "@/components/ui";
import { formatDate, formatShortDate, formatValue, formatValueWithUnit, metricTitle } from "./qa-format";
import type { ResultStatus, TrendJson } from "./qa-types";
import { EventGlyph, STATUS_ORDER, TREND_COLOURS, TrendMarker } from "./trend-markers";

interface PlotPoint {
  x: number;
  y: number;
  scanId: number;
  status: ResultStatus;
  at: string;
}

const DAY_MS = 86_400_000;
const AXIS_TICK = { fill: TREND_COLOURS.axis, fontSize: 12 } as const;
const LABEL_STYLE = { fontSize: 11, fontWeight: 500 } as const;

export interface TrendChartProps {
  trend: TrendJson;
  /** Range asked for ("YYYY-MM-DD" or ""), so the time axis spans it even where there are no results. */
  from: string;
  to: string;
  height?: number;
}

/** Nice round tick step for a value span. */
function niceStep(span: number, ticks: number): number {
  const raw = span / Math.max(1, ticks);
  const mag = 10 ** Math.floor(Math.log10(raw));
  const norm = raw / mag;
  return (norm < 1.5 ? 1 : norm < 3 ? 2 : norm < 7 ? 5 : 10) * mag;
}

const MONTH = new Intl.DateTimeFormat("en-GB", { month: "short", timeZone: "UTC" });
const MONTH_YEAR = new Intl.DateTimeFormat("en-GB", { month: "short", year: "numeric", timeZone: "UTC" });

/**
 * Calendar ticks (UTC) for a time axis: every week or two for short spans, else the first of every 1, 2, 3, 6 or 12
 * months, aiming at no more than ~12 ticks. Labels name the year on the first tick and at each January.
 */
export function timeTicks(x0: number, x1: number): { ticks: number[]; label: (t: number) => string } {
  const days = (x1 - x0) / DAY_MS;
  if (days <= 120) {
    const step = days <= 60 ? 7 : 14;
    const start = new Date(x0);
    let t = Date.UTC(start.getUTCFullYear(), start.getUTCMonth(), start.getUTCDate() + 1);
    const ticks: number[] = [];
    for (; t <= x1; t += step * DAY_MS) ticks.push(t);
    return { ticks, label: (v) => formatShortDate(new Date(v).toISOString(), new Date(x1)) };
  }
  const months = days / 30.4;
  const step = [1, 2, 3, 6, 12].find((m) => months / m <= 13) ?? 12 * Math.ceil(months / 144);
  const s = new Date(x0);
  const y = s.getUTCFullYear();
  let m = s.getUTCMonth() + 1;
  m = Math.ceil(m / step) * step; // align to multiples of the step (Jan, Apr, Jul, Oct for quarters)
  const ticks: number[] = [];
  for (let t = Date.UTC(y, m, 1); t <= x1; m += step, t = Date.UTC(y, m, 1)) if (t >= x0) ticks.push(t);
  const first = ticks[0];
  return {
    ticks,
    label: (v) => {
      const d = new Date(v);
      return v === first || d.getUTCMonth() === 0 ? MONTH_YEAR.format(d) : MONTH.format(d);
    },
  };
}

/**
 * One metric against test date: each result a marker whose colour AND shape give its status, a thin line joining
 * them, the baseline mean (solid), the warning and action levels (dashed, their zones shaded), Shewhart control
 * limits at ±2σ and ±3σ (dotted), and vertical markers for service visits and alert events (hover for details).
 * Clicking a marker opens the result. Hidden from assistive technology: the card around it gives the same
 * information as text and a results table with links.
 */
export function TrendChart({ trend, from, to, height = 360 }: TrendChartProps) {
  const router = useRouter();
  const metric = trend.metric;

  const points = useMemo<PlotPoint[]>(
    () =>
      trend.points
        .filter((p): p is typeof p & { value: number } => p.value !== null)
        .map((p) => ({ x: new Date(p.at).getTime(), y: p.value, scanId: p.scanId, status: p.status, at: p.at })),
    [trend.points],
  );

  const { xDomain, yDomain, yTicks, xTicks } = useMemo(() => {
    const xs = [
      ...points.map((p) => p.x),
      ...trend.serviceEvents.map((e) => new Date(e.at).getTime()),
      ...trend.alertEvents.map((e) => new Date(e.at).getTime()),
    ];
    let x0 = from ? Date.parse(`${from}T00:00:00Z`) : Math.min(...xs);
    let x1 = to ? Date.parse(`${to}T23:59:59Z`) : from ? Date.now() : Math.max(...xs);
    if (!Number.isFinite(x0) || !Number.isFinite(x1)) {
      x1 = Date.now();
      x0 = x1 - 90 * DAY_MS;
    }
    if (x1 - x0 < 14 * DAY_MS) {
      x0 -= 7 * DAY_MS;
      x1 += 7 * DAY_MS;
    }
    const xPad = (x1 - x0) * 0.02;

    const ys = [...points.map((p) => p.y)];
    if (trend.baseline) ys.push(trend.baseline.mean);
    if (trend.band) ys.push(trend.band.warningLimit, trend.band.actionLimit);
    if (trend.controlLimits) ys.push(trend.controlLimits.lower3, trend.controlLimits.upper3);
    let y0 = Math.min(...ys);
    let y1 = Math.max(...ys);
    if (!Number.isFinite(y0)) {
      y0 = 0;
      y1 = 1;
    }
    const span = y1 - y0 || Math.abs(y1) * 0.1 || 1;
    const step = niceStep(span * 1.16, 6);
    const lo = Math.floor((y0 - span * 0.08) / step) * step;
    const hi = Math.ceil((y1 + span * 0.08) / step) * step;
    const ticks: number[] = [];
    for (let v = lo; v <= hi + step / 2; v += step) ticks.push(Number(v.toPrecision(10)));
    return { xDomain: [x0 - xPad, x1 + xPad] as [number, number], yDomain: [lo, hi] as [number, number], yTicks: ticks, xTicks: timeTicks(x0 - xPad, x1 + xPad) };
  }, [points, trend, from, to]);

  const higherIsWorse = trend.direction === "higher-is-worse";
  const band = trend.band;
  const cl = trend.controlLimits;
  const clamp = (v: number) => Math.min(yDomain[1], Math.max(yDomain[0], v));
  const digits = (v: number) => formatValue(metric, v);

  const byStatus = STATUS_ORDER.map((status) => ({ status, data: points.filter((p) => p.status === status) })).filter((s) => s.data.length > 0);

  return (
    <div aria-hidden="true" className="w-full" data-testid="trend-chart-plot">
      <ResponsiveContainer width="100%" height={height}>
        <ComposedChart margin={{ top: 22, right: 96, bottom: 26, left: 10 }}>
          <CartesianGrid stroke={TREND_COLOURS.grid} strokeDasharray="2 3" />
          <XAxis
            dataKey="x"
            type="number"
            scale="time"
            domain={xDomain}
            ticks={xTicks.ticks}
            interval="preserveStartEnd"
            allowDataOverflow
            tick={AXIS_TICK}
            tickFormatter={xTicks.label}
            label={{ value: "Test date (UTC)", position: "insideBottom", offset: -16, fill: TREND_COLOURS.axis, fontSize: 12 }}
          />
          <YAxis
            type="number"
            domain={yDomain}
            ticks={yTicks}
            allowDataOverflow
            tick={AXIS_TICK}
            width={62}
            tickFormatter={digits}
            label={{ value: metricTitle(metric), angle: -90, position: "insideLeft", offset: 0, dx: -2, fill: TREND_COLOURS.axis, fontSize: 12, style: { textAnchor: "middle" } }}
          />

          {band ? (
            <>
              <ReferenceArea
                y1={clamp(Math.min(band.warningLimit, band.actionLimit))}
                y2={clamp(Math.max(band.warningLimit, band.actionLimit))}
                fill={TREND_COLOURS.warnZone}
                fillOpacity={0.9}
                ifOverflow="hidden"
              />
              <ReferenceArea
                y1={higherIsWorse ? clamp(band.actionLimit) : yDomain[0]}
                y2={higherIsWorse ? yDomain[1] : clamp(band.actionLimit)}
                fill={TREND_COLOURS.actZone}
                fillOpacity={0.9}
                ifOverflow="hidden"
              />
              <ReferenceLine
                y={band.warningLimit}
                stroke={TREND_COLOURS.warning}
                strokeDasharray="6 4"
                strokeWidth={1.4}
                ifOverflow="hidden"
                label={{ value: `Warning ${digits(band.warningLimit)}`, position: "right", fill: TREND_COLOURS.warning, ...LABEL_STYLE }}
              />
              <ReferenceLine
                y={band.actionLimit}
                stroke={TREND_COLOURS.action}
                strokeDasharray="6 4"
                strokeWidth={1.4}
                ifOverflow="hidden"
                label={{ value: `Action ${digits(band.actionLimit)}`, position: "right", fill: TREND_COLOURS.action, ...LABEL_STYLE }}
              />
            </>
          ) : null}

          {cl
            ? (
                [
                  [cl.upper3, "+3σ", -6],
                  [cl.upper2, null, 0],
                  [cl.lower2, null, 0],
                  [cl.lower3, "−3σ", 12],
                ] as const
              ).map(([y, name, dy], i) => (
                <ReferenceLine
                  key={i}
                  y={y}
                  stroke={TREND_COLOURS.control}
                  strokeDasharray={i === 0 || i === 3 ? "1 3" : "1 2"}
                  strokeWidth={i === 0 || i === 3 ? 1.4 : 1.1}
                  ifOverflow="hidden"
                  // Only ±3σ carry a label: the four lines can lie a few pixels apart; the legend names them all.
                  label={name ? { value: name, position: "insideLeft", fill: TREND_COLOURS.control, fontSize: 10, dy } : undefined}
                />
              ))
            : null}

          {trend.baseline ? (
            <ReferenceLine
              y={trend.baseline.mean}
              stroke={TREND_COLOURS.baseline}
              strokeWidth={1.6}
              ifOverflow="hidden"
              label={{ value: `Baseline ${digits(trend.baseline.mean)}`, position: "right", fill: TREND_COLOURS.baseline, ...LABEL_STYLE }}
            />
          ) : null}

          {trend.serviceEvents.map((e) => (
            <ReferenceLine
              key={`service-${e.id}`}
              x={new Date(e.at).getTime()}
              stroke={TREND_COLOURS.service}
              strokeDasharray="4 3"
              strokeWidth={1.4}
              ifOverflow="hidden"
              label={(props: { viewBox?: { x: number; y: number } }) => (
                <g style={{ pointerEvents: "auto" }}>
                  <title>{`Service visit ${formatDate(e.at)} (${e.engineer}): ${e.description}${e.parts ? ` — parts: ${e.parts}` : ""}`}</title>
                  <EventGlyph kind="service" x={props.viewBox?.x ?? 0} y={(props.viewBox?.y ?? 0) - 10} />
                </g>
              )}
            />
          ))}
          {trend.alertEvents.map((e, i) => (
            <ReferenceLine
              key={`alert-${e.alertId}-${i}`}
              x={new Date(e.at).getTime()}
              stroke={TREND_COLOURS.alert}
              strokeDasharray="1 3"
              strokeWidth={1.4}
              ifOverflow="hidden"
              label={(props: { viewBox?: { x: number; y: number; height: number } }) => (
                <g style={{ pointerEvents: "auto" }}>
                  <title>{`Alert ${e.alertId} ${alertActionText(e.action)} ${formatDate(e.at)}`}</title>
                  <EventGlyph kind="alert" x={props.viewBox?.x ?? 0} y={(props.viewBox?.y ?? 0) + (props.viewBox?.height ?? 0) - 8} />
                </g>
              )}
            />
          ))}

          <Line data={points} dataKey="y" stroke={TREND_COLOURS.line} strokeWidth={1.2} dot={false} activeDot={false} isAnimationActive={false} legendType="none" />
          {byStatus.map(({ status, data }) => (
            <Scatter
              key={status}
              name={status}
              data={data}
              dataKey="y"
              isAnimationActive={false}
              shape={(props: { cx?: number; cy?: number; payload?: PlotPoint }) => {
                const p = props.payload;
                if (props.cx === undefined || props.cy === undefined || !p) return <g />;
                return (
                  <g style={{ cursor: "pointer" }} onClick={() => router.push(`/scans/${p.scanId}`)}>
                    {/* a larger transparent target makes small markers easy to hit */}
                    <circle cx={props.cx} cy={props.cy} r={9} fill="transparent" />
                    <TrendMarker status={p.status} cx={props.cx} cy={props.cy} />
                  </g>
                );
              }}
            />
          ))}
          <Tooltip cursor={false} shared={false} isAnimationActive={false} content={<TrendTooltip metric={metric} />} />
        </ComposedChart>
      </ResponsiveContainer>
    </div>
  );
}

export function alertActionText(action: string): string {
  if (action === "alert.open") return "opened";
  if (action === "alert.acknowledge") return "acknowledged";
  if (action === "alert.resolve") return "resolved";
  return action;
}

function TrendTooltip({ metric, active, payload }: { metric: TrendJson["metric"]; active?: boolean; payload?: readonly { payload?: unknown }[] }) {
  const p = payload?.[0]?.payload as PlotPoint | undefined;
  if (!active || !p || typeof p.scanId !== "number") return null;
  return (
    <div className="flex flex-col gap-1 rounded-control border border-line bg-surface px-3 py-2 text-caption shadow-raised">
      <span className="font-medium text-ink">{formatDate(p.at)}</span>
      <span className="tnum text-body text-ink">{formatValueWithUnit(metric, p.y)}</span>
      <StatusBadge status={p.status} size="sm" />
      <span className="text-ink-subtle">Click to open the result</span>
    </div>
  );
}
