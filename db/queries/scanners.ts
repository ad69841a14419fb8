import { and, asc, eq, inArray, sql } from "drizzle-orm";
import { db, type Tx } from "@/db/client";
import { scannerEngineers, scanners, scans, sites, users, type Scanner } from "@/db/schema";
import { versionedCache } from "@/lib/cache/change-version";
import { AppError, notFound } from "@/lib/errors";
import type { CreateScannerInput, UpdateScannerInput } from "@/lib/validations/scanner";
import { insertAuditEvent } from "./audit";
import { isDuplicateKey } from "./mysql-errors";
import type { SessionUser } from "./users";

export interface ScannerListItem extends Scanner {
  siteName: string;
  responsiblePhysicistName: string | null;
  engineers: { id: number; name: string; email: string }[];
}

const listCache = versionedCache<ScannerListItem[]>(Number(process.env.FLEET_CACHE_MS ?? 5_000));

/**
 * Scanners visible to a user: everyone sees the fleet except service engineers, who see the scanners assigned to them.
 * Cached for a few seconds between recorded changes (see lib/cache/change-version.ts).
 */
export function listScannersForUser(user: SessionUser, opts: { includeInactive?: boolean } = {}): Promise<ScannerListItem[]> {
  const scope = user.role === "engineer" ? `engineer:${user.id}` : "all";
  return listCache(`${scope}:${opts.includeInactive ? 1 : 0}`, () => queryScannersForUser(user, opts));
}

async function queryScannersForUser(user: SessionUser, opts: { includeInactive?: boolean }): Promise<ScannerListItem[]> {
  const conditions = [];
  if (!opts.includeInactive) conditions.push(eq(scanners.active, true));
  if (user.role === "engineer") {
    conditions.push(
      sql`${scanners.id} in (select ${scannerEngineers.scannerId} from ${scannerEngineers} where ${scannerEngineers.userId} = ${user.id})`,
    );
  }
  const rows = await db()
    .select({ scanner: scanners, siteName: sites.name, physicistName: users.name })
    .from(scanners)
    .innerJoin(sites, eq(scanners.siteId, sites.id))
    .leftJoin(users, eq(scanners.responsiblePhysicistId, users.id))
    .where(conditions.length ? and(...conditions) : undefined)
    .orderBy(asc(sites.name), asc(scanners.name));
  const engineers = await engineersByScanner(rows.map((r) => r.scanner.id));
  return rows.map((r) => ({
    ...r.scanner,
    siteName: r.siteName,
    responsiblePhysicistName: r.physicistName,
    engineers: engineers.get(r.scanner.id) ?? [],
  }));
}

async function engineersByScanner(ids: number[]) {
  const map = new Map<number, { id: number; name: string; email: string }[]>();
  if (ids.length === 0) return map;
  const rows = await db()
    .select({ scannerId: scannerEngineers.scannerId, id: users.id, name: users.name, email: users.email })
    .from(scannerEngineers)
    .innerJoin(users, eq(scannerEngineers.userId, users.id))
    .where(inArray(scannerEngineers.scannerId, ids))
    .orderBy(asc(users.name));
  for (const r of rows) {
    const list = map.get(r.scannerId) ?? [];
    list.push({ id: r.id, name: r.name, email: r.email });
    map.set(r.scannerId, list);
  }
  return map;
}

/** One scanner if the user may see it (engineers: only assigned ones); 404 otherwise. */
export async function getScannerForUser(id: number, user: SessionUser): Promise<ScannerListItem> {
  const rows = await db()
    .select({ scanner: scanners, siteName: sites.name, physicistName: users.name })
    .from(scanners)
    .innerJoin(sites, eq(scanners.siteId, sites.id))
    .leftJoin(users, eq(scanners.responsiblePhysicistId, users.id))
    .where(eq(scanners.id, id))
    .limit(1);
  const row = rows[0];
  if (!row) throw notFound("Scanner");
  const engineers = (await engineersByScanner([id])).get(id) ?? [];
  if (user.role === "engineer" && !engineers.some((e) => e.id === user.id)) throw notFound("Scanner");
  return { ...row.scanner, siteName: row.siteName, responsiblePhysicistName: row.physicistName, engineers };
}

async function checkPeople(tx: Tx, physicistId: number | null | undefined, engineerIds: number[] | undefined) {
  if (physicistId) {
    const [p] = await tx.select({ role: users.role, active: users.active }).from(users).where(eq(users.id, physicistId));
    if (!p || !p.active || p.role !== "physicist") {
      throw new AppError({ code: "validation_failed", message: "The responsible physicist must be an active user with the physicist role" });
    }
  }
  if (engineerIds && engineerIds.length) {
    const found = await tx.select({ id: users.id, role: users.role }).from(users).where(inArray(users.id, engineerIds));
    const ok = new Set(found.filter((u) => u.role === "engineer").map((u) => u.id));
    const bad = engineerIds.filter((id) => !ok.has(id));
    if (bad.length) {
      throw new AppError({ code: "validation_failed", message: `Assigned engineers must have the engineer role (user ids ${bad.join(", ")})` });
    }
  }
}

async function checkSite(tx: Tx, siteId: number | undefined) {
  if (siteId === undefined) return;
  const [s] = await tx.select({ id: sites.id }).from(sites).where(eq(sites.id, siteId));
  if (!s) throw new AppError({ code: "validation_failed", message: `Site ${siteId} does not exist` });
}

const duplicateName = (name: string | undefined) =>
  new AppError({ code: "conflict", message: `A scanner named "${name ?? ""}" already exists at this site` });

export async function createScanner(input: CreateScannerInput, actorUserId: number): Promise<{ id: number }> {
  try {
    return await db().transaction(async (tx) => {
      await checkSite(tx, input.siteId);
      await checkPeople(tx, input.responsiblePhysicistId, input.engineerIds);
      const { engineerIds, ...fields } = input;
      const [row] = await tx.insert(scanners).values({ ...fields, responsiblePhysicistId: fields.responsiblePhysicistId ?? null }).$returningId();
      const id = row!.id;
      if (engineerIds.length) await tx.insert(scannerEngineers).values(engineerIds.map((userId) => ({ scannerId: id, userId })));
      await insertAuditEvent(tx, { actorUserId, action: "scanner.create", entityType: "scanner", entityId: id, scannerId: id, details: input });
      return { id };
    });
  } catch (err) {
    if (isDuplicateKey(err)) throw duplicateName(input.name);
    throw err;
  }
}

export async function updateScanner(id: number, input: UpdateScannerInput, actorUserId: number): Promise<void> {
  try {
    await db().transaction(async (tx) => {
      const [existing] = await tx.select({ id: scanners.id }).from(scanners).where(eq(scanners.id, id));
      if (!existing) throw notFound("Scanner");
      await checkSite(tx, input.siteId);
      await checkPeople(tx, input.responsiblePhysicistId, input.engineerIds);
      const { engineerIds, ...fields } = input;
      if (Object.keys(fields).length) await tx.update(scanners).set(fields).where(eq(scanners.id, id));
      if (engineerIds) {
        await tx.delete(scannerEngineers).where(eq(scannerEngineers.scannerId, id));
        if (engineerIds.length) await tx.insert(scannerEngineers).values(engineerIds.map((userId) => ({ scannerId: id, userId })));
      }
      await insertAuditEvent(tx, { actorUserId, action: "scanner.update", entityType: "scanner", entityId: id, scannerId: id, details: input });
    });
  } catch (err) {
    if (isDuplicateKey(err)) throw duplicateName(input.name);
    throw err;
  }
}

/**
 * Remove a scanner. One with stored scans is retired (kept, marked inactive) so its QA history survives;
 * one without scans is deleted. Returns which happened.
 */
export async function deleteScanner(id: number, actorUserId: number): Promise<{ outcome: "deleted" | "retired" }> {
  return db().transaction(async (tx) => {
    const [existing] = await tx.select({ id: scanners.id }).from(scanners).where(eq(scanners.id, id));
    if (!existing) throw notFound("Scanner");
    const [count] = await tx.select({ n: sql<number>`count(*)` }).from(scans).where(eq(scans.scannerId, id));
    const outcome = Number(count?.n ?? 0) > 0 ? "retired" : "deleted";
    if (outcome === "retired") await tx.update(scanners).set({ active: false }).where(eq(scanners.id, id));
    else {
      await insertAuditEvent(tx, { actorUserId, action: "scanner.delete", entityType: "scanner", entityId: id, scannerId: null });
      await tx.delete(scanners).where(eq(scanners.id, id));
      return { outcome };
    }
    await insertAuditEvent(tx, { actorUserId, action: "scanner.retire", entityType: "scanner", entityId: id, scannerId: id });
    return { outcome };
  });
}
