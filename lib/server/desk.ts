// The auditor's desk (read-only): every sign-off with server-side paging, sorting and filters, a
// bench's whole trail as one timeline, and both as CSV streamed in keyset batches (never built in memory).
import "server-only";
import { ACTION_WORDS, OUTCOME_WORDS, REVIEW_STATE_WORDS } from "@/lib/format/words";
import { asc, eq, sql } from "drizzle-orm";
import type { Database } from "@/db";
import { lab, reviewDecision } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { recordAudit } from "./audit";
import { authorize, type Actor } from "./authorize";
import { loadBenchTrail, type BenchTrail, type TrailEntry } from "./trail";
import {
  approvalsCountQuery,
  approvalsCsvStream,
  approvalsPageQuery,
  approvalView,
  buildCountsOf,
  csvLine,
  deskQuery,
  streamOf,
  type ApprovalsPage,
  type DeskQuery,
} from "./desk-queries";
import { scopeHolds } from "./scope";

export * from "./desk-queries";

// ── Approvals ─────────────────────────────────────────────────────────────────────────────────
export async function listApprovals(db: Database, actor: Actor, input: DeskQuery, now = new Date()): Promise<ApprovalsPage> {
  authorize(actor, { audit: ["read"] });
  const [rows, [{ total }], [{ total: mismatchTotal }]] = await Promise.all([
    approvalsPageQuery(db, actor, input, now),
    approvalsCountQuery(db, actor, input, now),
    approvalsCountQuery(db, actor, { ...input, builds: "mismatch" }, now),
  ]);
  const counts = await buildCountsOf(db, rows.map((r) => r.revisionId));
  return { rows: rows.map((r) => approvalView(r, counts)), total, mismatchTotal, page: input.page, pageSize: input.pageSize, pageCount: Math.max(1, Math.ceil(total / input.pageSize)), query: input };
}

/** The choices the filters offer: labs and everyone who has ever signed off. */
export async function deskFilterOptions(db: Database, actor: Actor): Promise<{ labs: { id: string; name: string }[]; officers: { id: string; name: string }[] }> {
  authorize(actor, { audit: ["read"] });
  const [labs, officers] = await Promise.all([
    db.select({ id: lab.id, name: lab.name }).from(lab).orderBy(asc(lab.name)),
    db
      .select({ id: reviewDecision.signerId, name: sql<string>`max(${reviewDecision.signerName})` })
      .from(reviewDecision)
      .where(eq(reviewDecision.outcome, "approved"))
      .groupBy(reviewDecision.signerId)
      .orderBy(sql`max(${reviewDecision.signerName})`),
  ]);
  return { labs: labs.filter((l) => scopeHolds(actor, l.id)), officers };
}

/** The filtered sign-offs as CSV, streamed batch by batch; the export itself goes into the audit trail first. */
export async function exportApprovalsCsv(db: Database, actor: Actor, q: DeskQuery, now = new Date()): Promise<ReadableStream<Uint8Array>> {
  authorize(actor, { audit: ["export"] });
  const { page: _page, pageSize: _size, sort: _sort, dir: _dir, ...filtersUsed } = q;
  await recordAudit(db, actor, { action: "desk-exported-approvals", detail: { filters: filtersUsed, format: "csv" } });
  return approvalsCsvStream(db, actor, q, now);
}

// ── A bench's trail ───────────────────────────────────────────────────────────────────────────
/** A bench's whole trail for the desk (audit: read; every lab for auditors and officers). */
export async function getBenchTrail(db: Database, actor: Actor, benchId: string): Promise<BenchTrail> {
  authorize(actor, { audit: ["read"] });
  return loadBenchTrail(db, actor, benchId);
}

const TRAIL_HEADER = ["at_utc", "kind", "revision", "content_hash", "who", "role", "what", "what_words", "signature_meaning", "conditions", "valid_until_utc", "detail"];

function trailLine(e: TrailEntry): string {
  switch (e.kind) {
    case "revision":
      return csvLine([e.at, "revision", e.revisionNumber, e.contentHash, e.by, "", `revision-created`, `Revision ${e.revisionNumber} created (now ${REVIEW_STATE_WORDS[e.state] ?? e.state})`, "", "", "", ""]);
    case "decision":
      return csvLine([e.at, "decision", e.revisionNumber, e.contentHash, e.by, e.role, e.outcome, OUTCOME_WORDS[e.outcome] ?? e.outcome, e.meaning, e.conditions, e.validUntil, { reason: e.reason, passwordReentered: e.stepUpVerified, hazardClassAtSigning: e.hazardClass }]);
    case "comment":
      return csvLine([e.at, "comment", e.revisionNumber, "", e.by, e.role, "comment", e.body, "", "", "", e.elementId ? { elementId: e.elementId } : ""]);
    case "event":
      return csvLine([e.at, "audit event", e.revisionNumber, e.contentHash, e.by, e.role, e.action, ACTION_WORDS[e.action] ?? e.action, "", "", "", e.detail]);
  }
}

/** One bench's trail as CSV; audited as an export. */
export async function exportTrailCsv(db: Database, actor: Actor, benchId: string): Promise<{ filename: string; stream: ReadableStream<Uint8Array> }> {
  authorize(actor, { audit: ["export"] });
  const trail = await getBenchTrail(db, actor, benchId);
  await recordAudit(db, actor, { action: "desk-exported-trail", benchId, detail: { format: "csv", entries: trail.entries.length } });
  async function* lines() {
    yield `\uFEFF${csvLine(TRAIL_HEADER)}`;
    for (const e of trail.entries) yield trailLine(e);
  }
  const slug = trail.bench.title.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "").slice(0, 40) || "bench";
  return { filename: `trail-${slug}-${benchId.slice(0, 8)}.csv`, stream: streamOf(lines()) };
}

export function assertDeskQuery(value: unknown): DeskQuery {
  const parsed = deskQuery.safeParse(value);
  if (parsed.success) return parsed.data;
  const fields = parsed.error.issues.map((i) => ({ path: i.path.map(String).join(".") || "(query)", message: i.message }));
  throw new AppError("bad-request", `The desk query has a problem: ${fields[0]?.message ?? "invalid"}.`, fields);
}
