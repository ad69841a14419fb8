import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { scans } from "@/db/schema";
import { findOrCreateTest, recordAnalysis } from "@/db/queries/analyses";
import { getScannerForUser } from "@/db/queries/scanners";
import { findScanBySha, getScanDetail, isStorageKeyReferenced } from "@/db/queries/scans";
import type { SessionUser } from "@/db/queries/users";
import type { PixelSpacingMm, Roi, MethodChoice } from "@/lib/analysis/types";
import { env } from "@/lib/env";
import { AppError, notFound } from "@/lib/errors";
import type { AnalyseJobOutput } from "@/lib/jobs/analysis-job";
import { runInWorker } from "@/lib/jobs/worker-pool";
import { sha256Hex, storage } from "@/lib/storage/file-storage";
import { testDateFromAttributes } from "./dicom-dates";
import { toUploadError } from "./job-error-response";

export interface IngestInput {
  bytes: Uint8Array;
  fileName: string;
  scannerId: number;
  method: MethodChoice;
  pixelSpacingMm?: PixelSpacingMm;
  roi?: Roi;
  note?: string;
  user: SessionUser;
}

/** DICOM attributes kept with every scan (by keyword). */
export const KEPT_ATTRIBUTES = [
  "Modality", "Manufacturer", "ManufacturerModelName", "StationName", "DeviceSerialNumber", "SoftwareVersions", "KVP",
  "ConvolutionKernel", "SliceThickness", "PixelSpacing", "ImagerPixelSpacing", "AcquisitionDate", "AcquisitionTime",
  "ContentDate", "ContentTime", "StudyDate", "StudyTime", "SeriesDescription", "ProtocolName", "SOPClassUID",
  "SOPInstanceUID", "StudyInstanceUID", "SeriesInstanceUID", "ReconstructionDiameter", "Exposure", "XRayTubeCurrent",
  "PresentationIntentType", "LossyImageCompression", "BitsStored", "Rows", "Columns", "NumberOfFrames",
] as const;

/** The KEPT_ATTRIBUTES that the file carries (absent or empty ones left out). */
export function keptAttributes(all: Record<string, string | number | null>): Record<string, string | number | null> {
  const kept: Record<string, string | number | null> = {};
  for (const k of KEPT_ATTRIBUTES) if (all[k] !== undefined && all[k] !== null) kept[k] = all[k];
  return kept;
}

function mismatchWarnings(out: AnalyseJobOutput, scanner: { modality: string; serialNumber: string; name: string }) {
  const w: { code: string; message: string }[] = [];
  const a = out.decoded.attributes;
  const modality = a.Modality ? String(a.Modality).trim() : null;
  if (modality && modality !== scanner.modality && !(scanner.modality === "CR" && modality === "DX")) {
    w.push({ code: "modality_mismatch", message: `The file's Modality is ${modality} but ${scanner.name} is registered as ${scanner.modality}: check that you chose the right scanner` });
  }
  const serial = a.DeviceSerialNumber ? String(a.DeviceSerialNumber).trim() : null;
  if (serial && scanner.serialNumber && serial !== scanner.serialNumber.trim()) {
    w.push({ code: "serial_mismatch", message: `The file's Device Serial Number is ${serial} but ${scanner.name} has serial number ${scanner.serialNumber}: check that you chose the right scanner` });
  }
  return w;
}

/**
 * Upload path: validate, analyse off the event loop, store the original (content-addressed) and write scan, analysis,
 * metric, alert and outbox rows in one transaction. Any failure leaves no file and no row behind.
 */
export async function ingestScan(input: IngestInput) {
  const scanner = await getScannerForUser(input.scannerId, input.user).catch((err) => {
    if (err instanceof AppError && err.code === "not_found") throw notFound(`Scanner ${input.scannerId}`);
    throw err;
  });
  if (!scanner.active) throw new AppError({ code: "conflict", message: `${scanner.name} is retired: reactivate it before adding scans` });
  const sha = sha256Hex(input.bytes);
  const dup = await findScanBySha(db(), scanner.id, sha);
  if (dup) {
    throw new AppError({ code: "conflict", message: `This file was already uploaded for ${scanner.name} (scan ${dup.id})`, details: { existingScanId: dup.id } });
  }
  let out: AnalyseJobOutput;
  try {
    out = (await runInWorker({
      kind: "analyse", bytes: input.bytes, method: input.method, pixelSpacingMm: input.pixelSpacingMm ?? null, roi: input.roi ?? null,
      maxPixels: env().MAX_IMAGE_PIXELS,
    })) as AnalyseJobOutput;
  } catch (err) {
    throw toUploadError(err);
  }
  const warnings = [...out.decoded.warnings, ...mismatchWarnings(out, scanner)];
  out.result.warnings = [...out.result.warnings, ...warnings];
  const attributes = keptAttributes(out.decoded.attributes);
  attributes.TransferSyntaxUID = out.decoded.transferSyntaxUid;
  attributes.PhotometricInterpretation = out.decoded.photometricInterpretation;
  const acquiredAt = testDateFromAttributes(out.decoded.attributes) ?? new Date();

  const store = storage();
  const { key, created } = await store.put(input.bytes);
  try {
    const scanId = await db().transaction(async (tx) => {
      const testId = await findOrCreateTest(tx, scanner.id, out.result.method);
      const [row] = await tx
        .insert(scans)
        .values({
          scannerId: scanner.id, testId, uploadedById: input.user.id, fileSha256: sha, fileName: input.fileName.slice(0, 255),
          fileSize: input.bytes.length, format: out.decoded.format, storageKey: key, acquiredAt, attributes, note: input.note ?? null,
        })
        .$returningId();
      const scanId = row!.id;
      await recordAnalysis(tx, {
        scanId, scannerId: scanner.id, modality: scanner.modality, testId, measuredAt: acquiredAt, result: out.result,
        options: { method: input.method, roi: input.roi ?? null, pixelSpacingMm: input.pixelSpacingMm ?? null, frame: out.decoded.frame, timingMs: out.timingMs },
        userId: input.user.id, appUrl: env().APP_URL,
      });
      return scanId;
    });
    return { scanId, timingMs: out.timingMs };
  } catch (err) {
    if (created && !(await isStorageKeyReferenced(db(), key).catch(() => true))) await store.delete(key).catch(() => {});
    throw err;
  }
}

/** Re-run the analysis of a stored scan with another method, ROI or spacing; the new revision becomes current. */
export async function reanalyseScan(scanId: number, opts: { method: MethodChoice; roi?: Roi | null; pixelSpacingMm?: PixelSpacingMm | null; reason?: string }, user: SessionUser) {
  const detail = await getScanDetail(scanId, user);
  const bytes = await storage().get(detail.storageKey);
  const previousOptions = (detail.analysis?.options ?? {}) as { pixelSpacingMm?: PixelSpacingMm | null };
  const pixelSpacingMm = opts.pixelSpacingMm ?? previousOptions.pixelSpacingMm ?? null;
  let out: AnalyseJobOutput;
  try {
    out = (await runInWorker({ kind: "analyse", bytes, method: opts.method, pixelSpacingMm, roi: opts.roi ?? null, maxPixels: env().MAX_IMAGE_PIXELS })) as AnalyseJobOutput;
  } catch (err) {
    throw toUploadError(err);
  }
  out.result.warnings = [...out.result.warnings, ...out.decoded.warnings];
  await db().transaction(async (tx) => {
    const testId = await findOrCreateTest(tx, detail.scannerId, out.result.method);
    if (testId !== detail.testId) await tx.update(scans).set({ testId }).where(eq(scans.id, scanId));
    await recordAnalysis(tx, {
      scanId, scannerId: detail.scannerId, modality: detail.scannerModality, testId, measuredAt: detail.acquiredAt, result: out.result,
      options: { method: opts.method, roi: opts.roi ?? null, pixelSpacingMm, frame: out.decoded.frame, reason: opts.reason ?? null, timingMs: out.timingMs },
      userId: user.id, appUrl: env().APP_URL,
    });
  });
  return getScanDetail(scanId, user);
}
