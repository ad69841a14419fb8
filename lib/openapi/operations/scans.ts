/** Scans operations: upload, list, read, re-analyse, sign off, download. */
import { createScanSchema, listScansQuerySchema, reanalyseSchema, signOffSchema } from "@/lib/validations/scan";
import { idNotFound, type ApiOperation } from "../operation";
import { documentFields, z } from "../registry";
import { okSchema, scanPageSchema, scanSchema } from "../responses";

const uploadFields = documentFields(createScanSchema, {
  scannerId: "Scanner the image was acquired on (GET /api/scanners lists them)",
  method: "point, line, edge or disk; auto picks the method from the image",
  pixelSpacingMm: {
    description: "Pixel spacing in mm: one number for square pixels, or 'row,column' (DICOM order). Needed when the file carries none (PNG, TIFF, raw)",
    examples: ["0.5", "0.39,0.39"],
  },
  roi: { description: "Region to analyse, 'x,y,width,height' in whole pixels (width and height ≥ 8); default: found around the object", examples: ["120,96,64,64"] },
  note: "Free text kept with the scan",
});

const uploadBody = z.object({
  // zod's own .meta() because the .openapi() metadata type (OpenAPI 3.0 keywords) lacks contentMediaType.
  file: z.string().meta({
    format: "binary",
    contentMediaType: "application/octet-stream",
    description: "The phantom image: DICOM (native or JPEG Lossless), PNG, TIFF or raw; at most MAX_UPLOAD_BYTES (200 MB by default)",
  }),
  ...uploadFields.shape,
});

const decodeErrors = {
  413: "The image has more pixels than MAX_IMAGE_PIXELS",
  415: "The stored file can no longer be decoded (unsupported format or transfer syntax)",
} as const;

export const SCAN_OPERATIONS: ApiOperation[] = [
  {
    method: "get", path: "/api/scans", tag: "Scans", access: "viewFleet",
    summary: "Scans with their current analysis, filtered and paginated",
    description: "Newest test date first. `total` counts every match, so pages = ceil(total / pageSize).",
    query: documentFields(listScansQuerySchema, {
      scannerId: "Only this scanner's scans",
      method: "Only results of this method",
      from: { description: "Test date on or after this day (YYYY-MM-DD, or an ISO 8601 date-time)", format: "date" },
      to: { description: "Test date on or before this day, inclusive (YYYY-MM-DD)", format: "date" },
      page: "Page number, from 1",
      pageSize: "Scans per page",
    }),
    success: { status: 200, description: "One page of scans", json: scanPageSchema },
    errors: { 422: "A filter or page value is invalid; `issues` lists which" },
  },
  {
    method: "post", path: "/api/scans", tag: "Scans", access: "uploadScans",
    summary: "Upload a phantom image, analyse it and store the result",
    description:
      "Send multipart/form-data with the image as `file`. The analysis runs before the answer (large images take seconds). " +
      "The result is evaluated against the scanner's baseline and tolerances; alerts are raised as configured.",
    body: { multipart: uploadBody },
    success: { status: 201, description: "Stored and analysed", json: scanSchema, headers: { location: "URL of the new scan, /api/scans/{id}" } },
    errors: {
      400: "The multipart body is malformed or incomplete",
      404: "The scanner does not exist or is not visible to the caller",
      409: "This file was already uploaded for the scanner (`existingScanId`), or the scanner is retired",
      413: "The file is larger than MAX_UPLOAD_BYTES, or the image has more pixels than MAX_IMAGE_PIXELS",
      415: "Not multipart/form-data, or the file is not a supported image (DICOM, PNG, TIFF, raw) or transfer syntax",
      422: "A field is invalid (validation_failed), or the image could not be decoded or analysed (unprocessable_image; `reason` says why)",
    },
  },
  {
    method: "get", path: "/api/scans/{id}", tag: "Scans", access: "viewFleet",
    summary: "One scan with its current analysis and analysis history",
    success: { status: 200, description: "The scan", json: scanSchema },
    errors: { 404: idNotFound("Scan") },
  },
  {
    method: "delete", path: "/api/scans/{id}", tag: "Scans", access: "deleteScans",
    summary: "Delete a scan and its analyses",
    description: "Recorded in the audit log.",
    success: { status: 200, description: "Deleted", json: okSchema },
    errors: { 404: idNotFound("Scan") },
  },
  {
    method: "get", path: "/api/scans/{id}/file", tag: "Scans", access: "viewFleet",
    summary: "Download the original uploaded file",
    success: {
      status: 200, description: "The file as uploaded",
      raw: { mediaTypes: ["application/dicom", "image/png", "image/tiff", "application/octet-stream"] },
      headers: { "content-disposition": "attachment; filename=\"…\"", "x-content-sha256": "SHA-256 of the file, hex" },
    },
    errors: { 404: idNotFound("Scan") },
  },
  {
    method: "get", path: "/api/scans/{id}/image", tag: "Scans", access: "viewFleet",
    summary: "The analysed frame for display, as float32 samples",
    description:
      "Little-endian float32, row-major (x along a row), at most 1024 samples a side: width × height × 4 bytes. " +
      "Values are the rescaled pixel values (e.g. HU).",
    success: {
      status: 200, description: "Samples", raw: { mediaTypes: ["application/octet-stream"] },
      headers: {
        "x-width": "Samples per row",
        "x-height": "Rows",
        "x-scale": "Original pixels per sample (1 when not reduced)",
        "x-min": "Smallest sample value",
        "x-max": "Largest sample value",
      },
    },
    errors: { 404: idNotFound("Scan"), ...decodeErrors, 422: "The stored file could not be decoded (unprocessable_image)" },
  },
  {
    method: "post", path: "/api/scans/{id}/analyses", tag: "Scans", access: "reanalyseScans",
    summary: "Re-run the analysis with another method, ROI or pixel spacing",
    description: "Every revision is kept; the new one becomes current and is evaluated again.",
    body: {
      json: documentFields(reanalyseSchema, {
        method: "point, line, edge, disk, or auto",
        roi: "Region to analyse in pixels; null or absent: found automatically",
        pixelSpacingMm: "Pixel spacing in mm, x = along a row (column spacing), y = between rows; null or absent: as in the previous analysis, else from the file",
        reason: "Why the analysis is re-run (kept in the history)",
      }),
    },
    success: { status: 201, description: "The scan with its new current analysis", json: scanSchema },
    errors: { 404: idNotFound("Scan"), ...decodeErrors, 422: "A field is invalid (validation_failed), or the analysis failed (unprocessable_image; `reason` says why)" },
  },
  {
    method: "post", path: "/api/scans/{id}/sign-off", tag: "Scans", access: "signOffScans",
    summary: "Sign off the current result",
    description: "The body is optional.",
    body: { json: documentFields(signOffSchema, { note: "Comment kept with the sign-off" }), required: false },
    success: { status: 200, description: "The scan, signed off", json: scanSchema },
    errors: { 404: idNotFound("Scan"), 409: "This result is already signed off" },
  },
];
