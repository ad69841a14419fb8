import { and, eq, gt, inArray, isNotNull, sql } from "drizzle-orm";
import type { Db } from "@/db/client";
import { alerts, auditEvents, mailOutbox, scans, serviceEvents } from "@/db/schema";
import { findOrCreateTest, recordAnalysis } from "@/db/queries/analyses";
import { createBaseline } from "@/db/queries/qa";
import { DEMO_PROFILES, DR_SERVICE_WEEK, demoScansFor } from "@/lib/demo/demo-history";
import { runJob, type AnalyseJobOutput } from "@/lib/jobs/analysis-job";
import { testDateFromAttributes } from "@/lib/scans/dicom-dates";
import { keptAttributes } from "@/lib/scans/ingest";
import { storage } from "@/lib/storage/file-storage";
import { DEMO_SCANNERS } from "./demo-fleet";
import type { SeedSummary } from "./seed-demo";

export const BASELINE_WEEKS = 8;

async function lastAuditId(database: Db): Promise<number> {
  const [row] = await database.select({ id: sql<number>`coalesce(max(${auditEvents.id}), 0)` }).from(auditEvents);
  return Number(row?.id ?? 0);
}

/**
 * A year of weekly results per demo scanner, each produced by running the real analysis on a generated phantom
 * DICOM, stored like an upload. Baselines are set from the first weeks; DR Room 1 drifts into the action level, is
 * serviced (logged by the engineer) and recovers; Mammography Lyra drifts now; the gamma camera is overdue.
 * History keeps its historical timestamps (alerts, audit events).
 */
export async function seedDemoHistory(database: Db, summary: SeedSummary, opts: { weeks: number; end: Date; appUrl: string; log?: (m: string) => void }) {
  const physicistId = summary.userIds.physicist!;
  const engineerId = summary.userIds.engineer!;
  for (const profile of DEMO_PROFILES) {
    const s = DEMO_SCANNERS.find((x) => x.key === profile.key)!;
    const scannerId = summary.scannerIds[s.key]!;
    const scanIds: number[] = [];
    const started = Date.now();
    for (const scan of demoScansFor(profile, { manufacturer: s.manufacturer, model: s.model, serialNumber: s.serialNumber, stationName: s.name }, opts.weeks, opts.end)) {
      if (s.key === "dr" && scan.week === DR_SERVICE_WEEK) await serviceVisit(database, scannerId, engineerId, scan.acquiredAt);
      const out = runJob({ kind: "analyse", bytes: scan.bytes, method: s.method, maxPixels: 50_000_000 }) as AnalyseJobOutput;
      const { key } = await storage().put(scan.bytes);
      const acquiredAt = testDateFromAttributes(out.decoded.attributes) ?? scan.acquiredAt;
      const before = await lastAuditId(database);
      const scanId = await database.transaction(async (tx) => {
        const testId = await findOrCreateTest(tx, scannerId, out.result.method);
        const [row] = await tx
          .insert(scans)
          .values({
            scannerId, testId, uploadedById: physicistId, fileSha256: key, fileName: scan.fileName, fileSize: scan.bytes.length, format: "dicom",
            storageKey: key, acquiredAt, attributes: keptAttributes(out.decoded.attributes), createdAt: acquiredAt,
            ...(scan.week < opts.weeks - 6 ? { signedOffById: physicistId, signedOffAt: new Date(acquiredAt.getTime() + 26 * 3_600_000) } : {}),
          })
          .$returningId();
        await recordAnalysis(tx, {
          scanId: row!.id, scannerId, modality: s.modality, testId, measuredAt: acquiredAt, result: out.result,
          options: { method: s.method, roi: null, pixelSpacingMm: null, frame: 0, timingMs: out.timingMs }, userId: physicistId, appUrl: opts.appUrl,
        });
        return row!.id;
      });
      await backdate(database, before, acquiredAt, scanId);
      scanIds.push(scanId);
      if (scanIds.length === BASELINE_WEEKS) {
        await createBaseline(scannerId, s.modality, { testId: summary.testIds[s.key]!, scanIds: [...scanIds], reason: "Commissioning: mean of the first eight weekly results after acceptance" }, physicistId);
        await database.update(auditEvents).set({ at: acquiredAt }).where(and(gt(auditEvents.id, before), eq(auditEvents.action, "baseline.set")));
      }
      if (s.key === "dr" && scan.week === DR_SERVICE_WEEK) await resolveAfterRetest(database, scannerId, physicistId, acquiredAt);
    }
    opts.log?.(`${s.name}: ${scanIds.length} weekly results in ${((Date.now() - started) / 1000).toFixed(1)} s`);
  }
  // The history is retrospective: its alert e-mails were never due, so none are left queued.
  await database.delete(mailOutbox).where(sql`${mailOutbox.kind} like 'alert-%'`);
}

/** Give the rows written for a historical result the result's own time instead of the seeding time. */
async function backdate(database: Db, auditAfterId: number, at: Date, scanId: number) {
  await database.update(auditEvents).set({ at }).where(gt(auditEvents.id, auditAfterId));
  await database.update(alerts).set({ openedAt: at, updatedAt: at }).where(eq(alerts.firstScanId, scanId));
  await database.update(alerts).set({ updatedAt: at }).where(eq(alerts.latestScanId, scanId));
  await database.update(alerts).set({ resolutionProposedAt: at }).where(eq(alerts.resolutionScanId, scanId));
}

async function serviceVisit(database: Db, scannerId: number, engineerId: number, retestAt: Date) {
  const visit = new Date(retestAt.getTime() - 2 * 86_400_000);
  const open = await database.select().from(alerts).where(and(eq(alerts.scannerId, scannerId), isNotNull(alerts.openKey)));
  const ackAt = new Date(visit.getTime() - 3 * 86_400_000);
  await database.transaction(async (tx) => {
    for (const a of open) {
      await tx.update(alerts).set({ state: "acknowledged", acknowledgedById: engineerId, acknowledgedAt: ackAt, updatedAt: ackAt }).where(eq(alerts.id, a.id));
      await tx.insert(auditEvents).values({ at: ackAt, actorUserId: engineerId, action: "alert.acknowledge", entityType: "alert", entityId: String(a.id), scannerId, details: {} });
    }
    const actionAlert = open.find((a) => a.cause === "action") ?? open[0];
    const [row] = await tx
      .insert(serviceEvents)
      .values({
        scannerId, alertId: actionAlert?.id ?? null, engineerId, performedAt: visit, createdAt: visit,
        description: "Detector gain and offset recalibration; flat-field maps regenerated; focal-spot alignment checked",
        parts: "Detector cooling fan (preventive)",
      })
      .$returningId();
    await tx.insert(auditEvents).values({ at: visit, actorUserId: engineerId, action: "service.log", entityType: "service_event", entityId: String(row!.id), scannerId, details: { alertId: actionAlert?.id ?? null } });
  });
}

async function resolveAfterRetest(database: Db, scannerId: number, physicistId: number, retestAt: Date) {
  const at = new Date(retestAt.getTime() + 4 * 3_600_000);
  const proposed = await database.select().from(alerts).where(and(eq(alerts.scannerId, scannerId), isNotNull(alerts.openKey)));
  const ids = proposed.filter((a) => a.resolutionProposedAt || a.cause === "drift").map((a) => a.id);
  if (!ids.length) return;
  await database.update(alerts).set({ state: "resolved", openKey: null, resolvedById: physicistId, resolvedAt: at, updatedAt: at, resolutionNote: "Re-test after detector recalibration passed; MTF50 back within tolerance of baseline" }).where(inArray(alerts.id, ids));
  for (const id of ids) await database.insert(auditEvents).values({ at, actorUserId: physicistId, action: "alert.resolve", entityType: "alert", entityId: String(id), scannerId, details: {} });
}
