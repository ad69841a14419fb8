/**
 * JSON shapes of the QA API answers the fleet and scanner pages read (dates are ISO strings after serialisation),
 * the react-query keys they share, and a JSON sender for PUT (lib/api/fetch-json covers GET/POST/PATCH/DELETE).
 * Units: widths in mm, MTF50/MTF10 in cycles/mm (= lp/mm), MTF at Nyquist dimensionless.
 */
import type { MetricDirection, MetricKey, MetricUnit } from "@/lib/qa/metrics";
import { ApiError, type ApiIssue } from "@/lib/api/fetch-json";

export type ResultStatus = "pass" | "warning" | "action" | "no-baseline";
export type DueStateName = "ok" | "due" | "overdue" | "never-tested";
export type Frequency = "daily" | "weekly" | "monthly" | "quarterly" | "annual";
export type MethodName = "point" | "line" | "edge" | "disk";
export type ModalityCode = "CT" | "PT" | "NM" | "DX" | "MG" | "CR" | "RF" | "US" | "MR" | "OT";

/** One routine test's latest result and schedule state (db/queries/fleet.ts TestStatus). */
export interface TestStatusJson {
  testId: number;
  name: string;
  method: MethodName;
  frequency: Frequency;
  lastTestAt: string | null;
  lastScanId: number | null;
  status: ResultStatus | null;
  due: DueStateName;
  dueAt: string | null;
  overdueByDays: number | null;
}

export interface ScannerStatusJson {
  tests: TestStatusJson[];
  lastTestAt: string | null;
  /** Worst latest status over active tests; null when never tested. */
  latestStatus: ResultStatus | null;
  openAlerts: number;
  due: DueStateName;
  /** MTF50 (cycles/mm) of recent results, oldest first. */
  sparkline: { at: string; value: number }[];
}

/** An item of GET /api/scanners. */
export interface FleetScannerJson {
  id: number;
  name: string;
  siteId: number;
  siteName: string;
  modality: ModalityCode;
  manufacturer: string;
  model: string;
  serialNumber: string;
  location: string;
  responsiblePhysicistId: number | null;
  responsiblePhysicistName: string | null;
  active: boolean;
  engineers: { id: number; name: string; email: string }[];
  status: ScannerStatusJson | null;
}

export interface FleetJson {
  scanners: FleetScannerJson[];
}

/** An item of GET /api/scanners/{id}/tests. */
export interface QaTestJson {
  id: number;
  scannerId: number;
  name: string;
  method: MethodName;
  phantom: string;
  protocol: string;
  frequency: Frequency;
  active: boolean;
  schedule: TestStatusJson | null;
}

/** An item of GET /api/scanners/{id}/baselines. */
export interface BaselineJson {
  id: number;
  scannerId: number;
  testId: number;
  metric: string;
  mean: number;
  sd: number | null;
  n: number;
  scanIds: number[];
  reason: string;
  setById: number;
  setAt: string;
  supersededAt: string | null;
}

/** An item of GET /api/scanners/{id}/tolerances. */
export interface ToleranceRowJson {
  testId: number;
  metric: MetricKey;
  mode: "relative" | "absolute";
  warning: number;
  action: number;
  source: string;
  direction: MetricDirection;
  isDefault: boolean;
  updatedAt: string | null;
}

export interface TrendPointJson {
  scanId: number;
  at: string;
  value: number | null;
  status: ResultStatus;
}

/** GET /api/scanners/{id}/trend. Band limits and control limits are absolute values in the metric's unit. */
export interface TrendJson {
  scannerId: number;
  metric: MetricKey;
  label: string;
  unit: MetricUnit;
  direction: MetricDirection;
  test: { id: number; name: string; method: MethodName; frequency: Frequency } | null;
  points: TrendPointJson[];
  baseline: { mean: number; sd: number | null; n: number; setAt: string } | null;
  baselineHistory: { id: number; mean: number; sd: number | null; n: number; setAt: string; supersededAt: string | null; reason: string }[];
  tolerance: { mode: "relative" | "absolute"; warning: number; action: number; source: string; isDefault: boolean } | null;
  band: { warningLimit: number; actionLimit: number } | null;
  controlLimits: { mean: number; sd: number; lower2: number; upper2: number; lower3: number; upper3: number } | null;
  driftFlags: { rule: string; description: string; side: "high" | "low"; scanIds: number[] }[];
  serviceEvents: { id: number; at: string; description: string; parts: string; engineer: string; alertId: number | null }[];
  alertEvents: { at: string; action: string; alertId: number }[];
}

/** An item of GET /api/scans. */
export interface ScanListItemJson {
  id: number;
  scannerId: number;
  testId: number | null;
  testName: string | null;
  fileName: string;
  acquiredAt: string;
  signedOffAt: string | null;
  method: MethodName;
  status: ResultStatus;
  fwhmMm: number | null;
  mtf50: number | null;
  mtf10: number | null;
}

export interface ScanListJson {
  scans: ScanListItemJson[];
  total: number;
  page: number;
  pageSize: number;
}

/** Query keys. Everything about scanners starts with "scanners", so one invalidation refreshes fleet and scanner pages. */
export const qaKeys = {
  all: ["scanners"] as const,
  fleet: ["scanners", "fleet"] as const,
  scanner: (id: number) => ["scanners", id] as const,
  tests: (id: number) => ["scanners", id, "tests"] as const,
  baselines: (id: number, history: boolean) => ["scanners", id, "baselines", { history }] as const,
  tolerances: (id: number) => ["scanners", id, "tolerances"] as const,
  trend: (id: number, q: { metric: MetricKey; testId: number | null; from: string; to: string }) => ["scanners", id, "trend", q] as const,
  scans: (scannerId: number, range: { from: string; to: string }) => ["scans", { scannerId, ...range }] as const,
};

/** PUT a JSON body to Halfmax's API; throws ApiError with the server's readable message on any non-2xx answer. */
export async function putJson<T>(url: string, body: unknown): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, {
      method: "PUT",
      credentials: "same-origin",
      headers: { accept: "application/json", "content-type": "application/json" },
      body: JSON.stringify(body),
    });
  } catch {
    throw new ApiError("Could not reach the Halfmax server. Check your connection and try again.", 0, "network");
  }
  const text = await res.text();
  let parsed: unknown;
  try {
    parsed = text ? JSON.parse(text) : undefined;
  } catch {
    parsed = undefined;
  }
  if (!res.ok) {
    const e = (parsed ?? {}) as { error?: unknown; code?: unknown; issues?: unknown };
    const message = typeof e.error === "string" && e.error ? e.error : `The server answered ${res.status} ${res.statusText}`.trim();
    throw new ApiError(message, res.status, typeof e.code === "string" ? e.code : "http_error", Array.isArray(e.issues) ? (e.issues as ApiIssue[]) : []);
  }
  return parsed as T;
}
