// Vitest runs against the test environment (separate database, port and data dir from `npm start`).
// `npm test` passes the environment; this fills it in when vitest is run directly.
// @ts-expect-error plain ESM helper without types
import { resolveConfig } from "../../scripts/lib/config.mjs";

const cfg = resolveConfig("test") as { runtimeEnv: Record<string, string> };
for (const [key, value] of Object.entries(cfg.runtimeEnv)) {
  if (key === "NODE_ENV") continue;
  // The database is always the test one, even if the shell has a DATABASE_URL of real data.
  if (process.env[key] === undefined || key === "HALFMAX_ENV" || key === "DATABASE_URL") process.env[key] = value;
}

// Route tests insert fixtures straight into the database (bypassing the audit log that invalidates cached
// summaries), so the fleet-status cache is off here; tests/cache/ covers the cache itself.
process.env.FLEET_CACHE_MS ??= "0";
