// The alert workflow in the browser: the demo engineer acknowledges an action-level alert and logs the service; the
// demo physicist uploads a passing re-test through the upload page and resolves the alert. The situation is built
// here through the API (its own scanner, baseline and failing result), so the test does not depend on the demo seed.
import { randomUUID } from "node:crypto";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { expect, test, type APIRequestContext, type Browser } from "@playwright/test";
import { jitteredPointSourceDicom } from "../helpers/phantom-files";
import { signIn } from "./helpers";

const ENGINEER = "engineer@halfmax.test";
const PHYSICIST = "physicist@halfmax.test";
const ADMIN = "admin@halfmax.test";

// Gaussian point source on 0.5 mm pixels: FWHM = 2√(2 ln 2)·σ (closed form). σ = 1.0 mm for the baseline and the
// re-test; σ = 1.6 mm is 60 % wider, far beyond the 15 % action level set below.
const GOOD_SIGMA_MM = 1.0;
const BAD_SIGMA_MM = 1.6;

function pointSourceDicom(sigmaMm: number, seed: number): Buffer {
  return Buffer.from(jitteredPointSourceDicom(sigmaMm, seed));
}

async function ok<T>(res: Awaited<ReturnType<APIRequestContext["get"]>>, what: string): Promise<T> {
  expect(res.ok(), `${what}: ${res.status()} ${await res.text()}`).toBe(true);
  return (await res.json()) as T;
}

async function uploadScan(request: APIRequestContext, scannerId: number, bytes: Buffer, name: string): Promise<{ id: number; testId: number; status: string }> {
  const body = await ok<{ scan: { id: number; testId: number }; analysis: { status: string } }>(
    await request.post("/api/scans", {
      multipart: { file: { name, mimeType: "application/dicom", buffer: bytes }, scannerId: String(scannerId), method: "point" },
    }),
    `upload ${name}`,
  );
  return { id: body.scan.id, testId: body.scan.testId, status: body.analysis.status };
}

const scannerName = `CT Alert e2e ${randomUUID().slice(0, 8)}`;
let scannerId: number;
let engineerName: string;
let physicistName: string;
let dir: string;
const scanIds: number[] = [];

async function asUser(browser: Browser, email: string) {
  const context = await browser.newContext();
  const page = await context.newPage();
  await signIn(page, email);
  return { context, page };
}

test.beforeAll(async ({ browser }) => {
  test.setTimeout(120_000);
  dir = mkdtempSync(path.join(tmpdir(), "halfmax-e2e-alerts-"));

  // Admin: a new scanner serviced by the demo engineer, with the demo physicist responsible.
  const admin = await asUser(browser, ADMIN);
  const { users } = await ok<{ users: { id: number; email: string; name: string }[] }>(await admin.page.request.get("/api/users"), "list users");
  const engineer = users.find((u) => u.email === ENGINEER)!;
  const physicist = users.find((u) => u.email === PHYSICIST)!;
  engineerName = engineer.name;
  physicistName = physicist.name;
  const { sites } = await ok<{ sites: { id: number }[] }>(await admin.page.request.get("/api/sites"), "list sites");
  const scanner = await ok<{ id: number }>(
    await admin.page.request.post("/api/scanners", {
      data: { name: scannerName, siteId: sites[0]!.id, modality: "CT", responsiblePhysicistId: physicist.id, engineerIds: [engineer.id] },
    }),
    "create scanner",
  );
  scannerId = scanner.id;
  await admin.context.close();

  // Physicist: baseline from three good results, levels of 10 % / 15 %, then a much wider PSF opens an alert.
  const phys = await asUser(browser, PHYSICIST);
  const baseline: number[] = [];
  let testId = 0;
  for (const seed of [401, 402, 403]) {
    const s = await uploadScan(phys.page.request, scannerId, pointSourceDicom(GOOD_SIGMA_MM, seed), `baseline-${seed}.dcm`);
    baseline.push(s.id);
    scanIds.push(s.id);
    testId = s.testId;
  }
  await ok(await phys.page.request.put(`/api/scanners/${scannerId}/baselines`, { data: { testId, scanIds: baseline, reason: "Acceptance test (browser test)" } }), "set baseline");
  const levels = (metric: string) => ({ testId, metric, mode: "relative", warning: 10, action: 15, source: "local decision (browser test)" });
  await ok(await phys.page.request.put(`/api/scanners/${scannerId}/tolerances`, { data: { tolerances: [levels("fwhmMm"), levels("mtf50")] } }), "set tolerances");
  const failing = await uploadScan(phys.page.request, scannerId, pointSourceDicom(BAD_SIGMA_MM, 404), "wide-psf.dcm");
  scanIds.push(failing.id);
  expect(failing.status).toBe("action");
  await phys.context.close();
});

test.afterAll(async ({ browser }) => {
  if (dir) rmSync(dir, { recursive: true, force: true });
  if (!scannerId) return;
  // Scans first, so the scanner is deleted (with its alerts and service log) rather than retired.
  const admin = await asUser(browser, ADMIN);
  for (const id of scanIds) await admin.page.request.delete(`/api/scans/${id}`);
  await admin.page.request.delete(`/api/scanners/${scannerId}`);
  await admin.context.close();
});

test("engineer acknowledges the alert and logs a service action; physicist uploads a passing re-test and resolves it", async ({ browser }) => {
  test.setTimeout(120_000);

  // ── the engineer ──
  const eng = await asUser(browser, ENGINEER);
  let page = eng.page;
  await page.getByRole("link", { name: "Alerts", exact: true }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Alerts" })).toBeVisible();
  await expect(page.getByRole("tab", { name: "Open" })).toHaveAttribute("aria-selected", "true");
  await page.getByLabel("Scanner").selectOption({ label: scannerName });
  await expect(page).toHaveURL(new RegExp(`scannerId=${scannerId}`));

  const row = page.getByRole("row").filter({ hasText: scannerName }).filter({ hasText: "Action level" });
  await expect(row).toHaveCount(1);
  await expect(row.locator("[data-status=open]")).toBeVisible();
  await row.getByTestId("alert-summary").click();

  let detail = page.getByRole("dialog", { name: `Action level alert on ${scannerName}` });
  await expect(detail).toBeVisible();
  await expect(detail.getByTestId("alert-timeline")).toContainText("Alert opened");
  await expect(detail.getByRole("button", { name: "Resolve" })).toHaveCount(0);

  await detail.getByRole("button", { name: "Acknowledge", exact: true }).click();
  const ack = page.getByRole("dialog", { name: "Acknowledge alert" });
  await ack.getByLabel("Note").fill("On site this afternoon");
  await ack.getByRole("button", { name: "Acknowledge alert" }).click();
  await expect(ack).toHaveCount(0);
  await expect(detail.getByTestId("alert-timeline")).toContainText(`Acknowledged by ${engineerName}`);
  await expect(detail.getByRole("button", { name: "Acknowledge", exact: true })).toHaveCount(0);

  await detail.getByRole("button", { name: "Log service action" }).click();
  const service = page.getByRole("dialog", { name: "Log service action" });
  await expect(service.getByLabel("Performed at")).not.toHaveValue("");
  await service.getByRole("button", { name: "Save service action" }).click();
  await expect(service.getByText("Describe what was done")).toBeVisible();
  await service.getByLabel("What was done").fill("Detector recalibrated; focal spot measured");
  await service.getByLabel("Parts replaced").fill("Collimator blade assembly");
  await service.getByRole("button", { name: "Save service action" }).click();
  await expect(service).toHaveCount(0);
  await expect(detail.getByTestId("alert-timeline")).toContainText("Detector recalibrated; focal spot measured");
  await expect(detail.getByTestId("alert-timeline")).toContainText("Parts replaced: Collimator blade assembly");
  await detail.getByRole("button", { name: "Close", exact: true }).last().click();

  await page.getByRole("tab", { name: "Acknowledged" }).click();
  const acknowledgedRow = page.getByRole("row").filter({ hasText: scannerName }).filter({ hasText: "Action level" });
  await expect(acknowledgedRow).toContainText(engineerName);
  await eng.context.close();

  // ── the physicist ──
  const phys = await asUser(browser, PHYSICIST);
  page = phys.page;
  // Before the re-test, Resolve is disabled and says why.
  await page.goto(`/alerts?state=acknowledged&scannerId=${scannerId}`);
  await page.getByRole("row").filter({ hasText: "Action level" }).getByTestId("alert-summary").click();
  detail = page.getByRole("dialog", { name: `Action level alert on ${scannerName}` });
  await expect(detail.getByRole("button", { name: "Resolve" })).toBeDisabled();
  await expect(detail).toContainText("Needs a passing re-test");
  await detail.getByRole("button", { name: "Close", exact: true }).last().click();

  const retestFile = path.join(dir, "retest.dcm");
  writeFileSync(retestFile, pointSourceDicom(GOOD_SIGMA_MM, 405));
  await page.goto("/scans/new");
  await page.getByLabel("Scanner").selectOption({ label: scannerName });
  await page.getByTestId("upload-input").setInputFiles(retestFile);
  await page.getByTestId("upload-row").getByLabel("Analysis method").selectOption({ label: "Point source" });
  await page.getByRole("button", { name: "Upload and analyse" }).click();
  await page.waitForURL(/\/scans\/\d+$/, { timeout: 90_000 });
  const retestId = Number(new URL(page.url()).pathname.split("/").pop());
  scanIds.push(retestId);

  await page.goto(`/alerts?state=acknowledged&scannerId=${scannerId}`);
  const readyRow = page.getByRole("row").filter({ hasText: "Action level" });
  await expect(readyRow.getByTestId("ready-to-resolve")).toHaveText("Re-test passed — ready to resolve");
  await readyRow.getByTestId("alert-summary").click();
  detail = page.getByRole("dialog", { name: `Action level alert on ${scannerName}` });
  await expect(detail.getByTestId("retest-link")).toHaveAttribute("href", `/scans/${retestId}`);
  await detail.getByRole("button", { name: "Resolve", exact: true }).click();
  const resolve = page.getByRole("dialog", { name: "Resolve alert" });
  await resolve.getByLabel("Resolution note").fill("Re-test passed after detector recalibration");
  await resolve.getByRole("button", { name: "Resolve alert" }).click();
  await expect(resolve).toHaveCount(0);
  await expect(detail.getByTestId("alert-timeline")).toContainText(`Resolved by ${physicistName}`);
  await expect(detail.getByTestId("alert-timeline")).toContainText("Re-test passed after detector recalibration");
  await expect(detail.getByRole("button", { name: "Resolve", exact: true })).toHaveCount(0);
  await detail.getByRole("button", { name: "Close", exact: true }).last().click();

  await page.getByRole("tab", { name: "Resolved" }).click();
  await expect(page.getByRole("row").filter({ hasText: "Action level" }).filter({ hasText: scannerName })).toHaveCount(1);
  await phys.context.close();
});
