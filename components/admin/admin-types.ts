import type { MAIL_PREFERENCES, Modality, Role } from "@/db/schema";

// Rows as the admin API returns them over JSON (dates are ISO strings).

export type MailPreference = (typeof MAIL_PREFERENCES)[number];

/** GET /api/users → users[] (PublicUser). */
export interface UserRow {
  id: number;
  email: string;
  name: string;
  role: Role;
  active: boolean;
  mailPreference: MailPreference;
  lastSignInAt: string | null;
  createdAt: string;
  hasPassword: boolean;
}

/** GET /api/sites → sites[]. */
export interface SiteRow {
  id: number;
  name: string;
  city: string;
  createdAt: string;
  scannerCount: number;
}

/** GET /api/scanners → scanners[] (ScannerListItem). */
export interface ScannerRow {
  id: number;
  siteId: number;
  siteName: string;
  name: string;
  modality: Modality;
  manufacturer: string;
  model: string;
  serialNumber: string;
  location: string;
  responsiblePhysicistId: number | null;
  responsiblePhysicistName: string | null;
  alertOnWarning: boolean;
  active: boolean;
  createdAt: string;
  engineers: { id: number; name: string; email: string }[];
}

/** react-query keys shared by the admin pages, so a mutation on one invalidates the others' data. */
export const QUERY_KEYS = {
  users: ["users"] as const,
  sites: ["sites"] as const,
  scannerRegister: ["scanners", "register"] as const,
};

export const MAIL_PREFERENCE_LABELS: Record<MailPreference, string> = {
  immediate: "Immediately",
  digest: "Daily digest",
  off: "Off",
};
