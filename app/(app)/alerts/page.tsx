// GET /alerts – alerts of the fleet (engineers: their assigned scanners), with acknowledge, service log and resolve
import type { Metadata } from "next";
import { AlertsBoard } from "@/components/alerts/alerts-board";
import type { AlertFilters, StateFilter } from "@/components/alerts/alert-types";
import { ClinicalCaution, PageHeader } from "@/components/ui";
import { listScannersForUser } from "@/db/queries/scanners";
import { ALERT_CAUSES } from "@/db/schema";
import { requirePagePermission } from "@/lib/auth/page-guards";
import { can } from "@/lib/auth/roles";

export const metadata: Metadata = { title: "Alerts" };

type Search = { state?: string | string[]; cause?: string | string[]; scannerId?: string | string[] };
const first = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v);
const STATES: readonly StateFilter[] = ["open", "acknowledged", "resolved", "all"];

export default async function AlertsPage({ searchParams }: { searchParams: Promise<Search> }) {
  const user = await requirePagePermission("viewFleet");
  const [search, scanners] = await Promise.all([searchParams, listScannersForUser(user)]);
  const state = first(search.state);
  const cause = first(search.cause);
  const wanted = Number(first(search.scannerId));
  const initialFilters: AlertFilters = {
    state: STATES.includes(state as StateFilter) ? (state as StateFilter) : "open",
    cause: (ALERT_CAUSES as readonly string[]).includes(cause ?? "") ? (cause as AlertFilters["cause"]) : "",
    scannerId: scanners.some((s) => s.id === wanted) ? wanted : null,
  };
  const engineer = user.role === "engineer";

  return (
    <div className="space-y-6">
      <PageHeader
        title="Alerts"
        description="Results at the action level (or the warning level, where a scanner is set to alert on warnings), overdue tests and drift advisories. The engineer acknowledges and logs the service; a passing re-test proposes resolution; the physicist resolves."
      />
      <AlertsBoard
        initialFilters={initialFilters}
        scanners={scanners.map((s) => ({ id: s.id, name: s.name, siteName: s.siteName }))}
        permissions={{
          acknowledge: can(user.role, "acknowledgeAlerts"),
          logService: can(user.role, "logService"),
          resolve: can(user.role, "resolveAlerts"),
          upload: can(user.role, "uploadScans"),
        }}
        scopeNote={
          engineer
            ? "You see the alerts of the scanners you are assigned to service."
            : "Alerts of every scanner. Each alert e-mails the scanner's assigned engineers and its responsible physicist, as each has chosen in Account settings."
        }
      />
      <ClinicalCaution />
    </div>
  );
}
