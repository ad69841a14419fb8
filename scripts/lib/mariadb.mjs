// Local MariaDB lifecycle: Debian's mariadb-server, own data dir under .data/<env>/, bound to 127.0.0.1.
import { spawn } from "node:child_process";
import { existsSync, mkdirSync, openSync, readFileSync } from "node:fs";
import path from "node:path";
import { capture, ensureDebianPackages, log, run, sleep } from "./run.mjs";

const SERVER_BINARIES = ["mariadbd", "mariadb-install-db", "mariadb-admin", "mariadb"];

function which(bin) {
  for (const dir of ["/usr/sbin", "/usr/bin", "/usr/local/sbin", "/usr/local/bin"]) {
    const p = path.join(dir, bin);
    if (existsSync(p)) return p;
  }
  const r = capture("sh", ["-c", `command -v ${bin}`]);
  return r.status === 0 ? r.stdout.trim() : null;
}

export function ensureMariaDbInstalled() {
  if (SERVER_BINARIES.every((b) => which(b))) return;
  ensureDebianPackages(["mariadb-server", "mariadb-client"], "the local database");
}

function adminArgs(cfg) {
  return ["--no-defaults", `--socket=${cfg.socket}`, "-uroot"];
}

export function isRunning(cfg) {
  if (!existsSync(cfg.socket)) return false;
  return capture(which("mariadb-admin"), [...adminArgs(cfg), "ping"]).status === 0;
}

function runningRoot() {
  return typeof process.getuid === "function" && process.getuid() === 0;
}

/** Initialise the data dir (once), start the server detached, wait until it answers, create DB and user. */
export async function startDatabase(cfg) {
  ensureMariaDbInstalled();
  for (const dir of [cfg.dbDir, path.dirname(cfg.socket), path.dirname(cfg.logFile)]) mkdirSync(dir, { recursive: true });
  if (!existsSync(path.join(cfg.dbDir, "mysql"))) {
    log(`initialising MariaDB data dir ${path.relative(process.cwd(), cfg.dbDir)}`);
    const args = ["--no-defaults", `--datadir=${cfg.dbDir}`, "--auth-root-authentication-method=socket", "--skip-test-db", "--skip-name-resolve"];
    if (runningRoot()) args.splice(1, 0, "--user=root");
    const r = capture(which("mariadb-install-db"), args);
    if (r.status !== 0) throw new Error(`mariadb-install-db failed:\n${r.stdout}\n${r.stderr}`);
  }
  if (!isRunning(cfg)) {
    log(`starting MariaDB (${cfg.env}) on 127.0.0.1:${cfg.dbPort}`);
    const args = [
      "--no-defaults",
      `--datadir=${cfg.dbDir}`,
      `--socket=${cfg.socket}`,
      `--pid-file=${cfg.pidFile}`,
      `--port=${cfg.dbPort}`,
      "--bind-address=127.0.0.1",
      "--skip-networking=0",
      "--skip-name-resolve",
      "--character-set-server=utf8mb4",
      "--collation-server=utf8mb4_unicode_ci",
      "--default-time-zone=+00:00",
      "--innodb-buffer-pool-size=128M",
      "--max-connections=300",
      `--log-error=${cfg.logFile}`,
    ];
    if (runningRoot()) args.splice(1, 0, "--user=root");
    const out = openSync(cfg.logFile, "a");
    const child = spawn(which("mariadbd"), args, { detached: true, stdio: ["ignore", out, out] });
    child.unref();
    const deadline = Date.now() + 30_000;
    while (!isRunning(cfg)) {
      if (Date.now() > deadline) {
        const tail = existsSync(cfg.logFile) ? readFileSync(cfg.logFile, "utf8").split("\n").slice(-15).join("\n") : "";
        throw new Error(`MariaDB did not start within 30 s (port ${cfg.dbPort} busy?). Log tail:\n${tail}`);
      }
      await sleep(100);
    }
  }
  const sql = [
    `CREATE DATABASE IF NOT EXISTS \`${cfg.dbName}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;`,
    `CREATE USER IF NOT EXISTS '${cfg.dbUser}'@'127.0.0.1' IDENTIFIED BY '${cfg.dbPassword}';`,
    `ALTER USER '${cfg.dbUser}'@'127.0.0.1' IDENTIFIED BY '${cfg.dbPassword}';`,
    `GRANT ALL PRIVILEGES ON \`${cfg.dbName}\`.* TO '${cfg.dbUser}'@'127.0.0.1';`,
    // Scratch databases (benchmarks, isolated tests) use this prefix.
    `GRANT ALL PRIVILEGES ON \`${cfg.dbName}\\_%\`.* TO '${cfg.dbUser}'@'127.0.0.1';`,
    "FLUSH PRIVILEGES;",
  ].join("\n");
  runSql(cfg, sql);
}

export function runSql(cfg, sql) {
  const r = capture(which("mariadb"), [...adminArgs(cfg), "-e", sql]);
  if (r.status !== 0) throw new Error(`SQL failed: ${r.stderr.trim()}`);
  return r.stdout;
}

/** Drop and recreate the environment's database (tests start from a clean slate). */
export function recreateDatabase(cfg) {
  runSql(cfg, `DROP DATABASE IF EXISTS \`${cfg.dbName}\`; CREATE DATABASE \`${cfg.dbName}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;`);
}

export async function stopDatabase(cfg) {
  if (!isRunning(cfg)) return;
  log(`stopping MariaDB (${cfg.env})`);
  run(which("mariadb-admin"), [...adminArgs(cfg), "shutdown"]);
  const deadline = Date.now() + 20_000;
  while (existsSync(cfg.pidFile) && Date.now() < deadline) await sleep(100);
}
