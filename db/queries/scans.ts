import { and, count, desc, eq, gte, lte, sql, type SQL } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { analyses, qaTests, scannerEngineers, scanners, scans, sites, users, type Scan } from "@/db/schema";
import { AppError, notFound } from "@/lib/errors";
import type { ListScansQuery } from "@/lib/validations/scan";
import { insertAuditEvent } from "./audit";
import type { SessionUser } from "./users";

export async function findScanBySha(tx: DbOrTx, scannerId: number, sha: string): Promise<Pick<Scan, "id"> | undefined> {
  const [row] = await tx.select({ id: scans.id }).from(scans).where(and(eq(scans.scannerId, scannerId), eq(scans.fileSha256, sha))).limit(1);
  return row;
}

/** Is `storageKey` still referenced by any scan (content-addressed files are shared between scanners)? */
export async function isStorageKeyReferenced(tx: DbOrTx, key: string): Promise<boolean> {
  const [row] = await tx.select({ n: count() }).from(scans).where(eq(scans.storageKey, key));
  return Number(row?.n ?? 0) > 0;
}

function visibleTo(user: SessionUser): SQL | undefined {
  if (user.role !== "engineer") return undefined;
  return sql`${scans.scannerId} in (select ${scannerEngineers.scannerId} from ${scannerEngineers} where ${scannerEngineers.userId} = ${user.id})`;
}

const listColumns = {
  id: scans.id,
  scannerId: scans.scannerId,
  scannerName: scanners.name,
  siteName: sites.name,
  testId: scans.testId,
  testName: qaTests.name,
  fileName: scans.fileName,
  acquiredAt: scans.acquiredAt,
  createdAt: scans.createdAt,
  signedOffAt: scans.signedOffAt,
  method: analyses.method,
  status: analyses.status,
  analysisId: analyses.id,
  revision: analyses.revision,
  fwhmMm: sql<number | null>`json_value(${analyses.result}, '$.fwhmMm')`,
  mtf50: sql<number | null>`json_value(${analyses.result}, '$.mtf50')`,
  mtf10: sql<number | null>`json_value(${analyses.result}, '$.mtf10')`,
};

/** Scans with their current analysis, newest test date first, filtered and paginated; `total` counts all matches. */
export async function listScans(query: ListScansQuery, user: SessionUser) {
  const conds: (SQL | undefined)[] = [eq(analyses.isCurrent, true), visibleTo(user)];
  if (query.scannerId) conds.push(eq(scans.scannerId, query.scannerId));
  if (query.method) conds.push(eq(analyses.method, query.method));
  if (query.from) conds.push(gte(scans.acquiredAt, query.from));
  if (query.to) conds.push(lte(scans.acquiredAt, new Date(query.to.getTime() + 86_399_999)));
  const where = and(...conds);
  const base = db()
    .select(listColumns)
    .from(scans)
    .innerJoin(analyses, eq(analyses.scanId, scans.id))
    .innerJoin(scanners, eq(scans.scannerId, scanners.id))
    .innerJoin(sites, eq(scanners.siteId, sites.id))
    .leftJoin(qaTests, eq(scans.testId, qaTests.id));
  const [rows, [totalRow]] = await Promise.all([
    base.where(where).orderBy(desc(scans.acquiredAt), desc(scans.id)).limit(query.pageSize).offset((query.page - 1) * query.pageSize),
    db().select({ n: count() }).from(scans).innerJoin(analyses, eq(analyses.scanId, scans.id)).where(where),
  ]);
  const toNum = (v: unknown) => (v === null || v === undefined ? null : Number(v));
  return {
    scans: rows.map((r) => ({ ...r, fwhmMm: toNum(r.fwhmMm), mtf50: toNum(r.mtf50), mtf10: toNum(r.mtf10) })),
    total: Number(totalRow?.n ?? 0),
    page: query.page,
    pageSize: query.pageSize,
  };
}

/** One scan with scanner, test, uploader, sign-off and every analysis revision (newest first). 404 when not visible. */
export async function getScanDetail(id: number, user: SessionUser) {
  const [row] = await db()
    .select({
      scan: scans,
      scannerName: scanners.name,
      scannerModality: scanners.modality,
      scannerSerial: scanners.serialNumber,
      siteName: sites.name,
      testName: qaTests.name,
      uploadedByName: users.name,
    })
    .from(scans)
    .innerJoin(scanners, eq(scans.scannerId, scanners.id))
    .innerJoin(sites, eq(scanners.siteId, sites.id))
    .leftJoin(qaTests, eq(scans.testId, qaTests.id))
    .innerJoin(users, eq(scans.uploadedById, users.id))
    .where(and(eq(scans.id, id), visibleTo(user)));
  if (!row) throw notFound("Scan");
  const history = await db()
    .select({ analysis: analyses, createdByName: users.name })
    .from(analyses)
    .innerJoin(users, eq(analyses.createdById, users.id))
    .where(eq(analyses.scanId, id))
    .orderBy(desc(analyses.revision));
  let signedOffByName: string | null = null;
  if (row.scan.signedOffById) {
    const [s] = await db().select({ name: users.name }).from(users).where(eq(users.id, row.scan.signedOffById));
    signedOffByName = s?.name ?? null;
  }
  const current = history.find((h) => h.analysis.isCurrent) ?? history[0];
  return {
    ...row.scan,
    scannerName: row.scannerName,
    scannerModality: row.scannerModality,
    scannerSerial: row.scannerSerial,
    siteName: row.siteName,
    testName: row.testName,
    uploadedByName: row.uploadedByName,
    signedOffByName,
    analysis: current ? { ...current.analysis, createdByName: current.createdByName } : null,
    history: history.map((h) => ({
      id: h.analysis.id, revision: h.analysis.revision, isCurrent: h.analysis.isCurrent, method: h.analysis.method, status: h.analysis.status,
      options: h.analysis.options, analysisVersion: h.analysis.analysisVersion, createdAt: h.analysis.createdAt, createdByName: h.createdByName,
    })),
  };
}
export type ScanDetail = Awaited<ReturnType<typeof getScanDetail>>;

/** Delete a scan and everything derived from it (admin); the audit event keeps what was removed. */
export async function deleteScan(id: number, actor: SessionUser): Promise<{ storageKey: string }> {
  return db().transaction(async (tx) => {
    const [scan] = await tx.select().from(scans).where(eq(scans.id, id));
    if (!scan) throw notFound("Scan");
    await tx.delete(scans).where(eq(scans.id, id));
    await insertAuditEvent(tx, {
      actorUserId: actor.id, action: "scan.delete", entityType: "scan", entityId: id, scannerId: scan.scannerId,
      details: { fileName: scan.fileName, sha256: scan.fileSha256, acquiredAt: scan.acquiredAt.toISOString() },
    });
    return { storageKey: scan.storageKey };
  });
}

/** Physicist sign-off of a scan's current result (who, when, note). Signing twice is refused. */
export async function signOffScan(id: number, actor: SessionUser, note: string | undefined): Promise<void> {
  await db().transaction(async (tx) => {
    const [scan] = await tx.select({ id: scans.id, scannerId: scans.scannerId, signedOffAt: scans.signedOffAt }).from(scans).where(eq(scans.id, id));
    if (!scan) throw notFound("Scan");
    if (scan.signedOffAt) throw new AppError({ code: "conflict", message: "This result is already signed off" });
    await tx.update(scans).set({ signedOffById: actor.id, signedOffAt: new Date(), signOffNote: note ?? null }).where(eq(scans.id, id));
    await insertAuditEvent(tx, { actorUserId: actor.id, action: "scan.sign_off", entityType: "scan", entityId: id, scannerId: scan.scannerId, details: { note: note ?? null } });
  });
}
