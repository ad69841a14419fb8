import { and, asc, eq, isNull, lte, or } from "drizzle-orm";
import type { Transporter } from "nodemailer";
import { db } from "@/db/client";
import { mailOutbox } from "@/db/schema";
import { nextAttemptAt, shouldGiveUp } from "@/lib/qa/retry";
import { mailFrom, smtpTransport } from "./transport";

const LOCK_MS = 60_000;
const BATCH = 20;

export interface DeliveryReport {
  sent: number;
  retried: number;
  failed: number;
}

/**
 * Deliver the outbox messages that are due. Each message is claimed with a short lock (so two app processes never send
 * it at the same time), sent over SMTP, then marked sent; a failure schedules the next attempt with exponential
 * back-off (lib/qa/retry.ts) until MAX_ATTEMPTS, after which it is marked failed and shown to admins.
 * Delivery is at-least-once: a crash between the SMTP answer and the database update may repeat one message.
 */
export async function deliverDueMail(opts: { now?: Date; transport?: Transporter; random?: () => number } = {}): Promise<DeliveryReport> {
  const now = opts.now ?? new Date();
  const random = opts.random ?? Math.random;
  const report: DeliveryReport = { sent: 0, retried: 0, failed: 0 };
  const due = await db()
    .select()
    .from(mailOutbox)
    .where(and(eq(mailOutbox.state, "pending"), lte(mailOutbox.nextAttemptAt, now), or(isNull(mailOutbox.lockedUntil), lte(mailOutbox.lockedUntil, now))))
    .orderBy(asc(mailOutbox.nextAttemptAt))
    .limit(BATCH);
  for (const msg of due) {
    const claim = await db()
      .update(mailOutbox)
      .set({ lockedUntil: new Date(now.getTime() + LOCK_MS) })
      .where(and(eq(mailOutbox.id, msg.id), eq(mailOutbox.state, "pending"), or(isNull(mailOutbox.lockedUntil), lte(mailOutbox.lockedUntil, now))));
    if (claim[0].affectedRows !== 1) continue;
    const attempts = msg.attempts + 1;
    try {
      const transport = opts.transport ?? smtpTransport();
      await transport.sendMail({ from: mailFrom(), to: msg.toAddress, subject: msg.subject, text: msg.textBody, html: msg.htmlBody, headers: { "X-Halfmax-Message-Id": String(msg.id) } });
      await db().update(mailOutbox).set({ state: "sent", attempts, sentAt: new Date(), lockedUntil: null, lastError: null }).where(eq(mailOutbox.id, msg.id));
      report.sent++;
    } catch (err) {
      const lastError = err instanceof Error ? err.message.slice(0, 2000) : String(err);
      if (shouldGiveUp(attempts)) {
        await db().update(mailOutbox).set({ state: "failed", attempts, lastError, lockedUntil: null }).where(eq(mailOutbox.id, msg.id));
        report.failed++;
      } else {
        await db().update(mailOutbox).set({ attempts, lastError, lockedUntil: null, nextAttemptAt: nextAttemptAt(now, attempts, random) }).where(eq(mailOutbox.id, msg.id));
        report.retried++;
      }
    }
  }
  return report;
}

/** Put a failed or waiting message back at the front of the queue (admin "retry now"). */
export async function retryNow(id: number): Promise<boolean> {
  const res = await db().update(mailOutbox).set({ state: "pending", nextAttemptAt: new Date(), lockedUntil: null }).where(and(eq(mailOutbox.id, id), or(eq(mailOutbox.state, "failed"), eq(mailOutbox.state, "pending"))));
  return res[0].affectedRows === 1;
}
