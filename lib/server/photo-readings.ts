// Reading a build's screen photo against the revision's prediction: the stored upload is decoded (photo-decode.ts),
// read by readScreenPhoto (lib/optics), compared by the photo rules (lib/build/photo-rules.ts) and kept as a
// photo_reading row. A reading that could be compared records its observation exactly as a typed one does (mismatch,
// reasons, audit row, e-mail to the bench's author); a photo that could not be read keeps the sentence saying why.
import "server-only";
import { and, eq } from "drizzle-orm";
import type { z } from "zod";
import type { Database } from "@/db";
import type { BenchDocument } from "@/lib/bench/schema";
import { buildObservation, photoReading, upload } from "@/db/schema";
import type { photoReadingInput, PhotoReadingResult, PhotoReadingView, BuildView } from "@/lib/api/contracts/builds";
import { comparePhoto, photoSummary, type PhotoPrediction } from "@/lib/build/photo-rules";
import { predictionsFor } from "@/lib/build/rules";
import { AppError, notFound } from "@/lib/errors";
import { PhotoReadError, readScreenPhoto } from "@/lib/optics";
import { OPTICS_ENGINE_VERSION } from "@/lib/optics/version";
import { storage } from "@/lib/storage";
import { recordAudit } from "./audit";
import { authorize, type Actor } from "./authorize";
import { aboutRevision, assertRecordable, buildView, loadBuild, mailMismatchToAuthor, photoReadingViews } from "./builds";
import { decodePhoto, PhotoDecodeError, type DecodedPhoto } from "./photo-decode";

export async function readBuildPhoto(
  db: Database,
  actor: Actor,
  buildId: string,
  input: z.infer<typeof photoReadingInput>,
): Promise<{ reading: PhotoReadingView; build: BuildView; created: boolean }> {
  authorize(actor, { build: ["record"] });
  const { build, revision } = await loadBuild(db, actor, buildId);
  assertRecordable(build, revision);
  const document = revision.document;
  if (document.version !== 1) {
    // A table plan (version 2) has no single rail to move the screen along; the reader takes a straight bench.
    throw new AppError("bad-request", "Screen photos can be read for benches drawn on a rail; this revision is a table plan, so record what the screen shows by hand.", [{ path: "apertureId", message: "Not a rail bench" }]);
  }
  const predictions = predictionsFor(document);
  const aperture = predictions.apertures.find((a) => a.apertureId === input.apertureId);
  if (!aperture) {
    throw new AppError("bad-request", `No light reaches an aperture "${input.apertureId}" on this bench, so there is no pattern to compare the photo with.`, [{ path: "apertureId", message: "Not a lit aperture of this bench" }]);
  }
  if (!aperture.screenId || aperture.observationDistanceMm === null) {
    throw new AppError("bad-request", `No screen stands behind ${input.apertureId} in the drawing, so there is no pattern to compare the photo with.`, [{ path: "apertureId", message: "No screen behind this aperture" }]);
  }
  const [file] = await db.select().from(upload).where(and(eq(upload.id, input.uploadId), eq(upload.buildId, build.id)));
  if (!file) throw notFound("The uploaded photo");
  if (file.kind !== "screen-photo") {
    throw new AppError("bad-request", `"${file.fileName}" was uploaded as a ${file.kind === "datasheet" ? "datasheet" : "photo of the built bench"}, not a photo of the screen; upload the screen's photo as "Photo of the screen" to read its pattern.`, [
      { path: "uploadId", message: "Not a photo of the screen" },
    ]);
  }
  const existing = await db.select({ id: photoReading.id }).from(photoReading).where(and(eq(photoReading.uploadId, file.id), eq(photoReading.apertureId, aperture.apertureId)));
  if (existing.length) return answer(db, actor, buildId, existing[0].id, false);

  const screenAperture = { ...aperture, screenId: aperture.screenId, observationDistanceMm: aperture.observationDistanceMm };
  const { result, reasons, prediction, refusal } = await readStored(file, document, screenAperture);

  const readingId = await db.transaction(async (tx) => {
    const { build: locked } = await loadBuild(tx, actor, buildId, true);
    assertRecordable(locked, revision);
    const [again] = await tx.select({ id: photoReading.id }).from(photoReading).where(and(eq(photoReading.uploadId, file.id), eq(photoReading.apertureId, aperture.apertureId)));
    if (again) return again.id; // read by a simultaneous request: keep that one
    let observationId: string | null = null;
    const mismatch = reasons.length > 0;
    if (result && prediction) {
      const note = photoSummary(file.fileName, prediction, { centre: result.centre, screenDistanceMm: result.screenDistanceMm, zoneCount: result.zoneCount, quality: result.quality });
      const [row] = await tx
        .insert(buildObservation)
        .values({
          buildId: build.id,
          apertureId: aperture.apertureId,
          centreSeen: result.centre,
          centrePredicted: aperture.centre,
          spotDiameterMm: null,
          screenPowerMw: null,
          predictedSpotDiameterMm: aperture.spotDiameterMm,
          predictedScreenPowerMw: aperture.screenPowerMw,
          predictionEngine: OPTICS_ENGINE_VERSION,
          reasons,
          mismatch,
          note,
          recordedBy: actor.userId,
        })
        .returning();
      observationId = row.id;
    }
    const [kept] = await tx
      .insert(photoReading)
      .values({ buildId: build.id, uploadId: file.id, apertureId: aperture.apertureId, observationId, refusal, result: result as Record<string, unknown> | null, predictionEngine: OPTICS_ENGINE_VERSION, readBy: actor.userId })
      .returning({ id: photoReading.id });
    await recordAudit(tx, actor, {
      ...aboutRevision(revision),
      action: "build-photo-read",
      detail: {
        buildId: build.id,
        photoReadingId: kept.id,
        uploadId: file.id,
        fileName: file.fileName,
        apertureId: aperture.apertureId,
        refusal,
        ...(result
          ? { zoneCount: result.zoneCount, predictedZoneCount: result.predictedZoneCount, centreSeen: result.centre, centrePredicted: result.centrePredicted, screenDistanceMm: result.screenDistanceMm, drawnDistanceMm: result.drawnDistanceMm, quality: result.quality }
          : {}),
      },
    });
    if (result && prediction && observationId) {
      await recordAudit(tx, actor, {
        ...aboutRevision(revision),
        action: "build-observation-recorded",
        detail: { buildId: build.id, observationId, photoReadingId: kept.id, uploadId: file.id, apertureId: aperture.apertureId, centreSeen: result.centre, centrePredicted: aperture.centre, spotDiameterMm: null, screenPowerMw: null, mismatch, reasons },
      });
      if (mismatch) {
        const note = photoSummary(file.fileName, prediction, { centre: result.centre, screenDistanceMm: result.screenDistanceMm, zoneCount: result.zoneCount, quality: result.quality });
        await mailMismatchToAuthor(tx, actor, revision, { apertureId: aperture.apertureId, reasons, note });
      }
    }
    return kept.id;
  });
  return answer(db, actor, buildId, readingId, true);
}

/** Decodes the stored photo and reads it; the pixels live only inside this call. */
async function readStored(
  file: typeof upload.$inferSelect,
  doc: BenchDocument,
  aperture: Parameters<typeof comparePhoto>[1],
): Promise<{ result: PhotoReadingResult | null; reasons: string[]; prediction: PhotoPrediction | null; refusal: string | null }> {
  const bytes = await storage().get(file.storageKey);
  if (!bytes) throw new AppError("not-found", "The photo's record exists but its content is missing from storage; tell your administrator.");
  let photo: DecodedPhoto;
  try {
    photo = await decodePhoto(bytes);
  } catch (error) {
    if (error instanceof PhotoDecodeError) throw new AppError("bad-request", `"${file.fileName}" cannot be read: ${error.message}`, [{ path: "uploadId", message: error.message }]);
    throw error;
  }
  try {
    const reading = readScreenPhoto(photo, { doc, apertureId: aperture.apertureId });
    return { ...comparePhoto(doc, aperture, reading, photo), refusal: null };
  } catch (error) {
    if (!(error instanceof PhotoReadError)) throw error;
    return { result: null, reasons: [], prediction: null, refusal: error.message };
  }
}

async function answer(db: Database, actor: Actor, buildId: string, readingId: string, created: boolean) {
  const { build, revision } = await loadBuild(db, actor, buildId);
  const [reading] = await photoReadingViews(db, build.id, readingId);
  return { reading, build: await buildView(db, actor, build, revision), created };
}
