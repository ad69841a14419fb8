// `npm run dev`: the same set-up as `npm start` (dependencies, MariaDB, migrations, demo data, SMTP sink), then
// `next dev` with hot reload instead of a production build.
import { resolveConfig, ROOT } from "./lib/config.mjs";
import { startDatabase } from "./lib/mariadb.mjs";
import { log, startChild } from "./lib/run.mjs";
import { bin, ensureNodeModules, tsx, TSX_CLI } from "./lib/setup.mjs";

async function main() {
  ensureNodeModules();
  const cfg = resolveConfig("dev");
  if (cfg.managedDb) await startDatabase(cfg);
  const env = { ...cfg.runtimeEnv, NODE_ENV: "development" };
  tsx("scripts/migrate.ts", [], env);
  if (process.env.HALFMAX_SEED !== "0") tsx("scripts/seed.ts", [], env);
  await (await import("./build-worker.mjs")).buildWorker();
  if (cfg.managedSmtp) startChild(process.execPath, [TSX_CLI, "scripts/smtp-sink.ts"], { cwd: ROOT, env: { ...env, SMTP_SINK_PORT: String(cfg.smtpPort) } });
  log(`development server on http://localhost:${cfg.appPort} (MariaDB keeps running; stop it with npm run db:down)`);
  startChild(bin("next"), ["dev", "-p", String(cfg.appPort)], { cwd: ROOT, env });
}

main().catch((err) => {
  console.error(`[halfmax] ${err.message}`);
  process.exit(err.exitCode ?? 1);
});
