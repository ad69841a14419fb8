/**
 * Zod schemas of the API's responses, for the OpenAPI document only (handlers build these shapes in db/queries and
 * lib/scans/scan-json.ts). Each is registered under components/schemas by its `.openapi("Name")`.
 * Objects allow extra properties: clients should ignore keys they do not know.
 */
import { MAIL_PREFERENCES, METHODS, MODALITIES, RESULT_STATUSES, ROLES } from "@/db/schema";
import { ERROR_STATUS, type ErrorCode } from "@/lib/errors";
import { z } from "./registry";

const dateTime = z.iso.datetime().openapi({ description: "ISO 8601 date-time, UTC" });
const id = z.number().int().positive();
const nullableNumber = (description: string) => z.number().nullable().openapi({ description });
/** `schema` or null, keeping the reference to a registered schema (its own `.nullable()` would re-register it as nullable). */
const orNull = <T extends z.ZodType>(schema: T) => z.union([schema, z.null()]);

export const errorBodySchema = z
  .object({
    error: z.string().openapi({ description: "What went wrong and, where possible, what to do about it" }),
    code: z.enum(Object.keys(ERROR_STATUS) as [ErrorCode, ...ErrorCode[]]).openapi({ description: "Stable machine-readable code" }),
    issues: z
      .array(z.object({ path: z.string().openapi({ description: "Field path, dot-separated" }), message: z.string() }))
      .optional()
      .openapi({ description: "Validation problems, one per field (422 validation_failed only)" }),
    existingScanId: id.optional().openapi({ description: "409 on upload: the scan that already holds this file" }),
    reason: z.string().optional().openapi({ description: "422/415/413 on upload: why the image could not be read or analysed" }),
  })
  .openapi("Error", { description: "Every error answer has this shape; `code` maps to one HTTP status (lib/errors.ts)." });

export const okSchema = z.object({ ok: z.literal(true) }).openapi("Ok");

export const healthSchema = z
  .object({
    status: z.enum(["ok", "degraded"]),
    version: z.string().openapi({ description: "Halfmax version (package.json)" }),
    analysisVersion: z.string().openapi({ description: "Version of the analysis algorithms" }),
    database: z.object({
      status: z.enum(["up", "down"]),
      latencyMs: z.number().optional(),
      error: z.string().optional(),
    }),
  })
  .openapi("Health");

export const sessionUserSchema = z
  .object({ id, email: z.email(), name: z.string(), role: z.enum(ROLES) })
  .openapi("SessionUser", { description: "The caller as the server sees them" });

export const publicUserSchema = z
  .object({
    id,
    email: z.email(),
    name: z.string(),
    role: z.enum(ROLES),
    active: z.boolean(),
    mailPreference: z.enum(MAIL_PREFERENCES),
    lastSignInAt: dateTime.nullable(),
    createdAt: dateTime,
    hasPassword: z.boolean().openapi({ description: "False while an invitation is pending" }),
  })
  .openapi("User");

export const mailPreferenceSchema = z.object({ mailPreference: z.enum(MAIL_PREFERENCES) }).openapi("MailPreference");

export const createdUserSchema = z
  .object({ id, invited: z.boolean().openapi({ description: "True when an invitation e-mail was queued (no password given)" }) })
  .openapi("CreatedUser");

const person = z.object({ id, name: z.string(), email: z.email() });

export const scannerSchema = z
  .object({
    id,
    siteId: id,
    siteName: z.string(),
    name: z.string(),
    modality: z.enum(MODALITIES),
    manufacturer: z.string(),
    model: z.string(),
    serialNumber: z.string(),
    location: z.string(),
    responsiblePhysicistId: id.nullable(),
    responsiblePhysicistName: z.string().nullable(),
    engineers: z.array(person).openapi({ description: "Service engineers assigned to this scanner" }),
    alertOnWarning: z.boolean().openapi({ description: "Open an alert for warning-level results too (action-level results always do)" }),
    active: z.boolean().openapi({ description: "False once retired" }),
    createdAt: dateTime,
  })
  .openapi("Scanner");

export const scannerDeletedSchema = z
  .object({
    outcome: z.enum(["deleted", "retired"]).openapi({ description: "A scanner with stored scans is retired (kept, inactive) so its QA history survives" }),
  })
  .openapi("ScannerDeleted");

export const siteSchema = z
  .object({ id, name: z.string(), city: z.string(), createdAt: dateTime, scannerCount: z.number().int().min(0) })
  .openapi("Site");

export const createdSiteSchema = z.object({ id, name: z.string(), city: z.string() }).openapi("CreatedSite");

export const apiTokenSchema = z
  .object({
    id,
    name: z.string(),
    prefix: z.string().openapi({ description: "First characters of the secret, to tell tokens apart" }),
    createdAt: dateTime,
    lastUsedAt: dateTime.nullable(),
    revokedAt: dateTime.nullable(),
  })
  .openapi("ApiToken");

export const createdApiTokenSchema = z
  .object({
    id,
    token: z.string().openapi({ description: "The secret. Shown in this response only; store it now" }),
    prefix: z.string(),
  })
  .openapi("CreatedApiToken");

export const passwordResetAcceptedSchema = z.object({ ok: z.literal(true), message: z.string() }).openapi("PasswordResetAccepted");

/** A sampled MTF curve in the analysis JSON. */
export const mtfCurveSchema = z
  .object({
    frequency: z.array(z.number()).openapi({ description: "Spatial frequency, cycles/mm (= lp/mm)" }),
    value: z.array(z.number()).openapi({ description: "Modulation, normalised to 1 at zero frequency" }),
  })
  .openapi("MtfCurve");

/** The analysis result keys fixed by the public contract (same keys as the analysis CLI's JSON). */
export const analysisResultSchema = z
  .object({
    method: z.enum(METHODS).openapi({ description: "Analysis method: point (PSF), line (LSF), edge (ESF) or disk (circular edge)" }),
    pixelSpacingMm: z.tuple([z.number(), z.number()]).openapi({ description: "[row spacing, column spacing] in mm (DICOM order)" }),
    fwhmMm: nullableNumber("Full width at half maximum, mm (point source: mean of x and y); null when not measurable"),
    fwtmMm: nullableNumber("Full width at tenth maximum, mm; null when not measurable"),
    fwhmXMm: nullableNumber("FWHM along x (along a row), mm").optional(),
    fwhmYMm: nullableNumber("FWHM along y (down a column), mm").optional(),
    fwtmXMm: nullableNumber("FWTM along x (along a row), mm").optional(),
    fwtmYMm: nullableNumber("FWTM along y (down a column), mm").optional(),
    mtf50: nullableNumber("Frequency where the MTF first falls to 0.5, cycles/mm; null when not reached"),
    mtf10: nullableNumber("Frequency where the MTF first falls to 0.1, cycles/mm; null when not reached"),
    nyquist: z.number().openapi({ description: "Nyquist frequency 1/(2·pixel spacing) along the primary MTF direction, cycles/mm" }),
    mtfAtNyquist: nullableNumber("MTF at the Nyquist frequency"),
    edgeAngleDeg: z.number().optional().openapi({ description: "Angle of the edge or line to the nearest image axis, degrees" }),
    mtf: mtfCurveSchema,
    warnings: z.array(z.object({ code: z.string(), message: z.string() })).openapi({ description: "Conditions that weaken the result (e.g. undersampled, low_snr)" }),
    version: z.string().openapi({ description: "Version of the analysis algorithms" }),
  })
  .openapi("AnalysisResult", { description: "One analysis in the public JSON contract: widths in mm, frequencies in cycles/mm." });

const evaluationSchema = z
  .object({
    status: z.enum(RESULT_STATUSES),
    headline: z.string(),
    metrics: z.array(
      z.object({
        metric: z.string(),
        value: z.number().nullable(),
        status: z.enum(RESULT_STATUSES),
        deviationPercent: z.number().nullable(),
        message: z.string(),
        baselineMean: z.number().nullable(),
        tolerance: z
          .object({ mode: z.enum(["relative", "absolute"]), warning: z.number(), action: z.number(), source: z.string(), isDefault: z.boolean() })
          .nullable(),
      }),
    ),
  })
  .openapi("Evaluation", { description: "The result against the scanner's baseline and tolerances" });

const driftFlagSchema = z
  .object({
    rule: z.string(),
    description: z.string(),
    pointIndices: z.array(z.number().int()),
    side: z.enum(["high", "low"]),
    isBadSide: z.boolean(),
  })
  .openapi("DriftFlag", { description: "A control-chart run rule that fired on this result" });

const spreadCurveSchema = z.object({
  id: z.string(),
  kind: z.enum(["psf", "lsf", "esf"]),
  axis: z.enum(["x", "y", "normal", "radial"]),
  positionMm: z.array(z.number()),
  value: z.array(z.number()),
});

const roiSchema = z
  .object({ x: z.number().int(), y: z.number().int(), width: z.number().int(), height: z.number().int() })
  .openapi({ description: "Pixel rectangle of the frame: columns x … x+width−1, rows y … y+height−1" });

export const scanAnalysisSchema = analysisResultSchema
  .extend({
    id,
    revision: z.number().int().positive().openapi({ description: "1, 2, … per scan; every re-run is kept" }),
    status: z.enum(RESULT_STATUSES),
    createdAt: dateTime,
    createdBy: z.string(),
    options: z.record(z.string(), z.unknown()).openapi({ description: "Options the analysis ran with" }),
    roi: roiSchema,
    spread: z.array(spreadCurveSchema).openapi({ description: "Spread-function profiles (PSF/LSF/ESF), positions in mm" }),
    mtfCurves: z.record(z.string(), mtfCurveSchema).openapi({ description: "Further MTF curves, e.g. x and y cuts of a point source" }),
    details: z.record(z.string(), z.unknown()).openapi({ description: "Method-specific extras (Gaussian fit, centre, disk radius …)" }),
    evaluation: orNull(evaluationSchema),
    driftFlags: z.array(driftFlagSchema),
  })
  .openapi("ScanAnalysis", { description: "The current analysis of a scan: the contract keys plus record fields, curves and evaluation" });

export const scanSchema = z
  .object({
    scan: z.object({
      id,
      scannerId: id,
      scannerName: z.string(),
      siteName: z.string(),
      testId: id.nullable(),
      testName: z.string().nullable(),
      fileName: z.string(),
      fileSize: z.number().int().openapi({ description: "Bytes" }),
      fileSha256: z.string().openapi({ description: "SHA-256 of the uploaded file, hex" }),
      format: z.enum(["dicom", "png", "tiff", "raw"]),
      acquiredAt: dateTime.openapi({ description: "Test date: DICOM acquisition date/time when present, else upload time" }),
      uploadedAt: dateTime,
      uploadedBy: z.string(),
      note: z.string().nullable(),
      attributes: z.record(z.string(), z.union([z.string(), z.number(), z.null()])).openapi({ description: "Header attributes read from the file" }),
      signOff: z.object({ by: z.string().nullable(), at: dateTime, note: z.string().nullable() }).nullable(),
    }),
    analysis: orNull(scanAnalysisSchema),
    history: z
      .array(
        z.object({
          id,
          revision: z.number().int().positive(),
          isCurrent: z.boolean(),
          method: z.enum(METHODS),
          status: z.enum(RESULT_STATUSES),
          options: z.record(z.string(), z.unknown()),
          analysisVersion: z.string(),
          createdAt: dateTime,
          createdByName: z.string(),
        }),
      )
      .openapi({ description: "Every analysis revision, newest first" }),
  })
  .openapi("Scan");

export const scanListItemSchema = z
  .object({
    id,
    scannerId: id,
    scannerName: z.string(),
    siteName: z.string(),
    testId: id.nullable(),
    testName: z.string().nullable(),
    fileName: z.string(),
    acquiredAt: dateTime,
    createdAt: dateTime,
    signedOffAt: dateTime.nullable(),
    method: z.enum(METHODS),
    status: z.enum(RESULT_STATUSES),
    analysisId: id,
    revision: z.number().int().positive(),
    fwhmMm: nullableNumber("mm"),
    mtf50: nullableNumber("cycles/mm"),
    mtf10: nullableNumber("cycles/mm"),
  })
  .openapi("ScanListItem");

export const scanPageSchema = z
  .object({
    scans: z.array(scanListItemSchema),
    total: z.number().int().min(0).openapi({ description: "Number of scans matching the filters, over all pages" }),
    page: z.number().int().min(1),
    pageSize: z.number().int().min(1),
  })
  .openapi("ScanPage");

/** The OpenAPI document itself (GET /api/openapi.json): any JSON object. */
export const openApiDocumentSchema = z.record(z.string(), z.unknown()).openapi({ description: "An OpenAPI 3.1 document" });
