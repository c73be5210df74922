// The working draft of a bench: read it, save it with optimistic concurrency (revision number + version), and make
// a revision of it. Saves only ever go to the newest revision: a save based on anything but its current version is
// refused with the server's draft, so an older revision (frozen by "make a revision", or sent for review) can never
// change; a save on top of a revision that is no longer a draft (submitted, approved, …) starts a new draft revision.
import "server-only";
import { desc, eq } from "drizzle-orm";
import { z } from "zod";
import type { Database, DbOrTx } from "@/db";
import { bench, benchRevision } from "@/db/schema";
import { rolesAllow } from "@/lib/auth/permissions";
import { contentHash } from "@/lib/bench/canonical";
import { anyBenchDocumentSchema } from "@/lib/bench/schema-v2";
import type { AnyBenchDocument } from "@/lib/bench/schema";
import { AppError, notFound } from "@/lib/errors";
import { recordAudit } from "./audit";
import { authorize, authorizeLab, type Actor } from "./authorize";
import { visibleOr404 } from "./scope";
import type { DraftView, MakeRevisionInput, MakeRevisionResult, SaveDraftInput, SaveDraftResult } from "@/lib/api/contracts/benches";

type BenchRow = { id: string; labId: string; title: string };

async function visibleBench(db: DbOrTx, actor: Actor, benchId: string, lock: boolean): Promise<BenchRow> {
  if (!z.uuid().safeParse(benchId).success) throw notFound("The bench");
  const query = db.select({ id: bench.id, labId: bench.labId, title: bench.title }).from(bench).where(eq(bench.id, benchId));
  const [row] = lock ? await query.for("update") : await query;
  return visibleOr404(actor, row, "The bench");
}

async function latestRevision(db: DbOrTx, benchId: string) {
  const [latest] = await db.select().from(benchRevision).where(eq(benchRevision.benchId, benchId)).orderBy(desc(benchRevision.number)).limit(1);
  if (!latest) throw notFound("The bench's draft");
  return latest;
}

function canEdit(actor: Actor, labId: string): boolean {
  return rolesAllow(actor.roles, { bench: ["edit"] }) && actor.labIds.includes(labId);
}

function view(actor: Actor, row: BenchRow, r: typeof benchRevision.$inferSelect): DraftView {
  return {
    benchId: row.id,
    labId: row.labId,
    title: row.title,
    revisionId: r.id,
    revisionNumber: r.number,
    state: r.state,
    version: r.version,
    contentHash: r.contentHash,
    document: r.document as AnyBenchDocument,
    updatedAt: r.updatedAt.toISOString(),
    canEdit: canEdit(actor, row.labId),
  };
}

/** The newest revision of a bench the actor may see. */
export async function getDraft(db: Database, actor: Actor, benchId: string): Promise<DraftView> {
  authorize(actor, { bench: ["read"] });
  const row = await visibleBench(db, actor, benchId, false);
  return view(actor, row, await latestRevision(db, benchId));
}

/** Only researchers of the bench's lab may change it; officers and auditors see every lab but edit none. */
function assertMember(actor: Actor, labId: string): void {
  if (!actor.labIds.includes(labId)) authorizeLab({ ...actor, allLabs: false }, labId);
}

/**
 * Saves the working draft. Only researchers of the bench's lab may. The bench row is locked for the transaction,
 * so two saves of one bench are serialised and exactly one of two saves based on the same version wins.
 */
export async function saveDraft(db: Database, actor: Actor, benchId: string, input: SaveDraftInput): Promise<SaveDraftResult> {
  authorize(actor, { bench: ["edit"] });
  return db.transaction(async (tx) => {
    const row = await visibleBench(tx, actor, benchId, true);
    assertMember(actor, row.labId);
    const latest = await latestRevision(tx, benchId);
    // Only the newest revision takes saves; naming an older (frozen) one is a conflict like any stale version.
    if (latest.number !== input.baseRevision || latest.version !== input.baseVersion) {
      return { ok: false as const, current: view(actor, row, latest) };
    }
    const document = input.document;
    const hash = contentHash(document);
    const now = new Date();
    let saved: typeof benchRevision.$inferSelect;
    let createdRevision = false;
    if (latest.state === "draft") {
      [saved] = await tx
        .update(benchRevision)
        .set({ document, contentHash: hash, version: latest.version + 1, updatedAt: now })
        .where(eq(benchRevision.id, latest.id))
        .returning();
    } else {
      // The newest revision is frozen (submitted, approved, …): it stays exactly as it is.
      [saved] = await tx
        .insert(benchRevision)
        .values({ benchId, number: latest.number + 1, document, contentHash: hash, state: "draft", version: 1, createdBy: actor.userId })
        .returning();
      createdRevision = true;
    }
    const title = document.title?.trim();
    let current = row;
    if (title && title !== row.title) {
      await tx.update(bench).set({ title, updatedAt: now }).where(eq(bench.id, benchId));
      current = { ...row, title };
    }
    await recordAudit(tx, actor, {
      action: createdRevision ? "draft-revision-started" : "draft-saved",
      benchId,
      revisionId: saved.id,
      contentHash: hash,
      detail: { number: saved.number, version: saved.version, basedOn: { revision: input.baseRevision, version: input.baseVersion }, elements: document.elements.length },
    });
    return { ok: true as const, draft: view(actor, current, saved), createdRevision };
  });
}

/**
 * "Make a revision": freezes the working draft as it is (it keeps its number, content hash and state "draft", but is
 * no longer the newest, so no save can reach it) and starts revision n+1 as the new working draft with the same
 * document. Based on a stale revision or version the answer is the server's draft, as for a save.
 */
export async function makeRevision(db: Database, actor: Actor, benchId: string, input: MakeRevisionInput): Promise<MakeRevisionResult> {
  authorize(actor, { bench: ["edit"] });
  return db.transaction(async (tx) => {
    const row = await visibleBench(tx, actor, benchId, true);
    assertMember(actor, row.labId);
    const latest = await latestRevision(tx, benchId);
    if (latest.number !== input.baseRevision || latest.version !== input.baseVersion) {
      return { ok: false as const, current: view(actor, row, latest) };
    }
    if (latest.state !== "draft") {
      throw new AppError(
        "conflict",
        `Revision ${latest.number} is no longer a draft, so it is already fixed as it is; your next change starts revision ${latest.number + 1} on its own.`,
      );
    }
    const document = latest.document as AnyBenchDocument;
    const complete = anyBenchDocumentSchema.safeParse(document);
    if (!complete.success) {
      const first = (complete.error.issues[0]?.message ?? "the drawing is not complete").replace(/\.$/, "");
      throw new AppError("bad-request", `Revision ${latest.number} cannot be made into a revision yet: ${first}.`);
    }
    const [created] = await tx
      .insert(benchRevision)
      .values({ benchId, number: latest.number + 1, document, contentHash: latest.contentHash, state: "draft", version: 1, createdBy: actor.userId })
      .returning();
    await recordAudit(tx, actor, {
      action: "revision-made",
      benchId,
      revisionId: latest.id,
      contentHash: latest.contentHash,
      detail: { number: latest.number, version: latest.version, newDraft: { number: created.number, revisionId: created.id }, elements: document.elements.length },
    });
    return { ok: true as const, draft: view(actor, row, created), frozen: { revisionId: latest.id, number: latest.number, contentHash: latest.contentHash } };
  });
}
