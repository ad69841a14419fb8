import { expect, test, type Page } from "@playwright/test";
import { signIn } from "./helpers";

// The demo fleet (db/seed/demo-fleet.ts): six scanners at two sites, one user per role.
const DEMO_SCANNERS = ["CT 1 (Emergency)", "CT Kestrel", "PET/CT Orion", "Gamma camera Vela", "DR Room 1", "Mammography Lyra"];

const fleetTable = (page: Page) => page.getByRole("table", { name: "Scanners with their latest QA results" });
const scannerRow = (page: Page, name: string) => fleetTable(page).getByRole("row").filter({ has: page.getByRole("link", { name, exact: true }) });

test("the lead opens the fleet dashboard and sees every demo scanner with status counts and filters", async ({ page }) => {
  await signIn(page, "lead@halfmax.test");
  await page.goto("/");
  await expect(page.getByRole("heading", { level: 1, name: "Fleet" })).toBeVisible();
  await expect(fleetTable(page)).toBeVisible();
  for (const name of DEMO_SCANNERS) await expect(scannerRow(page, name)).toHaveCount(1);

  const summary = page.getByTestId("fleet-summary");
  for (const label of ["Action", "Warning", "Pass", "No baseline", "Overdue", "Needs attention"]) {
    await expect(summary.getByRole("button", { name: new RegExp(label) })).toBeVisible();
  }
  await expect(page.getByText("For decision support only")).toBeVisible();

  // Filtering by modality keeps the CT scanners and hides the others; the filter lands in the URL.
  await page.getByLabel("Modality", { exact: true }).selectOption({ label: "CT" });
  await expect(page).toHaveURL(/modality=CT/);
  await expect(scannerRow(page, "CT 1 (Emergency)")).toHaveCount(1);
  await expect(scannerRow(page, "CT Kestrel")).toHaveCount(1);
  await expect(scannerRow(page, "DR Room 1")).toHaveCount(0);
  await page.getByLabel("Modality", { exact: true }).selectOption({ label: "All modalities" });
  await expect(scannerRow(page, "DR Room 1")).toHaveCount(1);

  // Columns sort: the scanner header is a button that sets aria-sort.
  const header = fleetTable(page).getByRole("columnheader", { name: "Scanner" });
  await header.getByRole("button").click();
  await expect(header).toHaveAttribute("aria-sort", /ascending|descending/);
});

// The demo QA history (db/seed/seed-history.ts): a year of weekly results; DR Room 1 drifted into the action level and
// recovered after a logged service visit; Mammography Lyra is drifting now.
test("with the demo history, a scanner at action or warning level is under Needs attention, and DR Room 1 shows its drift and service visit", async ({ page }) => {
  await signIn(page, "lead@halfmax.test");
  await page.goto("/");
  const flagged = fleetTable(page).getByRole("row").filter({ has: page.locator('[data-status="action"], [data-status="warning"]') });
  await expect(flagged.first()).toBeVisible();
  const name = (await flagged.first().getByRole("link").first().textContent())!.trim();

  await page.getByTestId("fleet-count-attention").click();
  await expect(page).toHaveURL(/attention=1/);
  await expect(scannerRow(page, name)).toHaveCount(1);
  await page.getByTestId("fleet-count-attention").click();

  await scannerRow(page, "DR Room 1").getByRole("link", { name: "DR Room 1", exact: true }).click();
  await expect(page.getByRole("heading", { level: 1, name: "DR Room 1" })).toBeVisible();
  await page.getByRole("button", { name: "1 year", exact: true }).click();
  const trend = page.getByTestId("trend-card");
  await expect(trend.getByTestId("trend-legend")).toContainText("Action level and zone");
  await expect(trend.locator("figcaption")).toContainText(/\d+ action/);
  await expect(trend.getByTestId("drift-flags")).toContainText("Western Electric");
  await expect(trend.getByTestId("trend-events")).toContainText("service visit by Tomasz Brierley");

  // Sorting the results by status puts the action-level results first.
  const results = page.getByRole("table", { name: "Results of this scanner" });
  await results.getByRole("columnheader", { name: "Status" }).getByRole("button").click();
  await expect(results.getByRole("row").nth(1).locator('[data-status="action"]')).toBeVisible();
});

test("the lead opens a scanner page: trend chart, results table and report links, but no editing", async ({ page }) => {
  await signIn(page, "lead@halfmax.test");
  await page.goto("/");
  await scannerRow(page, "CT 1 (Emergency)").getByRole("link", { name: "CT 1 (Emergency)", exact: true }).click();
  await expect(page).toHaveURL(/\/scanners\/\d+$/);
  await expect(page.getByRole("heading", { level: 1, name: "CT 1 (Emergency)" })).toBeVisible();
  await expect(page.getByTestId("scanner-facts")).toContainText("CV-AX128-0412");

  await expect(page.getByRole("heading", { name: "Resolution trend" })).toBeVisible();
  await expect(page.getByLabel("Metric", { exact: true })).toBeVisible();
  await expect(page.getByRole("heading", { name: "Results", exact: true })).toBeVisible();
  await expect(page.getByRole("table", { name: "Results of this scanner" })).toBeVisible();

  const csv = page.getByRole("link", { name: "Export results (CSV)" });
  await expect(page.getByRole("link", { name: "Download report (PDF)" })).toBeVisible();
  await page.getByRole("button", { name: "3 months", exact: true }).click();
  await expect(csv).toHaveAttribute("href", /results\.csv\?from=\d{4}-\d{2}-\d{2}$/);
  await page.getByRole("button", { name: "All", exact: true }).click();
  await expect(csv).toHaveAttribute("href", /results\.csv$/);

  await expect(page.getByRole("heading", { name: "Tolerances" })).toBeVisible();
  await expect(page.getByRole("button", { name: /^Edit .* tolerance/ })).toHaveCount(0);
  await expect(page.getByRole("button", { name: "Set new baseline" })).toHaveCount(0);
  await expect(page.getByRole("button", { name: "Edit schedule" })).toHaveCount(0);
  await expect(page.getByRole("heading", { name: "Add results" })).toHaveCount(0);
});

test("a service engineer sees the scanner page read-only, without report downloads", async ({ page }) => {
  await signIn(page, "engineer@halfmax.test");
  await page.goto("/");
  await scannerRow(page, "DR Room 1").getByRole("link", { name: "DR Room 1", exact: true }).click();
  await expect(page.getByRole("heading", { name: "Resolution trend" })).toBeVisible();
  await expect(page.getByRole("table", { name: "Tolerances per test and metric" })).toBeVisible();
  await expect(page.getByRole("link", { name: "Download report (PDF)" })).toHaveCount(0);
  await expect(page.getByRole("button", { name: /^Edit .* tolerance/ })).toHaveCount(0);
  await expect(page.getByRole("button", { name: "Set new baseline" })).toHaveCount(0);
  await expect(page.getByRole("button", { name: "Edit schedule" })).toHaveCount(0);
  await expect(page.getByRole("heading", { name: "Add results" })).toHaveCount(0);
});

test("the physicist changes an MTF50 tolerance in the dialog, saves, and the table shows the new levels", async ({ page }) => {
  await signIn(page, "physicist@halfmax.test");
  await page.goto("/");
  await scannerRow(page, "CT Kestrel").getByRole("link", { name: "CT Kestrel", exact: true }).click();
  await expect(page.getByRole("heading", { level: 1, name: "CT Kestrel" })).toBeVisible();
  await expect(page.getByRole("heading", { name: "Add results" })).toBeVisible();

  const table = page.getByRole("table", { name: "Tolerances per test and metric" });
  const row = table.getByRole("row").filter({ has: page.getByRole("cell", { name: "MTF50", exact: true }) }).filter({ hasText: "Bead PSF" });
  await expect(row).toHaveCount(1);
  await row.getByRole("button", { name: "Edit MTF50 tolerance of Bead PSF" }).click();

  const dialog = page.getByRole("dialog", { name: "MTF50 tolerance" });
  await expect(dialog).toBeVisible();
  await dialog.getByLabel("Mode").selectOption("relative");
  await dialog.getByLabel("Warning level (%)").fill("7");
  await dialog.getByLabel("Action level (%)").fill("12.5");
  await dialog.getByLabel("Source").fill("Local decision, QA committee (e2e)");
  await dialog.getByRole("button", { name: "Save levels" }).click();

  await expect(dialog).toBeHidden();
  await expect(page.getByText("Levels saved")).toBeVisible();
  await expect(row.getByTestId("tolerance-warning")).toHaveText("7 %");
  await expect(row.getByTestId("tolerance-action")).toHaveText("12.5 %");
  await expect(row).toContainText("Local decision, QA committee (e2e)");
  await expect(row).not.toContainText("Default");
});

test("the tolerance dialog refuses an action level below the warning level and names the field", async ({ page }) => {
  await signIn(page, "physicist@halfmax.test");
  await page.goto("/");
  await scannerRow(page, "DR Room 1").getByRole("link", { name: "DR Room 1", exact: true }).click();
  const row = page.getByRole("table", { name: "Tolerances per test and metric" }).getByRole("row").filter({ has: page.getByRole("cell", { name: "MTF10", exact: true }) });
  await row.getByRole("button", { name: /^Edit MTF10 tolerance/ }).click();
  const dialog = page.getByRole("dialog", { name: "MTF10 tolerance" });
  await dialog.getByLabel("Mode").selectOption("relative");
  await dialog.getByLabel("Warning level (%)").fill("20");
  await dialog.getByLabel("Action level (%)").fill("10");
  await dialog.getByLabel("Source").fill("Local decision");
  await dialog.getByRole("button", { name: "Save levels" }).click();
  await expect(dialog.getByText(/action level at or beyond the warning level/)).toBeVisible();
  await expect(dialog.getByLabel("Action level (%)")).toHaveAttribute("aria-invalid", "true");
  await dialog.getByRole("button", { name: "Cancel" }).click();
  await expect(dialog).toBeHidden();
});
