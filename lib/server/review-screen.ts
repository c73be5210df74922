// The review screen and the officer's queue: what a revision looks like to the reader, with its decision,
// the last signed-off revision and the diff, the threads, its trail and what the reader may do.
import "server-only";
import { and, asc, desc, eq, inArray, lt, sql } from "drizzle-orm";
import type { Database } from "@/db";
import { auditEvent, bench, benchRevision, lab, reviewDecision, user } from "@/db/schema";
import { rolesAllow } from "@/lib/auth/permissions";
import { diffBenches } from "@/lib/bench/diff";
import type { AnyBenchDocument } from "@/lib/bench/schema";
import { authorize, type Actor } from "./authorize";
import { COMMENTS_OPEN, ONCE_APPROVED, canMove, stateSentence } from "@/lib/review/transitions";
import { inScope } from "./scope";
import type { DecidedRow, QueueRow, ReviewDetail } from "@/lib/api/contracts/reviews";

import { decisionView, isAuthor, loadRevision } from "./reviews";
import { threadsOf } from "./review-comments";

export async function getReview(db: Database, actor: Actor, revisionId: string): Promise<ReviewDetail> {
  authorize(actor, { bench: ["read"] });
  const r = await loadRevision(db, actor, revisionId);
  const [decisionRow] = await db.select().from(reviewDecision).where(eq(reviewDecision.revisionId, r.id));
  const [approvedRow] = await db
    .select({ id: benchRevision.id, number: benchRevision.number, state: benchRevision.state, contentHash: benchRevision.contentHash, document: benchRevision.document })
    .from(benchRevision)
    .where(and(eq(benchRevision.benchId, r.benchId), lt(benchRevision.number, r.number), inArray(benchRevision.state, [...ONCE_APPROVED])))
    .orderBy(desc(benchRevision.number))
    .limit(1);
  const canReadReview = rolesAllow(actor.roles, { review: ["read"] });
  const threads = canReadReview ? await threadsOf(db, r.id) : [];
  const trailRows = await db
    .select({ at: auditEvent.at, action: auditEvent.action, actorName: user.name, detail: auditEvent.detail })
    .from(auditEvent)
    .leftJoin(user, eq(user.id, auditEvent.actorId))
    .where(and(eq(auditEvent.revisionId, r.id), sql`${auditEvent.action} like 'review-%'`))
    .orderBy(asc(auditEvent.at));

  const officer = rolesAllow(actor.roles, { review: ["decide"] });
  let whyNotDecide: string | null = null;
  if (!officer) whyNotDecide = "Only a laser safety officer can decide on a revision.";
  else if (isAuthor(actor, r)) whyNotDecide = "You drew this bench, so another safety officer has to review it.";
  else if (!canMove("approve", r.state)) whyNotDecide = stateSentence(r);

  return {
    revision: { id: r.id, number: r.number, state: r.state, contentHash: r.contentHash, document: r.document, updatedAt: r.updatedAt.toISOString() },
    bench: { id: r.benchId, title: r.benchTitle, labId: r.labId, labName: r.labName, authorName: r.authorName, authorId: r.authorId },
    decision: decisionRow ? decisionView(decisionRow) : null,
    lastApproved: approvedRow
      ? { id: approvedRow.id, number: approvedRow.number, state: approvedRow.state, contentHash: approvedRow.contentHash, diff: diffBenches(approvedRow.document as AnyBenchDocument, r.document) }
      : null,
    threads,
    trail: trailRows.map((t) => ({ at: t.at.toISOString(), action: t.action, actorName: t.actorName, detail: t.detail })),
    may: {
      decide: whyNotDecide === null,
      comment: rolesAllow(actor.roles, { review: ["comment"] }) && COMMENTS_OPEN(r.state),
      submit: r.authorId === actor.userId && rolesAllow(actor.roles, { bench: ["submit"] }) && canMove("submit", r.state),
      withdraw: r.authorId === actor.userId && rolesAllow(actor.roles, { bench: ["submit"] }) && canMove("withdraw", r.state),
      whyNotDecide,
    },
  };
}

/** The officer's queue (oldest waiting first) and the latest decisions. */
export async function reviewQueue(db: Database, actor: Actor): Promise<{ waiting: QueueRow[]; decided: DecidedRow[] }> {
  authorize(actor, { review: ["read"] });
  const scope = inScope(actor);
  const waiting = await db
    .select({
      revisionId: benchRevision.id,
      benchId: bench.id,
      title: bench.title,
      labName: lab.name,
      authorName: user.name,
      authorId: bench.authorId,
      number: benchRevision.number,
      contentHash: benchRevision.contentHash,
      submittedAt: benchRevision.updatedAt,
    })
    .from(benchRevision)
    .innerJoin(bench, eq(bench.id, benchRevision.benchId))
    .innerJoin(lab, eq(lab.id, bench.labId))
    .innerJoin(user, eq(user.id, bench.authorId))
    .where(and(scope, eq(benchRevision.state, "submitted")))
    .orderBy(asc(benchRevision.updatedAt));
  const decided = await db
    .select({
      revisionId: benchRevision.id,
      title: bench.title,
      labName: lab.name,
      number: benchRevision.number,
      state: benchRevision.state,
      outcome: reviewDecision.outcome,
      signerName: reviewDecision.signerName,
      decidedAt: reviewDecision.decidedAt,
      validUntil: reviewDecision.validUntil,
    })
    .from(reviewDecision)
    .innerJoin(benchRevision, eq(benchRevision.id, reviewDecision.revisionId))
    .innerJoin(bench, eq(bench.id, benchRevision.benchId))
    .innerJoin(lab, eq(lab.id, bench.labId))
    .where(scope)
    .orderBy(desc(reviewDecision.decidedAt))
    .limit(20);
  return {
    waiting: waiting.map(({ authorId, submittedAt, ...w }) => ({ ...w, submittedAt: submittedAt.toISOString(), mine: authorId === actor.userId })),
    decided: decided.map((d) => ({ ...d, decidedAt: d.decidedAt.toISOString(), validUntil: d.validUntil?.toISOString() ?? null })),
  };
}
