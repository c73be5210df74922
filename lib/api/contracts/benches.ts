// The bench contract: request bodies of the bench and draft routes (zod) and the shapes they answer with, imported by
// the route handlers, lib/server/benches.ts, lib/server/drafts.ts and the browser's hooks alike (no server-only code).
import { z } from "zod";
import type { ReviewState } from "@/db/schema";
import type { AnyBenchDocument, BenchDocument } from "@/lib/bench/schema";
import { anyBenchDocumentSchema, tableSchema } from "@/lib/bench/schema-v2";
import { safeText } from "@/lib/validation/text";

// ── Inputs ─────────────────────────────────────────────────────────────────────────────────────
export const createBenchInput = z.object({
  labId: z.uuid({ error: "Choose the lab the bench belongs to" }),
  title: safeText({ error: "Give the bench a title" }).trim().min(1, "Give the bench a title").max(200, "The title must be at most 200 characters"),
  /** Given: the bench is an optical table of this size (bench document version 2); absent: a straight rail (version 1). */
  table: tableSchema.optional(),
});
export type CreateBenchInput = z.infer<typeof createBenchInput>;

export const saveDraftInput = z.object({
  document: anyBenchDocumentSchema,
  baseRevision: z.number({ error: "baseRevision must be the revision number the edit started from" }).int().positive(),
  baseVersion: z.number({ error: "baseVersion must be the version the edit started from" }).int().positive(),
});
export type SaveDraftInput = z.infer<typeof saveDraftInput>;

export const makeRevisionInput = z.object({
  baseRevision: z.number({ error: "baseRevision must be the revision number the drawing is based on" }).int().positive(),
  baseVersion: z.number({ error: "baseVersion must be the version the drawing is based on" }).int().positive(),
});
export type MakeRevisionInput = z.infer<typeof makeRevisionInput>;

// ── Answers ────────────────────────────────────────────────────────────────────────────────────
export type DraftView<D extends AnyBenchDocument = AnyBenchDocument> = {
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
  /** Version 1 (a rail) or version 2 (a table); a stored version 1 document loads exactly as it was saved. */
  document: D;
  updatedAt: string;
  /** True when the caller may save (bench: edit and a member of the bench's lab). */
  canEdit: boolean;
};
/** A draft known to hold a rail (version 1), as the rail editor works on it. */
export type RailDraftView = DraftView<BenchDocument>;

export type FrozenRevision = { revisionId: string; number: number; contentHash: string };
/** "Make a revision": the frozen revision and the new draft, or the server's draft when the edit was based on an older one. */
export type MakeRevisionResult = { ok: true; draft: DraftView; frozen: FrozenRevision } | { ok: false; current: DraftView };
/** A save: the saved draft (and whether it started a new revision), or the server's draft when the edit was based on an older one. */
export type SaveDraftResult = { ok: true; draft: DraftView; createdRevision: boolean } | { ok: false; current: DraftView };
