// The audit trail: one append-only row per event, written by recordAudit with the actor who caused it.
// The database refuses UPDATE and DELETE on it (trigger in migrations/), so this module only inserts.
// Free of 'server-only' so the mail worker's review clock writes its rows through it too.
import type { DbOrTx } from "@/db";
import { auditEvent } from "@/db/schema";
import type { Actor } from "./authorize";

/** Who caused an event: a signed-in Actor, a person not signed in yet (accepting an invitation), or the system's clock. */
export type AuditActor = Actor | { userId: string | null; roleText: string | null; ipAddress?: string | null };

export const SYSTEM_ACTOR: AuditActor = { userId: null, roleText: "system" };

/** What happened and to what. */
export type AuditEvent = {
  action: string;
  benchId?: string | null;
  revisionId?: string | null;
  contentHash?: string | null;
  detail?: Record<string, unknown>;
};

export async function recordAudit(db: DbOrTx, by: AuditActor, event: AuditEvent): Promise<void> {
  const actorRole = "roles" in by ? by.roles.join(",") : by.roleText;
  await db.insert(auditEvent).values({
    actorId: by.userId,
    actorRole,
    action: event.action,
    benchId: event.benchId ?? null,
    revisionId: event.revisionId ?? null,
    contentHash: event.contentHash ?? null,
    ipAddress: by.ipAddress ?? null,
    detail: event.detail ?? {},
  });
}
