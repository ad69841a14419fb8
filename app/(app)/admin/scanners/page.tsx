import type { Metadata } from "next";
import { ScannersAdmin } from "@/components/admin/scanners-admin";
import { PageHeader } from "@/components/ui/page-header";
import { requirePagePermission } from "@/lib/auth/page-guards";

export const metadata: Metadata = { title: "Scanner register" };

export default async function ScannerRegisterPage() {
  await requirePagePermission("manageScanners");
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Scanner register"
        description="Every scanner of the group, including retired ones: site, modality, identification, responsible physicist and assigned engineers."
      />
      <ScannersAdmin />
    </div>
  );
}
