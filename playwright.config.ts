import { defineConfig, devices } from "@playwright/test";

const port = Number(process.env.HALFMAX_TEST_PORT ?? process.env.PORT ?? 3100);
const baseURL = `http://127.0.0.1:${port}`;

/**
 * Browser tests against the built app (`next start`) with Debian's chromium — never a downloaded browser.
 * `npm test` provides the environment (test database, secrets, SMTP sink) and builds first.
 */
export default defineConfig({
  testDir: "tests/e2e",
  fullyParallel: false,
  workers: 1,
  retries: process.env.CI ? 1 : 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  // The JSON report (file named by PLAYWRIGHT_JSON_OUTPUT_NAME) feeds the totals line of `npm test`.
  reporter: process.env.PLAYWRIGHT_JSON_OUTPUT_NAME ? [["list"], ["json"]] : [["list"]],
  use: {
    baseURL,
    trace: "retain-on-failure",
    screenshot: "only-on-failure",
    launchOptions: {
      executablePath: "/usr/bin/chromium",
      args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
    },
  },
  projects: [{ name: "chromium", use: { ...devices["Desktop Chrome"], channel: undefined } }],
  webServer: {
    command: `node node_modules/next/dist/bin/next start -p ${port} -H 127.0.0.1`,
    url: `${baseURL}/api/health`,
    reuseExistingServer: false,
    timeout: 60_000,
    stdout: "pipe",
    stderr: "pipe",
  },
});
