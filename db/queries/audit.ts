import { auditEvents } from "@/db/schema";
import type { DbOrTx } from "@/db/client";
import { bumpChangeVersion } from "@/lib/cache/change-version";

export interface AuditInput {
  actorUserId: number | null;
  action: string;
  entityType: string;
  entityId: string | number;
  scannerId?: number | null;
  details?: Record<string, unknown>;
}

/**
 * Append one audit event; call inside the same transaction as the change it records. Every change passes here, so
 * it also invalidates cached summaries (lib/cache/change-version.ts).
 */
export async function insertAuditEvent(tx: DbOrTx, input: AuditInput): Promise<void> {
  bumpChangeVersion();
  await tx.insert(auditEvents).values({
    at: new Date(),
    actorUserId: input.actorUserId,
    action: input.action,
    entityType: input.entityType,
    entityId: String(input.entityId),
    scannerId: input.scannerId ?? null,
    details: input.details ?? {},
  });
}
