// A build as the technician's workspace shows it: the checklist with its ticks, the predictions, the observations
// (each with the prediction it was compared with, as recorded), the uploads, the photo readings, and whether and why
// not the build may be signed off. Read-only; the writes are in builds.ts, build-uploads.ts and photo-readings.ts.
import "server-only";
import { and, asc, eq } from "drizzle-orm";
import type { DbOrTx } from "@/db";
import { buildCheck, buildObservation, photoReading, upload, user } from "@/db/schema";
import type { BuildView, CheckView, ObservationView, PhotoReadingResult, PhotoReadingView } from "@/lib/api/contracts/builds";
import { checklistFor, POSITION_TOLERANCE_MM, POWER_TOLERANCE_FRACTION, predictionsFor, signOffSentence, signOffStatus, SPOT_TOLERANCE_FRACTION, whyNotSignOff } from "@/lib/build/rules";
import { assessAnyRevision } from "@/lib/review/hazard";
import { authorize, type Actor } from "./authorize";
import type { BuildRow, SignedRevision } from "./builds";
import { labStandard } from "./lab-standard";

/** An observation as recorded: the prediction and the sentences kept with it, never recomputed by a later engine. */
export function observationView(row: typeof buildObservation.$inferSelect, name: string): ObservationView {
  return {
    id: row.id,
    apertureId: row.apertureId,
    centreSeen: row.centreSeen,
    centrePredicted: row.centrePredicted,
    spotDiameterMm: row.spotDiameterMm,
    predictedSpotDiameterMm: row.predictedSpotDiameterMm,
    screenPowerMw: row.screenPowerMw,
    predictedScreenPowerMw: row.predictedScreenPowerMw,
    predictionEngine: row.predictionEngine,
    mismatch: row.mismatch,
    reasons: row.reasons,
    note: row.note,
    recordedByName: name,
    createdAt: row.createdAt.toISOString(),
  };
}

export async function buildView(db: DbOrTx, actor: Actor, build: BuildRow, revision: SignedRevision): Promise<BuildView> {
  const assessed = assessAnyRevision(revision.document, { standard: await labStandard(db, revision.labId) });
  const items = checklistFor(revision.document, assessed.ok ? assessed.safety : null, revision.decision?.conditions);
  const checks = await db.select().from(buildCheck).where(eq(buildCheck.buildId, build.id));
  const byKey = new Map(checks.map((c) => [c.itemKey, c]));
  const checklist: CheckView[] = items.map((i) => {
    const c = byKey.get(i.itemKey);
    return {
      ...i,
      done: c?.done ?? false,
      measuredPositionMm: c?.measuredPositionMm ?? null,
      withinTolerance: c?.withinTolerance ?? null,
      note: c?.note ?? null,
      recordedAt: c && c.recordedBy ? c.updatedAt.toISOString() : null,
    };
  });
  const predictions = predictionsFor(revision.document);
  const observations = await db
    .select({ o: buildObservation, name: user.name })
    .from(buildObservation)
    .innerJoin(user, eq(user.id, buildObservation.recordedBy))
    .where(eq(buildObservation.buildId, build.id))
    .orderBy(asc(buildObservation.createdAt));
  const uploads = await db
    .select({ u: upload, name: user.name })
    .from(upload)
    .innerJoin(user, eq(user.id, upload.uploadedBy))
    .where(eq(upload.buildId, build.id))
    .orderBy(asc(upload.createdAt));
  const [technician] = await db.select({ name: user.name }).from(user).where(eq(user.id, build.technicianId));
  const status = signOffStatus(revision);
  const mayRecord = build.state === "in-progress" && status === "valid" && canRecord(actor);
  const why = canRecord(actor) ? whyNotSignOff(build, revision, checklist, actor.userId) : "Only a technician can complete a build.";
  return {
    id: build.id,
    state: build.state,
    startedAt: build.createdAt.toISOString(),
    signedOffAt: build.signedOffAt?.toISOString() ?? null,
    technicianName: technician?.name ?? "—",
    contentHash: build.contentHash,
    revision: {
      id: revision.id,
      number: revision.number,
      benchId: revision.benchId,
      benchTitle: revision.benchTitle,
      labName: revision.labName,
      authorName: revision.authorName,
      status,
      statusSentence: signOffSentence(revision, status),
      signerName: revision.decision?.signerName ?? null,
      decidedAt: revision.decision?.decidedAt.toISOString() ?? null,
      validUntil: revision.decision?.validUntil?.toISOString() ?? null,
      conditions: revision.decision?.conditions ?? null,
    },
    tolerance: { positionMm: POSITION_TOLERANCE_MM, spotPercent: SPOT_TOLERANCE_FRACTION * 100, powerPercent: POWER_TOLERANCE_FRACTION * 100 },
    checklist,
    observations: observations.map(({ o, name }) => observationView(o, name)),
    uploads: uploads.map(({ u, name }) => ({
      id: u.id,
      kind: u.kind,
      fileName: u.fileName,
      contentType: u.contentType,
      sizeBytes: u.sizeBytes,
      sha256: u.sha256,
      uploadedByName: name,
      createdAt: u.createdAt.toISOString(),
      url: `/api/builds/${build.id}/uploads/${u.id}`,
    })),
    predictions,
    photoReadings: await photoReadingViews(db, build.id),
    may: { record: mayRecord, signOff: why === null, whyNotSignOff: why },
  };
}

/** The screen photos read on a build, oldest first, with the observation each recorded. */
export async function photoReadingViews(db: DbOrTx, buildId: string, readingId?: string): Promise<PhotoReadingView[]> {
  const rows = await db
    .select({ r: photoReading, fileName: upload.fileName, name: user.name, mismatch: buildObservation.mismatch, reasons: buildObservation.reasons })
    .from(photoReading)
    .innerJoin(upload, eq(upload.id, photoReading.uploadId))
    .innerJoin(user, eq(user.id, photoReading.readBy))
    .leftJoin(buildObservation, eq(buildObservation.id, photoReading.observationId))
    .where(readingId ? and(eq(photoReading.buildId, buildId), eq(photoReading.id, readingId)) : eq(photoReading.buildId, buildId))
    .orderBy(asc(photoReading.createdAt));
  return rows.map(({ r, fileName, name, mismatch, reasons }) => ({
    id: r.id,
    uploadId: r.uploadId,
    apertureId: r.apertureId,
    fileName,
    photoUrl: `/api/builds/${buildId}/uploads/${r.uploadId}`,
    readByName: name,
    createdAt: r.createdAt.toISOString(),
    refusal: r.refusal,
    result: (r.result as PhotoReadingResult | null) ?? null,
    observationId: r.observationId,
    mismatch: r.observationId ? (mismatch ?? null) : null,
    reasons: reasons ?? [],
    predictionEngine: r.predictionEngine,
  }));
}

function canRecord(actor: Actor): boolean {
  try {
    authorize(actor, { build: ["record"] });
    return true;
  } catch {
    return false;
  }
}
