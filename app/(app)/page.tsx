import type { Metadata } from "next";
import { listScannersForUser } from "@/db/queries/scanners";
import { FleetTable } from "@/components/fleet/fleet-table";
import { ClinicalCaution, PageHeader } from "@/components/ui";
import { requirePagePermission } from "@/lib/auth/page-guards";
import { modalityLabel } from "@/lib/modalities";

export const metadata: Metadata = { title: "Fleet" };

export default async function FleetPage() {
  const user = await requirePagePermission("viewFleet");
  const scanners = await listScannersForUser(user);
  const rows = scanners.map((s) => ({
    id: s.id,
    name: s.name,
    siteName: s.siteName,
    modality: s.modality,
    modalityLabel: modalityLabel(s.modality),
    manufacturerModel: [s.manufacturer, s.model].filter(Boolean).join(" "),
    physicist: s.responsiblePhysicistName ?? "—",
  }));
  return (
    <div className="space-y-6">
      <PageHeader title="Fleet" description="Every scanner you can see, with its latest resolution results." />
      <FleetTable rows={rows} />
      <ClinicalCaution />
    </div>
  );
}
