import { z } from "zod";
import { MODALITIES } from "@/db/schema";

const text = (max: number) => z.string().trim().max(max, { message: `At most ${max} characters` });

/** Shared by the scanner form (react-hook-form) and POST/PATCH /api/scanners. */
export const createScannerSchema = z.object({
  name: text(120).min(1, { message: "Give the scanner a name" }),
  siteId: z.coerce.number().int().positive({ message: "Choose a site" }),
  modality: z.enum(MODALITIES, { message: `Modality must be one of ${MODALITIES.join(", ")}` }),
  manufacturer: text(120).default(""),
  model: text(120).default(""),
  serialNumber: text(64).default(""),
  location: text(120).default(""),
  responsiblePhysicistId: z.coerce.number().int().positive().nullable().optional(),
  engineerIds: z.array(z.coerce.number().int().positive()).max(20).default([]),
  alertOnWarning: z.boolean().default(false),
});
export type CreateScannerInput = z.infer<typeof createScannerSchema>;

export const updateScannerSchema = createScannerSchema.partial().extend({ active: z.boolean().optional() });
export type UpdateScannerInput = z.infer<typeof updateScannerSchema>;
