import { z } from "zod";
import { MODALITIES } from "@/db/schema";

const text = (max: number) => z.string().trim().max(max, { message: `At most ${max} characters` });

const scannerFields = {
  name: text(120).min(1, { message: "Give the scanner a name" }),
  siteId: z.coerce.number().int().positive({ message: "Choose a site" }),
  modality: z.enum(MODALITIES, { message: `Modality must be one of ${MODALITIES.join(", ")}` }),
  manufacturer: text(120),
  model: text(120),
  serialNumber: text(64),
  location: text(120),
  responsiblePhysicistId: z.coerce.number().int().positive().nullable(),
  engineerIds: z.array(z.coerce.number().int().positive()).max(20),
  alertOnWarning: z.boolean(),
};

/** Shared by the scanner form (react-hook-form) and POST /api/scanners. */
export const createScannerSchema = z.object({
  ...scannerFields,
  manufacturer: scannerFields.manufacturer.default(""),
  model: scannerFields.model.default(""),
  serialNumber: scannerFields.serialNumber.default(""),
  location: scannerFields.location.default(""),
  responsiblePhysicistId: scannerFields.responsiblePhysicistId.optional(),
  engineerIds: scannerFields.engineerIds.default([]),
  alertOnWarning: scannerFields.alertOnWarning.default(false),
});
export type CreateScannerInput = z.infer<typeof createScannerSchema>;

/** PATCH /api/scanners/{id}: only the fields sent change (no defaults, so omitted fields are left alone). */
export const updateScannerSchema = z.object(scannerFields).partial().extend({ active: z.boolean().optional() });
export type UpdateScannerInput = z.infer<typeof updateScannerSchema>;
