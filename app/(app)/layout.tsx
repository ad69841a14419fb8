import type { ReactNode } from "react";
import { AppNav } from "@/components/shell/app-nav";
import { requireUser } from "@/lib/auth/page-guards";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { navForRole } from "@/lib/navigation";

export const dynamic = "force-dynamic";

export default async function AppLayout({ children }: { children: ReactNode }) {
  const user = await requireUser();
  return (
    <div className="flex min-h-screen">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded-control focus:bg-surface focus:px-3 focus:py-2">
        Skip to content
      </a>
      <aside className="sticky top-0 h-screen w-56 shrink-0 border-r border-line bg-surface">
        <AppNav items={navForRole(user.role)} userName={user.name} roleLabel={ROLE_LABELS[user.role]} />
      </aside>
      <main id="main" className="min-w-0 flex-1 px-8 py-6">
        {children}
      </main>
    </div>
  );
}
