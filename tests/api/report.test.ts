// Route tests for GET /api/scanners/{id}/report (PDF QA report) against the real test MariaDB. Rows are inserted
// directly (scans, analyses with an MTF curve, metric values, baseline, tolerance, alert, service event). The PDF is
// read back with poppler's pdftotext (Debian poppler-utils), a PDF reader independent of pdfkit that wrote it.
import { execFileSync } from "node:child_process";
import { randomBytes } from "node:crypto";
import { existsSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { expectClose } from "../helpers/expect-close";
import { apiRequest, createTestSite, createTestUser, json, routeParams, unique, type ErrorJson, type TestUser } from "../helpers/api";
import { GET } from "@/app/api/scanners/[id]/report/route";
import { db } from "@/db/client";
import { getScannerForUser } from "@/db/queries/scanners";
import { alerts, analyses, baselines, metricValues, qaTests, scannerEngineers, scanners, scans, serviceEvents, tolerances } from "@/db/schema";
import type { Status } from "@/lib/qa";
import { getReportData } from "@/lib/report/report-data";

vi.mock("next-auth", async (importOriginal) =>
  (await import("../helpers/api")).withAnonymousSession(await importOriginal<typeof import("next-auth")>()),
);

const PDFTOTEXT = "/usr/bin/pdftotext";
const CAUTION =
  "Results support, and never replace, the judgement of the qualified medical physicist. Tolerances follow the " +
  "department's QA programme, the manufacturer's specifications and local regulations.";

// Gaussian LSF of standard deviation σ (mm): MTF(f) = exp(−2π²σ²f²), MTF50 = 0.187391/σ, MTF10 = 0.341541/σ
// (closed forms, domain notes §6).
const gaussMtf = (sigmaMm: number, f: number) => Math.exp(-2 * Math.PI ** 2 * sigmaMm ** 2 * f ** 2);
const FREQS = Array.from({ length: 51 }, (_, i) => i * 0.05); // 0 … 2.5 cycles/mm
const NYQUIST = 1.25;
const SIGMAS_MM = [0.4, 0.47, 0.41];
const DATES = ["2025-03-10T09:00:00Z", "2025-04-10T09:00:00Z", "2025-05-10T09:00:00Z"].map((s) => new Date(s));
const BASELINE = { mtf50: 0.187391 / 0.4, mtf10: 0.341541 / 0.4 };
// Statuses by hand: MTF50 against the 10/15 % defaults, MTF10 against the local 8/12 % levels set below.
// σ 0.47 mm: MTF50 and MTF10 14.9 % below baseline → warning (MTF50), action (MTF10); σ 0.41 mm: 2.4 % below → pass.
const STATUSES: { mtf50: Status; mtf10: Status; worst: Status }[] = [
  { mtf50: "pass", mtf10: "pass", worst: "pass" },
  { mtf50: "warning", mtf10: "action", worst: "action" },
  { mtf50: "pass", mtf10: "pass", worst: "pass" },
];
const PERIOD = "from=2025-01-01&to=2025-06-30";

let physicist: TestUser;
let lead: TestUser;
let engineer: TestUser;
let site: { id: number; name: string };
let scanner: { id: number; name: string; serialNumber: string; model: string; location: string };
let testId: number;

beforeAll(async () => {
  physicist = await createTestUser("physicist");
  lead = await createTestUser("lead");
  engineer = await createTestUser("engineer");
  site = await createTestSite();
  scanner = { id: 0, name: unique("CT report"), serialNumber: `SN-${randomBytes(4).toString("hex")}`, model: "T-64 Resolution", location: "Radiology room 9" };
  const [s] = await db()
    .insert(scanners)
    .values({ siteId: site.id, name: scanner.name, modality: "CT", manufacturer: "Testwerk", model: scanner.model, serialNumber: scanner.serialNumber, location: scanner.location, responsiblePhysicistId: physicist.id })
    .$returningId();
  scanner.id = s!.id;
  await db().insert(scannerEngineers).values({ scannerId: scanner.id, userId: engineer.id });
  const [t] = await db().insert(qaTests).values({ scannerId: scanner.id, name: "Edge MTF, monthly", method: "edge", phantom: "1 mm W edge", protocol: "", frequency: "monthly" }).$returningId();
  testId = t!.id;

  for (let i = 0; i < SIGMAS_MM.length; i++) {
    const sigma = SIGMAS_MM[i]!;
    const signed = i < 2;
    const [scan] = await db()
      .insert(scans)
      .values({
        scannerId: scanner.id, testId, uploadedById: physicist.id, fileSha256: randomBytes(32).toString("hex"), fileName: `edge-${i + 1}.dcm`,
        fileSize: 1000, format: "dicom", storageKey: `test/report/${randomBytes(8).toString("hex")}`, acquiredAt: DATES[i]!, attributes: {},
        signedOffById: signed ? physicist.id : null, signedOffAt: signed ? new Date(DATES[i]!.getTime() + 86_400_000) : null,
      })
      .$returningId();
    const values = { mtf50: 0.187391 / sigma, mtf10: 0.341541 / sigma };
    const result = {
      method: "edge", nyquist: NYQUIST, fwhmMm: null, fwtmMm: null, ...values, mtfAtNyquist: gaussMtf(sigma, NYQUIST),
      mtf: { frequencyCyclesPerMm: FREQS, value: FREQS.map((f) => gaussMtf(sigma, f)) }, warnings: [], version: "halfmax-analysis test",
    };
    const [analysis] = await db()
      .insert(analyses)
      .values({ scanId: scan!.id, revision: 1, isCurrent: true, method: "edge", options: {}, result, analysisVersion: "halfmax-analysis test", status: STATUSES[i]!.worst, createdById: physicist.id })
      .$returningId();
    await db().insert(metricValues).values(
      (["mtf50", "mtf10"] as const).map((metric) => ({
        analysisId: analysis!.id, scanId: scan!.id, scannerId: scanner.id, testId, metric, value: values[metric], status: STATUSES[i]![metric], isCurrent: true, measuredAt: DATES[i]!,
      })),
    );
  }
  const baselineCurve = { frequencyCyclesPerMm: FREQS, value: FREQS.map((f) => gaussMtf(0.4, f)) };
  await db().insert(baselines).values(
    (["mtf50", "mtf10"] as const).map((metric) => ({
      scannerId: scanner.id, testId, metric, mean: BASELINE[metric], sd: BASELINE[metric] * 0.01, n: 3, scanIds: [], mtfCurve: baselineCurve,
      reason: "Acceptance test after installation", setById: physicist.id, setAt: new Date("2025-02-01T12:00:00Z"),
    })),
  );
  await db().insert(tolerances).values({ scannerId: scanner.id, testId, metric: "mtf10", mode: "relative", warning: 8, action: 12, source: "local decision (test fixture)", updatedById: physicist.id, updatedAt: new Date() });
  const [alert] = await db()
    .insert(alerts)
    .values({
      scannerId: scanner.id, testId, cause: "action", state: "resolved", summary: "MTF10 14.9 % below baseline: action", openedAt: DATES[1]!, updatedAt: DATES[2]!,
      acknowledgedById: engineer.id, acknowledgedAt: new Date("2025-04-11T08:00:00Z"), resolvedById: physicist.id, resolvedAt: new Date("2025-05-12T08:00:00Z"),
    })
    .$returningId();
  await db().insert(alerts).values({
    scannerId: scanner.id, testId, cause: "overdue", state: "resolved", summary: "Old alert resolved before the period", openedAt: new Date("2024-03-01T00:00:00Z"),
    updatedAt: new Date("2024-03-05T00:00:00Z"), resolvedById: physicist.id, resolvedAt: new Date("2024-03-05T00:00:00Z"),
  });
  await db().insert(serviceEvents).values({
    scannerId: scanner.id, alertId: alert!.id, engineerId: engineer.id, performedAt: new Date("2025-04-20T10:00:00Z"), description: "Detector gain recalibration", parts: "none",
  });
});

const getReport = (query: string, token?: string, id: number | string = scanner.id) =>
  GET(apiRequest(`/api/scanners/${id}/report${query ? `?${query}` : ""}`, { token }), routeParams(id));

/** Text of each page of a PDF, as read by pdftotext (pages end in a form feed), whitespace collapsed. */
function pdfPages(pdf: Buffer): string[] {
  expect(existsSync(PDFTOTEXT), "pdftotext missing: install Debian's poppler-utils (npm test does)").toBe(true);
  const dir = mkdtempSync(path.join(tmpdir(), "halfmax-report-"));
  try {
    const file = path.join(dir, "report.pdf");
    writeFileSync(file, pdf);
    const text = execFileSync(PDFTOTEXT, ["-enc", "UTF-8", file, "-"], { encoding: "utf8" });
    return text.split("\f").filter((p) => p.trim() !== "").map((p) => p.replace(/\s+/g, " ").trim());
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

async function pdfOf(res: Response): Promise<Buffer> {
  expect(res.status, res.status === 200 ? "" : JSON.stringify(await res.clone().json())).toBe(200);
  return Buffer.from(await res.arrayBuffer());
}

describe("GET /api/scanners/{id}/report", () => {
  it("answers 401 without credentials", async () => {
    const res = await getReport(PERIOD);
    expect(res.status).toBe(401);
  });

  it("answers 403 for a service engineer, even one assigned to the scanner", async () => {
    const res = await getReport(PERIOD, engineer.token);
    expect(res.status).toBe(403);
    expect((await json<ErrorJson>(res)).code).toBe("forbidden");
  });

  it("answers 404 for a scanner that does not exist", async () => {
    const res = await getReport("", lead.token, 999_999_999);
    expect(res.status).toBe(404);
  });

  it("answers 422 for an unparseable date and for from after to", async () => {
    expect((await getReport("from=yesterday", lead.token)).status).toBe(422);
    const res = await getReport("from=2025-07-01&to=2025-06-30", lead.token);
    expect(res.status).toBe(422);
    expect((await json<ErrorJson>(res)).error).toMatch(/from .* must not be after to/);
  });

  it("returns an A4 PDF attachment named after the scanner and period", async () => {
    const res = await getReport(PERIOD, lead.token);
    const pdf = await pdfOf(res);
    expect(res.headers.get("content-type")).toBe("application/pdf");
    const slug = scanner.name.replace(/[^\w]+/g, "-").toLowerCase();
    expect(res.headers.get("content-disposition")).toBe(`attachment; filename="halfmax-qa-report-${slug}-2025-01-01-to-2025-06-30.pdf"`);
    expect(pdf.subarray(0, 5).toString("latin1")).toBe("%PDF-");
    // A4 = 210 × 297 mm = 595.28 × 841.89 pt (ISO 216); pdfkit writes the MediaBox of each page.
    expect(pdf.toString("latin1")).toMatch(/\/MediaBox \[0 0 595\.28 841\.89\]/);
  });

  it("prints the identity, period, summary values, alerts, service events, sign-off and the caution (read by pdftotext)", async () => {
    const pages = pdfPages(await pdfOf(await getReport(PERIOD, physicist.token)));
    const text = pages.join(" ");
    for (const s of ["Spatial-resolution QA report", scanner.name, site.name, scanner.serialNumber, scanner.model, "Testwerk", scanner.location, physicist.name, engineer.name]) {
      expect(text).toContain(s);
    }
    expect(text).toContain("2025-01-01 to 2025-06-30");
    expect(text).toContain("Edge MTF, monthly");
    // Latest MTF50 (σ = 0.41 mm) with its unit, and its deviation from the baseline, from the closed forms above.
    const latest = 0.187391 / 0.41;
    expect(text).toContain(`${latest.toFixed(3)} cycles/mm`);
    const deviation = (100 * (latest - BASELINE.mtf50)) / BASELINE.mtf50;
    expect(text).toContain(`-${Math.abs(deviation).toFixed(1)} %`);
    expect(text).toContain(`${BASELINE.mtf50.toFixed(3)} ± ${(BASELINE.mtf50 * 0.01).toFixed(3)} cycles/mm`);
    expect(text).toContain("Spatial frequency (cycles/mm)");
    expect(text).toContain(`Nyquist ${NYQUIST.toFixed(3)} cycles/mm`);
    expect(text).toContain("Mean of 3 results in period");
    expect(text).toContain("MTF10 14.9 % below baseline: action");
    expect(text).not.toContain("Old alert resolved before the period");
    expect(text).toContain("Detector gain recalibration");
    expect(text).toContain("Acceptance test after installation");
    expect(text).toContain("2 of 3 results in this period signed off");
    expect(text).toContain(CAUTION);
    expect(text).toMatch(/1 of 2 tolerances in this report are Halfmax defaults \("common practice"\) rather than locally set/);
    expect(text).toContain("Set locally: local decision (test fixture)");
    // Footer with the scanner name and page number on every page.
    expect(pages.length).toBeGreaterThan(1);
    pages.forEach((p, i) => {
      expect(p).toContain(`Page ${i + 1} of ${pages.length}`);
      expect(p).toContain(scanner.name);
    });
  });

  it("reports an empty period gracefully", async () => {
    const pages = pdfPages(await pdfOf(await getReport("from=2020-01-01&to=2020-12-31", lead.token)));
    const text = pages.join(" ");
    expect(text).toContain("No results in this period");
    expect(text).toContain("No alerts were open in this period.");
    expect(text).toContain("No service events in this period.");
    expect(text).toContain(CAUTION);
  });

  it("defaults to the 12 months ending today when the dates are left empty", async () => {
    const res = await getReport("from=&to=", lead.token);
    await pdfOf(res);
    // 12 calendar months back from today, plus one day, so the period is 12 months long with both ends included.
    const today = new Date();
    const from = new Date(Date.UTC(today.getUTCFullYear() - 1, today.getUTCMonth(), today.getUTCDate() + 1));
    const day = (d: Date) => d.toISOString().slice(0, 10);
    expect(res.headers.get("content-disposition")).toContain(`-${day(from)}-to-${day(today)}.pdf`);
  });
});

describe("getReportData(scanner, range)", () => {
  it("averages the period's MTF curves, counts statuses and sign-offs, and keeps alerts open in the period", async () => {
    const item = await getScannerForUser(scanner.id, { id: physicist.id, email: physicist.email, name: physicist.name, role: "physicist" });
    const data = await getReportData(item, { from: new Date("2025-01-01"), to: new Date("2025-06-30") });
    const test = data.tests.find((t) => t.id === testId)!;
    expect(test.resultCount).toBe(3);
    expect(test.statusCounts).toEqual({ pass: 2, warning: 0, action: 1, "no-baseline": 0 });
    expect([test.signedOff, test.notSignedOff]).toEqual([2, 1]);
    expect(test.metrics.map((m) => m.metric)).toEqual(["mtf50", "mtf10"]);
    expect(test.mtf.nyquistCyclesPerMm).toBe(NYQUIST);
    // Mean of the three Gaussian MTFs, point by point on their shared 0.05 cycles/mm grid.
    const mean = test.mtf.periodMean!;
    expect(mean.curveCount).toBe(3);
    expect(mean.frequencyCyclesPerMm.length).toBe(FREQS.length);
    mean.frequencyCyclesPerMm.forEach((f, i) => {
      expectClose(f, FREQS[i]!, { abs: 1e-12 });
      expectClose(mean.value[i], SIGMAS_MM.reduce((s, sigma) => s + gaussMtf(sigma, f), 0) / SIGMAS_MM.length, { abs: 1e-12 });
    });
    expect(test.mtf.baseline?.value[10]).toBeCloseTo(gaussMtf(0.4, FREQS[10]!), 12);
    expect(data.alerts.map((a) => a.summary)).toEqual(["MTF10 14.9 % below baseline: action"]);
    expect(data.serviceEvents.map((s) => s.description)).toEqual(["Detector gain recalibration"]);
    expect(data.tolerances.map((t) => [t.metric, t.tolerance.isDefault])).toEqual([["mtf50", true], ["mtf10", false]]);
  });
});
