/** Scanners, Sites and Users operations. */
import { createScannerSchema, updateScannerSchema } from "@/lib/validations/scanner";
import { createSiteSchema, updateSiteSchema } from "@/lib/validations/site";
import { createUserSchema, updateUserSchema } from "@/lib/validations/user";
import { idNotFound, type ApiOperation } from "../operation";
import { documentFields, z } from "../registry";
import { createdSiteSchema, createdUserSchema, okSchema, publicUserSchema, scannerDeletedSchema, scannerSchema, siteSchema } from "../responses";

const scannerFieldDocs = {
  name: "Name, unique within its site",
  siteId: "Site that holds the scanner (GET /api/sites)",
  modality: "DICOM modality code",
  responsiblePhysicistId: "Responsible physicist: an active user with the physicist role, or null",
  engineerIds: "Assigned service engineers (users with the engineer role); replaces the current list",
  alertOnWarning: "Open an alert for warning-level results too (action-level results always open one)",
} as const;

const duplicateScanner = "A scanner of this name already exists at the site";
const duplicateSite = "A site of this name already exists";

export const FLEET_OPERATIONS: ApiOperation[] = [
  {
    method: "get", path: "/api/scanners", tag: "Scanners", access: "viewFleet",
    summary: "The scanners the caller may see",
    description: "Service engineers see the scanners assigned to them; everyone else sees the fleet.",
    query: z.object({ includeInactive: z.enum(["1"]).optional().openapi({ description: "1 adds retired scanners" }) }),
    success: { status: 200, description: "Scanners by site and name", json: z.object({ scanners: z.array(scannerSchema) }) },
  },
  {
    method: "post", path: "/api/scanners", tag: "Scanners", access: "manageScanners",
    summary: "Create a scanner",
    body: { json: documentFields(createScannerSchema, scannerFieldDocs) },
    success: { status: 201, description: "Created", json: z.object({ id: z.number().int().positive() }) },
    errors: { 409: duplicateScanner, 422: "A field is invalid, the site does not exist, or a person has the wrong role" },
  },
  {
    method: "get", path: "/api/scanners/{id}", tag: "Scanners", access: "viewFleet",
    summary: "One scanner with site, responsible physicist and assigned engineers",
    success: { status: 200, description: "The scanner", json: z.object({ scanner: scannerSchema }) },
    errors: { 404: idNotFound("Scanner") },
  },
  {
    method: "patch", path: "/api/scanners/{id}", tag: "Scanners", access: "manageScanners",
    summary: "Change a scanner",
    body: {
      json: documentFields(updateScannerSchema, { ...scannerFieldDocs, active: "false retires the scanner (kept with its history), true brings it back" }),
    },
    success: { status: 200, description: "The scanner after the change", json: z.object({ scanner: scannerSchema }) },
    errors: { 404: idNotFound("Scanner"), 409: duplicateScanner, 422: "A field is invalid, the site does not exist, or a person has the wrong role" },
  },
  {
    method: "delete", path: "/api/scanners/{id}", tag: "Scanners", access: "manageScanners",
    summary: "Delete a scanner without scans, or retire one with history",
    success: { status: 200, description: "What happened", json: scannerDeletedSchema },
    errors: { 404: idNotFound("Scanner") },
  },
  {
    method: "get", path: "/api/sites", tag: "Sites", access: "viewFleet",
    summary: "All sites with their scanner counts",
    success: { status: 200, description: "Sites by name", json: z.object({ sites: z.array(siteSchema) }) },
  },
  {
    method: "post", path: "/api/sites", tag: "Sites", access: "manageSites",
    summary: "Create a site",
    body: { json: documentFields(createSiteSchema, { name: "Site name, unique", city: "City (optional)" }) },
    success: { status: 201, description: "Created", json: z.object({ site: createdSiteSchema }) },
    errors: { 409: duplicateSite },
  },
  {
    method: "patch", path: "/api/sites/{id}", tag: "Sites", access: "manageSites",
    summary: "Rename a site",
    body: { json: updateSiteSchema },
    success: { status: 200, description: "Changed", json: okSchema },
    errors: { 404: idNotFound("Site"), 409: duplicateSite },
  },
  {
    method: "delete", path: "/api/sites/{id}", tag: "Sites", access: "manageSites",
    summary: "Delete an empty site",
    success: { status: 200, description: "Deleted", json: okSchema },
    errors: { 404: idNotFound("Site"), 409: "The site still has scanners: move or remove them first" },
  },
  {
    method: "get", path: "/api/users", tag: "Users", access: "manageUsers",
    summary: "All users",
    success: { status: 200, description: "Users by name", json: z.object({ users: z.array(publicUserSchema) }) },
  },
  {
    method: "post", path: "/api/users", tag: "Users", access: "manageUsers",
    summary: "Create a user, or invite them by e-mail",
    description: "Without a password the user gets an invitation e-mail with a link to choose one.",
    body: {
      json: documentFields(createUserSchema, {
        email: "E-mail address, also the sign-in name",
        role: "admin, physicist, lead or engineer",
        password: "Leave out (or empty) to send an invitation instead",
      }),
    },
    success: { status: 201, description: "Created", json: createdUserSchema },
    errors: { 409: "A user with this e-mail address already exists" },
  },
  {
    method: "patch", path: "/api/users/{id}", tag: "Users", access: "manageUsers",
    summary: "Change name, role, active flag or mail preference",
    body: { json: documentFields(updateUserSchema, { active: "false deactivates the account: its sessions and tokens stop working" }) },
    success: { status: 200, description: "The user after the change", json: z.object({ user: publicUserSchema }) },
    errors: { 404: idNotFound("User"), 409: "Administrators cannot deactivate themselves or change their own role" },
  },
];
