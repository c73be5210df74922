// Review comments: threads on a revision (optionally pinned to an element), each comment e-mailed to the
// other party and audited in the same transaction.
import "server-only";
import { and, asc, eq, sql } from "drizzle-orm";
import type { Database, DbOrTx } from "@/db";
import { reviewComment, reviewDecision, user } from "@/db/schema";
import { ROLE_LABELS, rolesAllow } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { enqueueMail } from "@/lib/mail/outbox";
import { reviewCommentMail, type Recipient } from "@/lib/mail/review-mail";
import { recordAudit } from "./audit";
import { authorize, type Actor } from "./authorize";
import { COMMENTS_OPEN } from "@/lib/review/transitions";
import type { CommentInput, CommentThread, CommentView } from "@/lib/api/contracts/reviews";

import { isAuthor, loadRevision, mailContext, usersWithRole } from "./reviews";

export async function addComment(db: Database, actor: Actor, revisionId: string, input: CommentInput): Promise<CommentView> {
  authorize(actor, { review: ["comment"] });
  return db.transaction(async (tx) => {
    const r = await loadRevision(tx, actor, revisionId);
    if (!COMMENTS_OPEN(r.state)) throw new AppError("conflict", `Revision ${r.number} is still a draft; comments open once it is sent for review.`);
    let threadId: string | null = null;
    let elementId = input.elementId ?? null;
    if (input.parentId) {
      const [parent] = await tx.select().from(reviewComment).where(and(eq(reviewComment.id, input.parentId), eq(reviewComment.revisionId, r.id)));
      if (!parent) throw new AppError("bad-request", "The comment you are answering is not on this revision.", [{ path: "parentId", message: "Not a comment on this revision" }]);
      threadId = parent.threadId;
      elementId = parent.elementId;
    }
    if (elementId && !r.document.elements.some((e) => e.id === elementId)) {
      throw new AppError("bad-request", `There is no element "${elementId}" on revision ${r.number}.`, [{ path: "elementId", message: "No such element on this revision" }]);
    }
    const id = crypto.randomUUID();
    const role = rolesAllow(actor.roles, { review: ["decide"] }) && !isAuthor(actor, r) ? ROLE_LABELS.officer : actor.roles.map((x) => ROLE_LABELS[x]).join(", ");
    const [row] = await tx
      .insert(reviewComment)
      .values({ id, revisionId: r.id, benchId: r.benchId, threadId: threadId ?? id, parentId: input.parentId ?? null, elementId, authorId: actor.userId, authorName: actor.name, authorRole: role, body: input.body })
      .returning();
    await recordAudit(tx, actor, {
      action: "review-comment",
      benchId: r.benchId,
      revisionId: r.id,
      contentHash: r.contentHash,
      detail: { commentId: row.id, threadId: row.threadId, elementId, length: input.body.length },
    });

    // The other party: the author hears from reviewers; reviewers (or, before any, every officer) hear from the author.
    const recipients = new Map<string, Recipient>();
    if (actor.userId !== r.authorId) recipients.set(r.authorEmail, { email: r.authorEmail, name: r.authorName });
    else {
      const involved = await tx
        .selectDistinct({ email: user.email, name: user.name, id: user.id })
        .from(user)
        .where(
          sql`${user.id} in (select ${reviewComment.authorId} from ${reviewComment} where ${reviewComment.revisionId} = ${r.id}
              union select ${reviewDecision.signerId} from ${reviewDecision} where ${reviewDecision.revisionId} = ${r.id})`,
        );
      const others = involved.filter((u) => u.id !== actor.userId);
      for (const u of others.length ? others : await usersWithRole(tx, "officer")) if (u.id !== actor.userId) recipients.set(u.email, u);
    }
    const ctx = mailContext(r);
    for (const to of recipients.values()) {
      await enqueueMail(tx, reviewCommentMail(to, ctx, { commenterName: actor.name, commenterRole: role, body: input.body, elementId }));
    }
    return commentView(row);
  });
}

function commentView(row: typeof reviewComment.$inferSelect): CommentView {
  return {
    id: row.id,
    threadId: row.threadId,
    parentId: row.parentId,
    elementId: row.elementId,
    authorName: row.authorName,
    authorRole: row.authorRole,
    body: row.body,
    createdAt: row.createdAt.toISOString(),
  };
}

export async function threadsOf(db: DbOrTx, revisionId: string): Promise<CommentThread[]> {
  const rows = await db.select().from(reviewComment).where(eq(reviewComment.revisionId, revisionId)).orderBy(asc(reviewComment.createdAt));
  const threads = new Map<string, CommentThread>();
  for (const row of rows) {
    const thread = threads.get(row.threadId) ?? { id: row.threadId, elementId: row.elementId, comments: [] };
    thread.comments.push(commentView(row));
    threads.set(row.threadId, thread);
  }
  return [...threads.values()];
}

export async function listComments(db: Database, actor: Actor, revisionId: string): Promise<CommentThread[]> {
  authorize(actor, { review: ["read"] });
  const r = await loadRevision(db, actor, revisionId);
  return threadsOf(db, r.id);
}

