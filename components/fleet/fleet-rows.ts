/**
 * Fleet dashboard rows and filters, derived from GET /api/scanners. Pure functions, so the server page and the
 * client table agree on every count.
 */
import { dueRank } from "@/components/scanners/qa-format";
import type { FleetScannerJson, ResultStatus, TestStatusJson } from "@/components/scanners/qa-types";
import { MODALITY_SHORT_NAMES, modalityLabel } from "@/lib/modalities";

/** Values of the status filter: a result status, a schedule state, or everything. */
export const STATUS_FILTERS = ["all", "action", "warning", "pass", "no-baseline", "overdue", "never-tested"] as const;
export type StatusFilter = (typeof STATUS_FILTERS)[number];

export const STATUS_FILTER_LABELS: Record<StatusFilter, string> = {
  all: "Any status",
  action: "Action",
  warning: "Warning",
  pass: "Pass",
  "no-baseline": "No baseline",
  overdue: "Overdue",
  "never-tested": "Not tested yet",
};

export interface FleetFilters {
  status: StatusFilter;
  /** Site name, "" for all. */
  site: string;
  /** DICOM modality code, "" for all. */
  modality: string;
  /** Only scanners at action or warning level, overdue, or with open alerts. */
  attention: boolean;
}

export const NO_FILTERS: FleetFilters = { status: "all", site: "", modality: "", attention: false };

/** Short modality names for the dense fleet table (the full label goes in a tooltip and the filters). */
export const MODALITY_SHORT: Record<string, string> = MODALITY_SHORT_NAMES;

export interface FleetRow {
  id: number;
  name: string;
  siteName: string;
  modality: string;
  modalityLabel: string;
  manufacturerModel: string;
  lastTestAt: string | null;
  /** Worst latest status over active tests; null when never tested. */
  latestStatus: ResultStatus | null;
  tests: TestStatusJson[];
  /** The test whose schedule is most urgent (overdue first), or null without active tests. */
  nextTest: TestStatusJson | null;
  overdue: boolean;
  openAlerts: number;
  sparkline: { at: string; value: number }[];
  needsAttention: boolean;
}

/** Sort rank of a latest status: action highest; never tested lowest. */
export const STATUS_RANK: Record<ResultStatus | "none", number> = { action: 3, warning: 2, pass: 1, "no-baseline": 0, none: -1 };

export function toFleetRow(s: FleetScannerJson): FleetRow {
  const st = s.status;
  const tests = st?.tests ?? [];
  const nextTest = tests.length ? [...tests].sort((a, b) => dueRank(a) - dueRank(b))[0]! : null;
  const latestStatus = st?.latestStatus ?? null;
  const overdue = st?.due === "overdue";
  const openAlerts = st?.openAlerts ?? 0;
  return {
    id: s.id,
    name: s.name,
    siteName: s.siteName,
    modality: s.modality,
    modalityLabel: modalityLabel(s.modality),
    manufacturerModel: [s.manufacturer, s.model].filter(Boolean).join(" "),
    lastTestAt: st?.lastTestAt ?? null,
    latestStatus,
    tests,
    nextTest,
    overdue,
    openAlerts,
    sparkline: st?.sparkline ?? [],
    needsAttention: latestStatus === "action" || latestStatus === "warning" || overdue || openAlerts > 0,
  };
}

/** Does a row match a status filter? (A scanner can match two: e.g. action and overdue.) */
export function matchesStatus(row: FleetRow, status: StatusFilter): boolean {
  switch (status) {
    case "all":
      return true;
    case "overdue":
      return row.overdue;
    case "never-tested":
      return row.latestStatus === null;
    default:
      return row.latestStatus === status;
  }
}

/** Rows passing the site and modality filters only (the base of the summary counts). */
export function filterByPlace(rows: FleetRow[], f: Pick<FleetFilters, "site" | "modality">): FleetRow[] {
  return rows.filter((r) => (!f.site || r.siteName === f.site) && (!f.modality || r.modality === f.modality));
}

export function applyFilters(rows: FleetRow[], f: FleetFilters): FleetRow[] {
  return filterByPlace(rows, f).filter((r) => matchesStatus(r, f.status) && (!f.attention || r.needsAttention));
}

/** Scanners per status filter (excluding "all"), e.g. { action: 1, warning: 0, … }. */
export function countByStatus(rows: FleetRow[]): Record<Exclude<StatusFilter, "all">, number> {
  const out = { action: 0, warning: 0, pass: 0, "no-baseline": 0, overdue: 0, "never-tested": 0 };
  for (const r of rows) for (const k of Object.keys(out) as (keyof typeof out)[]) if (matchesStatus(r, k)) out[k]++;
  return out;
}

/** Filters from URL search parameters (unknown values fall back to "no filter"). */
export function filtersFromParams(params: URLSearchParams): FleetFilters {
  const status = params.get("status") ?? "all";
  return {
    status: (STATUS_FILTERS as readonly string[]).includes(status) ? (status as StatusFilter) : "all",
    site: params.get("site") ?? "",
    modality: params.get("modality") ?? "",
    attention: params.get("attention") === "1",
  };
}

/** URL query string of the filters, without defaults ("" when none). */
export function filtersToQuery(f: FleetFilters): string {
  const p = new URLSearchParams();
  if (f.status !== "all") p.set("status", f.status);
  if (f.site) p.set("site", f.site);
  if (f.modality) p.set("modality", f.modality);
  if (f.attention) p.set("attention", "1");
  const q = p.toString();
  return q ? `?${q}` : "";
}
