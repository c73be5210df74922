// The review workflow of a bench revision: submit, withdraw, decide (sign off, ask for changes, turn
// down), with the replacement of older sign-offs. The moves themselves are the review rules in
// lib/review/transitions.ts; here each state change, its e-mails and its audit row commit in one transaction.
// Comments: review-comments.ts; the review screen and queue: review-screen.ts; expiry: review-clock.ts.
import "server-only";
import { assertRegisterAllowsSubmission } from "./register";
import { and, eq, gt, lt, ne, sql } from "drizzle-orm";
import { verifyPassword } from "better-auth/crypto";
import { reserveAttempt } from "@/lib/auth/rate-limit";
import { z } from "zod";
import type { Database, DbOrTx } from "@/db";
import { account, bench, benchRevision, lab, labMember, reviewComment, reviewDecision, user, type DecisionOutcome, type HazardSummary, type ReviewState } from "@/db/schema";
import { ROLE_LABELS, parseRoles } from "@/lib/auth/permissions";
import { contentHash } from "@/lib/bench/canonical";
import { describeIssues, type AnyBenchDocument } from "@/lib/bench/schema";
import { anyBenchDocumentSchema } from "@/lib/bench/schema-v2";
import { AppError, notFound } from "@/lib/errors";
import { enqueueMail } from "@/lib/mail/outbox";
import { reviewDecisionMail, reviewSubmittedMail, reviewWithdrawnMail, type Recipient, type RevisionMailContext } from "@/lib/mail/review-mail";
import { labStandard } from "./lab-standard";
import { recordAudit } from "./audit";
import { authorize, type Actor } from "./authorize";
import { hazardSummary } from "@/lib/review/hazard";
import { DECISIONS, TRANSITIONS, canMove, refusal, stateSentence } from "@/lib/review/transitions";
import { validityEnd } from "@/lib/review/validity";
import { visibleOr404 } from "./scope";
import type { DecisionInput, DecisionView, submitInput } from "@/lib/api/contracts/reviews";

export { expireApprovals, runReviewClock, sendExpiryReminders } from "./review-clock";

// ── Loading ───────────────────────────────────────────────────────────────────────────────────
export type RevisionRow = {
  id: string;
  benchId: string;
  number: number;
  state: ReviewState;
  contentHash: string;
  /** Version 1 (a rail) or 2 (a table). */
  document: AnyBenchDocument;
  createdBy: string;
  updatedAt: Date;
  benchTitle: string;
  labId: string;
  labName: string;
  authorId: string;
  authorName: string;
  authorEmail: string;
};

/** One revision with its bench, lab and author; outside the actor's labs it does not exist (404). */
export async function loadRevision(db: DbOrTx, actor: Actor, revisionId: string, lock = false): Promise<RevisionRow> {
  if (!z.uuid().safeParse(revisionId).success) throw notFound("The revision");
  const query = db
    .select({
      id: benchRevision.id,
      benchId: benchRevision.benchId,
      number: benchRevision.number,
      state: benchRevision.state,
      contentHash: benchRevision.contentHash,
      document: benchRevision.document,
      createdBy: benchRevision.createdBy,
      updatedAt: benchRevision.updatedAt,
      benchTitle: bench.title,
      labId: bench.labId,
      labName: lab.name,
      authorId: bench.authorId,
      authorName: user.name,
      authorEmail: user.email,
    })
    .from(benchRevision)
    .innerJoin(bench, eq(bench.id, benchRevision.benchId))
    .innerJoin(lab, eq(lab.id, bench.labId))
    .innerJoin(user, eq(user.id, bench.authorId))
    .where(eq(benchRevision.id, revisionId));
  const [row] = lock ? await query.for("update", { of: benchRevision }) : await query;
  visibleOr404(actor, row, "The revision");
  return { ...row, document: row.document as AnyBenchDocument };
}

export function mailContext(r: RevisionRow): RevisionMailContext {
  return { benchTitle: r.benchTitle, labName: r.labName, revisionId: r.id, revisionNumber: r.number, contentHash: r.contentHash, authorName: r.authorName };
}

export function isAuthor(actor: Actor, r: Pick<RevisionRow, "authorId" | "createdBy">): boolean {
  return r.authorId === actor.userId || r.createdBy === actor.userId;
}

export async function usersWithRole(db: DbOrTx, role: "officer" | "technician", labId?: string): Promise<(Recipient & { id: string })[]> {
  const rows = labId
    ? await db
        .select({ id: user.id, email: user.email, name: user.name, role: user.role, banned: user.banned })
        .from(user)
        .innerJoin(labMember, and(eq(labMember.userId, user.id), eq(labMember.labId, labId)))
    : await db.select({ id: user.id, email: user.email, name: user.name, role: user.role, banned: user.banned }).from(user).where(sql`${user.role} like ${`%${role}%`}`);
  return rows.filter((r) => !r.banned && parseRoles(r.role).includes(role)).map(({ id, email, name }) => ({ id, email, name }));
}

// ── Submit and withdraw (the author) ──────────────────────────────────────────────────────────
export async function submitRevision(db: Database, actor: Actor, revisionId: string, input: z.infer<typeof submitInput>): Promise<{ state: ReviewState }> {
  authorize(actor, { bench: ["submit"] });
  return db.transaction(async (tx) => {
    const r = await loadRevision(tx, actor, revisionId, true);
    if (r.authorId !== actor.userId) throw new AppError("forbidden", `Only the bench's author, ${r.authorName}, can send it for review.`);
    const refused = refusal("submit", r);
    if (refused) throw new AppError("conflict", refused);
    if (input.contentHash && input.contentHash !== r.contentHash) {
      throw new AppError("conflict", `Revision ${r.number} has changed since you opened it; look at it again before sending it for review.`);
    }
    const [newer] = await tx
      .select({ number: benchRevision.number })
      .from(benchRevision)
      .where(and(eq(benchRevision.benchId, r.benchId), gt(benchRevision.number, r.number)))
      .limit(1);
    if (newer) throw new AppError("conflict", `Revision ${newer.number} of this bench is newer than revision ${r.number}; send the newest one for review.`);
    const [waiting] = await tx
      .select({ number: benchRevision.number })
      .from(benchRevision)
      .where(and(eq(benchRevision.benchId, r.benchId), eq(benchRevision.state, "submitted"), ne(benchRevision.id, r.id)))
      .limit(1);
    if (waiting) throw new AppError("conflict", `Revision ${waiting.number} of this bench is still waiting for review; withdraw it first.`);

    const parsed = anyBenchDocumentSchema.safeParse(r.document);
    if (!parsed.success) {
      const fields = describeIssues(parsed.error);
      throw new AppError("bad-request", `The bench cannot be sent for review yet: ${fields[0]?.message ?? "the drawing is incomplete"}.`, fields);
    }
    if (contentHash(parsed.data) !== r.contentHash) {
      throw new AppError("conflict", `Revision ${r.number}'s stored content hash does not match its drawing; save the bench again before sending it.`);
    }
    // A laser listed as out of service or disposed of in the register cannot be used in a new submission.
    await assertRegisterAllowsSubmission(tx, actor, parsed.data);

    // Bumping the draft counter makes any save still holding the old one get a conflict.
    await tx
      .update(benchRevision)
      .set({ state: TRANSITIONS.submit.to, version: sql`${benchRevision.version} + 1`, updatedAt: new Date() })
      .where(eq(benchRevision.id, r.id));
    await recordAudit(tx, actor, {
      action: TRANSITIONS.submit.auditAction,
      benchId: r.benchId,
      revisionId: r.id,
      contentHash: r.contentHash,
      detail: { from: r.state, to: TRANSITIONS.submit.to, number: r.number },
    });
    const ctx = mailContext(r);
    for (const officer of await usersWithRole(tx, "officer")) {
      if (officer.id === r.authorId) continue;
      await enqueueMail(tx, reviewSubmittedMail(officer, ctx));
    }
    return { state: TRANSITIONS.submit.to };
  });
}

export async function withdrawRevision(db: Database, actor: Actor, revisionId: string): Promise<{ state: ReviewState }> {
  authorize(actor, { bench: ["submit"] });
  return db.transaction(async (tx) => {
    const r = await loadRevision(tx, actor, revisionId, true);
    if (r.authorId !== actor.userId) throw new AppError("forbidden", `Only the bench's author, ${r.authorName}, can withdraw it from review.`);
    const refused = refusal("withdraw", r);
    if (refused) throw new AppError("conflict", refused);
    await tx.update(benchRevision).set({ state: TRANSITIONS.withdraw.to, updatedAt: new Date() }).where(eq(benchRevision.id, r.id));
    await recordAudit(tx, actor, {
      action: TRANSITIONS.withdraw.auditAction,
      benchId: r.benchId,
      revisionId: r.id,
      contentHash: r.contentHash,
      detail: { from: r.state, to: TRANSITIONS.withdraw.to, number: r.number },
    });
    // The officers were told it waits; tell them it no longer does, in the same transaction.
    const ctx = mailContext(r);
    for (const officer of await usersWithRole(tx, "officer")) {
      if (officer.id === r.authorId) continue;
      await enqueueMail(tx, reviewWithdrawnMail(officer, ctx));
    }
    return { state: TRANSITIONS.withdraw.to };
  });
}

// ── Decide (a safety officer who did not draw the bench) ──────────────────────────────────────
async function checkPassword(db: DbOrTx, userId: string, password: string): Promise<boolean> {
  const [row] = await db
    .select({ hash: account.password })
    .from(account)
    .where(and(eq(account.userId, userId), eq(account.providerId, "credential")));
  if (!row?.hash) return false;
  return verifyPassword({ hash: row.hash, password });
}

export function decisionView(row: typeof reviewDecision.$inferSelect): DecisionView {
  return {
    id: row.id,
    outcome: row.outcome,
    signerName: row.signerName,
    signerRole: row.signerRole,
    meaning: row.meaning,
    conditions: row.conditions,
    reason: row.reason,
    validUntil: row.validUntil?.toISOString() ?? null,
    contentHash: row.contentHash,
    hazardSummary: row.hazardSummary ?? null,
    decidedAt: row.decidedAt.toISOString(),
  };
}

/** The 409 for deciding on a revision that is not waiting, naming who decided on it if someone did. */
async function notWaiting(db: DbOrTx, r: RevisionRow): Promise<AppError> {
  const [existing] = await db.select().from(reviewDecision).where(eq(reviewDecision.revisionId, r.id));
  const by = existing ? ` ${existing.signerName} decided on it at ${existing.decidedAt.toISOString().slice(0, 16).replace("T", " ")} UTC.` : "";
  return new AppError("conflict", `${stateSentence(r)}${by} ${TRANSITIONS.approve.refusal}`);
}

export async function decideRevision(db: Database, actor: Actor, revisionId: string, input: DecisionInput): Promise<{ state: ReviewState; decision: DecisionView }> {
  authorize(actor, { review: ["decide"] });
  // Authorship and state are checked before the password, so the answer never depends on guessing it.
  const first = await loadRevision(db, actor, revisionId);
  if (isAuthor(actor, first)) {
    throw new AppError("forbidden", "You drew this bench, so another safety officer has to review it; nobody signs off their own work.");
  }
  if (!canMove(input.outcome, first.state)) throw await notWaiting(db, first);
  if (input.outcome === "approve") {
    // The step-up is limited like sign-in: per account and per address, counted in the database.
    const attempt = await reserveAttempt(db, "step-up", { account: actor.userId, address: actor.ipAddress });
    if (!attempt.allowed) {
      await recordAudit(db, actor, { action: "sign-off-password-limited", benchId: first.benchId, revisionId: first.id, contentHash: first.contentHash });
      throw new AppError("rate-limited", attempt.refusal ?? "Too many wrong signing password attempts; wait, then try again.");
    }
    if (await checkPassword(db, actor.userId, input.password)) await attempt.release();
    else {
      await recordAudit(db, actor, {
        action: "sign-off-password-refused",
        benchId: first.benchId,
        revisionId: first.id,
        contentHash: first.contentHash,
      });
      throw new AppError("forbidden", "That password is not right, so nothing was signed. Enter your own Benchwarden password again.", [
        { path: "password", message: "The password is not right" },
      ]);
    }
  }

  try {
    return await db.transaction(async (tx) => {
      const r = await loadRevision(tx, actor, revisionId, true);
      if (!canMove(input.outcome, r.state)) throw await notWaiting(tx, r);
      if (input.contentHash !== r.contentHash) {
        throw new AppError("conflict", `Revision ${r.number} is not the one you reviewed (its content hash differs); open it again before deciding.`);
      }
      const parsed = anyBenchDocumentSchema.safeParse(r.document);
      if (!parsed.success || contentHash(parsed.data) !== r.contentHash) {
        throw new AppError("conflict", `Revision ${r.number}'s drawing does not match its content hash, so it cannot be signed; ask the author to save it again.`);
      }

      const now = new Date();
      const outcome: DecisionOutcome = DECISIONS[input.outcome].outcome;
      const supersede: { id: string; number: number; contentHash: string }[] = [];
      let validUntil: Date | null = null;
      let summary: HazardSummary | null = null;
      if (input.outcome === "approve") {
        validUntil = validityEnd(now, input.validUntil);
        const [newerApproved] = await tx
          .select({ number: benchRevision.number })
          .from(benchRevision)
          .where(and(eq(benchRevision.benchId, r.benchId), eq(benchRevision.state, "approved"), gt(benchRevision.number, r.number)))
          .limit(1);
        if (newerApproved) throw new AppError("conflict", `Revision ${newerApproved.number} of this bench is already signed off and is newer than revision ${r.number}.`);
        supersede.push(
          ...(await tx
            .select({ id: benchRevision.id, number: benchRevision.number, contentHash: benchRevision.contentHash })
            .from(benchRevision)
            .where(and(eq(benchRevision.benchId, r.benchId), eq(benchRevision.state, "approved"), lt(benchRevision.number, r.number)))
            .for("update")),
        );
        summary = hazardSummary(parsed.data, { standard: await labStandard(tx, r.labId) });
      }
      const signerRole = ROLE_LABELS.officer;
      const [decision] = await tx
        .insert(reviewDecision)
        .values({
          revisionId: r.id,
          benchId: r.benchId,
          outcome,
          signerId: actor.userId,
          signerName: actor.name,
          signerRole,
          meaning: DECISIONS[input.outcome].meaning,
          conditions: input.outcome === "approve" ? input.conditions || null : null,
          reason: input.outcome === "reject" ? input.reason : input.outcome === "request-changes" ? input.comment : null,
          validUntil,
          contentHash: r.contentHash,
          hazardSummary: summary,
          stepUpVerified: input.outcome === "approve",
        })
        .returning();
      await tx.update(benchRevision).set({ state: TRANSITIONS[input.outcome].to, updatedAt: now }).where(eq(benchRevision.id, r.id));
      await recordAudit(tx, actor, {
        action: TRANSITIONS[input.outcome].auditAction,
        benchId: r.benchId,
        revisionId: r.id,
        contentHash: r.contentHash,
        detail: {
          from: r.state,
          to: TRANSITIONS[input.outcome].to,
          number: r.number,
          decisionId: decision.id,
          meaning: decision.meaning,
          conditions: decision.conditions,
          reason: decision.reason,
          validUntil: validUntil?.toISOString() ?? null,
          stepUpVerified: decision.stepUpVerified,
        },
    });
      if (input.outcome === "request-changes") {
        // The officer's words open a thread the author can answer.
        const id = crypto.randomUUID();
        await tx.insert(reviewComment).values({
          id,
          revisionId: r.id,
          benchId: r.benchId,
          threadId: id,
          authorId: actor.userId,
          authorName: actor.name,
          authorRole: signerRole,
          body: input.comment,
        });
      }
      for (const old of supersede) {
        await tx.update(benchRevision).set({ state: TRANSITIONS.supersede.to, updatedAt: now }).where(eq(benchRevision.id, old.id));
        await recordAudit(tx, actor, {
          action: TRANSITIONS.supersede.auditAction,
          benchId: r.benchId,
          revisionId: old.id,
          contentHash: old.contentHash,
          detail: { from: "approved", to: TRANSITIONS.supersede.to, number: old.number, replacedBy: { revisionId: r.id, number: r.number } },
    });
      }

      const ctx = mailContext(r);
      const recipients = new Map<string, Recipient>([[r.authorEmail, { email: r.authorEmail, name: r.authorName }]]);
      for (const t of await usersWithRole(tx, "technician", r.labId)) recipients.set(t.email, { ...t, builds: true });
      for (const to of recipients.values()) {
        await enqueueMail(
          tx,
          reviewDecisionMail(to, ctx, {
            outcome,
            signerName: actor.name,
            signerRole,
            decidedAt: decision.decidedAt,
            meaning: decision.meaning,
            conditions: decision.conditions,
            reason: decision.reason,
            validUntil,
            supersededNumbers: supersede.map((s) => s.number),
          }),
        );
      }
      return { state: outcome as ReviewState, decision: decisionView(decision) };
    });
  } catch (error) {
    // The unique index is the last guard against two officers deciding at the same instant.
    if (error instanceof Error && /review_decision_revision_idx/.test(`${error.message} ${String((error as { cause?: unknown }).cause ?? "")}`)) {
      throw new AppError("conflict", `Another safety officer decided on revision ${first.number} a moment ago.`);
    }
    throw error;
  }
}
