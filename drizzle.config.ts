import { defineConfig } from "drizzle-kit";

// Only `generate` is used (migrations are applied by scripts/migrate.ts at start-up), so no credentials are needed here.
export default defineConfig({
  dialect: "mysql",
  schema: "./db/schema/index.ts",
  out: "./drizzle",
});
