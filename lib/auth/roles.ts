import type { Role } from "@/db/schema";

export const ROLE_LABELS: Record<Role, string> = {
  admin: "Administrator",
  physicist: "Medical physicist",
  lead: "Department lead",
  engineer: "Service engineer",
};

/** Who may do what. Checked on the server beside the data; the UI only mirrors it. */
export const PERMISSIONS = {
  manageUsers: ["admin"],
  manageSites: ["admin"],
  manageScanners: ["admin"],
  viewFleet: ["admin", "physicist", "lead", "engineer"],
  uploadScans: ["admin", "physicist"],
  reanalyseScans: ["admin", "physicist"],
  deleteScans: ["admin"],
  signOffScans: ["physicist"],
  manageBaselines: ["physicist"],
  manageTolerances: ["physicist"],
  manageSchedules: ["physicist", "admin"],
  viewReports: ["admin", "physicist", "lead"],
  acknowledgeAlerts: ["engineer", "physicist"],
  logService: ["engineer", "physicist"],
  resolveAlerts: ["physicist"],
  viewOutbox: ["admin"],
  sendTestMail: ["admin"],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSIONS;

export function can(role: Role, permission: Permission): boolean {
  return (PERMISSIONS[permission] as readonly Role[]).includes(role);
}
