// Shapes of the alerts API as the browser sees them. Type-only imports from the schema: nothing of drizzle reaches the client bundle.
import type { Alert } from "@/db/schema";

export type AlertCauseName = Alert["cause"];
export type AlertStateName = Alert["state"];

/** JSON dates arrive as ISO strings. */
type Jsonified<T> = { [K in keyof T]: T[K] extends Date ? string : T[K] extends Date | null ? string | null : T[K] };

/** One row of GET /api/alerts. */
export type AlertRow = Jsonified<Alert> & {
  scannerName: string;
  siteName: string;
  testName: string | null;
  acknowledgedByName: string | null;
  resolvedByName: string | null;
  serviceCount: number;
};

export interface ServiceEventRow {
  id: number;
  performedAt: string;
  description: string;
  parts: string;
  engineer: string;
}

/** GET /api/alerts/{id}: the alert row with its service log (no names of people or scanner: those come from the list). */
export type AlertDetail = Jsonified<Alert> & { serviceEvents: ServiceEventRow[] };

/** The tabs of the alerts page; "all" sends no state filter. */
export const STATE_FILTERS = [
  { value: "open", label: "Open" },
  { value: "acknowledged", label: "Acknowledged" },
  { value: "resolved", label: "Resolved" },
  { value: "all", label: "All" },
] as const;
export type StateFilter = (typeof STATE_FILTERS)[number]["value"];

export interface AlertFilters {
  state: StateFilter;
  cause: AlertCauseName | "";
  scannerId: number | null;
}

/** What the signed-in user may do here (mirrors lib/auth/roles on the server, which decides). */
export interface AlertPermissions {
  acknowledge: boolean;
  logService: boolean;
  resolve: boolean;
  upload: boolean;
}

export interface ScannerOption {
  id: number;
  name: string;
  siteName: string;
}

export const alertKeys = {
  all: ["alerts"] as const,
  list: (f: { state: StateFilter; cause: string; scannerId: number | null }) => ["alerts", "list", f] as const,
  detail: (id: number) => ["alerts", "detail", id] as const,
};

/** Query string of GET /api/alerts for a filter set. */
export function alertsUrl(f: { state: StateFilter; cause: string; scannerId: number | null }): string {
  const q = new URLSearchParams();
  if (f.state !== "all") q.set("state", f.state);
  if (f.cause) q.set("cause", f.cause);
  if (f.scannerId) q.set("scannerId", String(f.scannerId));
  const s = q.toString();
  return s ? `/api/alerts?${s}` : "/api/alerts";
}
