// Shared set-up steps of `npm start` and `npm test`.
import { existsSync, statSync } from "node:fs";
import path from "node:path";
import { ROOT } from "./config.mjs";
import { log, run } from "./run.mjs";

/** `npm ci` when node_modules is missing or older than package-lock.json. */
export function ensureNodeModules() {
  const marker = path.join(ROOT, "node_modules", ".package-lock.json");
  const lock = path.join(ROOT, "package-lock.json");
  if (existsSync(marker) && statSync(marker).mtimeMs >= statSync(lock).mtimeMs) return;
  log("installing npm dependencies (npm ci)");
  run("npm", ["ci", "--no-audit", "--no-fund"], { cwd: ROOT });
}

export const TSX_CLI = path.join(ROOT, "node_modules", "tsx", "dist", "cli.mjs");

/** Run a TypeScript script to completion with tsx. */
export function tsx(script, args, env) {
  run(process.execPath, [TSX_CLI, script, ...args], { cwd: ROOT, env });
}

export function bin(name) {
  return path.join(ROOT, "node_modules", ".bin", name);
}
