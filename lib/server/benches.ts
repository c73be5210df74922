// Benches and their revisions, as the signed-in actor may see them: researchers and technicians
// see their labs' benches, safety officers and auditors see every lab. Authorization is checked here.
import "server-only";
import { and, desc, eq, sql } from "drizzle-orm";
import { z } from "zod";
import type { Database } from "@/db";
import { bench, benchRevision, lab, user, type ReviewState } from "@/db/schema";
import { contentHash } from "@/lib/bench/canonical";
import type { AnyBenchDocument } from "@/lib/bench/schema";
import { createBenchInput } from "@/lib/api/contracts/benches";
import { AppError, notFound } from "@/lib/errors";
import { recordAudit } from "./audit";
import { authorize, type Actor } from "./authorize";
import { inScope, visibleOr404 } from "./scope";

export type BenchSummary = {
  id: string;
  title: string;
  labId: string;
  labName: string;
  authorName: string;
  latestRevision: number;
  latestState: ReviewState;
  latestHash: string;
  updatedAt: string;
};

/** The number of a bench's newest revision, for joining only that one. */
const latestNumber = sql`(select max(r2.number) from bench_revision r2 where r2.bench_id = ${bench.id})`;

/** Benches the actor may see, newest first; optionally only one review state of the latest revision. */
export async function listBenches(db: Database, actor: Actor, filter: { state?: ReviewState; authoredByMe?: boolean } = {}): Promise<BenchSummary[]> {
  authorize(actor, { bench: ["read"] });
  const conditions = [inScope(actor), eq(benchRevision.number, latestNumber)];
  if (filter.state) conditions.push(eq(benchRevision.state, filter.state));
  if (filter.authoredByMe) conditions.push(eq(bench.authorId, actor.userId));
  const rows = await db
    .select({
      id: bench.id,
      title: bench.title,
      labId: bench.labId,
      labName: lab.name,
      authorName: user.name,
      latestRevision: benchRevision.number,
      latestState: benchRevision.state,
      latestHash: benchRevision.contentHash,
      updatedAt: benchRevision.updatedAt,
    })
    .from(bench)
    .innerJoin(lab, eq(lab.id, bench.labId))
    .innerJoin(user, eq(user.id, bench.authorId))
    .innerJoin(benchRevision, eq(benchRevision.benchId, bench.id))
    .where(and(...conditions))
    .orderBy(desc(benchRevision.updatedAt));
  return rows.map((r) => ({ ...r, updatedAt: r.updatedAt.toISOString() }));
}

/** Revisions in a given state, for the officer's queue, the technician's list and the auditor's desk. */
export async function listRevisionsInState(db: Database, actor: Actor, state: ReviewState) {
  authorize(actor, { bench: ["read"] });
  const rows = await db
    .select({
      benchId: bench.id,
      title: bench.title,
      labName: lab.name,
      authorName: user.name,
      revisionId: benchRevision.id,
      number: benchRevision.number,
      contentHash: benchRevision.contentHash,
      updatedAt: benchRevision.updatedAt,
    })
    .from(benchRevision)
    .innerJoin(bench, eq(bench.id, benchRevision.benchId))
    .innerJoin(lab, eq(lab.id, bench.labId))
    .innerJoin(user, eq(user.id, bench.authorId))
    .where(and(inScope(actor), eq(benchRevision.state, state)))
    .orderBy(desc(benchRevision.updatedAt));
  return rows.map((r) => ({ ...r, updatedAt: r.updatedAt.toISOString() }));
}

export type BenchDetail = {
  id: string;
  title: string;
  labId: string;
  labName: string;
  authorId: string;
  authorName: string;
  revisions: { id: string; number: number; state: ReviewState; contentHash: string; version: number; document: AnyBenchDocument; updatedAt: string }[];
};

/** One bench with all its revisions. Outside the actor's labs it does not exist (404). */
export async function getBench(db: Database, actor: Actor, benchId: string): Promise<BenchDetail> {
  authorize(actor, { bench: ["read"] });
  if (!z.uuid().safeParse(benchId).success) throw notFound("The bench");
  const [row] = await db
    .select({ id: bench.id, title: bench.title, labId: bench.labId, labName: lab.name, authorId: bench.authorId, authorName: user.name })
    .from(bench)
    .innerJoin(lab, eq(lab.id, bench.labId))
    .innerJoin(user, eq(user.id, bench.authorId))
    .where(eq(bench.id, benchId));
  visibleOr404(actor, row, "The bench");
  const revisions = await db.select().from(benchRevision).where(eq(benchRevision.benchId, benchId)).orderBy(desc(benchRevision.number));
  return {
    ...row,
    revisions: revisions.map((r) => ({
      id: r.id,
      number: r.number,
      state: r.state,
      contentHash: r.contentHash,
      version: r.version,
      document: r.document as AnyBenchDocument,
      updatedAt: r.updatedAt.toISOString(),
    })),
  };
}


/** A new bench with an empty first draft (the laser is added in the editor): a rail, or a table when its size is given. */
export async function createBench(db: Database, actor: Actor, input: z.infer<typeof createBenchInput>): Promise<{ id: string }> {
  authorize(actor, { bench: ["create"] });
  if (!actor.labIds.includes(input.labId)) throw new AppError("forbidden", "You can only create benches in a lab you belong to.");
  const document: AnyBenchDocument = input.table
    ? { version: 2, title: input.title, table: input.table, elements: [] }
    : { version: 1, title: input.title, elements: [] };
  return db.transaction(async (tx) => {
    const [created] = await tx.insert(bench).values({ labId: input.labId, title: input.title, authorId: actor.userId }).returning({ id: bench.id });
    const [revision] = await tx
      .insert(benchRevision)
      .values({ benchId: created.id, number: 1, document, contentHash: contentHash(document), createdBy: actor.userId })
      .returning({ id: benchRevision.id });
    await recordAudit(tx, actor, {
      action: "bench-created",
      benchId: created.id,
      revisionId: revision.id,
      contentHash: contentHash(document),
      detail: { title: input.title, ...(input.table ? { table: input.table } : {}) },
    });
    return created;
  });
}
