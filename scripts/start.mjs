// `npm start`: install dependencies, bring up MariaDB and the local SMTP sink, migrate, seed demo data once, build, serve.
import { resolveConfig, ROOT } from "./lib/config.mjs";
import { startDatabase, stopDatabase } from "./lib/mariadb.mjs";
import { log, run, startChild } from "./lib/run.mjs";
import { bin, ensureNodeModules, tsx, TSX_CLI } from "./lib/setup.mjs";

async function main() {
  ensureNodeModules();
  const cfg = resolveConfig("dev");
  if (cfg.managedDb) await startDatabase(cfg);
  const env = cfg.runtimeEnv;
  log("applying database migrations");
  tsx("scripts/migrate.ts", [], env);
  if (process.env.HALFMAX_SEED !== "0") tsx("scripts/seed.ts", [], env);
  const children = [];
  if (cfg.managedSmtp) {
    log(`local SMTP sink on 127.0.0.1:${cfg.smtpPort} (messages kept in ${env.SMTP_SINK_DIR})`);
    children.push(startChild(process.execPath, [TSX_CLI, "scripts/smtp-sink.ts"], { cwd: ROOT, env: { ...env, SMTP_SINK_PORT: String(cfg.smtpPort) } }));
  }
  if (process.env.HALFMAX_SKIP_BUILD !== "1") {
    log("building the analysis worker and the app (next build)");
    await (await import("./build-worker.mjs")).buildWorker(); // dynamic: esbuild exists only after npm ci
    run(bin("next"), ["build"], { cwd: ROOT, env });
  }
  log(`serving on http://localhost:${cfg.appPort}`);
  const server = startChild(bin("next"), ["start", "-p", String(cfg.appPort), "-H", process.env.HOST ?? "0.0.0.0"], { cwd: ROOT, env });
  children.push(server);
  let stopping = false;
  const shutdown = async (code) => {
    if (stopping) return;
    stopping = true;
    for (const c of children) c.kill("SIGTERM");
    if (cfg.managedDb && process.env.HALFMAX_KEEP_DB !== "1") await stopDatabase(cfg).catch(() => {});
    process.exit(code);
  };
  process.on("SIGINT", () => shutdown(0));
  process.on("SIGTERM", () => shutdown(0));
  server.on("exit", (code) => shutdown(code ?? 0));
}

main().catch((err) => {
  console.error(`[halfmax] ${err.message}`);
  process.exit(err.exitCode ?? 1);
});
