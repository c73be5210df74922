// The audit trail: one append-only row per event. The database refuses UPDATE and DELETE on it
// (trigger in migrations/), so this module only ever inserts.
import "server-only";
import type { DbOrTx } from "@/db";
import { auditEvent } from "@/db/schema";

export type AuditInput = {
  actorId: string | null;
  actorRole?: string | null;
  action: string;
  benchId?: string | null;
  revisionId?: string | null;
  contentHash?: string | null;
  ipAddress?: string | null;
  detail?: Record<string, unknown>;
};

export async function recordAudit(db: DbOrTx, input: AuditInput): Promise<void> {
  await db.insert(auditEvent).values({
    actorId: input.actorId,
    actorRole: input.actorRole ?? null,
    action: input.action,
    benchId: input.benchId ?? null,
    revisionId: input.revisionId ?? null,
    contentHash: input.contentHash ?? null,
    ipAddress: input.ipAddress ?? null,
    detail: input.detail ?? {},
  });
}
