// The review clock: sign-offs whose validity has ended become expired, and reminders go out 30
// and 7 days before. Kept free of 'server-only' so the mail worker process can run it each round.
import { and, eq, gt, lte, sql } from "drizzle-orm";
import type { Database, DbOrTx } from "@/db";
import { bench, benchRevision, lab, reviewDecision, reviewReminder, user, type ReminderKind } from "@/db/schema";
import { enqueueMail } from "@/lib/mail/outbox";
import { TRANSITIONS } from "@/lib/review/transitions";
import { approvalExpiredMail, expiryReminderMail, type Recipient, type RevisionMailContext } from "@/lib/mail/review-mail";
import { recordAudit, SYSTEM_ACTOR } from "./audit";

const REMINDER_DAYS: Record<ReminderKind, number> = { "30-days": 30, "7-days": 7 };
const DAY_MS = 24 * 60 * 60 * 1000;

type DueRow = {
  revision_id: string;
  decision_id: string;
  valid_until: Date;
  signer_id: string;
  signer_name: string;
};

async function contextForSystem(db: DbOrTx, revisionId: string): Promise<{ ctx: RevisionMailContext; author: Recipient; benchId: string; contentHash: string }> {
  const [row] = await db
    .select({
      id: benchRevision.id,
      number: benchRevision.number,
      contentHash: benchRevision.contentHash,
      benchId: bench.id,
      benchTitle: bench.title,
      labName: lab.name,
      authorName: user.name,
      authorEmail: user.email,
    })
    .from(benchRevision)
    .innerJoin(bench, eq(bench.id, benchRevision.benchId))
    .innerJoin(lab, eq(lab.id, bench.labId))
    .innerJoin(user, eq(user.id, bench.authorId))
    .where(eq(benchRevision.id, revisionId));
  return {
    ctx: { benchTitle: row.benchTitle, labName: row.labName, revisionId: row.id, revisionNumber: row.number, contentHash: row.contentHash, authorName: row.authorName },
    author: { email: row.authorEmail, name: row.authorName },
    benchId: row.benchId,
    contentHash: row.contentHash,
  };
}

async function signer(db: DbOrTx, signerId: string, signerName: string): Promise<Recipient | null> {
  const [row] = await db.select({ email: user.email, name: user.name, banned: user.banned }).from(user).where(eq(user.id, signerId));
  return row && !row.banned ? { email: row.email, name: row.name ?? signerName } : null;
}

/** Marks every sign-off whose validity has ended as expired, telling the author and the signer. Returns how many. */
export async function expireApprovals(db: Database, now: Date = new Date()): Promise<number> {
  let expired = 0;
  for (;;) {
    const done = await db.transaction(async (tx) => {
      const due = await tx.execute<DueRow>(sql`
        select r.id as revision_id, d.id as decision_id, d.valid_until, d.signer_id, d.signer_name
        from bench_revision r join review_decision d on d.revision_id = r.id
        where r.state = 'approved' and d.outcome = 'approved' and d.valid_until <= ${now.toISOString()}::timestamptz
        order by d.valid_until limit 1 for update of r skip locked`);
      const row = due.rows[0];
      if (!row) return false;
      const validUntil = new Date(row.valid_until);
      await tx.update(benchRevision).set({ state: TRANSITIONS.expire.to, updatedAt: now }).where(eq(benchRevision.id, row.revision_id));
      const { ctx, author, benchId, contentHash: hash } = await contextForSystem(tx, row.revision_id);
      await recordAudit(tx, SYSTEM_ACTOR, {
        action: TRANSITIONS.expire.auditAction,
        benchId,
        revisionId: row.revision_id,
        contentHash: hash,
        detail: { from: "approved", to: TRANSITIONS.expire.to, decisionId: row.decision_id, validUntil: validUntil.toISOString() },
      });
      const to = new Map<string, Recipient>([[author.email, author]]);
      const s = await signer(tx, row.signer_id, row.signer_name);
      if (s) to.set(s.email, s);
      for (const r of to.values()) await enqueueMail(tx, approvalExpiredMail(r, ctx, { validUntil, signerName: row.signer_name }));
      return true;
    });
    if (!done) return expired;
    expired++;
  }
}

/** Writes the 30-day and 7-day expiry reminders that are due, each at most once per sign-off. Returns how many. */
export async function sendExpiryReminders(db: Database, now: Date = new Date()): Promise<number> {
  const horizon = new Date(now.getTime() + REMINDER_DAYS["30-days"] * DAY_MS);
  const candidates = await db
    .select({ decisionId: reviewDecision.id, revisionId: reviewDecision.revisionId, validUntil: reviewDecision.validUntil, signerId: reviewDecision.signerId, signerName: reviewDecision.signerName })
    .from(reviewDecision)
    .innerJoin(benchRevision, eq(benchRevision.id, reviewDecision.revisionId))
    .where(and(eq(benchRevision.state, "approved"), eq(reviewDecision.outcome, "approved"), gt(reviewDecision.validUntil, now), lte(reviewDecision.validUntil, horizon)));
  let written = 0;
  for (const c of candidates) {
    const validUntil = c.validUntil as Date;
    const msLeft = validUntil.getTime() - now.getTime();
    const kind: ReminderKind = msLeft <= REMINDER_DAYS["7-days"] * DAY_MS ? "7-days" : "30-days";
    await db.transaction(async (tx) => {
      // The unique (decision, kind) key makes a second worker, or a second round, write nothing.
      const inserted = await tx.insert(reviewReminder).values({ decisionId: c.decisionId, kind }).onConflictDoNothing().returning({ id: reviewReminder.id });
      if (inserted.length === 0) return;
      const { ctx, author } = await contextForSystem(tx, c.revisionId);
      const daysLeft = Math.max(1, Math.ceil(msLeft / DAY_MS));
      const to = new Map<string, Recipient>([[author.email, author]]);
      const s = await signer(tx, c.signerId, c.signerName);
      if (s) to.set(s.email, s);
      for (const r of to.values()) await enqueueMail(tx, expiryReminderMail(r, ctx, { daysLeft, validUntil, signerName: c.signerName }));
      written++;
    });
  }
  return written;
}

/** One round of the review clock, for the mail worker's loop. */
export async function runReviewClock(db: Database, now: Date = new Date()): Promise<{ expired: number; reminders: number }> {
  const expired = await expireApprovals(db, now);
  const reminders = await sendExpiryReminders(db, now);
  return { expired, reminders };
}
