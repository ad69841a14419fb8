import { checkOverdueTests } from "@/db/queries/overdue";
import { queueDailyDigests } from "@/lib/mail/digest";
import { deliverDueMail } from "@/lib/mail/outbox-sender";

const globalForJobs = globalThis as unknown as { halfmaxJobs?: NodeJS.Timeout[] };

/**
 * In-process background work of the web server: deliver due e-mail every few seconds (MAIL_POLL_MS), and every
 * ten minutes check for overdue tests and queue daily digests. State lives in the database, so a restart resumes.
 */
export function startBackgroundJobs(): void {
  if (globalForJobs.halfmaxJobs || process.env.HALFMAX_BACKGROUND_JOBS === "0") return;
  const appUrl = process.env.APP_URL ?? "http://127.0.0.1:3000";
  const pollMs = Number(process.env.MAIL_POLL_MS ?? 3_000);
  let sending = false;
  let checking = false;
  const send = async () => {
    if (sending) return;
    sending = true;
    try {
      await deliverDueMail();
    } catch (err) {
      console.error("[halfmax] mail delivery loop:", err instanceof Error ? err.message : err);
    } finally {
      sending = false;
    }
  };
  const check = async () => {
    if (checking) return;
    checking = true;
    try {
      await checkOverdueTests(new Date(), appUrl);
      await queueDailyDigests(new Date(), appUrl);
    } catch (err) {
      console.error("[halfmax] scheduled checks:", err instanceof Error ? err.message : err);
    } finally {
      checking = false;
    }
  };
  globalForJobs.halfmaxJobs = [setInterval(send, pollMs), setInterval(check, 10 * 60_000)];
  setTimeout(check, 5_000);
}
