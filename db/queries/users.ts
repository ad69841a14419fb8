import { and, asc, eq, like, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { apiTokens, users, type Role, type User } from "@/db/schema";

export interface SessionUser {
  id: number;
  email: string;
  name: string;
  role: Role;
}

export function toSessionUser(u: Pick<User, "id" | "email" | "name" | "role">): SessionUser {
  return { id: u.id, email: u.email, name: u.name, role: u.role };
}

export async function getUserByEmail(email: string, tx: DbOrTx = db()): Promise<User | undefined> {
  const rows = await tx.select().from(users).where(eq(users.email, email.trim().toLowerCase())).limit(1);
  return rows[0];
}

export async function getActiveUserById(id: number): Promise<User | undefined> {
  const rows = await db().select().from(users).where(and(eq(users.id, id), eq(users.active, true))).limit(1);
  return rows[0];
}

export async function getUserById(id: number, tx: DbOrTx = db()): Promise<User | undefined> {
  const rows = await tx.select().from(users).where(eq(users.id, id)).limit(1);
  return rows[0];
}

export type PublicUser = Omit<User, "passwordHash"> & { hasPassword: boolean };

export function toPublicUser(u: User): PublicUser {
  const { passwordHash, ...rest } = u;
  return { ...rest, hasPassword: Boolean(passwordHash) };
}

export async function listUsers(): Promise<PublicUser[]> {
  const rows = await db().select().from(users).orderBy(asc(users.name));
  return rows.map(toPublicUser);
}

export async function listActiveUsersByRole(role: Role): Promise<SessionUser[]> {
  const rows = await db().select().from(users).where(and(eq(users.role, role), eq(users.active, true))).orderBy(asc(users.name));
  return rows.map(toSessionUser);
}

/** Resolve a Bearer token to its active owner and stamp last use; undefined when unknown, revoked or deactivated. */
export async function getUserByApiTokenHash(tokenHash: string): Promise<SessionUser | undefined> {
  const rows = await db()
    .select({ user: users, tokenId: apiTokens.id, revokedAt: apiTokens.revokedAt, lastUsedAt: apiTokens.lastUsedAt })
    .from(apiTokens)
    .innerJoin(users, eq(apiTokens.userId, users.id))
    .where(eq(apiTokens.tokenHash, tokenHash))
    .limit(1);
  const row = rows[0];
  if (!row || row.revokedAt || !row.user.active) return undefined;
  // Stamp "last used" at most once a minute: a write per request would serialise a script's parallel calls.
  const now = new Date();
  if (!row.lastUsedAt || now.getTime() - row.lastUsedAt.getTime() > 60_000) {
    await db().update(apiTokens).set({ lastUsedAt: now }).where(eq(apiTokens.id, row.tokenId));
  }
  return toSessionUser(row.user);
}

/** True when the demo accounts (seeded with the reserved .test domain) are present. */
export async function hasDemoUsers(): Promise<boolean> {
  const rows = await db()
    .select({ n: sql<number>`count(*)` })
    .from(users)
    .where(like(users.email, "%@halfmax.test"));
  return Number(rows[0]?.n ?? 0) > 0;
}
