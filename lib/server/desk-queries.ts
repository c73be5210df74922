// The auditor's desk queries: the approvals filter/sort/page SQL, keyset batches and CSV encoding.
// Kept free of 'server-only' (like review-clock.ts) so scripts/bench-desk.ts times the same SQL; callers pass the lab scope.
import { and, asc, desc, eq, gte, ilike, lt, or, sql, type SQL } from "drizzle-orm";
import { z } from "zod";
import { safeText } from "@/lib/validation/text";
import type { Database } from "@/db";
import { bench, benchRevision, lab, reviewDecision } from "@/db/schema";
import { HAZARD_CLASSES, type HazardClass } from "@/lib/safety/types";
import { REVIEW_STATE_WORDS } from "@/lib/format/words";
import { inScope, type LabScope } from "./scope";

export type { LabScope };

// ── The query (the URL's search params, the API's query string) ───────────────────────────────
export const APPROVAL_STATES = ["approved", "expired", "superseded"] as const;
export type ApprovalState = (typeof APPROVAL_STATES)[number];
export const DESK_SORTS = ["decidedAt", "validUntil", "title", "lab", "officer", "class"] as const;
export type DeskSort = (typeof DESK_SORTS)[number];
export const PAGE_SIZES = [10, 25, 50, 100] as const;
/** "mismatch": only sign-offs with a build whose recorded observation (typed or read from a screen photo) differs from the prediction. */
export const BUILD_FILTERS = ["mismatch"] as const;
export type BuildFilter = (typeof BUILD_FILTERS)[number];

const blankToUndefined = (v: unknown) => (v === "" || v === null ? undefined : v);
const opt = <T extends z.ZodType>(schema: T) => z.preprocess(blankToUndefined, schema.optional());

export const deskQuery = z
  .object({
    page: opt(z.coerce.number({ error: "page must be a number" }).int().min(1, "page starts at 1").max(100_000)).transform((v) => v ?? 1),
    pageSize: opt(z.coerce.number().refine((v) => (PAGE_SIZES as readonly number[]).includes(v), `pageSize must be one of ${PAGE_SIZES.join(", ")}`)).transform((v) => v ?? 25),
    sort: opt(z.enum(DESK_SORTS, { error: `sort must be one of ${DESK_SORTS.join(", ")}` })).transform((v) => v ?? "decidedAt"),
    dir: opt(z.enum(["asc", "desc"], { error: "dir must be asc or desc" })).transform((v) => v ?? "desc"),
    lab: opt(z.uuid({ error: "lab must be a lab id" })),
    hazardClass: opt(z.enum(HAZARD_CLASSES, { error: `class must be one of ${HAZARD_CLASSES.join(", ")}` })),
    state: opt(z.enum(APPROVAL_STATES, { error: `state must be one of ${APPROVAL_STATES.join(", ")}` })),
    officer: opt(safeText().max(64)),
    from: opt(z.iso.date({ error: "from must be a date (YYYY-MM-DD)" })),
    to: opt(z.iso.date({ error: "to must be a date (YYYY-MM-DD)" })),
    expiringDays: opt(z.coerce.number({ error: "expiring must be a number of days" }).int().min(0, "expiring must be 0 days or more").max(3650, "expiring must be at most 3650 days")),
    q: opt(safeText().trim().max(100, "The search must be at most 100 characters")),
    builds: opt(z.enum(BUILD_FILTERS, { error: `builds must be ${BUILD_FILTERS.join(" or ")}` })),
  })
  .refine((v) => !v.from || !v.to || v.from <= v.to, { path: ["to"], message: "The end date must not be before the start date" });
export type DeskQuery = z.infer<typeof deskQuery>;

/** Reads the desk query from URL search params (the names the page's URL uses). */
export function deskQueryFromParams(params: URLSearchParams | Record<string, string | string[] | undefined>): unknown {
  const get = (k: string) => {
    if (params instanceof URLSearchParams) return params.get(k) ?? undefined;
    const v = params[k];
    return Array.isArray(v) ? v[0] : v;
  };
  return {
    page: get("page"),
    pageSize: get("pageSize"),
    sort: get("sort"),
    dir: get("dir"),
    lab: get("lab"),
    hazardClass: get("class"),
    state: get("state"),
    officer: get("officer"),
    from: get("from"),
    to: get("to"),
    expiringDays: get("expiring"),
    q: get("q"),
    builds: get("builds"),
  };
}

/**
 * The desk page's reading of its address: a filter the desk cannot read is dropped and named, and every other
 * filter is kept (the API, by contrast, refuses the whole query with 400).
 */
export function deskQueryKeepingGoodFilters(raw: unknown): { query: DeskQuery; dropped: { field: string; message: string }[] } {
  const input = { ...(raw as Record<string, unknown>) };
  const dropped: { field: string; message: string }[] = [];
  for (let round = 0; round < 16; round++) {
    const parsed = deskQuery.safeParse(input);
    if (parsed.success) return { query: parsed.data, dropped };
    const issue = parsed.error.issues[0];
    const key = String(issue?.path[0] ?? "");
    if (!key || !(key in input) || input[key] === undefined) break;
    dropped.push({ field: ADDRESS_NAMES[key] ?? key, message: issue.message });
    input[key] = undefined;
  }
  return { query: deskQuery.parse({}), dropped: dropped.length ? dropped : [{ field: "the address", message: "it could not be read" }] };
}

/** The name each query field has in the page's address (deskQueryFromParams reads them). */
const ADDRESS_NAMES: Record<string, string> = { hazardClass: "class", expiringDays: "expiring" };

// ── Approvals ─────────────────────────────────────────────────────────────────────────────────
export type ApprovalRow = {
  decisionId: string;
  revisionId: string;
  benchId: string;
  title: string;
  labId: string;
  labName: string;
  number: number;
  contentHash: string;
  state: ApprovalState;
  hazardClass: HazardClass | null;
  signerId: string;
  signerName: string;
  signerRole: string;
  meaning: string;
  conditions: string | null;
  stepUpVerified: boolean;
  decidedAt: string;
  validUntil: string | null;
  /** Builds of this revision, the observations recorded in them that differ from the prediction, and how many of those a screen photo's reading recorded. */
  builds: number;
  mismatches: number;
  photoMismatches: number;
};

/** `mismatchTotal`: how many of the filtered sign-offs have a build with an observation that differs from the prediction. */
export type ApprovalsPage = { rows: ApprovalRow[]; total: number; mismatchTotal: number; page: number; pageSize: number; pageCount: number; query: DeskQuery };

/** The class the engine gave when the officer signed (kept in the signature's hazard summary). */
export const hazardClassExpr = sql<string | null>`(${reviewDecision.hazardSummary} -> 'hazardClass' ->> 'value')`;

const DAY_MS = 86_400_000;

// Whether a build of the signed revision recorded an observation that differs from the prediction (the filter and the
// count above the list); build_record_revision_idx and build_observation_build_idx keep it to index look-ups.
const hasMismatchExpr = sql`exists (select 1 from build_observation o join build_record b on b.id = o.build_id where b.revision_id = ${reviewDecision.revisionId} and o.mismatch)`;

function filters(scope: LabScope, q: DeskQuery, now: Date): SQL[] {
  const where: SQL[] = [eq(reviewDecision.outcome, "approved")];
  const labs = inScope(scope);
  if (labs) where.push(labs);
  if (q.lab) where.push(eq(bench.labId, q.lab));
  if (q.hazardClass) where.push(sql`${hazardClassExpr} = ${q.hazardClass}`);
  if (q.state) where.push(eq(benchRevision.state, q.state));
  if (q.officer) where.push(eq(reviewDecision.signerId, q.officer));
  if (q.from) where.push(gte(reviewDecision.decidedAt, new Date(`${q.from}T00:00:00.000Z`)));
  if (q.to) where.push(lt(reviewDecision.decidedAt, new Date(new Date(`${q.to}T00:00:00.000Z`).getTime() + DAY_MS)));
  if (q.expiringDays !== undefined) {
    // Still valid now, and its validity ends within the next N days.
    where.push(eq(benchRevision.state, "approved"), gte(reviewDecision.validUntil, now), lt(reviewDecision.validUntil, new Date(now.getTime() + q.expiringDays * DAY_MS)));
  }
  if (q.q) where.push(ilike(bench.title, `%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`));
  if (q.builds === "mismatch") where.push(hasMismatchExpr);
  return where;
}

function ordering(q: DeskQuery): SQL[] {
  const dir = q.dir === "asc" ? asc : desc;
  const key: Record<DeskSort, SQL> = {
    decidedAt: dir(reviewDecision.decidedAt),
    // Every sign-off has a validity end, so the plain order can walk review_decision_valid_until_idx.
    validUntil: dir(reviewDecision.validUntil),
    title: dir(bench.title),
    lab: dir(lab.name),
    officer: dir(reviewDecision.signerName),
    // By hazard (1 < 1M < 2 < 2M < 3R < 3B < 4), not by spelling.
    class: sql`array_position(array['1','1M','2','2M','3R','3B','4']::text[], ${hazardClassExpr}) ${sql.raw(q.dir === "asc" ? "asc" : "desc")} nulls last`,
  };
  // The signing time and the id break ties, so pages never overlap.
  return q.sort === "decidedAt" ? [key.decidedAt, dir(reviewDecision.id)] : [key[q.sort], desc(reviewDecision.decidedAt), desc(reviewDecision.id)];
}

const approvalColumns = {
  decisionId: reviewDecision.id,
  revisionId: reviewDecision.revisionId,
  benchId: reviewDecision.benchId,
  title: bench.title,
  labId: bench.labId,
  labName: lab.name,
  number: benchRevision.number,
  contentHash: reviewDecision.contentHash,
  state: benchRevision.state,
  hazardClass: hazardClassExpr,
  signerId: reviewDecision.signerId,
  signerName: reviewDecision.signerName,
  signerRole: reviewDecision.signerRole,
  meaning: reviewDecision.meaning,
  conditions: reviewDecision.conditions,
  stepUpVerified: reviewDecision.stepUpVerified,
  decidedAt: reviewDecision.decidedAt,
  validUntil: reviewDecision.validUntil,
};

/**
 * Each row's builds as columns, for the CSV's keyset batches (no OFFSET, so each subquery runs once per row returned; a
 * page instead asks buildCountsOf once for its rows, since an OFFSET would run these for every row it skips).
 */
const buildCountColumns = {
  builds: sql<number>`(select count(*)::int from build_record b where b.revision_id = ${reviewDecision.revisionId})`,
  mismatches: sql<number>`(select count(*)::int from build_observation o join build_record b on b.id = o.build_id where b.revision_id = ${reviewDecision.revisionId} and o.mismatch)`,
  photoMismatches: sql<number>`(select count(*)::int from build_observation o join build_record b on b.id = o.build_id join photo_reading p on p.build_id = o.build_id and p.observation_id = o.id where b.revision_id = ${reviewDecision.revisionId} and o.mismatch)`,
};

function approvalsFrom(db: Database) {
  return db
    .select(approvalColumns)
    .from(reviewDecision)
    .innerJoin(benchRevision, eq(benchRevision.id, reviewDecision.revisionId))
    .innerJoin(bench, eq(bench.id, reviewDecision.benchId))
    .innerJoin(lab, eq(lab.id, bench.labId));
}

function approvalsWithBuildsFrom(db: Database) {
  return db
    .select({ ...approvalColumns, ...buildCountColumns })
    .from(reviewDecision)
    .innerJoin(benchRevision, eq(benchRevision.id, reviewDecision.revisionId))
    .innerJoin(bench, eq(bench.id, reviewDecision.benchId))
    .innerJoin(lab, eq(lab.id, bench.labId));
}

type RawApproval = Awaited<ReturnType<ReturnType<typeof approvalsFrom>["execute"]>>[number];

export type BuildCounts = { builds: number; mismatches: number; photoMismatches: number };
const NO_BUILDS: BuildCounts = { builds: 0, mismatches: 0, photoMismatches: 0 };

/**
 * For the rows of one page or batch: each revision's builds, the observations in them that differ from the prediction,
 * and how many of those a screen photo's reading recorded. One grouped query over the page's revisions (not a
 * subquery per row, which an OFFSET would also run for every row it skips).
 */
export async function buildCountsOf(db: Database, revisionIds: string[]): Promise<Map<string, BuildCounts>> {
  const counts = new Map<string, BuildCounts>();
  if (revisionIds.length === 0) return counts;
  const { rows } = await db.execute<{ revision_id: string; builds: number; mismatches: number; photo_mismatches: number }>(sql`
    select b.revision_id,
           count(distinct b.id)::int as builds,
           (count(distinct o.id) filter (where o.mismatch))::int as mismatches,
           (count(distinct o.id) filter (where o.mismatch and p.id is not null))::int as photo_mismatches
      from build_record b
      left join build_observation o on o.build_id = b.id
      left join photo_reading p on p.build_id = o.build_id and p.observation_id = o.id
     where b.revision_id = any(${sql.param(revisionIds)}::uuid[])
     group by b.revision_id`);
  for (const r of rows) counts.set(r.revision_id, { builds: r.builds, mismatches: r.mismatches, photoMismatches: r.photo_mismatches });
  return counts;
}

/** A row for the desk: with its builds from `counts` (a page) or from its own columns (a CSV batch). */
export function approvalView(r: RawApproval & Partial<BuildCounts>, counts?: Map<string, BuildCounts>): ApprovalRow {
  return {
    ...r,
    ...(counts?.get(r.revisionId) ?? (r.builds === undefined ? NO_BUILDS : { builds: r.builds, mismatches: r.mismatches ?? 0, photoMismatches: r.photoMismatches ?? 0 })),
    state: r.state as ApprovalState,
    hazardClass: (HAZARD_CLASSES as readonly string[]).includes(r.hazardClass ?? "") ? (r.hazardClass as HazardClass) : null,
    decidedAt: r.decidedAt.toISOString(),
    validUntil: r.validUntil?.toISOString() ?? null,
  };
}

/** The SQL of one page, for the benchmark's EXPLAIN check. */
export function approvalsPageQuery(db: Database, scope: LabScope, q: DeskQuery, now = new Date()) {
  return approvalsFrom(db)
    .where(and(...filters(scope, q, now)))
    .orderBy(...ordering(q))
    .limit(q.pageSize)
    .offset((q.page - 1) * q.pageSize);
}

/** The count for the same filters; joins only the tables the filters use, so the planner can stay on indexes. */
export function approvalsCountQuery(db: Database, scope: LabScope, q: DeskQuery, now = new Date()) {
  let query = db.select({ total: sql<number>`count(*)::int` }).from(reviewDecision).$dynamic();
  if (q.state !== undefined || q.expiringDays !== undefined) query = query.innerJoin(benchRevision, eq(benchRevision.id, reviewDecision.revisionId));
  if (!scope.allLabs || q.lab !== undefined || q.q !== undefined) query = query.innerJoin(bench, eq(bench.id, reviewDecision.benchId));
  return query.where(and(...filters(scope, q, now)));
}

// ── CSV ───────────────────────────────────────────────────────────────────────────────────────
/** One CSV field: quoted when needed; a leading = + - @ is defused so spreadsheets do not run it. */
export function csvField(value: unknown): string {
  if (value === null || value === undefined) return "";
  let text = value instanceof Date ? value.toISOString() : typeof value === "object" ? JSON.stringify(value) : String(value);
  if (/^[=+\-@\t\r]/.test(text)) text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}
export const csvLine = (values: unknown[]) => `${values.map(csvField).join(",")}\r\n`;

const EXPORT_BATCH = 500;
export const APPROVAL_HEADER = [
  "signed_at_utc",
  "bench",
  "lab",
  "revision",
  "content_hash",
  "state",
  "state_words",
  "hazard_class_at_signing",
  "signed_by",
  "signer_role",
  "signature_meaning",
  "conditions",
  "valid_until_utc",
  "password_reentered",
  "bench_id",
  "revision_id",
  "decision_id",
  "builds",
  "observations_differing",
  "of_which_read_from_a_photo",
];

/** Rows in signing order (newest first), fetched in keyset batches. */
export async function* approvalBatches(db: Database, scope: LabScope, q: DeskQuery, now = new Date(), batchSize = EXPORT_BATCH): AsyncGenerator<ApprovalRow[]> {
  let after: { decidedAt: Date; id: string } | null = null;
  for (;;) {
    const where = filters(scope, q, now);
    if (after) {
      const a: { decidedAt: Date; id: string } = after;
      where.push(or(lt(reviewDecision.decidedAt, a.decidedAt), and(eq(reviewDecision.decidedAt, a.decidedAt), lt(reviewDecision.id, a.id)))!);
    }
    const rows = await approvalsWithBuildsFrom(db)
      .where(and(...where))
      .orderBy(desc(reviewDecision.decidedAt), desc(reviewDecision.id))
      .limit(batchSize);
    if (rows.length === 0) return;
    yield rows.map((r) => approvalView(r));
    const last = rows[rows.length - 1];
    after = { decidedAt: last.decidedAt, id: last.decisionId };
    if (rows.length < batchSize) return;
  }
}

export function streamOf(lines: AsyncGenerator<string>): ReadableStream<Uint8Array> {
  const encoder = new TextEncoder();
  return new ReadableStream<Uint8Array>({
    async pull(controller) {
      try {
        const next = await lines.next();
        if (next.done) controller.close();
        else controller.enqueue(encoder.encode(next.value));
      } catch (error) {
        console.error("[benchwarden] CSV export failed part-way", error);
        controller.error(error);
      }
    },
    async cancel() {
      await lines.return(undefined);
    },
  });
}

/** Every filtered sign-off as CSV lines, batch by batch (at most one batch of rows held at a time). */
export function approvalsCsvStream(db: Database, scope: LabScope, q: DeskQuery, now = new Date(), batchSize = EXPORT_BATCH): ReadableStream<Uint8Array> {
  async function* lines() {
    yield `\uFEFF${csvLine(APPROVAL_HEADER)}`;
    for await (const batch of approvalBatches(db, scope, q, now, batchSize)) {
      yield batch
        .map((r) =>
          csvLine([r.decidedAt, r.title, r.labName, r.number, r.contentHash, r.state, REVIEW_STATE_WORDS[r.state] ?? r.state, r.hazardClass, r.signerName, r.signerRole, r.meaning, r.conditions, r.validUntil, r.stepUpVerified ? "yes" : "no", r.benchId, r.revisionId, r.decisionId, r.builds, r.mismatches, r.photoMismatches]),
        )
        .join("");
    }
  }
  return streamOf(lines());
}
