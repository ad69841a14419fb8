// `npm test`: the same set-up as `npm start` against a separate test database, then every suite:
// type-check, vitest (unit + integration against the real test MariaDB and SMTP), next build, Playwright (Debian chromium).
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
    if (wants("unit")) step("unit and integration tests (vitest)", () => run(bin("vitest"), ["run"], { cwd: ROOT, env }));
    if (wants("e2e")) {
      await freshDatabase(cfg, env);
      children.push(startChild(process.execPath, [TSX_CLI, "scripts/smtp-sink.ts"], { cwd: ROOT, env: { ...env, SMTP_SINK_PORT: String(cfg.smtpPort) } }));
      step("build (next build)", () => run(bin("next"), ["build"], { cwd: ROOT, env }));
      step("browser tests (playwright, Debian chromium)", () => run(bin("playwright"), ["test"], { cwd: ROOT, env }));
    }
  } finally {
    for (const c of children) c.kill("SIGTERM");
    if (process.env.HALFMAX_KEEP_DB !== "1") await stopDatabase(cfg).catch(() => {});
    log("summary:");
    for (const [name, outcome] of results) log(`  ${outcome.padEnd(7)} ${name}`);
  }
}

main().catch((err) => {
  console.error(`[halfmax] ${err.message}`);
  process.exit(err.exitCode ?? 1);
});
