// The data side of the technician's as-built record: loading what the actor may see, starting a build, saving
// checks and observations, signing off, each with its audit row (uploads: build-uploads.ts). The rules themselves (status,
// checklist, predictions, comparison, file types) are the build rules in lib/build/rules.ts.
import "server-only";
import { and, desc, eq, inArray } from "drizzle-orm";
import { z } from "zod";
import type { Database, DbOrTx } from "@/db";
import { bench, benchRevision, buildCheck, buildObservation, buildRecord, lab, reviewDecision, user, type ReviewState } from "@/db/schema";
import type { AnyBenchDocument } from "@/lib/bench/schema";
import { AppError, notFound } from "@/lib/errors";
import { observationMismatchMail } from "@/lib/mail/build-mail";
import { enqueueMail } from "@/lib/mail/outbox";
import { recordAudit } from "./audit";
import { authorize, type Actor } from "./authorize";
import { checklistFor, compareObservation, positionWithinTolerance, predictionsFor, signOffSentence, signOffStatus, whyNotSignOff, type SignOffRecord, type SignOffStatus } from "@/lib/build/rules";
import { assessAnyRevision } from "@/lib/review/hazard";
import { OPTICS_ENGINE_VERSION } from "@/lib/optics/version";
import { labStandard } from "./lab-standard";
import { loadRevision } from "./reviews";
import { inScope, notFoundAs } from "./scope";
import { buildView, observationView } from "./build-views";
import type { BuildableRow, BuildView, checkInput, ObservationView, observationInput, startBuildInput } from "@/lib/api/contracts/builds";

// ── Signed-off revisions ──────────────────────────────────────────────────────────────────────
export type SignedRevision = {
  id: string;
  benchId: string;
  number: number;
  state: ReviewState;
  contentHash: string;
  document: AnyBenchDocument;
  benchTitle: string;
  labId: string;
  labName: string;
  authorId: string;
  authorName: string;
  authorEmail: string;
  decision: SignOffRecord | null;
};

/** One revision with its sign-off, as the actor may see it (outside their labs it does not exist). */
export async function loadSignedRevision(db: DbOrTx, actor: Actor, revisionId: string): Promise<SignedRevision> {
  const row = await loadRevision(db, actor, revisionId);
  const [d] = await db
    .select()
    .from(reviewDecision)
    .where(and(eq(reviewDecision.revisionId, row.id), eq(reviewDecision.outcome, "approved")));
  return {
    ...row,
    decision: d
      ? { signerName: d.signerName, signerRole: d.signerRole, meaning: d.meaning, conditions: d.conditions, validUntil: d.validUntil, decidedAt: d.decidedAt, contentHash: d.contentHash }
      : null,
  };
}

/** Every once-signed-off revision of the actor's labs, valid ones first; expired and replaced ones are marked. */
export async function listBuildable(db: Database, actor: Actor): Promise<BuildableRow[]> {
  authorize(actor, { build: ["read"] });
  const rows = await db
    .select({
      revisionId: benchRevision.id,
      benchId: bench.id,
      title: bench.title,
      labName: lab.name,
      authorName: user.name,
      number: benchRevision.number,
      contentHash: benchRevision.contentHash,
      state: benchRevision.state,
      signerName: reviewDecision.signerName,
      decidedAt: reviewDecision.decidedAt,
      validUntil: reviewDecision.validUntil,
    })
    .from(benchRevision)
    .innerJoin(bench, eq(bench.id, benchRevision.benchId))
    .innerJoin(lab, eq(lab.id, bench.labId))
    .innerJoin(user, eq(user.id, bench.authorId))
    .innerJoin(reviewDecision, and(eq(reviewDecision.revisionId, benchRevision.id), eq(reviewDecision.outcome, "approved")))
    .where(and(inScope(actor), inArray(benchRevision.state, ["approved", "expired", "superseded"])))
    .orderBy(desc(reviewDecision.decidedAt))
    .limit(500);
  const ids = rows.map((r) => r.revisionId);
  const builds = ids.length
    ? await db
        .select({ id: buildRecord.id, revisionId: buildRecord.revisionId, state: buildRecord.state, technicianName: user.name, createdAt: buildRecord.createdAt, signedOffAt: buildRecord.signedOffAt })
        .from(buildRecord)
        .innerJoin(user, eq(user.id, buildRecord.technicianId))
        .where(inArray(buildRecord.revisionId, ids))
        .orderBy(desc(buildRecord.createdAt))
    : [];
  const now = new Date();
  const order: Record<SignOffStatus, number> = { valid: 0, expired: 1, superseded: 2, "not-signed-off": 3 };
  return rows
    .map((r) => {
      const status = signOffStatus({ state: r.state, decision: { validUntil: r.validUntil } }, now);
      return {
        ...r,
        status,
        statusSentence: signOffSentence({ number: r.number, decision: { validUntil: r.validUntil } }, status),
        decidedAt: r.decidedAt.toISOString(),
        validUntil: r.validUntil?.toISOString() ?? null,
        builds: builds
          .filter((b) => b.revisionId === r.revisionId)
          .map((b) => ({ id: b.id, state: b.state, technicianName: b.technicianName, startedAt: b.createdAt.toISOString(), signedOffAt: b.signedOffAt?.toISOString() ?? null })),
      };
    })
    .sort((a, b) => order[a.status] - order[b.status]);
}

export type BuildRow = typeof buildRecord.$inferSelect;

export async function loadBuild(db: DbOrTx, actor: Actor, buildId: string, lock = false): Promise<{ build: BuildRow; revision: SignedRevision }> {
  if (!z.uuid().safeParse(buildId).success) throw notFound("The build record");
  const query = db.select().from(buildRecord).where(eq(buildRecord.id, buildId));
  const [build] = lock ? await query.for("update") : await query;
  if (!build) throw notFound("The build record");
  const revision = await notFoundAs("The build record", loadSignedRevision(db, actor, build.revisionId));
  return { build, revision };
}

export async function getBuild(db: Database, actor: Actor, buildId: string): Promise<BuildView> {
  authorize(actor, { build: ["read"] });
  const { build, revision } = await loadBuild(db, actor, buildId);
  return buildView(db, actor, build, revision);
}

/** The revision's author is told of an observation that does not match the prediction, typed or read from a photo. */
export async function mailMismatchToAuthor(tx: DbOrTx, actor: Actor, revision: SignedRevision, seen: { apertureId: string | null; reasons: string[]; note: string | null }): Promise<void> {
  await enqueueMail(
    tx,
    observationMismatchMail({
      to: { email: revision.authorEmail, name: revision.authorName },
      benchTitle: revision.benchTitle,
      labName: revision.labName,
      revisionId: revision.id,
      revisionNumber: revision.number,
      contentHash: revision.contentHash,
      technicianName: actor.name,
      ...seen,
    }),
  );
}

/** What a build's audit rows are about: the signed-off revision. */
export function aboutRevision(revision: SignedRevision) {
  return { benchId: revision.benchId, revisionId: revision.id, contentHash: revision.contentHash };
}

/** Starts a build of a valid sign-off; a technician's unfinished build of the same revision is returned instead of a second one. */
export async function startBuild(db: Database, actor: Actor, input: z.infer<typeof startBuildInput>, retried = false): Promise<{ build: BuildView; created: boolean }> {
  authorize(actor, { build: ["record"] });
  // A simultaneous start that won the race made the one open build (build_record_one_open_idx): answer with it.
  return startBuildOnce(db, actor, input).catch((error: unknown) => {
    if (!retried && isUniqueViolation(error, "build_record_one_open_idx")) return startBuild(db, actor, input, true);
    throw error;
  });
}

function isUniqueViolation(error: unknown, constraint: string): boolean {
  for (let e: unknown = error; e && typeof e === "object"; e = (e as { cause?: unknown }).cause) {
    const pgError = e as { code?: string; constraint?: string };
    if (pgError.code === "23505" && pgError.constraint === constraint) return true;
  }
  return false;
}

async function startBuildOnce(db: Database, actor: Actor, input: z.infer<typeof startBuildInput>): Promise<{ build: BuildView; created: boolean }> {
  return db.transaction(async (tx) => {
    const revision = await loadSignedRevision(tx, actor, input.revisionId);
    await tx.select({ id: benchRevision.id }).from(benchRevision).where(eq(benchRevision.id, revision.id)).for("share");
    const status = signOffStatus(revision);
    if (status !== "valid") throw new AppError("conflict", signOffSentence(revision, status));
    const [open] = await tx
      .select()
      .from(buildRecord)
      .where(and(eq(buildRecord.revisionId, revision.id), eq(buildRecord.technicianId, actor.userId), eq(buildRecord.state, "in-progress")))
      .limit(1);
    if (open) return { build: await buildView(tx, actor, open, revision), created: false };
    const [build] = await tx
      .insert(buildRecord)
      .values({ revisionId: revision.id, benchId: revision.benchId, contentHash: revision.contentHash, technicianId: actor.userId })
      .returning();
    const assessed = assessAnyRevision(revision.document, { standard: await labStandard(tx, revision.labId) });
    const items = checklistFor(revision.document, assessed.ok ? assessed.safety : null, revision.decision?.conditions);
    await tx.insert(buildCheck).values(items.map((i) => ({ buildId: build.id, itemKey: i.itemKey })));
    await recordAudit(tx, actor, { ...aboutRevision(revision), action: "build-started", detail: { buildId: build.id, number: revision.number, items: items.length } });
    return { build: await buildView(tx, actor, build, revision), created: true };
  });
}

export function assertRecordable(build: BuildRow, revision: SignedRevision): void {
  if (build.state === "completed") throw new AppError("conflict", "This build is already signed off; its record can no longer be changed.");
  const status = signOffStatus(revision);
  if (status !== "valid") throw new AppError("conflict", signOffSentence(revision, status));
}

export async function updateCheck(db: Database, actor: Actor, buildId: string, input: z.infer<typeof checkInput>): Promise<BuildView> {
  authorize(actor, { build: ["record"] });
  return db.transaction(async (tx) => {
    const { build, revision } = await loadBuild(tx, actor, buildId, true);
    assertRecordable(build, revision);
    const assessed = assessAnyRevision(revision.document, { standard: await labStandard(tx, revision.labId) });
    const item = checklistFor(revision.document, assessed.ok ? assessed.safety : null, revision.decision?.conditions).find((i) => i.itemKey === input.itemKey);
    if (!item) throw new AppError("bad-request", `There is no checklist item "${input.itemKey}" on this build.`, [{ path: "itemKey", message: "No such item" }]);
    if (input.measuredPositionMm !== undefined && item.expectedPositionMm === null) {
      throw new AppError("bad-request", `"${item.label}" has no position to measure.`, [{ path: "measuredPositionMm", message: "This item has no position" }]);
    }
    const [current] = await tx.select().from(buildCheck).where(and(eq(buildCheck.buildId, build.id), eq(buildCheck.itemKey, item.itemKey)));
    const measured = input.measuredPositionMm !== undefined ? input.measuredPositionMm : (current?.measuredPositionMm ?? null);
    const withinTolerance = positionWithinTolerance(item.expectedPositionMm, measured);
    const values = {
      done: input.done ?? current?.done ?? false,
      measuredPositionMm: measured,
      withinTolerance,
      note: input.note !== undefined ? input.note || null : (current?.note ?? null),
      recordedBy: actor.userId,
      updatedAt: new Date(),
    };
    await tx
      .insert(buildCheck)
      .values({ buildId: build.id, itemKey: item.itemKey, ...values })
      .onConflictDoUpdate({ target: [buildCheck.buildId, buildCheck.itemKey], set: values });
    await recordAudit(tx, actor, {
      ...aboutRevision(revision),
      action: "build-check-recorded",
      detail: { buildId: build.id, itemKey: item.itemKey, done: values.done, measuredPositionMm: measured, expectedPositionMm: item.expectedPositionMm, withinTolerance, note: values.note },
    });
    return buildView(tx, actor, build, revision);
  });
}

export async function addObservation(db: Database, actor: Actor, buildId: string, input: z.infer<typeof observationInput>): Promise<{ observation: ObservationView; build: BuildView }> {
  authorize(actor, { build: ["record"] });
  return db.transaction(async (tx) => {
    const { build, revision } = await loadBuild(tx, actor, buildId, true);
    assertRecordable(build, revision);
    const predictions = predictionsFor(revision.document);
    const apertureId = input.apertureId ?? null;
    if (apertureId && !predictions.apertures.some((a) => a.apertureId === apertureId)) {
      throw new AppError("bad-request", `No light reaches an aperture "${apertureId}" on this bench, so there is no prediction to compare with.`, [{ path: "apertureId", message: "Not a lit aperture of this bench" }]);
    }
    if (input.centreSeen && !apertureId) {
      throw new AppError("bad-request", "Say which aperture's pattern the centre belongs to.", [{ path: "apertureId", message: "Choose the aperture" }]);
    }
    const compared = compareObservation(predictions, { ...input, apertureId });
    const mismatch = compared.reasons.length > 0;
    const [row] = await tx
      .insert(buildObservation)
      .values({
        buildId: build.id,
        apertureId,
        centreSeen: input.centreSeen ?? null,
        centrePredicted: compared.centrePredicted,
        spotDiameterMm: input.spotDiameterMm ?? null,
        screenPowerMw: input.screenPowerMw ?? null,
        predictedSpotDiameterMm: compared.predictedSpotDiameterMm,
        predictedScreenPowerMw: compared.predictedScreenPowerMw,
        predictionEngine: OPTICS_ENGINE_VERSION,
        reasons: compared.reasons,
        mismatch,
        note: input.note || null,
        recordedBy: actor.userId,
      })
      .returning();
    await recordAudit(tx, actor, {
      ...aboutRevision(revision),
      action: "build-observation-recorded",
      detail: { buildId: build.id, observationId: row.id, apertureId, centreSeen: row.centreSeen, centrePredicted: row.centrePredicted, spotDiameterMm: row.spotDiameterMm, screenPowerMw: row.screenPowerMw, mismatch, reasons: compared.reasons },
    });
    if (mismatch) await mailMismatchToAuthor(tx, actor, revision, { apertureId, reasons: compared.reasons, note: row.note });
    return { observation: observationView(row, actor.name), build: await buildView(tx, actor, build, revision) };
  });
}

// ── Sign-off ──────────────────────────────────────────────────────────────────────────────────
export async function signOffBuild(db: Database, actor: Actor, buildId: string): Promise<BuildView> {
  authorize(actor, { build: ["record"] });
  return db.transaction(async (tx) => {
    const { build, revision } = await loadBuild(tx, actor, buildId, true);
    const view = await buildView(tx, actor, build, revision);
    const why = whyNotSignOff(build, revision, view.checklist, actor.userId);
    if (why) throw new AppError("conflict", `The build cannot be signed off yet: ${why}`);
    const now = new Date();
    const [done] = await tx.update(buildRecord).set({ state: "completed", signedOffAt: now, updatedAt: now }).where(eq(buildRecord.id, build.id)).returning();
    await recordAudit(tx, actor, {
      ...aboutRevision(revision),
      action: "build-signed-off",
      detail: { buildId: build.id, items: view.checklist.length, observations: view.observations.length, mismatches: view.observations.filter((o) => o.mismatch).length, uploads: view.uploads.length },
    });
    return buildView(tx, actor, done, revision);
  });
}
