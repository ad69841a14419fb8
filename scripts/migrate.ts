// Applies the committed SQL migrations in drizzle/ to DATABASE_URL (runtime migrator: it reports the failing SQL).
import { loadRuntimeEnv } from "./lib/runtime-env";
import { migrate } from "drizzle-orm/mysql2/migrator";
import { closeDb, db } from "@/db/client";

async function main(): Promise<void> {
  await loadRuntimeEnv();
  await migrate(db(), { migrationsFolder: "drizzle" });
  await closeDb();
}

main().catch(async (err) => {
  console.error(`[halfmax] migration failed: ${err instanceof Error ? err.message : String(err)}`);
  await closeDb().catch(() => {});
  process.exit(1);
});
