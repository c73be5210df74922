// The working draft of a bench: read it, and save it with optimistic concurrency (revision number + version).
// A save based on anything but the newest revision's current version is refused with the server's draft; a save
// on top of a revision that is no longer a draft (submitted, approved, …) starts a new draft revision instead.
import "server-only";
import { desc, eq } from "drizzle-orm";
import { z } from "zod";
import type { Database, DbOrTx } from "@/db";
import { bench, benchRevision, type ReviewState } from "@/db/schema";
import { rolesAllow } from "@/lib/auth/permissions";
import { contentHash } from "@/lib/bench/canonical";
import { benchDocumentSchema, type BenchDocument } from "@/lib/bench/schema";
import { notFound } from "@/lib/errors";
import { recordAudit } from "./audit";
import { authorize, authorizeLab, type Actor } from "./authorize";

export type DraftView = {
  benchId: string;
  labId: string;
  title: string;
  /** The newest revision: the working draft, or the revision a save will start a new draft from. */
  revisionId: string;
  revisionNumber: number;
  state: ReviewState;
  /** Optimistic-concurrency counter of that revision; a save must name it. */
  version: number;
  contentHash: string;
  document: BenchDocument;
  updatedAt: string;
  /** True when the caller may save (bench: edit and a member of the bench's lab). */
  canEdit: boolean;
};

export const saveDraftInput = z.object({
  document: benchDocumentSchema,
  baseRevision: z.number({ error: "baseRevision must be the revision number the edit started from" }).int().positive(),
  baseVersion: z.number({ error: "baseVersion must be the version the edit started from" }).int().positive(),
});
export type SaveDraftInput = z.infer<typeof saveDraftInput>;

export type SaveDraftResult = { ok: true; draft: DraftView; createdRevision: boolean } | { ok: false; current: DraftView };

type BenchRow = { id: string; labId: string; title: string };

async function visibleBench(db: DbOrTx, actor: Actor, benchId: string, lock: boolean): Promise<BenchRow> {
  if (!z.uuid().safeParse(benchId).success) throw notFound("The bench");
  const query = db.select({ id: bench.id, labId: bench.labId, title: bench.title }).from(bench).where(eq(bench.id, benchId));
  const [row] = lock ? await query.for("update") : await query;
  if (!row) throw notFound("The bench");
  try {
    authorizeLab(actor, row.labId);
  } catch {
    // Outside the actor's labs the bench does not exist, the same answer as a missing one.
    throw notFound("The bench");
  }
  return row;
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
    document: r.document as BenchDocument,
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

/**
 * Saves the working draft. Only researchers of the bench's lab may. The bench row is locked for the transaction,
 * so two saves of one bench are serialised and exactly one of two saves based on the same version wins.
 */
export async function saveDraft(db: Database, actor: Actor, benchId: string, input: SaveDraftInput): Promise<SaveDraftResult> {
  authorize(actor, { bench: ["edit"] });
  return db.transaction(async (tx) => {
    const row = await visibleBench(tx, actor, benchId, true);
    if (!actor.labIds.includes(row.labId)) {
      // Officers and auditors see every lab but edit none; a researcher must belong to the bench's lab.
      authorizeLab({ ...actor, allLabs: false }, row.labId);
    }
    const latest = await latestRevision(tx, benchId);
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
    await recordAudit(tx, {
      actorId: actor.userId,
      actorRole: actor.roles.join(","),
      action: createdRevision ? "draft-revision-started" : "draft-saved",
      benchId,
      revisionId: saved.id,
      contentHash: hash,
      ipAddress: actor.ipAddress,
      detail: { number: saved.number, version: saved.version, basedOn: { revision: input.baseRevision, version: input.baseVersion }, elements: document.elements.length },
    });
    return { ok: true as const, draft: view(actor, current, saved), createdRevision };
  });
}
