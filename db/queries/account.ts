import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { users, type MAIL_PREFERENCES } from "@/db/schema";
import { notFound } from "@/lib/errors";
import { insertAuditEvent } from "./audit";

export type MailPreference = (typeof MAIL_PREFERENCES)[number];

/**
 * Set the caller's own mail preference (and nothing else) and record the change in the audit log, in one transaction.
 * Scope is the caller's id, so a user can only ever change their own row.
 */
export async function updateOwnMailPreference(userId: number, mailPreference: MailPreference): Promise<{ mailPreference: MailPreference }> {
  return db().transaction(async (tx) => {
    const [current] = await tx.select({ mailPreference: users.mailPreference }).from(users).where(eq(users.id, userId)).for("update");
    if (!current) throw notFound("User");
    if (current.mailPreference !== mailPreference) {
      await tx.update(users).set({ mailPreference }).where(eq(users.id, userId));
    }
    await insertAuditEvent(tx, {
      actorUserId: userId,
      action: "user.mail_preference",
      entityType: "user",
      entityId: userId,
      details: { from: current.mailPreference, to: mailPreference },
    });
    return { mailPreference };
  });
}
