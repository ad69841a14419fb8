// `npm run db:up|db:down [-- test]`: start or stop the local MariaDB of the dev (default) or test environment.
import { resolveConfig } from "./lib/config.mjs";
import { isRunning, startDatabase, stopDatabase } from "./lib/mariadb.mjs";

const [command = "status", env = "dev"] = process.argv.slice(2);
const cfg = resolveConfig(env);
try {
  if (command === "up") await startDatabase(cfg);
  else if (command === "down") await stopDatabase(cfg);
  else console.log(isRunning(cfg) ? `MariaDB (${env}) is running on 127.0.0.1:${cfg.dbPort}` : `MariaDB (${env}) is stopped`);
} catch (err) {
  console.error(`[halfmax] ${err.message}`);
  process.exit(1);
}
