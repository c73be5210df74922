// The auditor's desk (read-only): every sign-off with server-side paging, sorting and filters, a
// bench's whole trail as one timeline, and both as CSV streamed in keyset batches (never built in memory).
import "server-only";
import { asc, eq, sql } from "drizzle-orm";
import { z } from "zod";
import type { Database } from "@/db";
import { auditEvent, bench, benchRevision, lab, reviewComment, reviewDecision, user, type ReviewState } from "@/db/schema";
import { AppError, notFound } from "@/lib/errors";
import { recordAudit } from "./audit";
import { authorize, authorizeLab, type Actor } from "./authorize";
import {
  approvalsCountQuery,
  approvalsCsvStream,
  approvalsPageQuery,
  approvalView,
  csvLine,
  deskQuery,
  streamOf,
  type ApprovalsPage,
  type DeskQuery,
} from "./desk-queries";

export * from "./desk-queries";

// ── Approvals ─────────────────────────────────────────────────────────────────────────────────
export async function listApprovals(db: Database, actor: Actor, input: DeskQuery, now = new Date()): Promise<ApprovalsPage> {
  authorize(actor, { audit: ["read"] });
  const [rows, [{ total }]] = await Promise.all([approvalsPageQuery(db, actor, input, now), approvalsCountQuery(db, actor, input, now)]);
  return { rows: rows.map(approvalView), total, page: input.page, pageSize: input.pageSize, pageCount: Math.max(1, Math.ceil(total / input.pageSize)), query: input };
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
  return { labs: actor.allLabs ? labs : labs.filter((l) => actor.labIds.includes(l.id)), officers };
}

/** The filtered sign-offs as CSV, streamed batch by batch; the export itself goes into the audit trail first. */
export async function exportApprovalsCsv(db: Database, actor: Actor, q: DeskQuery, now = new Date()): Promise<ReadableStream<Uint8Array>> {
  authorize(actor, { audit: ["export"] });
  const { page: _page, pageSize: _size, sort: _sort, dir: _dir, ...filtersUsed } = q;
  await recordAudit(db, { actorId: actor.userId, actorRole: actor.roles.join(","), action: "desk-exported-approvals", ipAddress: actor.ipAddress, detail: { filters: filtersUsed, format: "csv" } });
  return approvalsCsvStream(db, actor, q, now);
}

// ── A bench's trail ───────────────────────────────────────────────────────────────────────────
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

export async function getBenchTrail(db: Database, actor: Actor, benchId: string): Promise<BenchTrail> {
  authorize(actor, { audit: ["read"] });
  if (!z.uuid().safeParse(benchId).success) throw notFound("The bench");
  const [b] = await db
    .select({ id: bench.id, title: bench.title, labId: bench.labId, labName: lab.name, authorName: user.name, createdAt: bench.createdAt })
    .from(bench)
    .innerJoin(lab, eq(lab.id, bench.labId))
    .innerJoin(user, eq(user.id, bench.authorId))
    .where(eq(bench.id, benchId));
  if (!b) throw notFound("The bench");
  try {
    authorizeLab(actor, b.labId);
  } catch {
    throw notFound("The bench");
  }
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
  const entries: TrailEntry[] = [
    ...revisions.map((r): TrailEntry => ({ kind: "revision", at: r.createdAt.toISOString(), revisionNumber: r.number, revisionId: r.id, contentHash: r.contentHash, state: r.state, by: r.by })),
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

const TRAIL_HEADER = ["at_utc", "kind", "revision", "content_hash", "who", "role", "what", "signature_meaning", "conditions", "valid_until_utc", "detail"];

function trailLine(e: TrailEntry): string {
  switch (e.kind) {
    case "revision":
      return csvLine([e.at, "revision", e.revisionNumber, e.contentHash, e.by, "", `Revision ${e.revisionNumber} created (now ${e.state})`, "", "", "", ""]);
    case "decision":
      return csvLine([e.at, "decision", e.revisionNumber, e.contentHash, e.by, e.role, e.outcome, e.meaning, e.conditions, e.validUntil, { reason: e.reason, passwordReentered: e.stepUpVerified, hazardClassAtSigning: e.hazardClass }]);
    case "comment":
      return csvLine([e.at, "comment", e.revisionNumber, "", e.by, e.role, e.body, "", "", "", e.elementId ? { elementId: e.elementId } : ""]);
    case "event":
      return csvLine([e.at, "audit event", e.revisionNumber, e.contentHash, e.by, e.role, e.action, "", "", "", e.detail]);
  }
}

/** One bench's trail as CSV; audited as an export. */
export async function exportTrailCsv(db: Database, actor: Actor, benchId: string): Promise<{ filename: string; stream: ReadableStream<Uint8Array> }> {
  authorize(actor, { audit: ["export"] });
  const trail = await getBenchTrail(db, actor, benchId);
  await recordAudit(db, { actorId: actor.userId, actorRole: actor.roles.join(","), action: "desk-exported-trail", benchId, ipAddress: actor.ipAddress, detail: { format: "csv", entries: trail.entries.length } });
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
