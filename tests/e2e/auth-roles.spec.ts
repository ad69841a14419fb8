import { expect, test } from "@playwright/test";
import { signIn } from "./helpers";

const ROLES = [
  {
    email: "admin@halfmax.test",
    name: "Rowan Pell",
    nav: ["Fleet", "Scanners", "Alerts", "Add scans", "Users", "Sites", "Scanner register", "Outbox", "Account & tokens"],
    hidden: [],
    allowed: ["/", "/scanners", "/admin/users", "/admin/sites", "/admin/scanners", "/account"],
    forbidden: [],
  },
  {
    email: "physicist@halfmax.test",
    name: "Dr Ilse Varga",
    nav: ["Fleet", "Scanners", "Add scans", "Alerts"],
    hidden: ["Users", "Scanner register", "Outbox"],
    allowed: ["/", "/scanners", "/account"],
    forbidden: ["/admin/users", "/admin/scanners"],
  },
  {
    email: "lead@halfmax.test",
    name: "Marta Quennell",
    nav: ["Fleet", "Scanners", "Alerts"],
    hidden: ["Add scans", "Users", "Sites", "Scanner register"],
    allowed: ["/", "/scanners"],
    forbidden: ["/admin/users", "/admin/sites"],
  },
  {
    email: "engineer@halfmax.test",
    name: "Tomasz Brierley",
    nav: ["Fleet", "Scanners", "Alerts"],
    hidden: ["Add scans", "Users", "Sites", "Scanner register", "Outbox"],
    allowed: ["/", "/scanners", "/account"],
    forbidden: ["/admin/users", "/admin/scanners"],
  },
];

test("an anonymous visitor is sent to the sign-in page, which lists the demo accounts", async ({ page }) => {
  await page.goto("/scanners");
  await expect(page).toHaveURL(/\/login/);
  await expect(page.getByTestId("demo-accounts")).toContainText("physicist@halfmax.test");
});

test("a wrong password is refused with a readable message", async ({ page }) => {
  await page.goto("/login");
  await page.locator("form[data-hydrated='true']").waitFor();
  await page.getByLabel("E-mail").fill("lead@halfmax.test");
  await page.getByLabel("Password").fill("not-the-password");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByText("E-mail or password is not right")).toBeVisible();
});

for (const role of ROLES) {
  test(`${role.email} sees a role-appropriate navigation, reaches allowed pages and gets 403 elsewhere`, async ({ page }) => {
    await signIn(page, role.email);
    await expect(page.getByTestId("current-user")).toHaveText(role.name);
    const nav = page.getByRole("navigation", { name: "Main" });
    for (const label of role.nav) await expect(nav.getByRole("link", { name: label, exact: true })).toBeVisible();
    for (const label of role.hidden) await expect(nav.getByRole("link", { name: label, exact: true })).toHaveCount(0);
    for (const path of role.allowed) {
      const res = await page.goto(path);
      expect(res?.status(), path).toBe(200);
      await expect(page.getByTestId("forbidden")).toHaveCount(0);
    }
    for (const path of role.forbidden) {
      const res = await page.goto(path);
      expect(res?.status(), path).toBe(403);
      await expect(page.getByTestId("forbidden")).toBeVisible();
    }
  });
}

test("the API answers 401 JSON without credentials and 403 JSON for a forbidden role", async ({ page, request }) => {
  const anon = await request.get("/api/scanners");
  expect(anon.status()).toBe(401);
  expect((await anon.json()).error).toMatch(/Sign in|token/);
  await signIn(page, "lead@halfmax.test");
  const res = await page.request.post("/api/scanners", { data: { name: "x" } });
  expect(res.status()).toBe(403);
  expect((await res.json()).code).toBe("forbidden");
});

test("/api/health answers 200 with the version and database status", async ({ request }) => {
  const res = await request.get("/api/health");
  expect(res.status()).toBe(200);
  const body = await res.json();
  expect(body.database.status).toBe("up");
  expect(body.version).toMatch(/^\d+\.\d+\.\d+/);
});
