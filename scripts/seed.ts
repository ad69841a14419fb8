// Seeds the fictional demo group once (users, sites, scanners, tests, then a year of QA history). Safe to re-run.
import { loadRuntimeEnv } from "./lib/runtime-env";
import { closeDb, db } from "@/db/client";
import { seedDemoHistory } from "@/db/seed/seed-history";
import { seedDemoFleet } from "@/db/seed/seed-demo";
import { env } from "@/lib/env";

async function main(): Promise<void> {
  await loadRuntimeEnv();
  const summary = await seedDemoFleet(db(), env().DEMO_PASSWORD);
  if (!summary.created) {
    console.log("[halfmax] demo data already present: left as it is");
  } else {
    const weeks = Number(process.env.HALFMAX_DEMO_WEEKS ?? 52);
    console.log(`[halfmax] demo fleet created; analysing ${weeks} weeks of generated phantom scans per scanner…`);
    await seedDemoHistory(db(), summary, { weeks, end: new Date(), appUrl: env().APP_URL, log: (m) => console.log(`[halfmax]   ${m}`) });
    console.log("[halfmax] demo data loaded");
  }
  await closeDb();
}

main().catch(async (err) => {
  console.error(`[halfmax] seeding failed: ${err instanceof Error ? err.stack : String(err)}`);
  await closeDb().catch(() => {});
  process.exit(1);
});
