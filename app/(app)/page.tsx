// GET / – the fleet dashboard: every visible scanner with its latest results, schedule state, open alerts and MTF50 trend
import type { Metadata } from "next";
import { getFleetStatus } from "@/db/queries/fleet";
import { listScannersForUser } from "@/db/queries/scanners";
import { FleetDashboard } from "@/components/fleet/fleet-dashboard";
import type { FleetJson } from "@/components/scanners/qa-types";
import { ClinicalCaution, PageHeader } from "@/components/ui";
import { requirePagePermission } from "@/lib/auth/page-guards";

export const metadata: Metadata = { title: "Fleet" };

export default async function FleetPage() {
  const user = await requirePagePermission("viewFleet");
  const scanners = await listScannersForUser(user);
  const status = await getFleetStatus(scanners.map((s) => s.id));
  const readAt = Date.now();
  // The same shape GET /api/scanners answers after JSON serialisation, so react-query can take over from it.
  const initialData = JSON.parse(JSON.stringify({ scanners: scanners.map((s) => ({ ...s, status: status.get(s.id) ?? null })) })) as FleetJson;
  return (
    <div className="space-y-6">
      <PageHeader
        title="Fleet"
        description={
          user.role === "engineer"
            ? "The scanners you service: latest resolution results, next tests and open alerts."
            : "Every scanner's latest resolution results against its baseline, the next test due, open alerts and the MTF50 trend."
        }
      />
      <FleetDashboard initialData={initialData} initialUpdatedAt={readAt} />
      <ClinicalCaution />
    </div>
  );
}
