import type { Metadata } from "next";
import { UsersAdmin } from "@/components/admin/users-admin";
import { PageHeader } from "@/components/ui/page-header";
import { requirePagePermission } from "@/lib/auth/page-guards";

export const metadata: Metadata = { title: "Users" };

export default async function UsersPage() {
  const admin = await requirePagePermission("manageUsers");
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Users"
        description="Who can sign in to Halfmax and with which role: medical physicists, department leads, service engineers and administrators."
      />
      <UsersAdmin currentUserId={admin.id} />
    </div>
  );
}
