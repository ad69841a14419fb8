import { z } from "zod";

export const createSiteSchema = z.object({
  name: z.string().trim().min(1, { message: "Give the site a name" }).max(120, { message: "At most 120 characters" }),
  city: z.string().trim().max(120, { message: "At most 120 characters" }).default(""),
});
export type CreateSiteInput = z.infer<typeof createSiteSchema>;
export const updateSiteSchema = createSiteSchema.partial();
export type UpdateSiteInput = z.infer<typeof updateSiteSchema>;
