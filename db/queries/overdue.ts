import { and, eq, isNotNull } from "drizzle-orm";
import { db } from "@/db/client";
import { alerts, scanners, sites } from "@/db/schema";
import { alertMail } from "@/lib/mail/alert-mail";
import { planAlertChanges } from "@/lib/qa";
import { alertRecipients } from "./alerts";
import { insertAuditEvent } from "./audit";
import { getFleetStatus } from "./fleet";
import { enqueueMail } from "./outbox";

/**
 * Open an "overdue" alert (and queue its e-mails) for every active test of an active scanner whose schedule says
 * overdue; an existing open overdue alert is left as it is, so the periodic check does not repeat mails.
 */
export async function checkOverdueTests(now: Date, appUrl: string): Promise<number> {
  const active = await db().select({ id: scanners.id, name: scanners.name, siteName: sites.name }).from(scanners).innerJoin(sites, eq(scanners.siteId, sites.id)).where(eq(scanners.active, true));
  if (!active.length) return 0;
  const status = await getFleetStatus(active.map((s) => s.id), now);
  let opened = 0;
  for (const s of active) {
    for (const t of status.get(s.id)?.tests ?? []) {
      if (t.due !== "overdue") continue;
      await db().transaction(async (tx) => {
        const open = await tx.select({ id: alerts.id, cause: alerts.cause, testId: alerts.testId, state: alerts.state }).from(alerts).where(and(eq(alerts.scannerId, s.id), isNotNull(alerts.openKey)));
        const plan = planAlertChanges({
          scannerId: s.id, testId: t.testId, resultId: null, status: null, driftFlags: [], alertOnWarning: false, dueState: "overdue",
          openAlerts: open.map((a) => ({ id: a.id, cause: a.cause, testId: a.testId ?? 0, state: a.state })),
        });
        for (const o of plan.open) {
          const summary = `${t.name} is overdue by ${t.overdueByDays ?? 1} day(s) (${t.frequency} test)`;
          const [row] = await tx.insert(alerts).values({ scannerId: s.id, testId: t.testId, cause: "overdue", state: "open", openKey: o.key, summary, openedAt: now, updatedAt: now }).$returningId();
          await insertAuditEvent(tx, { actorUserId: null, action: "alert.open", entityType: "alert", entityId: row!.id, scannerId: s.id, details: { cause: "overdue", testId: t.testId } });
          for (const u of (await alertRecipients(tx, s.id)).filter((r) => r.pref === "immediate")) {
            const mail = alertMail({ recipientName: u.name, scannerName: s.name, siteName: s.siteName, testName: t.name, cause: "overdue", change: "opened", summary, metrics: [], link: `${appUrl}/scanners/${s.id}` });
            await enqueueMail(tx, { kind: "alert-overdue", to: u.email, ...mail, dedupeKey: `alert:${row!.id}:overdue:user:${u.id}` });
          }
          opened++;
        }
      });
    }
  }
  return opened;
}
