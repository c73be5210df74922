// A bench's trail (revisions, decisions, comments, audit events) as one timeline for everyone who may read
// the bench, within their lab scope; the auditor's desk shows and exports the same entries.
import "server-only";
import { asc, eq } from "drizzle-orm";
import { z } from "zod";
import type { Database } from "@/db";
import { auditEvent, bench, benchRevision, lab, reviewComment, reviewDecision, user, type ReviewState } from "@/db/schema";
import { rolesAllow } from "@/lib/auth/permissions";
import { notFound } from "@/lib/errors";
import { authorize, type Actor } from "./authorize";
import { scopeHolds, visibleOr404, type LabScope } from "./scope";

/** One line of a bench's trail: a revision, a decision, a comment or any other audit event. */
export type TrailEntry =
  | { kind: "revision"; at: string; revisionNumber: number; revisionId: string; contentHash: string; state: ReviewState; by: string | null }
  | {
      kind: "decision";
      at: string;
      revisionNumber: number;
      revisionId: string;
      contentHash: string;
      outcome: string;
      by: string;
      role: string;
      meaning: string;
      conditions: string | null;
      reason: string | null;
      validUntil: string | null;
      stepUpVerified: boolean;
      hazardClass: string | null;
    }
  | { kind: "comment"; at: string; revisionNumber: number; revisionId: string; by: string; role: string; body: string; elementId: string | null }
  | { kind: "event"; at: string; revisionNumber: number | null; revisionId: string | null; contentHash: string | null; action: string; by: string | null; role: string | null; detail: Record<string, unknown> };

export type BenchTrail = {
  bench: { id: string; title: string; labName: string; authorName: string; createdAt: string };
  revisions: { id: string; number: number; state: ReviewState; contentHash: string; createdAt: string }[];
  entries: TrailEntry[];
};

/** What the reader's roles leave out: review comments need review:read (technicians do not have it). */
export type ReaderTrail = BenchTrail & { commentsHidden: boolean };

type BenchHead = { id: string; title: string; labId: string; labName: string; authorName: string; createdAt: Date };

async function benchHead(db: Database, benchId: string): Promise<BenchHead> {
  if (!z.uuid().safeParse(benchId).success) throw notFound("The bench");
  const [b] = await db
    .select({ id: bench.id, title: bench.title, labId: bench.labId, labName: lab.name, authorName: user.name, createdAt: bench.createdAt })
    .from(bench)
    .innerJoin(lab, eq(lab.id, bench.labId))
    .innerJoin(user, eq(user.id, bench.authorId))
    .where(eq(bench.id, benchId));
  if (!b) throw notFound("The bench");
  return b;
}

/**
 * The trail's rows for one bench inside the given lab scope; the caller checks the permission (the desk:
 * audit:read, a bench's reader: bench:read). Outside the scope the bench answers 404, like a missing one.
 */
export async function loadBenchTrail(db: Database, scope: LabScope, benchId: string): Promise<BenchTrail> {
  const b = await benchHead(db, benchId);
  if (!scopeHolds(scope, b.labId)) throw notFound("The bench");
  return trailOf(db, b);
}

async function trailOf(db: Database, b: BenchHead): Promise<BenchTrail> {
  const benchId = b.id;
  const [revisions, decisions, comments, events] = await Promise.all([
    db
      .select({ id: benchRevision.id, number: benchRevision.number, state: benchRevision.state, contentHash: benchRevision.contentHash, createdAt: benchRevision.createdAt, by: user.name })
      .from(benchRevision)
      .leftJoin(user, eq(user.id, benchRevision.createdBy))
      .where(eq(benchRevision.benchId, benchId))
      .orderBy(asc(benchRevision.number)),
    db.select().from(reviewDecision).where(eq(reviewDecision.benchId, benchId)).orderBy(asc(reviewDecision.decidedAt)),
    db.select().from(reviewComment).where(eq(reviewComment.benchId, benchId)).orderBy(asc(reviewComment.createdAt)),
    db
      .select({ at: auditEvent.at, action: auditEvent.action, revisionId: auditEvent.revisionId, contentHash: auditEvent.contentHash, by: user.name, role: auditEvent.actorRole, detail: auditEvent.detail })
      .from(auditEvent)
      .leftJoin(user, eq(user.id, auditEvent.actorId))
      .where(eq(auditEvent.benchId, benchId))
      .orderBy(asc(auditEvent.at)),
  ]);
  const numberOf = new Map(revisions.map((r) => [r.id, r.number]));
  // A revision's "made" row shows the content hash it had then: a draft's hash moves with every save, so the
  // row takes the first hash the audit trail recorded for that revision (the current one when none was recorded).
  const hashWhenMade = new Map<string, string>();
  for (const e of events) {
    // "make a revision" is recorded on the revision it copies; the new draft starts with that content and hash
    const newDraft = e.action === "revision-made" ? (e.detail as { newDraft?: { revisionId?: unknown } } | null)?.newDraft?.revisionId : undefined;
    const made = typeof newDraft === "string" ? newDraft : e.revisionId;
    if (made && e.contentHash && !hashWhenMade.has(made)) hashWhenMade.set(made, e.contentHash);
  }
  const entries: TrailEntry[] = [
    ...revisions.map(
      (r): TrailEntry => ({ kind: "revision", at: r.createdAt.toISOString(), revisionNumber: r.number, revisionId: r.id, contentHash: hashWhenMade.get(r.id) ?? r.contentHash, state: r.state, by: r.by }),
    ),
    ...decisions.map(
      (d): TrailEntry => ({
        kind: "decision",
        at: d.decidedAt.toISOString(),
        revisionNumber: numberOf.get(d.revisionId) ?? 0,
        revisionId: d.revisionId,
        contentHash: d.contentHash,
        outcome: d.outcome,
        by: d.signerName,
        role: d.signerRole,
        meaning: d.meaning,
        conditions: d.conditions,
        reason: d.reason,
        validUntil: d.validUntil?.toISOString() ?? null,
        stepUpVerified: d.stepUpVerified,
        hazardClass: (d.hazardSummary as { hazardClass?: { value?: string } } | null)?.hazardClass?.value ?? null,
      }),
    ),
    ...comments.map(
      (c): TrailEntry => ({ kind: "comment", at: c.createdAt.toISOString(), revisionNumber: numberOf.get(c.revisionId) ?? 0, revisionId: c.revisionId, by: c.authorName, role: c.authorRole, body: c.body, elementId: c.elementId }),
    ),
    ...events.map(
      (e): TrailEntry => ({
        kind: "event",
        at: e.at.toISOString(),
        revisionNumber: e.revisionId ? (numberOf.get(e.revisionId) ?? null) : null,
        revisionId: e.revisionId,
        contentHash: e.contentHash,
        action: e.action,
        by: e.by,
        role: e.role,
        detail: e.detail,
      }),
    ),
  ];
  const order = { revision: 0, decision: 1, comment: 2, event: 3 } as const;
  entries.sort((a, b) => a.at.localeCompare(b.at) || order[a.kind] - order[b.kind]);
  return {
    bench: { id: b.id, title: b.title, labName: b.labName, authorName: b.authorName, createdAt: b.createdAt.toISOString() },
    revisions: revisions.map((r) => ({ id: r.id, number: r.number, state: r.state, contentHash: r.contentHash, createdAt: r.createdAt.toISOString() })),
    entries,
  };
}

/** The trail for anyone who may read the bench (bench: read, and a member of its lab unless they see every lab). */
export async function getReaderTrail(db: Database, actor: Actor, benchId: string): Promise<ReaderTrail> {
  authorize(actor, { bench: ["read"] });
  const b = visibleOr404(actor, await benchHead(db, benchId), "The bench");
  const trail = await trailOf(db, b);
  const commentsHidden = !rolesAllow(actor.roles, { review: ["read"] });
  if (!commentsHidden) return { ...trail, commentsHidden };
  // Without review:read the comment bodies stay out; that a comment was written stays in (its audit row).
  return { ...trail, entries: trail.entries.filter((e) => e.kind !== "comment"), commentsHidden };
}
