import type { Role } from "@/db/schema";
import { can, type Permission } from "@/lib/auth/roles";

export interface NavItem {
  href: string;
  label: string;
  permission: Permission | null;
  group: "work" | "admin" | "me";
}

/** The app's pages and who sees them in the navigation (the pages check the same permissions on the server). */
export const NAV_ITEMS: NavItem[] = [
  { href: "/", label: "Fleet", permission: "viewFleet", group: "work" },
  { href: "/scanners", label: "Scanners", permission: "viewFleet", group: "work" },
  { href: "/scans/new", label: "Add scans", permission: "uploadScans", group: "work" },
  { href: "/alerts", label: "Alerts", permission: "viewFleet", group: "work" },
  { href: "/admin/users", label: "Users", permission: "manageUsers", group: "admin" },
  { href: "/admin/sites", label: "Sites", permission: "manageSites", group: "admin" },
  { href: "/admin/scanners", label: "Scanner register", permission: "manageScanners", group: "admin" },
  { href: "/admin/outbox", label: "Outbox", permission: "viewOutbox", group: "admin" },
  { href: "/account", label: "Account & tokens", permission: null, group: "me" },
  { href: "/api-docs", label: "API", permission: null, group: "me" },
];

export function navForRole(role: Role): NavItem[] {
  return NAV_ITEMS.filter((item) => item.permission === null || can(role, item.permission));
}
