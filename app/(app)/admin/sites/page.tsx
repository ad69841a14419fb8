import type { Metadata } from "next";
import { SitesAdmin } from "@/components/admin/sites-admin";
import { PageHeader } from "@/components/ui/page-header";
import { requirePagePermission } from "@/lib/auth/page-guards";

export const metadata: Metadata = { title: "Sites" };

export default async function SitesPage() {
  await requirePagePermission("manageSites");
  return (
    <div className="flex flex-col gap-6">
      <PageHeader title="Sites" description="The hospitals and clinics of your group. Every scanner belongs to one site." />
      <SitesAdmin />
    </div>
  );
}
