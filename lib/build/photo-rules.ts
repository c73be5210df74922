// The build rules for a screen photo read by readScreenPhoto: how far the fitted screen distance may sit from the drawn
// one, and the mismatch rule applied to the fitted values (the centre of the other brightness, or the distance beyond
// that tolerance). Pure (no database); the zone counts come from lib/optics (Born & Wolf, Principles of Optics, 7th ed.,
// §8.2: N = (R²/λ)(1/ρ + 1/b), computed by screenProfile).
import type { PhotoReadingResult } from "@/lib/api/contracts/builds";
import type { BenchDocument } from "@/lib/bench/schema";
import { screenProfile, type CentreAppearance, type ScreenPhotoReading } from "@/lib/optics";
import { zoneCountAt } from "@/lib/optics/photo-fit";
import { formatFixed, formatNumber } from "@/lib/format";
import { POSITION_TOLERANCE_MM, type AperturePrediction } from "./rules";

/** A fitted screen distance within this share of the drawn one matches (the reader's own accuracy is 3 %, lib/optics/photo.ts). */
export const PHOTO_DISTANCE_TOLERANCE_FRACTION = 0.05;

/** The reader's accuracy on the zone count, as its tests measure it (lib/optics/photo.ts): 0.1 + 1 % of N. */
export function zoneCountTolerance(zoneCount: number): number {
  return 0.1 + 0.01 * Math.abs(zoneCount);
}

export type DistanceTolerance = {
  toleranceMm: number;
  /** Which bound set it: the rail's placement, the share of the distance, or how little the count changes with distance here. */
  setBy: "placement" | "share" | "zone-count";
};

/**
 * How far the fitted distance may sit from the drawn one and still match: the largest of the rail's placement tolerance,
 * PHOTO_DISTANCE_TOLERANCE_FRACTION of the drawn distance, and the change of distance that moves the zone count by the
 * reader's count accuracy (where the count hardly changes with distance — a diverging beam near its far-field count —
 * a photo cannot place the screen any closer than that; capped at the drawn distance itself).
 */
export function photoDistanceTolerance(doc: BenchDocument, apertureId: string, screenId: string, drawnMm: number): DistanceTolerance {
  const placement = POSITION_TOLERANCE_MM;
  const share = PHOTO_DISTANCE_TOLERANCE_FRACTION * drawnMm;
  let zone = 0;
  const step = 0.01 * drawnMm;
  const near = zoneCountAt(doc, apertureId, screenId, drawnMm - step);
  const far = zoneCountAt(doc, apertureId, screenId, drawnMm + step);
  const here = zoneCountAt(doc, apertureId, screenId, drawnMm);
  if (near && far && here) {
    const slope = Math.abs(far.zoneCount - near.zoneCount) / (2 * step);
    zone = slope > 0 ? Math.min(drawnMm, zoneCountTolerance(here.zoneCount) / slope) : drawnMm;
  }
  const toleranceMm = Math.max(placement, share, zone);
  return { toleranceMm, setBy: toleranceMm === zone ? "zone-count" : toleranceMm === share ? "share" : "placement" };
}

export type PhotoPrediction = { apertureId: string; centre: CentreAppearance; drawnDistanceMm: number; zoneCount: number };
export type PhotoFit = { centre: CentreAppearance; screenDistanceMm: number; zoneCount: number };

/** Each difference between the photo's fitted values and the prediction, as one sentence; none means they agree. */
export function photoDifferences(prediction: PhotoPrediction, fit: PhotoFit, toleranceMm: number): string[] {
  const reasons: string[] = [];
  // As for a typed centre: bright against dark counts; "between" on either side is not called a mismatch.
  if (fit.centre !== "between" && prediction.centre !== "between" && fit.centre !== prediction.centre) {
    reasons.push(`Centre: predicted ${prediction.centre}, the photo shows ${fit.centre}.`);
  }
  const delta = fit.screenDistanceMm - prediction.drawnDistanceMm;
  if (Math.abs(delta) > toleranceMm) {
    reasons.push(
      `Screen distance: drawn ${mm(prediction.drawnDistanceMm)} behind ${prediction.apertureId}, the photo's pattern fits ${mm(fit.screenDistanceMm)} (${mm(Math.abs(delta))} ${delta > 0 ? "further" : "nearer"}; allowed ±${mm(toleranceMm)}), ${formatNumber(fit.zoneCount, { digits: 3 })} half-period zones against ${formatNumber(prediction.zoneCount, { digits: 3 })} predicted.`,
    );
  }
  return reasons;
}

/** One sentence saying what the photo showed, kept as the observation's note. */
export function photoSummary(fileName: string, prediction: PhotoPrediction, fit: PhotoFit & { quality: number }): string {
  return `Read from the screen photo "${fileName}": ${formatNumber(fit.zoneCount, { digits: 3 })} half-period zones (predicted ${formatNumber(prediction.zoneCount, { digits: 3 })}), ${fit.centre} centre, the screen about ${mm(fit.screenDistanceMm)} behind ${prediction.apertureId} (drawn ${mm(prediction.drawnDistanceMm)}); confidence ${formatFixed(100 * fit.quality, 0)} %.`;
}

const mm = (v: number) => `${formatFixed(v, Math.abs(v) >= 100 ? 0 : 1)} mm`;

const sig = (v: number, digits = 5) => (Number.isFinite(v) ? Number(v.toPrecision(digits)) : 0);

/** The photo's levels turned back into intensity relative to the open beam through the fitted tone curve. */
function relative(levels: number[], tone: ScreenPhotoReading["profile"]["tone"]): number[] {
  return levels.map((level) => sig(Math.pow(Math.max(0, (level - tone.offset) / tone.gain), 1 / tone.gamma), 4));
}

/**
 * A reading set beside the prediction for one aperture: the values kept (rounded for storage), the profile predicted as
 * drawn at the same radii for the plot, and the mismatch sentences. The aperture must have a screen behind it. `names`:
 * how the build names the aperture and screen when `doc` is a table's unfolded path (whose ids are the chain's), and the
 * table's beam.
 */
export function comparePhoto(
  doc: BenchDocument,
  aperture: AperturePrediction & { screenId: string; observationDistanceMm: number },
  reading: ScreenPhotoReading,
  photo: { widthPx: number; heightPx: number; orientation: number },
  names: { apertureId: string; screenId: string; pathId: string | null } = { apertureId: aperture.apertureId, screenId: aperture.screenId, pathId: null },
): { result: PhotoReadingResult; reasons: string[]; prediction: PhotoPrediction } {
  const prediction: PhotoPrediction = { apertureId: names.apertureId, centre: aperture.centre, drawnDistanceMm: aperture.observationDistanceMm, zoneCount: Math.abs(aperture.fresnelNumber) };
  const tolerance = photoDistanceTolerance(doc, aperture.apertureId, aperture.screenId, aperture.observationDistanceMm);
  const { profile, mmPerPixel } = reading;
  const predicted = screenProfile(doc, aperture.apertureId, { radiiMm: profile.radiusMm }).relativeIntensity;
  const result: PhotoReadingResult = {
    centre: reading.centre,
    centrePredicted: prediction.centre,
    screenId: names.screenId,
    ...(names.pathId ? { pathId: names.pathId } : {}),
    centrePx: { x: sig(reading.centrePx.x), y: sig(reading.centrePx.y) },
    imageWidthPx: photo.widthPx,
    imageHeightPx: photo.heightPx,
    orientation: photo.orientation,
    zoneCount: sig(reading.zoneCount, 4),
    predictedZoneCount: sig(prediction.zoneCount, 4),
    screenDistanceMm: sig(reading.screenDistanceMm),
    drawnDistanceMm: sig(prediction.drawnDistanceMm),
    distanceToleranceMm: sig(tolerance.toleranceMm, 3),
    mmPerPixel: sig(mmPerPixel, 4),
    ringRadiiPx: reading.ringRadiiPx.map((r) => sig(r, 4)),
    ringRadiiMm: reading.ringRadiiPx.map((r) => sig(r * mmPerPixel, 4)),
    shadowRadiusMm: sig(profile.shadowRadiusMm, 4),
    quality: sig(reading.quality, 3),
    profile: {
      radiusMm: profile.radiusMm.map((r) => sig(r, 4)),
      measured: relative(profile.measuredLevel, profile.tone),
      fitted: relative(profile.fittedLevel, profile.tone),
      predicted: Array.from(predicted, (v) => sig(Math.max(0, v), 4)),
    },
  };
  const reasons = photoDifferences(prediction, { centre: reading.centre, screenDistanceMm: reading.screenDistanceMm, zoneCount: reading.zoneCount }, tolerance.toleranceMm);
  return { result, reasons, prediction };
}
