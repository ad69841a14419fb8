import { and, desc, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { apiTokens } from "@/db/schema";
import { generateSecretToken, hashToken } from "@/lib/auth/tokens";
import { notFound } from "@/lib/errors";
import { insertAuditEvent } from "./audit";

/** Create a personal API token; the secret is returned once and only its hash is stored. */
export async function createApiToken(userId: number, name: string): Promise<{ id: number; token: string; prefix: string }> {
  const token = generateSecretToken();
  const prefix = token.slice(0, 10);
  return db().transaction(async (tx) => {
    const [row] = await tx.insert(apiTokens).values({ userId, name, tokenHash: hashToken(token), prefix }).$returningId();
    await insertAuditEvent(tx, { actorUserId: userId, action: "token.create", entityType: "api_token", entityId: row!.id, details: { name } });
    return { id: row!.id, token, prefix };
  });
}

export async function listApiTokensForUser(userId: number) {
  return db()
    .select({
      id: apiTokens.id,
      name: apiTokens.name,
      prefix: apiTokens.prefix,
      createdAt: apiTokens.createdAt,
      lastUsedAt: apiTokens.lastUsedAt,
      revokedAt: apiTokens.revokedAt,
    })
    .from(apiTokens)
    .where(eq(apiTokens.userId, userId))
    .orderBy(desc(apiTokens.createdAt));
}

export async function revokeApiToken(userId: number, tokenId: number): Promise<void> {
  await db().transaction(async (tx) => {
    const res = await tx
      .update(apiTokens)
      .set({ revokedAt: new Date() })
      .where(and(eq(apiTokens.id, tokenId), eq(apiTokens.userId, userId), isNull(apiTokens.revokedAt)));
    if (res[0].affectedRows === 0) throw notFound("Active token");
    await insertAuditEvent(tx, { actorUserId: userId, action: "token.revoke", entityType: "api_token", entityId: tokenId });
  });
}
