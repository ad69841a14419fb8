import { and, eq, gt, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { users, userTokens } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import { generateSecretToken, hashToken } from "@/lib/auth/tokens";
import { env } from "@/lib/env";
import { AppError, notFound } from "@/lib/errors";
import { invitationMail, passwordResetMail } from "@/lib/mail/templates";
import type { CreateUserInput, UpdateUserInput } from "@/lib/validations/user";
import { insertAuditEvent } from "./audit";
import { isDuplicateKey } from "./mysql-errors";
import { enqueueMail } from "./outbox";
import type { SessionUser } from "./users";

const LINK_HOURS = 72;

/** Create a user; without a password an invitation e-mail with a one-time link is queued in the same transaction. */
export async function createUser(input: CreateUserInput, actor: SessionUser): Promise<{ id: number; invited: boolean }> {
  const passwordHash = input.password ? await hashPassword(input.password) : null;
  try {
    return await db().transaction(async (tx) => {
      const [row] = await tx.insert(users).values({ email: input.email, name: input.name, role: input.role, passwordHash }).$returningId();
      const id = row!.id;
      let invited = false;
      if (!passwordHash) {
        const token = generateSecretToken("inv_");
        await tx.insert(userTokens).values({ userId: id, kind: "invite", tokenHash: hashToken(token), expiresAt: new Date(Date.now() + LINK_HOURS * 3600_000) });
        const mail = invitationMail({ name: input.name, inviterName: actor.name, link: `${env().APP_URL}/set-password?token=${token}`, expiresHours: LINK_HOURS });
        await enqueueMail(tx, { kind: "invitation", to: input.email, ...mail });
        invited = true;
      }
      await insertAuditEvent(tx, { actorUserId: actor.id, action: "user.create", entityType: "user", entityId: id, details: { email: input.email, role: input.role, invited } });
      return { id, invited };
    });
  } catch (err) {
    if (isDuplicateKey(err)) throw new AppError({ code: "conflict", message: `A user with e-mail ${input.email} already exists` });
    throw err;
  }
}

export async function updateUser(id: number, input: UpdateUserInput, actor: SessionUser): Promise<void> {
  if (id === actor.id && (input.active === false || (input.role && input.role !== actor.role))) {
    throw new AppError({ code: "conflict", message: "You cannot deactivate yourself or change your own role; ask another administrator" });
  }
  await db().transaction(async (tx) => {
    const res = await tx.update(users).set(input).where(eq(users.id, id));
    if (res[0].affectedRows === 0) {
      const [exists] = await tx.select({ id: users.id }).from(users).where(eq(users.id, id));
      if (!exists) throw notFound("User");
    }
    await insertAuditEvent(tx, { actorUserId: actor.id, action: "user.update", entityType: "user", entityId: id, details: input });
  });
}

/** Queue a password-reset e-mail. Unknown addresses are answered the same way, so the form does not reveal accounts. */
export async function requestPasswordReset(email: string): Promise<void> {
  await db().transaction(async (tx) => {
    const [user] = await tx.select().from(users).where(and(eq(users.email, email.trim().toLowerCase()), eq(users.active, true)));
    if (!user) return;
    const token = generateSecretToken("rst_");
    await tx.insert(userTokens).values({ userId: user.id, kind: "reset", tokenHash: hashToken(token), expiresAt: new Date(Date.now() + 2 * 3600_000) });
    const mail = passwordResetMail({ name: user.name, link: `${env().APP_URL}/set-password?token=${token}`, expiresHours: 2 });
    await enqueueMail(tx, { kind: "password-reset", to: user.email, ...mail });
    await insertAuditEvent(tx, { actorUserId: null, action: "user.password_reset_requested", entityType: "user", entityId: user.id });
  });
}

/** Consume an invitation or reset token and set the password. */
export async function setPasswordWithToken(token: string, password: string): Promise<void> {
  const passwordHash = await hashPassword(password);
  await db().transaction(async (tx) => {
    const [row] = await tx
      .select()
      .from(userTokens)
      .where(and(eq(userTokens.tokenHash, hashToken(token)), isNull(userTokens.usedAt), gt(userTokens.expiresAt, new Date())));
    if (!row) throw new AppError({ code: "bad_request", message: "This link is invalid, used or expired. Ask for a new one." });
    await tx.update(userTokens).set({ usedAt: new Date() }).where(eq(userTokens.id, row.id));
    await tx.update(users).set({ passwordHash }).where(eq(users.id, row.userId));
    await insertAuditEvent(tx, { actorUserId: row.userId, action: "user.password_set", entityType: "user", entityId: row.userId, details: { via: row.kind } });
  });
}
