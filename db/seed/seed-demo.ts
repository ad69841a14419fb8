import { eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import { qaTests, scannerEngineers, scanners, sites, users } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import { DEMO_SCANNERS, DEMO_SITES, DEMO_USERS } from "./demo-fleet";

export interface SeedSummary {
  created: boolean;
  scannerIds: Record<string, number>;
  testIds: Record<string, number>;
  userIds: Record<string, number>;
}

/**
 * Insert the demo group once (in one transaction). Returns created=false when the demo admin already exists, so
 * running it again never duplicates or overwrites anything a user changed.
 */
export async function seedDemoFleet(database: Db, password: string): Promise<SeedSummary> {
  const [existing] = await database.select({ id: users.id }).from(users).where(eq(users.email, DEMO_USERS[0]!.email));
  if (existing) return { created: false, scannerIds: {}, testIds: {}, userIds: {} };
  const passwordHash = await hashPassword(password);
  return database.transaction(async (tx) => {
    const userIds: Record<string, number> = {};
    for (const u of DEMO_USERS) {
      const [row] = await tx.insert(users).values({ ...u, passwordHash }).$returningId();
      userIds[u.role] = row!.id;
    }
    const siteIds: Record<string, number> = {};
    for (const s of DEMO_SITES) {
      const [row] = await tx.insert(sites).values({ name: s.name, city: s.city }).$returningId();
      siteIds[s.key] = row!.id;
    }
    const scannerIds: Record<string, number> = {};
    const testIds: Record<string, number> = {};
    for (const s of DEMO_SCANNERS) {
      const [row] = await tx
        .insert(scanners)
        .values({
          siteId: siteIds[s.site]!,
          name: s.name,
          modality: s.modality,
          manufacturer: s.manufacturer,
          model: s.model,
          serialNumber: s.serialNumber,
          location: s.location,
          responsiblePhysicistId: userIds.physicist!,
        })
        .$returningId();
      scannerIds[s.key] = row!.id;
      await tx.insert(scannerEngineers).values({ scannerId: row!.id, userId: userIds.engineer! });
      const [test] = await tx.insert(qaTests).values({ scannerId: row!.id, method: s.method, ...s.test }).$returningId();
      testIds[s.key] = test!.id;
    }
    return { created: true, scannerIds, testIds, userIds };
  });
}
