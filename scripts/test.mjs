// `npm test`: the same set-up as `npm start` against a separate test database, then every suite:
// type-check, vitest (unit + integration against the real test MariaDB and SMTP), next build, Playwright (Debian chromium).
import { existsSync, readFileSync, rmSync } from "node:fs";
import path from "node:path";
import { resolveConfig, ROOT } from "./lib/config.mjs";
import { recreateDatabase, startDatabase, stopDatabase } from "./lib/mariadb.mjs";
import { ensureDebianPackages, log, run, startChild } from "./lib/run.mjs";
import { bin, ensureNodeModules, tsx, TSX_CLI } from "./lib/setup.mjs";

const only = process.argv.slice(2); // e.g. `npm test -- unit` or `npm test -- e2e`
const wants = (suite) => only.length === 0 || only.includes(suite);

async function freshDatabase(cfg, env) {
  recreateDatabase(cfg);
  tsx("scripts/migrate.ts", [], env);
  tsx("scripts/seed.ts", [], env);
}

/** Totals of the vitest and Playwright JSON reports written by this run (null when neither exists). */
function countTests(dir) {
  const read = (name) => {
    const file = path.join(dir, name);
    if (!existsSync(file)) return null;
    try {
      const data = JSON.parse(readFileSync(file, "utf8"));
      rmSync(file);
      return data;
    } catch {
      return null;
    }
  };
  const v = read("vitest-report.json");
  const p = read("playwright-report.json");
  if (!v && !p) return null;
  return {
    passed: (v?.numPassedTests ?? 0) + (p?.stats?.expected ?? 0) + (p?.stats?.flaky ?? 0),
    failed: (v?.numFailedTests ?? 0) + (p?.stats?.unexpected ?? 0),
    skipped: (v?.numPendingTests ?? 0) + (v?.numTodoTests ?? 0) + (p?.stats?.skipped ?? 0),
  };
}

async function main() {
  ensureNodeModules();
  ensureDebianPackages(["chromium", "python3-pydicom", "python3-numpy", "python3-pil", "poppler-utils"], "the test suites (browser tests; reference DICOM files; PDF text via pdftotext)");
  const cfg = resolveConfig("test");
  const env = { ...cfg.runtimeEnv, CI: process.env.CI ?? "" };
  await startDatabase(cfg);
  const children = [];
  const results = [];
  const step = (name, fn) => {
    log(`── ${name}`);
    try {
      fn();
      results.push([name, "passed"]);
    } catch (err) {
      results.push([name, "FAILED"]);
      throw err;
    }
  };
  try {
    await freshDatabase(cfg, env);
    await (await import("./build-worker.mjs")).buildWorker(); // dynamic: esbuild exists only after npm ci
    if (wants("types")) step("type-check (tsc)", () => run(bin("tsc"), ["--noEmit", "-p", "."], { cwd: ROOT, env }));
    if (wants("unit")) {
      step("unit and integration tests (vitest)", () =>
        run(bin("vitest"), ["run", "--reporter=default", "--reporter=json", `--outputFile.json=${path.join(cfg.dataDir, "vitest-report.json")}`], { cwd: ROOT, env }),
      );
    }
    if (wants("e2e")) {
      await freshDatabase(cfg, env);
      children.push(startChild(process.execPath, [TSX_CLI, "scripts/smtp-sink.ts"], { cwd: ROOT, env: { ...env, SMTP_SINK_PORT: String(cfg.smtpPort) } }));
      step("build (next build)", () => run(bin("next"), ["build"], { cwd: ROOT, env }));
      step("browser tests (playwright, Debian chromium)", () =>
        run(bin("playwright"), ["test"], { cwd: ROOT, env: { ...env, PLAYWRIGHT_JSON_OUTPUT_NAME: path.join(cfg.dataDir, "playwright-report.json") } }),
      );
    }
  } finally {
    for (const c of children) c.kill("SIGTERM");
    if (process.env.HALFMAX_KEEP_DB !== "1") await stopDatabase(cfg).catch(() => {});
    log("summary:");
    for (const [name, outcome] of results) log(`  ${outcome.padEnd(7)} ${name}`);
    const counts = countTests(cfg.dataDir);
    if (counts) console.log(`tests: ${counts.passed} passed, ${counts.failed} failed${counts.skipped ? `, ${counts.skipped} skipped` : ""}`);
  }
}

main().catch((err) => {
  console.error(`[halfmax] ${err.message}`);
  process.exit(err.exitCode ?? 1);
});
