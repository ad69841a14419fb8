import { z } from "zod";
import { METHODS } from "@/db/schema";

/** "0.5" (square pixels) or "0.5,0.6" / "0.5\0.6" = row spacing, column spacing (DICOM order), mm. */
export const pixelSpacingField = z
  .string()
  .trim()
  .transform((s, ctx) => {
    const parts = s.split(/[,\\\s]+/).filter(Boolean).map(Number);
    if ((parts.length !== 1 && parts.length !== 2) || parts.some((n) => !Number.isFinite(n) || n <= 0 || n > 100)) {
      ctx.addIssue({ code: "custom", message: "pixelSpacingMm must be one number or 'row,column' in mm, each between 0 and 100" });
      return z.NEVER;
    }
    const [row, col = row] = parts as [number, number?];
    return { x: col as number, y: row };
  });

/** "x,y,width,height" in pixels. */
export const roiField = z
  .string()
  .trim()
  .transform((s, ctx) => {
    const parts = s.split(",").map((p) => Number(p.trim()));
    if (parts.length !== 4 || parts.some((n) => !Number.isInteger(n) || n < 0) || parts[2]! < 8 || parts[3]! < 8) {
      ctx.addIssue({ code: "custom", message: "roi must be 'x,y,width,height' in whole pixels, width and height at least 8" });
      return z.NEVER;
    }
    return { x: parts[0]!, y: parts[1]!, width: parts[2]!, height: parts[3]! };
  });

export const roiObject = z.object({
  x: z.number().int().min(0),
  y: z.number().int().min(0),
  width: z.number().int().min(8),
  height: z.number().int().min(8),
});

const emptyToUndefined = (v: unknown) => (v === "" || v === null ? undefined : v);

/** Multipart fields of POST /api/scans (the file itself is checked separately). */
export const createScanSchema = z.object({
  scannerId: z.coerce.number({ message: "scannerId is required" }).int().positive({ message: "scannerId must be a positive integer" }),
  method: z.preprocess(emptyToUndefined, z.enum([...METHODS, "auto"], { message: "method must be point, line, edge, disk or auto" }).default("auto")),
  pixelSpacingMm: z.preprocess(emptyToUndefined, pixelSpacingField.optional()),
  roi: z.preprocess(emptyToUndefined, roiField.optional()),
  note: z.preprocess(emptyToUndefined, z.string().trim().max(2000).optional()),
});
export type CreateScanInput = z.infer<typeof createScanSchema>;

/** JSON body of POST /api/scans/{id}/analyses: re-run with another method or ROI. */
export const reanalyseSchema = z.object({
  method: z.enum([...METHODS, "auto"]).default("auto"),
  roi: roiObject.nullable().optional(),
  pixelSpacingMm: z.object({ x: z.number().positive().max(100), y: z.number().positive().max(100) }).nullable().optional(),
  reason: z.string().trim().max(500).optional(),
});
export type ReanalyseInput = z.infer<typeof reanalyseSchema>;

export const listScansQuerySchema = z.object({
  scannerId: z.coerce.number().int().positive().optional(),
  method: z.enum(METHODS).optional(),
  from: z.coerce.date({ message: "from must be a date (YYYY-MM-DD)" }).optional(),
  to: z.coerce.date({ message: "to must be a date (YYYY-MM-DD)" }).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});
export type ListScansQuery = z.infer<typeof listScansQuerySchema>;

export const signOffSchema = z.object({ note: z.string().trim().max(2000).optional() });
