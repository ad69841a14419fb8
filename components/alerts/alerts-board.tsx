"use client";

import { useQuery } from "@tanstack/react-query";
import { useCallback, useEffect, useId, useState } from "react";
import { Button, Callout, Card, Select, Tab, TabList, TabPanel, Tabs } from "@/components/ui";
import { ScannerOptionGroups } from "@/components/scanners/scanner-option-groups";
import { errorMessage, fetchJson } from "@/lib/api/fetch-json";
import { AlertDetailDialog } from "./alert-detail-dialog";
import { alertKeys, alertsUrl, STATE_FILTERS, type AlertFilters, type AlertPermissions, type AlertRow, type ScannerOption, type StateFilter } from "./alert-types";
import { AlertsTable } from "./alerts-table";
import { CAUSE_OPTIONS } from "./cause-label";

export interface AlertsBoardProps {
  initialFilters: AlertFilters;
  scanners: ScannerOption[];
  permissions: AlertPermissions;
  /** Engineers see only the alerts of their assigned scanners. */
  scopeNote: string;
}

const EMPTY: Record<StateFilter, { title: string; description: string }> = {
  open: { title: "No open alerts", description: "Nothing is waiting to be acknowledged. Alerts open when a result reaches the action level (or the warning level, where a scanner is set to alert on warnings)." },
  acknowledged: { title: "No acknowledged alerts", description: "Alerts someone is working on appear here until the physicist resolves them." },
  resolved: { title: "No resolved alerts", description: "Closed alerts stay here with their timeline." },
  all: { title: "No alerts", description: "No result has opened an alert yet." },
};

/** Filters in the address bar, so a filtered view can be bookmarked or shared (e.g. the fleet page links ?scannerId=). */
function writeUrl(f: AlertFilters) {
  const q = new URLSearchParams();
  if (f.state !== "open") q.set("state", f.state);
  if (f.cause) q.set("cause", f.cause);
  if (f.scannerId) q.set("scannerId", String(f.scannerId));
  const s = q.toString();
  window.history.replaceState(null, "", s ? `?${s}` : window.location.pathname);
}

/** The alerts page: state tabs, cause and scanner filters, the table, and the detail dialog of the chosen alert. */
export function AlertsBoard({ initialFilters, scanners, permissions, scopeNote }: AlertsBoardProps) {
  const [filters, setFilters] = useState<AlertFilters>(initialFilters);
  const [openRow, setOpenRow] = useState<AlertRow | null>(null);
  const causeId = useId();
  const scannerId = useId();

  useEffect(() => writeUrl(filters), [filters]);
  const update = (patch: Partial<AlertFilters>) => setFilters((f) => ({ ...f, ...patch }));

  const key = { state: filters.state, cause: filters.cause, scannerId: filters.scannerId };
  const list = useQuery({
    queryKey: alertKeys.list(key),
    queryFn: ({ signal }) => fetchJson<{ alerts: AlertRow[] }>(alertsUrl(key), { signal }).then((r) => r.alerts),
    refetchInterval: 60_000,
  });
  const onOpen = useCallback((row: AlertRow) => setOpenRow(row), []);

  const filtered = filters.cause !== "" || filters.scannerId !== null;
  const stateLabel = STATE_FILTERS.find((s) => s.value === filters.state)!.label;

  const toolbar = (
    <>
      <div className="flex flex-col gap-1">
        <label htmlFor={causeId} className="text-caption font-medium text-ink-muted">
          Cause
        </label>
        <Select id={causeId} controlSize="sm" className="w-44" value={filters.cause} onChange={(e) => update({ cause: e.target.value as AlertFilters["cause"] })}>
          <option value="">All causes</option>
          {CAUSE_OPTIONS.map((c) => (
            <option key={c.value} value={c.value}>
              {c.label}
            </option>
          ))}
        </Select>
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor={scannerId} className="text-caption font-medium text-ink-muted">
          Scanner
        </label>
        <Select
          id={scannerId}
          controlSize="sm"
          className="w-56"
          value={filters.scannerId ? String(filters.scannerId) : ""}
          onChange={(e) => update({ scannerId: e.target.value ? Number(e.target.value) : null })}
        >
          <option value="">All scanners</option>
          <ScannerOptionGroups scanners={scanners} />
        </Select>
      </div>
      {filtered ? (
        <Button variant="ghost" size="sm" className="self-end" onClick={() => update({ cause: "", scannerId: null })}>
          Clear filters
        </Button>
      ) : null}
    </>
  );

  return (
    <div className="flex flex-col gap-4">
      <p className="max-w-prose text-body text-ink-muted">{scopeNote}</p>
      <Tabs value={filters.state} onValueChange={(v) => update({ state: v as StateFilter })}>
        <TabList label="Alert state">
          {STATE_FILTERS.map((s) => (
            <Tab key={s.value} value={s.value}>
              {s.label}
            </Tab>
          ))}
        </TabList>
        {STATE_FILTERS.map((s) => (
          <TabPanel key={s.value} value={s.value} keepMounted={false}>
            {list.isError ? (
              <Callout
                tone="error"
                title="The alerts could not be loaded"
                actions={
                  <Button variant="secondary" size="sm" onClick={() => list.refetch()}>
                    Try again
                  </Button>
                }
              >
                {errorMessage(list.error)}
              </Callout>
            ) : (
              <Card>
                <AlertsTable
                  alerts={list.data ?? []}
                  loading={list.isPending}
                  onOpen={onOpen}
                  toolbar={toolbar}
                  caption={`${stateLabel} alerts`}
                  emptyTitle={filtered ? `No ${s.value === "all" ? "" : `${stateLabel.toLowerCase()} `}alerts match these filters` : EMPTY[s.value].title}
                  emptyDescription={filtered ? "Choose another cause or scanner, or clear the filters." : EMPTY[s.value].description}
                />
              </Card>
            )}
          </TabPanel>
        ))}
      </Tabs>

      {openRow ? <AlertDetailDialog key={openRow.id} row={openRow} permissions={permissions} onClose={() => setOpenRow(null)} /> : null}
    </div>
  );
}
