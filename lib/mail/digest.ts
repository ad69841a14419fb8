import { and, eq, gte, inArray, or } from "drizzle-orm";
import { db } from "@/db/client";
import { alerts, scannerEngineers, scanners, sites, users } from "@/db/schema";
import { enqueueMail } from "@/db/queries/outbox";
import { escapeHtml, layoutHtml } from "./templates";

/** Hour (UTC) after which the daily digest for the previous 24 h is queued. */
export const DIGEST_HOUR_UTC = 7;

/**
 * Queue one daily digest per user whose preference is "digest": alerts opened or updated in the last 24 h on the
 * scanners they are assigned to (engineers) or responsible for (physicists). Idempotent per user and day (dedupe key).
 */
export async function queueDailyDigests(now: Date, appUrl: string): Promise<number> {
  if (now.getUTCHours() < DIGEST_HOUR_UTC) return 0;
  const day = now.toISOString().slice(0, 10);
  const since = new Date(now.getTime() - 86_400_000);
  const people = await db().select().from(users).where(and(eq(users.mailPreference, "digest"), eq(users.active, true)));
  let queued = 0;
  for (const u of people) {
    const assigned = await db().select({ id: scannerEngineers.scannerId }).from(scannerEngineers).where(eq(scannerEngineers.userId, u.id));
    const responsible = await db().select({ id: scanners.id }).from(scanners).where(eq(scanners.responsiblePhysicistId, u.id));
    const ids = [...new Set([...assigned, ...responsible].map((r) => r.id))];
    if (!ids.length) continue;
    const recent = await db()
      .select({ id: alerts.id, summary: alerts.summary, cause: alerts.cause, state: alerts.state, scannerName: scanners.name, siteName: sites.name, scannerId: scanners.id })
      .from(alerts)
      .innerJoin(scanners, eq(alerts.scannerId, scanners.id))
      .innerJoin(sites, eq(scanners.siteId, sites.id))
      .where(and(inArray(alerts.scannerId, ids), or(gte(alerts.openedAt, since), gte(alerts.updatedAt, since))));
    if (!recent.length) continue;
    const lines = recent.map((a) => `- ${a.scannerName} (${a.siteName}): ${a.summary} [${a.state}] ${appUrl}/alerts?scannerId=${a.scannerId}`);
    const subject = `[Halfmax] Daily digest: ${recent.length} alert${recent.length === 1 ? "" : "s"} on your scanners`;
    const text = `Hello ${u.name},\n\nAlerts opened or updated in the last 24 hours:\n\n${lines.join("\n")}\n\nResults support, and never replace, the judgement of the qualified medical physicist.\n`;
    const html = layoutHtml(subject.replace("[Halfmax] ", ""), `<p>Hello ${escapeHtml(u.name)},</p><ul>${recent.map((a) => `<li><strong>${escapeHtml(a.scannerName)}</strong> (${escapeHtml(a.siteName)}): ${escapeHtml(a.summary)} — ${a.state}</li>`).join("")}</ul><p><a href="${escapeHtml(appUrl)}/alerts">Open the alerts</a></p>`);
    await db().transaction((tx) => enqueueMail(tx, { kind: "digest", to: u.email, subject, text, html, dedupeKey: `digest:${u.id}:${day}` }));
    queued++;
  }
  return queued;
}
