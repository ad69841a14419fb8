// Small process helpers for the lifecycle scripts (no dependencies).
import { spawn, spawnSync } from "node:child_process";

export function log(message) {
  process.stdout.write(`[halfmax] ${message}\n`);
}

/** Run a command, inheriting stdio; throws on a non-zero exit. */
export function run(cmd, args, options = {}) {
  const res = spawnSync(cmd, args, { stdio: "inherit", ...options, env: { ...process.env, ...(options.env ?? {}) } });
  if (res.error) throw res.error;
  if (res.status !== 0) {
    const err = new Error(`${cmd} ${args.join(" ")} exited with ${res.status}`);
    err.exitCode = res.status ?? 1;
    throw err;
  }
}

/** Run a command and capture stdout; returns { status, stdout, stderr }. */
export function capture(cmd, args, options = {}) {
  const res = spawnSync(cmd, args, { encoding: "utf8", ...options, env: { ...process.env, ...(options.env ?? {}) } });
  return { status: res.status ?? (res.error ? 127 : 1), stdout: res.stdout ?? "", stderr: res.stderr ?? "", error: res.error };
}

export function commandExists(cmd) {
  return capture("sh", ["-c", `command -v ${cmd}`]).status === 0;
}

export function sleep(ms) {
  return new Promise((resolve) => setTimeout(resolve, ms));
}

/** Start a long-running child that keeps the parent's stdio. */
export function startChild(cmd, args, options = {}) {
  return spawn(cmd, args, { stdio: "inherit", ...options, env: { ...process.env, ...(options.env ?? {}) } });
}

/**
 * Install Debian packages when missing. As root this runs apt-get; otherwise it prints the exact command and fails.
 */
export function ensureDebianPackages(packages, reason) {
  const missing = packages.filter((p) => capture("dpkg-query", ["-W", "-f=${Status}", p]).stdout.trim() !== "install ok installed");
  if (missing.length === 0) return;
  const cmd = `apt-get update && apt-get install -y ${missing.join(" ")}`;
  if (typeof process.getuid === "function" && process.getuid() !== 0) {
    throw new Error(`${reason} needs Debian packages ${missing.join(", ")}. Run as root: sudo sh -c '${cmd}'`);
  }
  log(`installing ${missing.join(", ")} (${reason})`);
  const env = { DEBIAN_FRONTEND: "noninteractive" };
  run("apt-get", ["update", "-qq"], { env });
  run("apt-get", ["install", "-y", "-qq", "--no-install-recommends", ...missing], { env });
}
