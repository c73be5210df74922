// "Waiting for you": per role, what waits for the signed-in person (submissions to review, benches sent
// back, signed-off benches not yet built, sign-offs about to expire), with counts for the navigation.
import "server-only";
import { and, desc, eq, gt, gte, inArray, isNull, lt, ne, or, sql } from "drizzle-orm";
import type { Database } from "@/db";
import { bench, benchRevision, buildRecord, lab, reviewComment, reviewDecision, user, type ReviewState } from "@/db/schema";
import { ROLE_LABELS, type Permission, type RoleName } from "@/lib/auth/permissions";
import { authorize, type Actor } from "./authorize";
import { inScope } from "./scope";

/** How far back comments on one's benches count as new, and how far ahead an expiry counts as near. */
export const COMMENT_WINDOW_DAYS = 7;
export const EXPIRY_WINDOW_DAYS = 30;
/** Items listed per section (newest first; expiries soonest first); the count is always the full number. */
export const INBOX_ITEMS_SHOWN = 8;
const DAY_MS = 86_400_000;

export type InboxRole = Extract<RoleName, "officer" | "researcher" | "technician" | "auditor">;

export type InboxItem = {
  /** Stable key for lists. */
  id: string;
  title: string;
  /** One line saying why it waits. */
  detail: string;
  href: string;
  /** When it started waiting (ISO). */
  at: string;
};

export type InboxSection = {
  role: InboxRole;
  /** What the section lists, e.g. "Revisions to review". */
  label: string;
  /** The navigation link the count belongs beside. */
  navHref: string;
  /** The page listing all of them. */
  listHref: string;
  count: number;
  items: InboxItem[];
};

export type Inbox = { total: number; sections: InboxSection[] };

/** The nav link each role's count is shown beside (components/shell/app-header.tsx). */
export const INBOX_NAV: Record<InboxRole, string> = {
  officer: "/reviews",
  researcher: "/benches",
  technician: "/builds",
  auditor: "/desk",
};

/** The permission each section reads under; the role alone does not open it. */
const SECTION_PERMISSION: Record<InboxRole, Permission> = {
  officer: { review: ["decide"] },
  researcher: { bench: ["submit"] },
  technician: { build: ["record"] },
  auditor: { audit: ["read"] },
};

/** The full count of a limited query, from a window over the same rows. */
const fullCount = sql<number>`count(*) over ()`.mapWith(Number);
const day = (d: Date | null) => (d ? d.toISOString().slice(0, 10) : "—");

// ── Officer: submitted revisions they may decide (never their own benches) ───────────────────
async function officerSection(db: Database, actor: Actor): Promise<InboxSection> {
  const rows = await db
    .select({ revisionId: benchRevision.id, number: benchRevision.number, title: bench.title, labName: lab.name, authorName: user.name, at: benchRevision.updatedAt, total: fullCount })
    .from(benchRevision)
    .innerJoin(bench, eq(bench.id, benchRevision.benchId))
    .innerJoin(lab, eq(lab.id, bench.labId))
    .innerJoin(user, eq(user.id, bench.authorId))
    .where(and(inScope(actor), eq(benchRevision.state, "submitted"), ne(bench.authorId, actor.userId), ne(benchRevision.createdBy, actor.userId)))
    .orderBy(desc(benchRevision.updatedAt))
    .limit(INBOX_ITEMS_SHOWN);
  return {
    role: "officer",
    label: "Revisions to review",
    navHref: INBOX_NAV.officer,
    listHref: INBOX_NAV.officer,
    count: rows[0]?.total ?? 0,
    items: rows.map((r) => ({
      id: `review-${r.revisionId}`,
      title: `${r.title}, revision ${r.number}`,
      detail: `Sent for review by ${r.authorName} (${r.labName})`,
      href: `/reviews/${r.revisionId}`,
      at: r.at.toISOString(),
    })),
  };
}

// ── Researcher: their benches sent back (latest revision changes-requested or turned down), and new comments ──
const SENT_BACK: ReviewState[] = ["changes-requested", "rejected"];
const latestNumber = sql`(select max(r2.number) from bench_revision r2 where r2.bench_id = ${bench.id})`;

async function researcherSection(db: Database, actor: Actor, now: Date): Promise<InboxSection> {
  const since = new Date(now.getTime() - COMMENT_WINDOW_DAYS * DAY_MS);
  const [sentBack, comments] = await Promise.all([
    db
      .select({ benchId: bench.id, title: bench.title, revisionId: benchRevision.id, number: benchRevision.number, state: benchRevision.state, at: benchRevision.updatedAt })
      .from(bench)
      .innerJoin(benchRevision, and(eq(benchRevision.benchId, bench.id), eq(benchRevision.number, latestNumber)))
      .where(and(inScope(actor), eq(bench.authorId, actor.userId), inArray(benchRevision.state, SENT_BACK)))
      .orderBy(desc(benchRevision.updatedAt))
      .limit(200),
    db
      .select({
        benchId: bench.id,
        title: bench.title,
        count: sql<number>`count(*)`.mapWith(Number),
        at: sql<Date>`max(${reviewComment.createdAt})`.mapWith((v: string | Date) => new Date(v)),
        // The revision of the newest comment, to link to its thread.
        revisionId: sql<string>`(array_agg(${reviewComment.revisionId} order by ${reviewComment.createdAt} desc))[1]`,
      })
      .from(reviewComment)
      .innerJoin(bench, eq(bench.id, reviewComment.benchId))
      .where(and(inScope(actor), eq(bench.authorId, actor.userId), ne(reviewComment.authorId, actor.userId), gte(reviewComment.createdAt, since)))
      .groupBy(bench.id, bench.title)
      .limit(200),
  ]);
  // One line per bench: a bench sent back with comments on it waits once, not twice.
  const byBench = new Map<string, InboxItem & { sortAt: number }>();
  for (const b of sentBack) {
    const what = b.state === "rejected" ? "Turned down" : "Changes asked";
    byBench.set(b.benchId, { id: `bench-${b.benchId}`, title: b.title, detail: `${what} on revision ${b.number}`, href: `/reviews/${b.revisionId}`, at: b.at.toISOString(), sortAt: b.at.getTime() });
  }
  for (const c of comments) {
    const words = `${c.count === 1 ? "1 new comment" : `${c.count} new comments`} in the last ${COMMENT_WINDOW_DAYS} days`;
    const existing = byBench.get(c.benchId);
    if (existing) {
      existing.detail = `${existing.detail} · ${words}`;
      if (c.at.getTime() > existing.sortAt) {
        existing.sortAt = c.at.getTime();
        existing.at = c.at.toISOString();
      }
    } else {
      byBench.set(c.benchId, { id: `bench-${c.benchId}`, title: c.title, detail: words, href: `/reviews/${c.revisionId}`, at: c.at.toISOString(), sortAt: c.at.getTime() });
    }
  }
  const all = [...byBench.values()].sort((a, b) => b.sortAt - a.sortAt);
  return {
    role: "researcher",
    label: "Your benches: sent back or commented on",
    navHref: INBOX_NAV.researcher,
    listHref: INBOX_NAV.researcher,
    count: all.length,
    items: all.slice(0, INBOX_ITEMS_SHOWN).map(({ sortAt: _sortAt, ...item }) => item),
  };
}

// ── Technician: valid sign-offs of their labs with no completed build yet ─────────────────────
async function technicianSection(db: Database, actor: Actor, now: Date): Promise<InboxSection> {
  const completed = db
    .select({ one: sql`1` })
    .from(buildRecord)
    .where(and(eq(buildRecord.revisionId, benchRevision.id), eq(buildRecord.state, "completed")));
  const rows = await db
    .select({ revisionId: benchRevision.id, number: benchRevision.number, title: bench.title, labName: lab.name, signerName: reviewDecision.signerName, at: reviewDecision.decidedAt, validUntil: reviewDecision.validUntil, total: fullCount })
    .from(benchRevision)
    .innerJoin(bench, eq(bench.id, benchRevision.benchId))
    .innerJoin(lab, eq(lab.id, bench.labId))
    .innerJoin(reviewDecision, and(eq(reviewDecision.revisionId, benchRevision.id), eq(reviewDecision.outcome, "approved")))
    .where(and(inScope(actor), eq(benchRevision.state, "approved"), or(isNull(reviewDecision.validUntil), gt(reviewDecision.validUntil, now)), sql`not exists (${completed})`))
    .orderBy(desc(reviewDecision.decidedAt))
    .limit(INBOX_ITEMS_SHOWN);
  return {
    role: "technician",
    label: "Signed-off benches not built yet",
    navHref: INBOX_NAV.technician,
    listHref: INBOX_NAV.technician,
    count: rows[0]?.total ?? 0,
    items: rows.map((r) => ({
      id: `build-${r.revisionId}`,
      title: `${r.title}, revision ${r.number}`,
      detail: `Signed off by ${r.signerName} (${r.labName}), valid until ${day(r.validUntil)}`,
      href: "/builds",
      at: r.at.toISOString(),
    })),
  };
}

// ── Auditor: sign-offs still valid that end within the next 30 days ───────────────────────────
async function auditorSection(db: Database, actor: Actor, now: Date): Promise<InboxSection> {
  const until = new Date(now.getTime() + EXPIRY_WINDOW_DAYS * DAY_MS);
  const rows = await db
    .select({ benchId: bench.id, revisionId: benchRevision.id, number: benchRevision.number, title: bench.title, labName: lab.name, signerName: reviewDecision.signerName, validUntil: reviewDecision.validUntil, total: fullCount })
    .from(reviewDecision)
    .innerJoin(benchRevision, eq(benchRevision.id, reviewDecision.revisionId))
    .innerJoin(bench, eq(bench.id, reviewDecision.benchId))
    .innerJoin(lab, eq(lab.id, bench.labId))
    .where(and(inScope(actor), eq(reviewDecision.outcome, "approved"), eq(benchRevision.state, "approved"), gte(reviewDecision.validUntil, now), lt(reviewDecision.validUntil, until)))
    .orderBy(reviewDecision.validUntil)
    .limit(INBOX_ITEMS_SHOWN);
  return {
    role: "auditor",
    label: `Sign-offs ending within ${EXPIRY_WINDOW_DAYS} days`,
    navHref: INBOX_NAV.auditor,
    listHref: `/desk?expiring=${EXPIRY_WINDOW_DAYS}`,
    count: rows[0]?.total ?? 0,
    items: rows.map((r) => ({
      id: `expiring-${r.revisionId}`,
      title: `${r.title}, revision ${r.number}`,
      detail: `Signed off by ${r.signerName} (${r.labName}); ends ${day(r.validUntil)}`,
      href: `/desk/benches/${r.benchId}`,
      at: r.validUntil!.toISOString(),
    })),
  };
}

const SECTIONS: { role: InboxRole; load: (db: Database, actor: Actor, now: Date) => Promise<InboxSection> }[] = [
  { role: "officer", load: officerSection },
  { role: "researcher", load: researcherSection },
  { role: "technician", load: technicianSection },
  { role: "auditor", load: auditorSection },
];

/** What waits for the actor, one section per role they hold (none for roles with nothing to wait for, e.g. admin). */
export async function getInbox(db: Database, actor: Actor, now = new Date()): Promise<Inbox> {
  const mine = SECTIONS.filter((s) => actor.roles.includes(s.role));
  for (const s of mine) authorize(actor, SECTION_PERMISSION[s.role]);
  const sections = await Promise.all(mine.map((s) => s.load(db, actor, now)));
  return { total: sections.reduce((n, s) => n + s.count, 0), sections };
}

export const INBOX_ROLE_LABELS: Record<InboxRole, string> = {
  officer: ROLE_LABELS.officer,
  researcher: ROLE_LABELS.researcher,
  technician: ROLE_LABELS.technician,
  auditor: ROLE_LABELS.auditor,
};
