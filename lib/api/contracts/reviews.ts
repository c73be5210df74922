// The review contract: request bodies of the review routes (zod) and the shapes they answer with, imported by
// the route handlers, lib/server/reviews.ts and the browser alike (no server-only code here).
import { z } from "zod";
import { safeText } from "@/lib/validation/text";
import type { DecisionOutcome, HazardSummary, ReviewState } from "@/db/schema";
import type { BenchDiff } from "@/lib/bench/diff";
import type { AnyBenchDocument } from "@/lib/bench/schema";

// ── Inputs (the one contract for routes and client forms) ─────────────────────────────────────
export const hashField = safeText({ error: "Send the content hash of the revision you reviewed" }).regex(/^[0-9a-f]{64}$/, "The content hash must be 64 hexadecimal characters");

export const submitInput = z.object({ contentHash: hashField.optional() });

export const withdrawInput = z.object({});

export const decisionInput = z.discriminatedUnion(
  "outcome",
  [
    z.object({
      outcome: z.literal("approve"),
      contentHash: hashField,
      password: safeText({ error: "Enter your password to sign" }).min(1, "Enter your password to sign"),
      conditions: safeText().trim().max(4000, "Conditions must be at most 4000 characters").optional(),
      /** The last day the sign-off holds (YYYY-MM-DD); 12 months from today when left out. */
      validUntil: z.iso.date({ error: "Valid until must be a date (YYYY-MM-DD)" }).optional(),
    }),
    z.object({
      outcome: z.literal("request-changes"),
      contentHash: hashField,
      comment: safeText({ error: "Say what has to change" }).trim().min(1, "Say what has to change").max(4000, "The comment must be at most 4000 characters"),
    }),
    z.object({
      outcome: z.literal("reject"),
      contentHash: hashField,
      reason: safeText({ error: "Give the reason for turning it down" }).trim().min(1, "Give the reason for turning it down").max(4000, "The reason must be at most 4000 characters"),
    }),
  ],
  { error: "Choose approve, request-changes or reject" },
);

export type DecisionInput = z.infer<typeof decisionInput>;

export const commentInput = z.object({
  body: safeText({ error: "Write the comment" }).trim().min(1, "Write the comment").max(4000, "A comment must be at most 4000 characters"),
  elementId: safeText().min(1).max(64).optional(),
  parentId: z.uuid({ error: "The comment to answer is not a valid id" }).optional(),
});

export type CommentInput = z.infer<typeof commentInput>;

export type DecisionView = {
  id: string;
  outcome: DecisionOutcome;
  signerName: string;
  signerRole: string;
  meaning: string;
  conditions: string | null;
  reason: string | null;
  validUntil: string | null;
  contentHash: string;
  hazardSummary: HazardSummary | null;
  decidedAt: string;
};

// ── Comments ──────────────────────────────────────────────────────────────────────────────────
export type CommentView = {
  id: string;
  threadId: string;
  parentId: string | null;
  elementId: string | null;
  authorName: string;
  authorRole: string;
  body: string;
  createdAt: string;
};

export type CommentThread = { id: string; elementId: string | null; comments: CommentView[] };

// ── Reading: the review screen and the queue ──────────────────────────────────────────────────
export type ReviewDetail = {
  revision: { id: string; number: number; state: ReviewState; contentHash: string; document: AnyBenchDocument; updatedAt: string };
  bench: { id: string; title: string; labId: string; labName: string; authorName: string; authorId: string };
  decision: DecisionView | null;
  /** The newest earlier revision that was ever signed off, and what changed since. */
  lastApproved: { id: string; number: number; state: ReviewState; contentHash: string; diff: BenchDiff } | null;
  threads: CommentThread[];
  trail: { at: string; action: string; actorName: string | null; detail: Record<string, unknown> }[];
  may: { decide: boolean; comment: boolean; submit: boolean; withdraw: boolean; whyNotDecide: string | null };
};

export type QueueRow = { revisionId: string; benchId: string; title: string; labName: string; authorName: string; number: number; contentHash: string; submittedAt: string; mine: boolean };

export type DecidedRow = { revisionId: string; title: string; labName: string; number: number; state: ReviewState; outcome: DecisionOutcome; signerName: string; decidedAt: string; validUntil: string | null };
