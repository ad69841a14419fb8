"use client";

import { useQuery } from "@tanstack/react-query";
import type { ColumnDef } from "@tanstack/react-table";
import Link from "next/link";
import { useSearchParams } from "next/navigation";
import { useCallback, useId, useMemo } from "react";
import { Button, Callout, EmptyState, Select, Spinner, StatusBadge, StatusIcon, cn, type Status } from "@/components/ui";
import { DataTable } from "@/components/ui/data-table";
import { dueRank, dueSummary, formatDate, formatDateTime } from "@/components/scanners/qa-format";
import { qaKeys, type FleetJson } from "@/components/scanners/qa-types";
import { errorMessage, fetchJson } from "@/lib/api/fetch-json";
import {
  applyFilters,
  countByStatus,
  filterByPlace,
  filtersFromParams,
  filtersToQuery,
  MODALITY_SHORT,
  NO_FILTERS,
  STATUS_FILTER_LABELS,
  STATUS_FILTERS,
  STATUS_RANK,
  toFleetRow,
  type FleetFilters,
  type FleetRow,
  type StatusFilter,
} from "./fleet-rows";
import { MtfSparkline } from "./mtf-sparkline";

const capitalise = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

const columns: ColumnDef<FleetRow, any>[] = [
  { id: "name", accessorKey: "name", header: "Scanner", cell: ({ row }) => <span className="inline-block min-w-28 max-w-44 whitespace-normal">{row.original.name}</span> },
  // Long site and modality names wrap inside a narrow column, so the whole row fits a laptop screen.
  { id: "site", accessorKey: "siteName", header: "Site", cell: ({ row }) => <span className="block min-w-24 max-w-32 whitespace-normal">{row.original.siteName}</span> },
  {
    id: "modality",
    accessorKey: "modalityLabel",
    header: "Modality",
    cell: ({ row }) => <span title={row.original.modalityLabel}>{MODALITY_SHORT[row.original.modality] ?? row.original.modalityLabel}</span>,
  },
  {
    id: "lastTest",
    header: "Last test",
    accessorFn: (r) => (r.lastTestAt ? new Date(r.lastTestAt).getTime() : 0),
    cell: ({ row }) => formatDate(row.original.lastTestAt, "Never"),
    meta: { muted: true },
    enableGlobalFilter: false,
  },
  {
    id: "status",
    header: "Latest result",
    accessorFn: (r) => STATUS_RANK[r.latestStatus ?? "none"],
    enableGlobalFilter: false,
    cell: ({ row }) => {
      const tests = row.original.tests;
      if (tests.length === 0) return <span className="text-ink-subtle">No routine test set up</span>;
      return (
        <ul className="flex flex-col gap-1.5">
          {tests.map((t) => (
            <li key={t.testId} className="flex flex-col items-start gap-0.5">
              {t.status ? <StatusBadge status={t.status} size="sm" /> : <span className="text-caption text-ink-subtle">Not tested yet</span>}
              <span className="block max-w-40 truncate text-caption text-ink-muted" title={t.name}>{t.name}</span>
            </li>
          ))}
        </ul>
      );
    },
  },
  {
    id: "due",
    header: "Next test",
    accessorFn: (r) => (r.nextTest ? dueRank(r.nextTest) : 1e9),
    enableGlobalFilter: false,
    cell: ({ row }) => {
      const t = row.original.nextTest;
      if (!t) return <span className="text-ink-subtle">—</span>;
      const { badge, text } = dueSummary(t);
      const title = row.original.tests.length > 1 ? `${t.name}: ${text}` : undefined;
      return badge ? <StatusBadge status={badge} label={capitalise(text)} size="sm" title={title} /> : <span className="text-ink-muted" title={title}>{capitalise(text)}</span>;
    },
  },
  {
    id: "alerts",
    header: () => <span title="Open or acknowledged alerts">Alerts</span>,
    accessorKey: "openAlerts",
    meta: { numeric: true },
    enableGlobalFilter: false,
    cell: ({ row }) => {
      const n = row.original.openAlerts;
      if (n === 0) return <span className="text-ink-subtle">0</span>;
      return (
        <Link href={`/alerts?scannerId=${row.original.id}`} className="font-semibold text-act underline underline-offset-2 hover:text-act-strong">
          {n}
          <span className="sr-only"> open {n === 1 ? "alert" : "alerts"} for {row.original.name}</span>
        </Link>
      );
    },
  },
  {
    id: "trend",
    header: "MTF50 trend",
    enableSorting: false,
    enableGlobalFilter: false,
    cell: ({ row }) => <MtfSparkline points={row.original.sparkline} />,
  },
];

const CARDS: { filter: Exclude<StatusFilter, "all">; badge: Status | null; tone: string }[] = [
  { filter: "action", badge: "action", tone: "text-act" },
  { filter: "warning", badge: "warning", tone: "text-warn" },
  { filter: "pass", badge: "pass", tone: "text-pass" },
  { filter: "no-baseline", badge: "no-baseline", tone: "text-ink-muted" },
  { filter: "overdue", badge: "overdue", tone: "text-act" },
  { filter: "never-tested", badge: null, tone: "text-ink-muted" },
];

export interface FleetDashboardProps {
  /** GET /api/scanners as rendered on the server (dates as ISO strings). */
  initialData?: FleetJson;
  /** When the server read it (ms since epoch), so react-query knows how fresh it is. */
  initialUpdatedAt?: number;
}

/**
 * The fleet at a glance: counts per status (which double as filters), filters by site, modality, status and
 * "needs attention", and one sortable table of every scanner with its latest result per test, next due test,
 * open alerts and an MTF50 sparkline. Filters live in the URL so a filtered view can be bookmarked or shared.
 */
export function FleetDashboard({ initialData, initialUpdatedAt }: FleetDashboardProps) {
  const query = useQuery({
    queryKey: qaKeys.fleet,
    queryFn: ({ signal }) => fetchJson<FleetJson>("/api/scanners", { signal }),
    initialData,
    initialDataUpdatedAt: initialUpdatedAt,
    refetchInterval: 5 * 60_000,
  });
  const searchParams = useSearchParams();
  const filters = useMemo(() => filtersFromParams(new URLSearchParams(searchParams.toString())), [searchParams]);
  const setFilters = useCallback((next: FleetFilters) => {
    // Next.js syncs useSearchParams with the native history API: no navigation, no server round trip.
    window.history.replaceState(null, "", `${window.location.pathname}${filtersToQuery(next)}`);
  }, []);

  const rows = useMemo(() => (query.data?.scanners ?? []).map(toFleetRow), [query.data]);
  const placeRows = useMemo(() => filterByPlace(rows, filters), [rows, filters]);
  const counts = useMemo(() => countByStatus(placeRows), [placeRows]);
  const shown = useMemo(() => applyFilters(rows, filters), [rows, filters]);
  const sites = useMemo(() => [...new Set(rows.map((r) => r.siteName))].sort(), [rows]);
  const modalities = useMemo(() => [...new Map(rows.map((r) => [r.modality, r.modalityLabel])).entries()].sort((a, b) => a[1].localeCompare(b[1])), [rows]);
  const attentionCount = placeRows.filter((r) => r.needsAttention).length;
  const filtering = filters.status !== "all" || filters.site !== "" || filters.modality !== "" || filters.attention;

  const ids = { site: useId(), modality: useId(), status: useId(), attention: useId() };
  const toolbar = (
    <div className="flex flex-wrap items-end gap-3">
      <div className="flex flex-col gap-1">
        <label htmlFor={ids.site} className="text-caption font-medium text-ink-muted">Site</label>
        <Select id={ids.site} controlSize="sm" className="w-52" value={filters.site} onChange={(e) => setFilters({ ...filters, site: e.target.value })}>
          <option value="">All sites</option>
          {sites.map((s) => (
            <option key={s} value={s}>{s}</option>
          ))}
        </Select>
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor={ids.modality} className="text-caption font-medium text-ink-muted">Modality</label>
        <Select id={ids.modality} controlSize="sm" className="w-44" value={filters.modality} onChange={(e) => setFilters({ ...filters, modality: e.target.value })}>
          <option value="">All modalities</option>
          {modalities.map(([code, label]) => (
            <option key={code} value={code}>{label}</option>
          ))}
        </Select>
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor={ids.status} className="text-caption font-medium text-ink-muted">Status</label>
        <Select id={ids.status} controlSize="sm" className="w-40" value={filters.status} onChange={(e) => setFilters({ ...filters, status: e.target.value as StatusFilter })}>
          {STATUS_FILTERS.map((s) => (
            <option key={s} value={s}>{STATUS_FILTER_LABELS[s]}</option>
          ))}
        </Select>
      </div>
      <label htmlFor={ids.attention} className="flex h-8 cursor-pointer items-center gap-2 text-body text-ink">
        <input
          id={ids.attention}
          type="checkbox"
          className="size-4 accent-accent"
          checked={filters.attention}
          onChange={(e) => setFilters({ ...filters, attention: e.target.checked })}
        />
        Needs attention only
      </label>
    </div>
  );

  return (
    <div className="flex flex-col gap-5">
      <section aria-labelledby="fleet-summary-title" data-testid="fleet-summary" className="flex flex-col gap-2">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h2 id="fleet-summary-title" className="text-title font-semibold">
            {placeRows.length} {placeRows.length === 1 ? "scanner" : "scanners"}
            {filters.site || filters.modality ? <span className="font-normal text-ink-muted"> (filtered by place)</span> : null}
          </h2>
          <p className="flex items-center gap-2 text-caption text-ink-muted" aria-live="polite">
            {query.isFetching ? <Spinner size="sm" label="Refreshing the fleet" /> : null}
            {query.dataUpdatedAt ? <>Updated {formatDateTime(new Date(query.dataUpdatedAt).toISOString())}</> : null}
            <Button variant="ghost" size="sm" onClick={() => void query.refetch()} disabled={query.isFetching}>Refresh</Button>
          </p>
        </div>
        <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 xl:grid-cols-7">
          {CARDS.map((c) => {
            const n = counts[c.filter];
            const pressed = filters.status === c.filter;
            return (
              <li key={c.filter}>
                <button
                  type="button"
                  aria-pressed={pressed}
                  data-testid={`fleet-count-${c.filter}`}
                  onClick={() => setFilters({ ...filters, status: pressed ? "all" : c.filter, attention: false })}
                  className={cn(
                    "flex w-full flex-col items-start gap-1 rounded-card border bg-surface px-4 py-3 text-left shadow-card hover:bg-surface-hover",
                    pressed ? "border-accent ring-2 ring-accent" : "border-line",
                  )}
                >
                  <span className={cn("flex items-center gap-1.5 text-caption font-medium", n > 0 ? c.tone : "text-ink-muted")}>
                    {c.badge ? <StatusIcon status={c.badge} /> : <NotTestedIcon />}
                    {STATUS_FILTER_LABELS[c.filter]}
                  </span>
                  <span className="text-display font-semibold tnum text-ink">{n}</span>
                  <span className="sr-only">{n === 1 ? "scanner" : "scanners"}. {pressed ? "Showing only these; press to show all." : "Press to show only these."}</span>
                </button>
              </li>
            );
          })}
          <li>
            <button
              type="button"
              aria-pressed={filters.attention}
              data-testid="fleet-count-attention"
              onClick={() => setFilters({ ...filters, attention: !filters.attention, status: "all" })}
              className={cn(
                "flex w-full flex-col items-start gap-1 rounded-card border bg-surface px-4 py-3 text-left shadow-card hover:bg-surface-hover",
                filters.attention ? "border-accent ring-2 ring-accent" : "border-line",
              )}
            >
              <span className={cn("flex items-center gap-1.5 text-caption font-medium", attentionCount > 0 ? "text-act" : "text-ink-muted")}>
                <AttentionIcon />
                Needs attention
              </span>
              <span className="text-display font-semibold tnum text-ink">{attentionCount}</span>
              <span className="sr-only">
                {attentionCount === 1 ? "scanner" : "scanners"} at action or warning level, overdue, or with open alerts.{" "}
                {filters.attention ? "Showing only these; press to show all." : "Press to show only these."}
              </span>
            </button>
          </li>
        </ul>
        <p className="text-caption text-ink-subtle">
          Latest result is the worst status over each scanner&apos;s routine tests; a scanner can count under a result status and under Overdue.
        </p>
      </section>

      {query.error ? (
        <Callout tone="error" title="The fleet could not be refreshed" actions={<Button variant="secondary" size="sm" onClick={() => void query.refetch()}>Try again</Button>}>
          {errorMessage(query.error)}
          {query.data ? " The table shows the last data received." : null}
        </Callout>
      ) : null}

      <div className="rounded-card border border-line bg-surface shadow-card" data-testid="fleet-table">
        <DataTable
          data={shown}
          columns={columns}
          caption="Scanners with their latest QA results"
          filterLabel="Find a scanner"
          filterPlaceholder="Name, site or modality"
          loading={query.isPending}
          getRowId={(r) => String(r.id)}
          getRowHref={(r) => `/scanners/${r.id}`}
          linkColumnId="name"
          initialSorting={[{ id: "status", desc: true }]}
          initialPageSize={50}
          toolbar={toolbar}
          empty={
            filtering && rows.length > 0 ? (
              <EmptyState
                size="compact"
                titleAs="p"
                title="No scanner matches these filters"
                description="Every scanner here is outside the chosen site, modality or status."
                action={<Button variant="secondary" size="sm" onClick={() => setFilters(NO_FILTERS)}>Clear filters</Button>}
              />
            ) : (
              <EmptyState
                size="compact"
                titleAs="p"
                title="No scanners yet"
                description="Scanners appear here once an administrator adds them in the scanner register."
              />
            )
          }
        />
      </div>
    </div>
  );
}

function NotTestedIcon() {
  return (
    <svg viewBox="0 0 16 16" aria-hidden="true" focusable="false" className="size-3.5 shrink-0">
      <circle cx="8" cy="8" r="6.2" fill="none" stroke="currentColor" strokeWidth="1.6" />
      <path d="M8 4.8v3.4M8 10.6v.4" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
    </svg>
  );
}

function AttentionIcon() {
  return (
    <svg viewBox="0 0 16 16" aria-hidden="true" focusable="false" className="size-3.5 shrink-0">
      <path d="M8 1.8 14.6 13.6H1.4Z" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinejoin="round" />
      <path d="M8 6.2v3.4" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
      <circle cx="8" cy="11.6" r="0.9" fill="currentColor" />
    </svg>
  );
}
