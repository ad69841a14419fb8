"use client";

import { keepPreviousData, useQuery } from "@tanstack/react-query";
import Link from "next/link";
import { useId, useMemo, useState, type ReactNode } from "react";
import { Card, CardBody, CardDescription, CardHeader, CardTitle, Callout, EmptyState, Select, Skeleton, Spinner, STATUS_LABELS } from "@/components/ui";
import { errorMessage, fetchJson } from "@/lib/api/fetch-json";
import { METRIC_KEYS, METRICS, metricsForMethod, type MetricKey } from "@/lib/qa/metrics";
import { describeRange, type DateRange } from "./date-range-picker";
import { directionText, formatDate, formatLevel, formatValueWithUnit, metricTitle } from "./qa-format";
import { qaKeys, type TrendJson } from "./qa-types";
import { alertActionText, TrendChart } from "./trend-chart";
import { EventSwatch, LineSwatch, MARKER_SHAPE_NAMES, MarkerSwatch, STATUS_ORDER, TREND_COLOURS, ZoneSwatch } from "./trend-markers";
import { useScannerTests } from "./use-scanner-queries";

/**
 * The trend of one metric of one routine test over the chosen period, with its selectors, legend, a text summary,
 * the drift flags (rule text) and the service and alert events listed for keyboard and screen-reader users.
 */
export function TrendCard({ scannerId, range }: { scannerId: number; range: DateRange }) {
  const metricId = useId();
  const testId = useId();
  const tests = useScannerTests(scannerId);
  const activeTests = useMemo(() => (tests.data ?? []).filter((t) => t.active), [tests.data]);
  const metricOptions = useMemo(() => {
    const produced = new Set(activeTests.flatMap((t) => metricsForMethod(t.method)));
    return METRIC_KEYS.filter((k) => produced.has(k));
  }, [activeTests]);

  const [chosenMetric, setChosenMetric] = useState<MetricKey | null>(null);
  const metric: MetricKey | null =
    chosenMetric && metricOptions.includes(chosenMetric) ? chosenMetric : metricOptions.includes("mtf50") ? "mtf50" : (metricOptions[0] ?? null);
  const eligibleTests = activeTests.filter((t) => metric && metricsForMethod(t.method).includes(metric));
  const [chosenTest, setChosenTest] = useState<number | null>(null);
  const test = eligibleTests.find((t) => t.id === chosenTest) ?? eligibleTests[0] ?? null;

  const q = { metric: metric ?? "mtf50", testId: test?.id ?? null, from: range.from, to: range.to };
  const trend = useQuery({
    queryKey: qaKeys.trend(scannerId, q),
    queryFn: ({ signal }) => {
      const p = new URLSearchParams({ metric: q.metric });
      if (q.testId) p.set("testId", String(q.testId));
      if (q.from) p.set("from", q.from);
      if (q.to) p.set("to", q.to);
      return fetchJson<TrendJson>(`/api/scanners/${scannerId}/trend?${p}`, { signal });
    },
    enabled: metric !== null && test !== null && !(range.from && range.to && range.from > range.to),
    placeholderData: keepPreviousData,
  });
  const data = trend.data;

  let body;
  if (tests.isPending) body = <Skeleton className="h-80 w-full rounded-card" />;
  else if (tests.error) body = <Callout tone="error" title="The routine tests could not be loaded">{errorMessage(tests.error)}</Callout>;
  else if (!metric || !test) {
    body = <EmptyState title="No routine test yet" description="A trend needs an active routine test on this scanner. Set one up under Schedule below." />;
  } else if (trend.error) {
    body = <Callout tone="error" title="The trend could not be loaded">{errorMessage(trend.error)}</Callout>;
  } else if (!data) {
    body = <Skeleton className="h-80 w-full rounded-card" />;
  } else {
    const measured = data.points.filter((p) => p.value !== null);
    body = (
      <figure className="flex flex-col gap-4" aria-labelledby="trend-summary">
        {measured.length === 0 ? (
          <EmptyState
            title="No results in this period"
            description={`No ${data.label} results of “${data.test?.name ?? test.name}” ${range.from || range.to ? `for ${describeRange(range)}` : "yet"}. Widen the period or add results.`}
          />
        ) : (
          <TrendChart trend={data} from={range.from} to={range.to} />
        )}
        <TrendLegend trend={data} />
        <figcaption id="trend-summary" className="text-body text-ink-muted">
          {summarise(data, range)}
        </figcaption>
        <DriftFlags trend={data} />
        <EventList trend={data} />
      </figure>
    );
  }

  return (
    <Card aria-labelledby="trend-title" data-testid="trend-card">
      <CardHeader
        actions={trend.isFetching && data ? <Spinner size="sm" label="Updating the trend" /> : null}
      >
        <CardTitle id="trend-title">Resolution trend</CardTitle>
        <CardDescription>
          Each result against the baseline and the warning and action levels. Click a marker, or use the results table below, to open a result.
        </CardDescription>
      </CardHeader>
      <CardBody className="flex flex-col gap-4">
        {metricOptions.length > 0 ? (
          <div className="flex flex-wrap items-end gap-3">
            <div className="flex flex-col gap-1">
              <label htmlFor={metricId} className="text-caption font-medium text-ink-muted">Metric</label>
              <Select id={metricId} controlSize="sm" className="w-56" value={metric ?? ""} onChange={(e) => setChosenMetric(e.target.value as MetricKey)}>
                {metricOptions.map((k) => (
                  <option key={k} value={k}>{metricTitle(k)}</option>
                ))}
              </Select>
            </div>
            {eligibleTests.length > 1 ? (
              <div className="flex flex-col gap-1">
                <label htmlFor={testId} className="text-caption font-medium text-ink-muted">Test</label>
                <Select id={testId} controlSize="sm" className="w-72" value={String(test?.id ?? "")} onChange={(e) => setChosenTest(Number(e.target.value))}>
                  {eligibleTests.map((t) => (
                    <option key={t.id} value={t.id}>{t.name}</option>
                  ))}
                </Select>
              </div>
            ) : test ? (
              <p className="pb-1.5 text-body text-ink-muted">Test: <span className="font-medium text-ink">{test.name}</span></p>
            ) : null}
            {metric ? <p className="pb-1.5 text-caption text-ink-subtle">{METRICS[metric].label}: {directionText(metric)}</p> : null}
          </div>
        ) : null}
        {body}
      </CardBody>
    </Card>
  );
}

function summarise(t: TrendJson, range: DateRange): string {
  const measured = t.points.filter((p) => p.value !== null);
  const parts: string[] = [];
  const counts = STATUS_ORDER.map((s) => [s, measured.filter((p) => p.status === s).length] as const).filter(([, n]) => n > 0);
  parts.push(
    `${measured.length} ${t.label} ${measured.length === 1 ? "result" : "results"} (${describeRange(range)})` +
      (counts.length ? `: ${counts.map(([s, n]) => `${n} ${STATUS_LABELS[s].toLowerCase()}`).join(", ")}` : ""),
  );
  const last = measured[measured.length - 1];
  if (last) parts.push(`latest ${formatValueWithUnit(t.metric, last.value)} on ${formatDate(last.at)} (${STATUS_LABELS[last.status]})`);
  if (t.baseline) {
    parts.push(
      `baseline ${formatValueWithUnit(t.metric, t.baseline.mean)}${t.baseline.sd !== null ? ` ± ${formatValueWithUnit(t.metric, t.baseline.sd)} (1 SD)` : ""}, n = ${t.baseline.n}, set ${formatDate(t.baseline.setAt)}`,
    );
  } else parts.push("no baseline set for this metric yet");
  if (t.band && t.tolerance) {
    parts.push(
      `warning at ${formatValueWithUnit(t.metric, t.band.warningLimit)}, action at ${formatValueWithUnit(t.metric, t.band.actionLimit)}` +
        (t.tolerance.mode === "relative" ? ` (${formatLevel(t.metric, "relative", t.tolerance.warning)} and ${formatLevel(t.metric, "relative", t.tolerance.action)} from baseline)` : "") +
        (t.tolerance.isDefault ? ", default levels" : ""),
    );
  }
  return `${parts.join("; ")}.`;
}

function TrendLegend({ trend }: { trend: TrendJson }) {
  const items: { key: string; swatch: ReactNode; text: string }[] = STATUS_ORDER.map((s) => ({
    key: s,
    swatch: <MarkerSwatch status={s} />,
    text: `${STATUS_LABELS[s]} (${MARKER_SHAPE_NAMES[s]})`,
  }));
  if (trend.baseline) items.push({ key: "baseline", swatch: <LineSwatch colour={TREND_COLOURS.baseline} />, text: "Baseline mean" });
  if (trend.band) {
    items.push({ key: "warning-zone", swatch: <ZoneSwatch fill={TREND_COLOURS.warnZone} edge={TREND_COLOURS.warning} />, text: "Warning level and zone" });
    items.push({ key: "action-zone", swatch: <ZoneSwatch fill={TREND_COLOURS.actZone} edge={TREND_COLOURS.action} />, text: "Action level and zone" });
  }
  if (trend.controlLimits) items.push({ key: "control", swatch: <LineSwatch colour={TREND_COLOURS.control} dash="1 2" />, text: "Control limits ±2σ, ±3σ" });
  if (trend.serviceEvents.length) items.push({ key: "service", swatch: <EventSwatch kind="service" />, text: "Service visit" });
  if (trend.alertEvents.length) items.push({ key: "alert", swatch: <EventSwatch kind="alert" />, text: "Alert event" });
  return (
    <ul aria-label="Chart legend" className="flex flex-wrap gap-x-5 gap-y-1.5 text-caption text-ink-muted" data-testid="trend-legend">
      {items.map((i) => (
        <li key={i.key} className="flex items-center gap-1.5">
          {i.swatch}
          {i.text}
        </li>
      ))}
    </ul>
  );
}

const MAX_FLAG_LINKS = 8;

/** Flags of the same rule and side merged (a rule can fire in several separate windows), results in time order. */
function groupFlags(trend: TrendJson) {
  const order = new Map(trend.points.map((p, i) => [p.scanId, i]));
  const groups = new Map<string, { rule: string; description: string; side: "high" | "low"; scanIds: Set<number> }>();
  for (const f of trend.driftFlags) {
    const key = `${f.rule}|${f.side}`;
    const g = groups.get(key) ?? { rule: f.rule, description: f.description, side: f.side, scanIds: new Set<number>() };
    for (const id of f.scanIds) g.scanIds.add(id);
    groups.set(key, g);
  }
  return [...groups.values()].map((g) => ({ ...g, scanIds: [...g.scanIds].sort((a, b) => (order.get(a) ?? 0) - (order.get(b) ?? 0)) }));
}

function DriftFlags({ trend }: { trend: TrendJson }) {
  const byScan = new Map(trend.points.map((p) => [p.scanId, p]));
  const groups = groupFlags(trend);
  return (
    <section aria-labelledby="drift-title" className="flex flex-col gap-2" data-testid="drift-flags">
      <h3 id="drift-title" className="text-body font-semibold text-ink">Drift rules</h3>
      {!trend.controlLimits ? (
        <p className="text-body text-ink-muted">
          Drift rules need a baseline of at least two results (to give a standard deviation){trend.baseline ? "; this baseline has none." : "."}
        </p>
      ) : groups.length === 0 ? (
        <p className="text-body text-ink-muted">No run rule fired on the worse side since the baseline was set.</p>
      ) : (
        <ul className="flex flex-col gap-2">
          {groups.map((f) => {
            const shown = f.scanIds.slice(-MAX_FLAG_LINKS);
            const hidden = f.scanIds.length - shown.length;
            return (
              <li key={`${f.rule}-${f.side}`} className="rounded-control border border-warn-line bg-warn-soft px-3 py-2 text-body">
                <p className="font-medium text-ink">
                  {f.description} — {f.side === "high" ? "above" : "below"} the baseline mean
                </p>
                <p className="text-caption text-ink-muted">
                  {f.scanIds.length} {f.scanIds.length === 1 ? "result" : "results"}
                  {hidden > 0 ? `, the latest ${shown.length}` : ""}:{" "}
                  {shown.map((id, j) => (
                    <span key={id}>
                      {j > 0 ? ", " : null}
                      <Link href={`/scans/${id}`} className="text-accent underline underline-offset-2">
                        {formatDate(byScan.get(id)?.at ?? null, `scan ${id}`)}
                      </Link>
                    </span>
                  ))}
                </p>
              </li>
            );
          })}
        </ul>
      )}
    </section>
  );
}

function EventList({ trend }: { trend: TrendJson }) {
  if (trend.serviceEvents.length === 0 && trend.alertEvents.length === 0) return null;
  return (
    <section aria-labelledby="events-title" className="flex flex-col gap-2" data-testid="trend-events">
      <h3 id="events-title" className="text-body font-semibold text-ink">Service visits and alerts in this period</h3>
      <ul className="flex flex-col gap-1 text-body">
        {[
          ...trend.serviceEvents.map((e) => ({
            at: e.at,
            key: `s${e.id}`,
            node: (
              <>
                <EventSwatch kind="service" />
                <span>
                  <span className="font-medium">{formatDate(e.at)}</span> — service visit by {e.engineer}: {e.description}
                  {e.parts ? <span className="text-ink-muted"> (parts: {e.parts})</span> : null}
                </span>
              </>
            ),
          })),
          ...trend.alertEvents.map((e, i) => ({
            at: e.at,
            key: `a${e.alertId}-${i}`,
            node: (
              <>
                <EventSwatch kind="alert" />
                <span>
                  <span className="font-medium">{formatDate(e.at)}</span> — alert {e.alertId} {alertActionText(e.action)}
                </span>
              </>
            ),
          })),
        ]
          .sort((a, b) => a.at.localeCompare(b.at))
          .map((e) => (
            <li key={e.key} className="flex items-start gap-2">
              {e.node}
            </li>
          ))}
      </ul>
    </section>
  );
}
