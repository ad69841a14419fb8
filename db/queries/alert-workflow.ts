import { and, desc, eq, inArray, sql, type SQL } from "drizzle-orm";
import { db } from "@/db/client";
import { alerts, qaTests, scannerEngineers, scanners, serviceEvents, sites, users } from "@/db/schema";
import { AppError, notFound } from "@/lib/errors";
import type { ServiceEventInput } from "@/lib/validations/alert";
import { insertAuditEvent } from "./audit";
import type { SessionUser } from "./users";

function visibleScanner(user: SessionUser): SQL | undefined {
  if (user.role !== "engineer") return undefined;
  return sql`${alerts.scannerId} in (select ${scannerEngineers.scannerId} from ${scannerEngineers} where ${scannerEngineers.userId} = ${user.id})`;
}

/** Alerts the user may see (engineers: their assigned scanners), newest first, with scanner, test and people. */
export async function listAlerts(user: SessionUser, q: { state?: "open" | "acknowledged" | "resolved" | "active"; cause?: string; scannerId?: number }) {
  const conds: (SQL | undefined)[] = [visibleScanner(user)];
  if (q.state === "active") conds.push(inArray(alerts.state, ["open", "acknowledged"]));
  else if (q.state) conds.push(eq(alerts.state, q.state));
  if (q.cause) conds.push(eq(alerts.cause, q.cause as "action"));
  if (q.scannerId) conds.push(eq(alerts.scannerId, q.scannerId));
  const ack = sql<string | null>`(select name from users u where u.id = ${alerts.acknowledgedById})`;
  const res = sql<string | null>`(select name from users u where u.id = ${alerts.resolvedById})`;
  const rows = await db()
    .select({
      alert: alerts,
      scannerName: scanners.name,
      siteName: sites.name,
      testName: qaTests.name,
      acknowledgedByName: ack,
      resolvedByName: res,
      serviceCount: sql<number>`(select count(*) from service_events se where se.alert_id = ${alerts.id})`,
    })
    .from(alerts)
    .innerJoin(scanners, eq(alerts.scannerId, scanners.id))
    .innerJoin(sites, eq(scanners.siteId, sites.id))
    .leftJoin(qaTests, eq(alerts.testId, qaTests.id))
    .where(and(...conds))
    .orderBy(desc(alerts.updatedAt))
    .limit(500);
  return rows.map((r) => ({ ...r.alert, scannerName: r.scannerName, siteName: r.siteName, testName: r.testName, acknowledgedByName: r.acknowledgedByName, resolvedByName: r.resolvedByName, serviceCount: Number(r.serviceCount) }));
}

async function alertForUser(id: number, user: SessionUser) {
  const [row] = await db().select().from(alerts).where(and(eq(alerts.id, id), visibleScanner(user)));
  if (!row) throw notFound("Alert");
  return row;
}

/** One alert with its service events and the scans involved. */
export async function getAlertDetail(id: number, user: SessionUser) {
  const alert = await alertForUser(id, user);
  const services = await db()
    .select({ id: serviceEvents.id, performedAt: serviceEvents.performedAt, description: serviceEvents.description, parts: serviceEvents.parts, engineer: users.name })
    .from(serviceEvents)
    .innerJoin(users, eq(serviceEvents.engineerId, users.id))
    .where(eq(serviceEvents.alertId, id))
    .orderBy(desc(serviceEvents.performedAt));
  return { ...alert, serviceEvents: services };
}

export async function acknowledgeAlert(id: number, user: SessionUser, note?: string) {
  await db().transaction(async (tx) => {
    const [a] = await tx.select().from(alerts).where(eq(alerts.id, id)).for("update");
    if (!a) throw notFound("Alert");
    await alertForUser(id, user);
    if (a.state !== "open") throw new AppError({ code: "conflict", message: `The alert is already ${a.state}` });
    const now = new Date();
    await tx.update(alerts).set({ state: "acknowledged", acknowledgedById: user.id, acknowledgedAt: now, updatedAt: now }).where(eq(alerts.id, id));
    await insertAuditEvent(tx, { actorUserId: user.id, action: "alert.acknowledge", entityType: "alert", entityId: id, scannerId: a.scannerId, details: { note: note ?? null } });
  });
}

/** Log a service action on a scanner, optionally against an alert (which it acknowledges if still open). */
export async function logServiceEvent(scannerId: number, input: ServiceEventInput, user: SessionUser, alertId?: number) {
  return db().transaction(async (tx) => {
    if (alertId) {
      const [a] = await tx.select().from(alerts).where(eq(alerts.id, alertId));
      if (!a || a.scannerId !== scannerId) throw notFound("Alert");
      if (a.state === "resolved") throw new AppError({ code: "conflict", message: "The alert is resolved: log the service on the scanner instead" });
      if (a.state === "open") {
        const now = new Date();
        await tx.update(alerts).set({ state: "acknowledged", acknowledgedById: user.id, acknowledgedAt: now, updatedAt: now }).where(eq(alerts.id, alertId));
        await insertAuditEvent(tx, { actorUserId: user.id, action: "alert.acknowledge", entityType: "alert", entityId: alertId, scannerId, details: { via: "service log" } });
      } else {
        await tx.update(alerts).set({ updatedAt: new Date() }).where(eq(alerts.id, alertId));
      }
    }
    const [row] = await tx.insert(serviceEvents).values({ scannerId, alertId: alertId ?? null, engineerId: user.id, performedAt: input.performedAt, description: input.description, parts: input.parts }).$returningId();
    await insertAuditEvent(tx, { actorUserId: user.id, action: "service.log", entityType: "service_event", entityId: row!.id, scannerId, details: { alertId: alertId ?? null, ...input, performedAt: input.performedAt.toISOString() } });
    return { id: row!.id };
  });
}

/**
 * Close an alert (physicist). Action and warning alerts need a passing re-test after the alert opened (the resolution
 * proposed by the alert rules); overdue and drift alerts can be closed with a note.
 */
export async function resolveAlert(id: number, user: SessionUser, note: string) {
  await db().transaction(async (tx) => {
    const [a] = await tx.select().from(alerts).where(eq(alerts.id, id)).for("update");
    if (!a) throw notFound("Alert");
    if (a.state === "resolved") throw new AppError({ code: "conflict", message: "The alert is already resolved" });
    if ((a.cause === "action" || a.cause === "warning") && !a.resolutionProposedAt) {
      throw new AppError({ code: "conflict", message: "Upload a passing re-test before resolving this alert: it must show the scanner is back within tolerance" });
    }
    const now = new Date();
    await tx.update(alerts).set({ state: "resolved", openKey: null, resolvedById: user.id, resolvedAt: now, resolutionNote: note, updatedAt: now }).where(eq(alerts.id, id));
    await insertAuditEvent(tx, { actorUserId: user.id, action: "alert.resolve", entityType: "alert", entityId: id, scannerId: a.scannerId, details: { note, resolutionScanId: a.resolutionScanId } });
  });
}

export async function listServiceEvents(scannerId: number) {
  return db()
    .select({ id: serviceEvents.id, performedAt: serviceEvents.performedAt, description: serviceEvents.description, parts: serviceEvents.parts, alertId: serviceEvents.alertId, engineer: users.name })
    .from(serviceEvents)
    .innerJoin(users, eq(serviceEvents.engineerId, users.id))
    .where(eq(serviceEvents.scannerId, scannerId))
    .orderBy(desc(serviceEvents.performedAt));
}
