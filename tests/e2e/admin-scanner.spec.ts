import { expect, test } from "@playwright/test";
import { signIn } from "./helpers";

test("an admin adds a scanner in the register and sees it in the table", async ({ page }) => {
  const name = `CT Test ${Date.now().toString(36)}`;
  await signIn(page, "admin@halfmax.test");
  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Scanner register", exact: true }).click();
  await expect(page).toHaveURL(/\/admin\/scanners/);
  await page.getByRole("button", { name: "Add scanner" }).first().click();
  const dialog = page.getByRole("dialog");
  await dialog.getByLabel("Name").fill(name);
  await dialog.getByLabel("Site").selectOption({ label: "Kestrel Bay Clinic" });
  await dialog.getByLabel("Modality").selectOption("CT");
  await dialog.getByLabel("Manufacturer").fill("Corvane Medical");
  await dialog.getByLabel("Serial number").fill("E2E-0001");
  await dialog.getByRole("button", { name: "Save scanner" }).click();
  await expect(dialog).toBeHidden();
  await expect(page.getByRole("link", { name, exact: true })).toBeVisible();

  // The new scanner is in the API's list too (same session).
  const res = await page.request.get("/api/scanners");
  expect(res.status()).toBe(200);
  const body = await res.json();
  expect(body.scanners.map((s: { name: string }) => s.name)).toContain(name);

  // A form with a missing name is refused with a readable message and nothing is saved.
  await page.getByRole("button", { name: "Add scanner" }).first().click();
  await page.getByRole("dialog").getByRole("button", { name: "Save scanner" }).click();
  await expect(page.getByRole("dialog").getByText("Give the scanner a name")).toBeVisible();
});
