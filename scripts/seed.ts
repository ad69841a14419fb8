// Seeds the fictional demo group once (users, sites, scanners, tests, then a year of QA history). Safe to re-run.
import { closeDb, db } from "@/db/client";
import { seedDemoFleet } from "@/db/seed/seed-demo";
import { env } from "@/lib/env";

async function main(): Promise<void> {
  const summary = await seedDemoFleet(db(), env().DEMO_PASSWORD);
  console.log(summary.created ? "[halfmax] demo data loaded" : "[halfmax] demo data already present: left as it is");
  await closeDb();
}

main().catch(async (err) => {
  console.error(`[halfmax] seeding failed: ${err instanceof Error ? err.stack : String(err)}`);
  await closeDb().catch(() => {});
  process.exit(1);
});
