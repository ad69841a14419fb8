import { desc, eq, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { mailOutbox } from "@/db/schema";

export interface OutgoingMail {
  kind: string;
  to: string;
  subject: string;
  text: string;
  html: string;
  /** Same key twice → queued once (INSERT IGNORE on the unique key). */
  dedupeKey?: string;
}

/** Queue a message in the outbox, inside the caller's transaction so it commits (or not) with the change it reports. */
export async function enqueueMail(tx: DbOrTx, mail: OutgoingMail): Promise<void> {
  await tx
    .insert(mailOutbox)
    .values({
      kind: mail.kind,
      toAddress: mail.to,
      subject: mail.subject.slice(0, 255),
      textBody: mail.text,
      htmlBody: mail.html,
      dedupeKey: mail.dedupeKey ?? null,
      nextAttemptAt: new Date(),
    })
    .onDuplicateKeyUpdate({ set: { id: sql`id` } });
}

export async function listOutbox(limit = 200) {
  return db().select().from(mailOutbox).orderBy(desc(mailOutbox.createdAt)).limit(limit);
}

export async function getOutboxMessage(id: number) {
  const [row] = await db().select().from(mailOutbox).where(eq(mailOutbox.id, id));
  return row;
}
