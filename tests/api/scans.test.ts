// Upload, list, inspect, re-analyse, sign off and delete scans through the route handlers, against the real test
// MariaDB, the real worker-thread analysis and the filesystem storage. Every rejected upload must leave no row and no file.
import { readdirSync, readFileSync, existsSync } from "node:fs";
import path from "node:path";
import { and, count, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { auditEvents, scanners, scans } from "@/db/schema";
import { GET as listScansRoute, POST as uploadRoute } from "@/app/api/scans/route";
import { DELETE as deleteScanRoute, GET as getScanRoute } from "@/app/api/scans/[id]/route";
import { GET as fileRoute } from "@/app/api/scans/[id]/file/route";
import { POST as reanalyseRoute } from "@/app/api/scans/[id]/analyses/route";
import { POST as signOffRoute } from "@/app/api/scans/[id]/sign-off/route";
import { GET as healthRoute } from "@/app/api/health/route";
import { sha256Hex } from "@/lib/storage/file-storage";
import { apiRequest, createTestSite, createTestUser, noParams, routeParams, unique, type TestUser } from "../helpers/api";
import { expectClose } from "../helpers/expect-close";
import { largeEdgeDicom, patchUs, pointSourceDicom, pointSourcePng } from "../helpers/phantom-files";

const PYDICOM_FILES = "/usr/lib/python3/dist-packages/pydicom/data/test_files";

let physicist: TestUser;
let admin: TestUser;
let lead: TestUser;
let scannerId: number;

function upload(token: string | undefined, fields: Record<string, string | Uint8Array>, fileName = "phantom.dcm"): Request {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) {
    if (typeof v === "string") form.set(k, v);
    else form.set(k, new Blob([v as BlobPart]), fileName);
  }
  const headers = new Headers();
  if (token) headers.set("authorization", `Bearer ${token}`);
  return new Request("http://test/api/scans", { method: "POST", headers, body: form });
}

async function scanCount(): Promise<number> {
  const [row] = await db().select({ n: count() }).from(scans).where(eq(scans.scannerId, scannerId));
  return Number(row?.n ?? 0);
}

function storedFile(bytes: Uint8Array): string {
  const sha = sha256Hex(bytes);
  return path.join(process.env.STORAGE_DIR!, sha.slice(0, 2), sha);
}

/** The upload must be refused with `status` and a JSON error, leaving no scan row and no stored file behind. */
async function expectRejectedWithoutTrace(req: Request, bytes: Uint8Array | null, status: number, messagePart: RegExp) {
  const before = await scanCount();
  const res = await uploadRoute(req, noParams);
  const body = await res.json();
  expect(res.status, JSON.stringify(body)).toBe(status);
  expect(body.error).toMatch(messagePart);
  expect(await scanCount()).toBe(before);
  if (bytes) expect(existsSync(storedFile(bytes))).toBe(false);
  return body;
}

beforeAll(async () => {
  [physicist, admin, lead] = await Promise.all([createTestUser("physicist"), createTestUser("admin"), createTestUser("lead")]);
  const site = await createTestSite();
  const [row] = await db().insert(scanners).values({ siteId: site.id, name: unique("CT upload"), modality: "CT", serialNumber: "SN-TEST-1", responsiblePhysicistId: physicist.id }).$returningId();
  scannerId = row!.id;
});

describe("POST /api/scans rejects bad input with a clear 4xx and writes nothing", () => {
  it("401 without a token, 403 for a lead", async () => {
    const { bytes } = pointSourceDicom();
    await expectRejectedWithoutTrace(upload(undefined, { file: bytes, scannerId: String(scannerId) }), bytes, 401, /Sign in|token/);
    await expectRejectedWithoutTrace(upload(lead.token, { file: bytes, scannerId: String(scannerId) }), bytes, 403, /role/);
  });

  it("422 without a file or scanner, 404 for an unknown scanner", async () => {
    const { bytes } = pointSourceDicom();
    await expectRejectedWithoutTrace(upload(physicist.token, { scannerId: String(scannerId) }), null, 422, /file/);
    const body = await expectRejectedWithoutTrace(upload(physicist.token, { file: bytes }), bytes, 422, /scannerId/);
    expect(body.code).toBe("validation_failed");
    await expectRejectedWithoutTrace(upload(physicist.token, { file: bytes, scannerId: "99999999" }), bytes, 404, /Scanner 99999999 not found/);
  });

  it("415 for bytes that are not an image", async () => {
    const bytes = new TextEncoder().encode("this is a text file, not a phantom image\n".repeat(20));
    const body = await expectRejectedWithoutTrace(upload(physicist.token, { file: bytes, scannerId: String(scannerId) }, "notes.dcm"), bytes, 415, /DICOM, PNG or TIFF/);
    expect(body.reason).toBe("not_an_image");
  });

  it("422 for a truncated DICOM file (pydicom's MR_truncated.dcm and a cut phantom)", async () => {
    const { bytes } = pointSourceDicom();
    const cut = bytes.subarray(0, bytes.length - 3000);
    await expectRejectedWithoutTrace(upload(physicist.token, { file: cut, scannerId: String(scannerId) }), cut, 422, /./);
    const truncated = new Uint8Array(readFileSync(path.join(PYDICOM_FILES, "MR_truncated.dcm")));
    await expectRejectedWithoutTrace(upload(physicist.token, { file: truncated, scannerId: String(scannerId) }), truncated, 422, /./);
  });

  it("415 for an unsupported compressed transfer syntax, naming it (pydicom's JPEG2000.dcm)", async () => {
    const bytes = new Uint8Array(readFileSync(path.join(PYDICOM_FILES, "JPEG2000.dcm")));
    const body = await expectRejectedWithoutTrace(upload(physicist.token, { file: bytes, scannerId: String(scannerId) }), bytes, 415, /JPEG 2000|1\.2\.840\.10008\.1\.2\.4\.9/);
    expect(body.reason).toBe("unsupported_transfer_syntax");
  });

  it("422 for a DICOM object without pixel data (pydicom's rtplan.dcm)", async () => {
    const bytes = new Uint8Array(readFileSync(path.join(PYDICOM_FILES, "rtplan.dcm")));
    const body = await expectRejectedWithoutTrace(upload(physicist.token, { file: bytes, scannerId: String(scannerId) }), bytes, 422, /pixel data/i);
    expect(body.reason).toBe("no_pixel_data");
  });

  it("413 when the header announces more pixels than the configured limit", async () => {
    const { bytes } = pointSourceDicom();
    const huge = patchUs(patchUs(bytes, 0x0028, 0x0010, 65535), 0x0028, 0x0011, 65535);
    const body = await expectRejectedWithoutTrace(upload(physicist.token, { file: huge, scannerId: String(scannerId) }), huge, 413, /limit/);
    expect(body.reason).toBe("too_many_pixels");
  });

  it("422 asking for the pixel spacing for a PNG without one, then 201 once it is given", async () => {
    const png = pointSourcePng(Math.floor(Math.random() * 1e9));
    const body = await expectRejectedWithoutTrace(upload(physicist.token, { file: png, scannerId: String(scannerId) }, "bead.png"), png, 422, /pixel spacing/i);
    expect(body.reason).toBe("missing_pixel_spacing");
    const res = await uploadRoute(upload(physicist.token, { file: png, scannerId: String(scannerId), pixelSpacingMm: "0.25", method: "point" }, "bead.png"), noParams);
    expect(res.status).toBe(201);
    const ok = await res.json();
    expect(ok.analysis.pixelSpacingMm).toEqual([0.25, 0.25]);
  });

  it("422 when no source can be found (pure noise)", async () => {
    const { bytes } = pointSourceDicom({ sigmaMm: 0.5, seed: 5 });
    // Same header, but flatten the pixel data to a constant: nothing stands out from the background.
    const flat = bytes.slice();
    const pixelStart = flat.length - 96 * 96 * 2;
    for (let i = pixelStart; i < flat.length; i += 2) { flat[i] = 100; flat[i + 1] = 0; }
    const body = await expectRejectedWithoutTrace(upload(physicist.token, { file: flat, scannerId: String(scannerId), method: "point" }), flat, 422, /Analysis failed/);
    expect(body.code).toBe("unprocessable_image");
  });

  it("422 for a malformed roi and a negative pixel spacing", async () => {
    const { bytes } = pointSourceDicom();
    await expectRejectedWithoutTrace(upload(physicist.token, { file: bytes, scannerId: String(scannerId), roi: "1,2,3" }), bytes, 422, /roi/);
    await expectRejectedWithoutTrace(upload(physicist.token, { file: bytes, scannerId: String(scannerId), pixelSpacingMm: "-1" }), bytes, 422, /pixelSpacingMm/);
  });
});

describe("POST /api/scans stores and analyses a phantom", () => {
  let scanId: number;
  const phantom = pointSourceDicom({ sigmaMm: 0.5, seed: 1234, serialNumber: "SN-OTHER" });

  it("201 with the metrics in the CLI's JSON keys, FWHM close to the phantom's truth", async () => {
    const res = await uploadRoute(upload(physicist.token, { file: phantom.bytes, scannerId: String(scannerId), note: "weekly bead" }), noParams);
    const body = await res.json();
    expect(res.status, JSON.stringify(body).slice(0, 400)).toBe(201);
    scanId = body.scan.id;
    for (const key of ["method", "pixelSpacingMm", "fwhmMm", "fwtmMm", "fwhmXMm", "fwhmYMm", "mtf50", "mtf10", "nyquist", "mtfAtNyquist", "mtf", "warnings", "version"]) {
      expect(body.analysis, key).toHaveProperty(key);
    }
    expect(body.analysis.method).toBe("point");
    // Pixel-integrated Gaussian: measured FWHM ≈ √(FWHM² + 0.4621·a²) (domain notes §6, common practice).
    const fwhm = 2 * Math.sqrt(2 * Math.LN2) * 0.5;
    expectClose(body.analysis.fwhmMm, Math.sqrt(fwhm ** 2 + 0.4621 * 0.25 ** 2), { rel: 0.03 });
    expect(body.analysis.mtf.frequency.length).toBe(body.analysis.mtf.value.length);
    expect(body.scan.acquiredAt).toBe("2026-11-15T09:30:00.000Z");
    expect(body.scan.attributes.DeviceSerialNumber).toBe("SN-OTHER");
    expect(body.analysis.warnings.map((w: { code: string }) => w.code)).toContain("serial_mismatch");
    expect(existsSync(storedFile(phantom.bytes))).toBe(true);
  });

  it("409 for the same file again, naming the existing scan, and nothing new is written", async () => {
    const body = await expectRejectedWithoutTrace(upload(physicist.token, { file: phantom.bytes, scannerId: String(scannerId) }), null, 409, /already uploaded/);
    expect(body.existingScanId).toBe(scanId);
  });

  it("GET /api/scans lists it with total; filters by scanner and method; GET /api/scans/{id} returns it", async () => {
    const res = await listScansRoute(apiRequest(`/api/scans?scannerId=${scannerId}&method=point&pageSize=1`, { token: lead.token }), noParams);
    const body = await res.json();
    expect(res.status).toBe(200);
    expect(body.total).toBeGreaterThanOrEqual(2);
    expect(body.scans).toHaveLength(1);
    const one = await (await getScanRoute(apiRequest(`/api/scans/${scanId}`, { token: lead.token }), routeParams(scanId))).json();
    expect(one.scan.id).toBe(scanId);
    expect(one.history).toHaveLength(1);
    const bad = await listScansRoute(apiRequest(`/api/scans?from=yesterday`, { token: lead.token }), noParams);
    expect(bad.status).toBe(422);
  });

  it("GET /api/scans/{id}/file returns the original bytes", async () => {
    const res = await fileRoute(apiRequest(`/api/scans/${scanId}/file`, { token: lead.token }), routeParams(scanId));
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/dicom");
    expect(sha256Hex(new Uint8Array(await res.arrayBuffer()))).toBe(sha256Hex(phantom.bytes));
  });

  it("POST /api/scans/{id}/analyses keeps every revision and makes the newest current", async () => {
    const res = await reanalyseRoute(apiRequest(`/api/scans/${scanId}/analyses`, { method: "POST", token: physicist.token, body: { method: "point", roi: { x: 16, y: 16, width: 64, height: 64 } } }), routeParams(scanId));
    const body = await res.json();
    expect(res.status, JSON.stringify(body).slice(0, 300)).toBe(201);
    expect(body.analysis.revision).toBe(2);
    // The analysed ROI lies inside the one asked for (the method may tighten it around the source).
    const roi = body.analysis.roi;
    expect(roi.x).toBeGreaterThanOrEqual(16);
    expect(roi.y).toBeGreaterThanOrEqual(16);
    expect(roi.x + roi.width).toBeLessThanOrEqual(80);
    expect(roi.y + roi.height).toBeLessThanOrEqual(80);
    expect(body.analysis.options.roi).toEqual({ x: 16, y: 16, width: 64, height: 64 });
    expect(body.history.map((h: { revision: number; isCurrent: boolean }) => [h.revision, h.isCurrent])).toEqual([[2, true], [1, false]]);
    const lead403 = await reanalyseRoute(apiRequest(`/api/scans/${scanId}/analyses`, { method: "POST", token: lead.token, body: {} }), routeParams(scanId));
    expect(lead403.status).toBe(403);
  });

  it("POST /api/scans/{id}/sign-off records who and when, once", async () => {
    const res = await signOffRoute(apiRequest(`/api/scans/${scanId}/sign-off`, { method: "POST", token: physicist.token, body: { note: "checked" } }), routeParams(scanId));
    const body = await res.json();
    expect(res.status).toBe(200);
    expect(body.scan.signOff.by).toBe(physicist.name);
    const again = await signOffRoute(apiRequest(`/api/scans/${scanId}/sign-off`, { method: "POST", token: physicist.token, body: {} }), routeParams(scanId));
    expect(again.status).toBe(409);
  });

  it("DELETE is admin-only, removes the scan and its file, and is audited", async () => {
    const denied = await deleteScanRoute(apiRequest(`/api/scans/${scanId}`, { method: "DELETE", token: physicist.token }), routeParams(scanId));
    expect(denied.status).toBe(403);
    const res = await deleteScanRoute(apiRequest(`/api/scans/${scanId}`, { method: "DELETE", token: admin.token }), routeParams(scanId));
    expect(res.status).toBe(200);
    expect((await getScanRoute(apiRequest(`/api/scans/${scanId}`, { token: admin.token }), routeParams(scanId))).status).toBe(404);
    expect(existsSync(storedFile(phantom.bytes))).toBe(false);
    const [audit] = await db().select().from(auditEvents).where(and(eq(auditEvents.action, "scan.delete"), eq(auditEvents.entityId, String(scanId))));
    expect(audit?.actorUserId).toBe(admin.id);
  });
});

describe("analysis runs off the request's event loop", () => {
  it("GET /api/health answers while a 3000×3000 image is still being analysed", async () => {
    const bytes = largeEdgeDicom(3000);
    let uploadDone = false;
    const pending = uploadRoute(upload(physicist.token, { file: bytes, scannerId: String(scannerId), method: "edge" }, "large-edge.dcm"), noParams).then((r) => {
      uploadDone = true;
      return r;
    });
    // Let the upload reach the worker, then ask for health: it must answer before the analysis finishes.
    await new Promise((r) => setTimeout(r, 200));
    const health = await healthRoute();
    const answeredWhileBusy = !uploadDone;
    expect(health.status).toBe(200);
    expect(answeredWhileBusy).toBe(true);
    const res = await pending;
    expect([201, 422]).toContain(res.status);
  }, 120_000);
});

describe("storage stays clean", () => {
  it("no temporary files are left in STORAGE_DIR", () => {
    const root = process.env.STORAGE_DIR!;
    if (!existsSync(root)) return;
    const leftovers = readdirSync(root, { recursive: true }).map(String).filter((f) => f.endsWith(".tmp"));
    expect(leftovers).toEqual([]);
  });
});
