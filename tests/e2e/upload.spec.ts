import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { expect, test, type Browser } from "@playwright/test";
import { jitteredPointSourceDicom } from "../helpers/phantom-files";
import { signIn } from "./helpers";

const SPACING_MM = 0.25;
const SIGMA_MM = 0.5;
// Gaussian PSF: FWHM = 2√(2 ln 2)·σ and MTF(f) = exp(−2π²σ²f²), so f50 = √(ln 2 / 2)/(π σ) = 0.187391/σ (closed forms).
const TRUE_FWHM_MM = 2 * Math.sqrt(2 * Math.LN2) * SIGMA_MM;
const TRUE_MTF50 = Math.sqrt(Math.LN2 / 2) / (Math.PI * SIGMA_MM);

let dir: string;
const created: number[] = [];

test.beforeAll(() => {
  dir = mkdtempSync(path.join(tmpdir(), "halfmax-e2e-upload-"));
});

test.afterAll(async ({ browser }) => {
  rmSync(dir, { recursive: true, force: true });
  await deleteScans(browser, created);
});

/** Removes the scans this file created (admin only), so repeated runs leave the demo fleet as it was. */
async function deleteScans(browser: Browser, ids: number[]) {
  if (ids.length === 0) return;
  const context = await browser.newContext();
  const page = await context.newPage();
  await signIn(page, "admin@halfmax.test");
  for (const id of ids) await page.request.delete(`/api/scans/${id}`);
  await context.close();
}

/**
 * A CT bead phantom as DICOM: Gaussian PSF (σ = 0.5 mm) on 0.25 mm pixels, with a centre and noise drawn from a
 * per-run seed so the file is new each run (the duplicate check compares file hashes).
 */
function writeBeadPhantom(seed: number): string {
  const bytes = jitteredPointSourceDicom(SIGMA_MM, seed, {
    pixelSpacingMm: SPACING_MM,
    amplitude: 1500,
    background: 0,
    noiseSd: 4,
    attributes: { Manufacturer: "Lumeris Imaging", DeviceSerialNumber: "LM-HS64-2207", ConvolutionKernel: "SHARP" },
  });
  const file = path.join(dir, `bead-${seed}.dcm`);
  writeFileSync(file, bytes);
  return file;
}

test("upload of a point-source DICOM for CT Kestrel lands on its result with the MTF chart, FWHM and MTF50", async ({ page }) => {
  test.setTimeout(120_000);
  const seed = Date.now() % 2_147_483_647;
  test.info().annotations.push({ type: "phantom seed", description: String(seed) });
  const file = writeBeadPhantom(seed);

  await signIn(page, "physicist@halfmax.test");
  await page.goto("/scans/new");
  await expect(page.getByRole("heading", { level: 1, name: "Add scans" })).toBeVisible();
  await page.getByLabel("Scanner").selectOption({ label: "CT Kestrel" });
  await page.getByTestId("upload-input").setInputFiles(file);

  const row = page.getByTestId("upload-row");
  await expect(row).toHaveCount(1);
  await expect(row).toContainText(path.basename(file));
  await row.getByLabel("Analysis method").selectOption({ label: "Point source" });
  await page.getByRole("button", { name: "Upload and analyse" }).click();

  await page.waitForURL(/\/scans\/\d+$/, { timeout: 90_000 });
  created.push(Number(new URL(page.url()).pathname.split("/").pop()));

  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  await expect(page.getByText("CT Kestrel").first()).toBeVisible();
  const chart = page.getByTestId("mtf-chart");
  await expect(chart).toBeVisible();
  await expect(chart.locator(".recharts-line path").first()).toBeVisible();
  await expect(chart.locator("figcaption")).toContainText("MTF50");

  const metrics = page.getByTestId("metrics-table");
  await expect(metrics.getByRole("rowheader", { name: "FWHM", exact: true })).toBeVisible();
  await expect(metrics.getByRole("rowheader", { name: "MTF50", exact: true })).toBeVisible();

  // Measured values near the closed forms. Pixel-area sampling widens the PSF (variance + a²/12 per axis, about
  // +1 % in FWHM here) and the presampled MTF carries sinc(a·f) (about −1.5 % at f50): tolerances of 6 % and 8 %
  // cover those and the noise (common practice for an end-to-end check, not an accuracy test).
  const fwhm = parseFloat(await page.getByTestId("metric-value-fwhmMm").innerText());
  expect(Math.abs(fwhm - TRUE_FWHM_MM) / TRUE_FWHM_MM).toBeLessThan(0.06);
  const mtf50 = parseFloat(await page.getByTestId("metric-value-mtf50").innerText());
  expect(Math.abs(mtf50 - TRUE_MTF50) / TRUE_MTF50).toBeLessThan(0.08);
});
