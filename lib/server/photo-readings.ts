// Reading a build's screen photo against the revision's prediction: the stored upload is decoded (photo-decode.ts),
// read by readScreenPhoto (lib/optics), compared by the photo rules (lib/build/photo-rules.ts) and kept as a
// photo_reading row. A reading that could be compared records its observation exactly as a typed one does (mismatch,
// reasons, audit row, e-mail to the bench's author); a photo that could not be read keeps the sentence saying why.
import "server-only";
import { and, eq } from "drizzle-orm";
import type { z } from "zod";
import type { Database } from "@/db";
import type { AnyBenchDocument, BenchDocument } from "@/lib/bench/schema";
import { buildObservation, photoReading, upload } from "@/db/schema";
import type { photoReadingInput, PhotoReadingResult, PhotoReadingView, BuildView } from "@/lib/api/contracts/builds";
import { comparePhoto, photoSummary, type PhotoPrediction } from "@/lib/build/photo-rules";
import { predictionsFor, type AperturePrediction } from "@/lib/build/rules";
import { AppError, notFound } from "@/lib/errors";
import { analyzeBench, OpticsInputError, PhotoReadError, readScreenPhoto } from "@/lib/optics";
import type { TableAnalysis } from "@/lib/optics/table";
import { tableScreenChain } from "@/lib/optics/table-profile";
import { OPTICS_ENGINE_VERSION } from "@/lib/optics/version";
import { storage } from "@/lib/storage";
import { recordAudit } from "./audit";
import { authorize, type Actor } from "./authorize";
import { aboutRevision, assertRecordable, loadBuild, mailMismatchToAuthor } from "./builds";
import { buildView, photoReadingViews } from "./build-views";
import { decodePhoto, PhotoDecodeError, type DecodedPhoto } from "./photo-decode";

/**
 * What a photo is read against: the straight bench the light follows (the revision itself on a rail; on a table the
 * unfolded path from the laser through the aperture to the chosen screen, lib/optics/table-profile.ts), the prediction
 * for the aperture on it, and the names the build uses for the aperture and the screen.
 */
type PhotoTarget = {
  doc: BenchDocument;
  aperture: AperturePrediction & { screenId: string; observationDistanceMm: number };
  apertureId: string;
  screenId: string;
  /** The table's beam (path) the aperture stands on; null on a rail. */
  pathId: string | null;
};

function noPattern(apertureId: string): AppError {
  return new AppError("bad-request", `No screen stands behind ${apertureId} in the drawing, so there is no pattern to compare the photo with.`, [{ path: "apertureId", message: "No screen behind this aperture" }]);
}
function notLit(apertureId: string): AppError {
  return new AppError("bad-request", `No light reaches an aperture "${apertureId}" on this bench, so there is no pattern to compare the photo with.`, [{ path: "apertureId", message: "Not a lit aperture of this bench" }]);
}

function photoTarget(document: AnyBenchDocument, apertureId: string, screenId: string | undefined): PhotoTarget {
  if (document.version === 1) {
    const aperture = predictionsFor(document).apertures.find((a) => a.apertureId === apertureId);
    if (!aperture) throw notLit(apertureId);
    if (!aperture.screenId || aperture.observationDistanceMm === null) throw noPattern(apertureId);
    if (screenId !== undefined && screenId !== aperture.screenId) {
      throw new AppError("bad-request", `The light through ${apertureId} falls on ${aperture.screenId}, not on "${screenId}".`, [{ path: "screenId", message: `Not the screen behind ${apertureId}` }]);
    }
    return { doc: document, aperture: { ...aperture, screenId: aperture.screenId, observationDistanceMm: aperture.observationDistanceMm }, apertureId, screenId: aperture.screenId, pathId: null };
  }
  // A table: the technician says which screen the photo shows when the aperture's light reaches more than one.
  let analysis: TableAnalysis;
  try {
    analysis = analyzeBench(document);
  } catch (error) {
    if (error instanceof OpticsInputError) throw new AppError("bad-request", `The revision's predictions cannot be computed, so the photo cannot be compared: ${error.message}`, [{ path: "apertureId", message: error.message }]);
    throw error;
  }
  const entries = analysis.apertures.filter((a) => a.id === apertureId);
  if (!entries.length) throw notLit(apertureId);
  const screens = [...new Set(entries.flatMap((a) => (a.screenId === null ? [] : [a.screenId])))];
  if (!screens.length) throw noPattern(apertureId);
  if (screenId !== undefined && !screens.includes(screenId)) {
    throw new AppError("bad-request", `The light through ${apertureId} reaches ${screens.join(" and ")}, not "${screenId}"; say which of those the photo shows.`, [{ path: "screenId", message: `Not a screen the light through ${apertureId} reaches` }]);
  }
  if (screenId === undefined && screens.length > 1) {
    throw new AppError("bad-request", `The light through ${apertureId} reaches ${screens.length} screens (${screens.join(", ")}); say which one the photo shows.`, [{ path: "screenId", message: "Say which screen the photo shows" }]);
  }
  const chosen = screenId ?? screens[0];
  const chain = tableScreenChain(document, analysis, apertureId, { screenId: chosen });
  const aperture = predictionsFor(chain.doc).apertures.find((a) => a.apertureId === chain.chainApertureId);
  if (!aperture || aperture.screenId !== chain.chainScreenId || aperture.observationDistanceMm === null) throw noPattern(apertureId);
  return { doc: chain.doc, aperture: { ...aperture, screenId: aperture.screenId, observationDistanceMm: aperture.observationDistanceMm }, apertureId, screenId: chosen, pathId: chain.pathId };
}

export async function readBuildPhoto(
  db: Database,
  actor: Actor,
  buildId: string,
  input: z.infer<typeof photoReadingInput>,
): Promise<{ reading: PhotoReadingView; build: BuildView; created: boolean }> {
  authorize(actor, { build: ["record"] });
  const { build, revision } = await loadBuild(db, actor, buildId);
  assertRecordable(build, revision);
  const target = photoTarget(revision.document, input.apertureId, input.screenId);
  const { aperture } = target;
  const [file] = await db.select().from(upload).where(and(eq(upload.id, input.uploadId), eq(upload.buildId, build.id)));
  if (!file) throw notFound("The uploaded photo");
  if (file.kind !== "screen-photo") {
    throw new AppError("bad-request", `"${file.fileName}" was uploaded as a ${file.kind === "datasheet" ? "datasheet" : "photo of the built bench"}, not a photo of the screen; upload the screen's photo as "Photo of the screen" to read its pattern.`, [
      { path: "uploadId", message: "Not a photo of the screen" },
    ]);
  }
  const existing = await db.select({ id: photoReading.id }).from(photoReading).where(and(eq(photoReading.uploadId, file.id), eq(photoReading.apertureId, target.apertureId)));
  if (existing.length) return answer(db, actor, buildId, existing[0].id, false);

  const { result, reasons, prediction, refusal } = await readStored(file, target);

  const readingId = await db.transaction(async (tx) => {
    const { build: locked } = await loadBuild(tx, actor, buildId, true);
    assertRecordable(locked, revision);
    const [again] = await tx.select({ id: photoReading.id }).from(photoReading).where(and(eq(photoReading.uploadId, file.id), eq(photoReading.apertureId, target.apertureId)));
    if (again) return again.id; // read by a simultaneous request: keep that one
    let observationId: string | null = null;
    const mismatch = reasons.length > 0;
    if (result && prediction) {
      const note = photoSummary(file.fileName, prediction, { centre: result.centre, screenDistanceMm: result.screenDistanceMm, zoneCount: result.zoneCount, quality: result.quality });
      const [row] = await tx
        .insert(buildObservation)
        .values({
          buildId: build.id,
          apertureId: target.apertureId,
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
      .values({ buildId: build.id, uploadId: file.id, apertureId: target.apertureId, observationId, refusal, result: result as Record<string, unknown> | null, predictionEngine: OPTICS_ENGINE_VERSION, readBy: actor.userId })
      .returning({ id: photoReading.id });
    await recordAudit(tx, actor, {
      ...aboutRevision(revision),
      action: "build-photo-read",
      detail: {
        buildId: build.id,
        photoReadingId: kept.id,
        uploadId: file.id,
        fileName: file.fileName,
        apertureId: target.apertureId,
        screenId: target.screenId,
        ...(target.pathId ? { pathId: target.pathId } : {}),
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
        detail: { buildId: build.id, observationId, photoReadingId: kept.id, uploadId: file.id, apertureId: target.apertureId, centreSeen: result.centre, centrePredicted: aperture.centre, spotDiameterMm: null, screenPowerMw: null, mismatch, reasons },
      });
      if (mismatch) {
        const note = photoSummary(file.fileName, prediction, { centre: result.centre, screenDistanceMm: result.screenDistanceMm, zoneCount: result.zoneCount, quality: result.quality });
        await mailMismatchToAuthor(tx, actor, revision, { apertureId: target.apertureId, reasons, note });
      }
    }
    return kept.id;
  });
  return answer(db, actor, buildId, readingId, true);
}

/** Decodes the stored photo and reads it against the target's straight bench; the pixels live only inside this call. */
async function readStored(
  file: typeof upload.$inferSelect,
  target: PhotoTarget,
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
    const reading = readScreenPhoto(photo, { doc: target.doc, apertureId: target.aperture.apertureId });
    return { ...comparePhoto(target.doc, target.aperture, reading, photo, { apertureId: target.apertureId, screenId: target.screenId, pathId: target.pathId }), refusal: null };
  } catch (error) {
    if (!(error instanceof PhotoReadError)) throw error;
    return { result: null, reasons: [], prediction: null, refusal: target.pathId ? error.message.replaceAll(`"${target.aperture.apertureId}"`, target.apertureId) : error.message };
  }
}

async function answer(db: Database, actor: Actor, buildId: string, readingId: string, created: boolean) {
  const { build, revision } = await loadBuild(db, actor, buildId);
  const [reading] = await photoReadingViews(db, build.id, readingId);
  return { reading, build: await buildView(db, actor, build, revision), created };
}
