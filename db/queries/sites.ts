import { asc, eq, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { scanners, sites } from "@/db/schema";
import { AppError, notFound } from "@/lib/errors";
import type { CreateSiteInput, UpdateSiteInput } from "@/lib/validations/site";
import { insertAuditEvent } from "./audit";
import { isDuplicateKey } from "./mysql-errors";

export async function listSites() {
  return db()
    .select({ id: sites.id, name: sites.name, city: sites.city, createdAt: sites.createdAt, scannerCount: sql<number>`count(${scanners.id})` })
    .from(sites)
    .leftJoin(scanners, eq(scanners.siteId, sites.id))
    .groupBy(sites.id)
    .orderBy(asc(sites.name))
    .then((rows) => rows.map((r) => ({ ...r, scannerCount: Number(r.scannerCount) })));
}

export async function createSite(input: CreateSiteInput, actorUserId: number) {
  try {
    return await db().transaction(async (tx) => {
      const [row] = await tx.insert(sites).values(input).$returningId();
      await insertAuditEvent(tx, { actorUserId, action: "site.create", entityType: "site", entityId: row!.id, details: input });
      return { id: row!.id, ...input };
    });
  } catch (err) {
    if (isDuplicateKey(err)) throw new AppError({ code: "conflict", message: `A site named "${input.name}" already exists` });
    throw err;
  }
}

export async function updateSite(id: number, input: UpdateSiteInput, actorUserId: number) {
  try {
    return await db().transaction(async (tx) => {
      const res = await tx.update(sites).set(input).where(eq(sites.id, id));
      if (res[0].affectedRows === 0) throw notFound("Site");
      await insertAuditEvent(tx, { actorUserId, action: "site.update", entityType: "site", entityId: id, details: input });
    });
  } catch (err) {
    if (isDuplicateKey(err)) throw new AppError({ code: "conflict", message: `A site named "${input.name}" already exists` });
    throw err;
  }
}

export async function deleteSite(id: number, actorUserId: number) {
  await db().transaction(async (tx) => {
    const [count] = await tx.select({ n: sql<number>`count(*)` }).from(scanners).where(eq(scanners.siteId, id));
    if (Number(count?.n ?? 0) > 0) {
      throw new AppError({ code: "conflict", message: "This site still has scanners: move or remove them first" });
    }
    const res = await tx.delete(sites).where(eq(sites.id, id));
    if (res[0].affectedRows === 0) throw notFound("Site");
    await insertAuditEvent(tx, { actorUserId, action: "site.delete", entityType: "site", entityId: id });
  });
}
