import { and, desc, eq, inArray, isNotNull } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { alerts, qaTests, scannerEngineers, scanners, sites, users } from "@/db/schema";
import { alertMail } from "@/lib/mail/alert-mail";
import { formatMetric, METRICS, planAlertChanges, type AlertCause, type DriftFlag } from "@/lib/qa";
import type { ResultEvaluation } from "@/lib/scans/evaluate";
import { insertAuditEvent } from "./audit";
import { enqueueMail } from "./outbox";

export interface ResultForAlerts {
  scannerId: number;
  testId: number;
  scanId: number;
  evaluation: ResultEvaluation;
  driftFlags: DriftFlag[];
  actorUserId: number;
  appUrl: string;
}

/** People who hear about a scanner's alerts: its assigned engineers and its responsible physicist (active users). */
export async function alertRecipients(tx: DbOrTx, scannerId: number) {
  const engineers = await tx
    .select({ id: users.id, name: users.name, email: users.email, pref: users.mailPreference, active: users.active })
    .from(scannerEngineers)
    .innerJoin(users, eq(scannerEngineers.userId, users.id))
    .where(eq(scannerEngineers.scannerId, scannerId));
  const physicist = await tx
    .select({ id: users.id, name: users.name, email: users.email, pref: users.mailPreference, active: users.active })
    .from(scanners)
    .innerJoin(users, eq(scanners.responsiblePhysicistId, users.id))
    .where(eq(scanners.id, scannerId));
  const all = new Map<number, (typeof engineers)[number]>();
  for (const u of [...engineers, ...physicist]) if (u.active) all.set(u.id, u);
  return [...all.values()];
}

/**
 * Apply the alert rules (lib/qa/alert-rules) to a new result inside the caller's transaction: open or update alerts,
 * propose resolutions, queue e-mails (outbox) for recipients who want them immediately, and audit each change.
 */
export async function applyResultToAlerts(tx: DbOrTx, r: ResultForAlerts): Promise<{ opened: number[]; updated: number[] }> {
  const [ctx] = await tx
    .select({ scannerName: scanners.name, alertOnWarning: scanners.alertOnWarning, siteName: sites.name, testName: qaTests.name })
    .from(scanners)
    .innerJoin(sites, eq(scanners.siteId, sites.id))
    .innerJoin(qaTests, eq(qaTests.id, r.testId))
    .where(eq(scanners.id, r.scannerId));
  if (!ctx) return { opened: [], updated: [] };
  const active = await tx
    .select({ id: alerts.id, cause: alerts.cause, testId: alerts.testId, state: alerts.state })
    .from(alerts)
    .where(and(eq(alerts.scannerId, r.scannerId), isNotNull(alerts.openKey)));
  const plan = planAlertChanges({
    scannerId: r.scannerId,
    testId: r.testId,
    resultId: r.scanId,
    status: r.evaluation.status,
    driftFlags: r.driftFlags,
    alertOnWarning: ctx.alertOnWarning,
    detail: r.evaluation.headline,
    openAlerts: active.map((a) => ({ id: a.id, cause: a.cause, testId: a.testId ?? 0, state: a.state })),
  });
  const now = new Date();
  const opened: number[] = [];
  const updated: number[] = [];
  const notify: { alertId: number; cause: AlertCause; change: "opened" | "updated"; summary: string }[] = [];
  for (const o of plan.open) {
    const [row] = await tx
      .insert(alerts)
      .values({
        scannerId: r.scannerId, testId: r.testId, cause: o.cause, state: "open", openKey: o.key, summary: o.summary,
        firstScanId: r.scanId, latestScanId: r.scanId, openedAt: now, updatedAt: now,
      })
      .$returningId();
    opened.push(row!.id);
    notify.push({ alertId: row!.id, cause: o.cause, change: "opened", summary: o.summary });
    await insertAuditEvent(tx, { actorUserId: r.actorUserId, action: "alert.open", entityType: "alert", entityId: row!.id, scannerId: r.scannerId, details: { cause: o.cause, scanId: r.scanId } });
  }
  for (const u of plan.update) {
    const id = Number(u.alertId);
    const [cur] = await tx.select({ occurrences: alerts.occurrences }).from(alerts).where(eq(alerts.id, id));
    await tx.update(alerts).set({ summary: u.summary, latestScanId: r.scanId, updatedAt: now, occurrences: (cur?.occurrences ?? 1) + 1 }).where(eq(alerts.id, id));
    updated.push(id);
    notify.push({ alertId: id, cause: u.cause, change: "updated", summary: u.summary });
    await insertAuditEvent(tx, { actorUserId: r.actorUserId, action: "alert.repeat", entityType: "alert", entityId: id, scannerId: r.scannerId, details: { scanId: r.scanId } });
  }
  for (const p of plan.proposeResolution) {
    const id = Number(p.alertId);
    await tx.update(alerts).set({ resolutionProposedAt: now, resolutionScanId: r.scanId, updatedAt: now }).where(eq(alerts.id, id));
    await insertAuditEvent(tx, { actorUserId: r.actorUserId, action: "alert.resolution_proposed", entityType: "alert", entityId: id, scannerId: r.scannerId, details: { scanId: r.scanId, reason: p.reason } });
  }
  if (notify.length) {
    const recipients = (await alertRecipients(tx, r.scannerId)).filter((u) => u.pref === "immediate");
    const metrics = r.evaluation.metrics
      .filter((m) => m.status === "warning" || m.status === "action")
      .map((m) => ({
        label: METRICS[m.metric].label,
        value: formatMetric(m.metric, m.value),
        baseline: formatMetric(m.metric, m.baselineMean),
        levels: m.tolerance
          ? m.tolerance.mode === "relative"
            ? `warning at ${m.tolerance.warning} %, action at ${m.tolerance.action} % from baseline`
            : `warning at ${formatMetric(m.metric, m.tolerance.warning)}, action at ${formatMetric(m.metric, m.tolerance.action)}`
          : "no tolerance",
        status: m.status,
      }));
    for (const n of notify) {
      for (const u of recipients) {
        const mail = alertMail({
          recipientName: u.name, scannerName: ctx.scannerName, siteName: ctx.siteName, testName: ctx.testName,
          cause: n.cause, change: n.change, summary: n.summary, metrics, link: `${r.appUrl}/scans/${r.scanId}`,
        });
        await enqueueMail(tx, { kind: `alert-${n.cause}`, to: u.email, ...mail, dedupeKey: `alert:${n.alertId}:scan:${r.scanId}:user:${u.id}` });
      }
    }
  }
  return { opened, updated };
}

export async function listOpenAlertIdsForScanner(tx: DbOrTx, scannerId: number) {
  return tx.select({ id: alerts.id }).from(alerts).where(and(eq(alerts.scannerId, scannerId), inArray(alerts.state, ["open", "acknowledged"]))).orderBy(desc(alerts.openedAt));
}
