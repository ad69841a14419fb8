import { z } from "zod";

const siteName = z.string().trim().min(1, { message: "Give the site a name" }).max(120, { message: "At most 120 characters" });
const siteCity = z.string().trim().max(120, { message: "At most 120 characters" });

export const createSiteSchema = z.object({ name: siteName, city: siteCity.default("") });
export type CreateSiteInput = z.infer<typeof createSiteSchema>;
/** PATCH: only the fields sent change. */
export const updateSiteSchema = z.object({ name: siteName, city: siteCity }).partial();
export type UpdateSiteInput = z.infer<typeof updateSiteSchema>;
