// The build contract: request bodies of the as-built routes (zod) and the shapes they answer with, imported by
// the route handlers, lib/server/builds.ts and the browser alike (no server-only code here).
import { z } from "zod";
import { safeText } from "@/lib/validation/text";
import { UPLOAD_KINDS, type BuildState, type ReviewState, type UploadKind } from "@/db/schema";
import type { ChecklistItem, Predictions, SignOffStatus } from "@/lib/build/rules";

// ── The list of benches to build ──────────────────────────────────────────────────────────────
export type BuildSummary = { id: string; state: BuildState; technicianName: string; startedAt: string; signedOffAt: string | null };

export type BuildableRow = {
  revisionId: string;
  benchId: string;
  title: string;
  labName: string;
  authorName: string;
  number: number;
  contentHash: string;
  state: ReviewState;
  status: SignOffStatus;
  statusSentence: string;
  signerName: string;
  decidedAt: string;
  validUntil: string | null;
  builds: BuildSummary[];
};

// ── One build ─────────────────────────────────────────────────────────────────────────────────
export type CheckView = ChecklistItem & { done: boolean; measuredPositionMm: number | null; withinTolerance: boolean | null; note: string | null; recordedAt: string | null };

export type ObservationView = {
  id: string;
  apertureId: string | null;
  /** "unclear" is the older code of "between". */
  centreSeen: "bright" | "dark" | "between" | "unclear" | null;
  centrePredicted: string | null;
  spotDiameterMm: number | null;
  predictedSpotDiameterMm: number | null;
  screenPowerMw: number | null;
  predictedScreenPowerMw: number | null;
  /** The optics engine version the prediction came from; null for records kept before it was stored. */
  predictionEngine: string | null;
  mismatch: boolean;
  reasons: string[];
  note: string | null;
  recordedByName: string;
  createdAt: string;
};

export type UploadView = { id: string; kind: UploadKind; fileName: string; contentType: string; sizeBytes: number; sha256: string; uploadedByName: string; createdAt: string; url: string };

export type BuildView = {
  id: string;
  state: BuildState;
  startedAt: string;
  signedOffAt: string | null;
  technicianName: string;
  contentHash: string;
  revision: {
    id: string;
    number: number;
    benchId: string;
    benchTitle: string;
    labName: string;
    authorName: string;
    status: SignOffStatus;
    statusSentence: string;
    signerName: string | null;
    decidedAt: string | null;
    validUntil: string | null;
    conditions: string | null;
  };
  tolerance: { positionMm: number; spotPercent: number; powerPercent: number };
  checklist: CheckView[];
  observations: ObservationView[];
  uploads: UploadView[];
  predictions: Predictions;
  /** Screen photos read against the prediction, oldest first. */
  photoReadings: PhotoReadingView[];
  may: { record: boolean; signOff: boolean; whyNotSignOff: string | null };
};

export const startBuildInput = z.object({ revisionId: z.uuid({ error: "Choose the signed-off revision to build" }) });

export const checkInput = z
  .object({
    itemKey: safeText({ error: "Say which checklist item" }).min(1, "Say which checklist item").max(200, "The item key is too long"),
    done: z.boolean({ error: "Done must be true or false" }).optional(),
    measuredPositionMm: z
      .number({ error: "The measured position must be a number of millimetres" })
      .refine(Number.isFinite, "The measured position must be a finite number")
      .refine((v) => Math.abs(v) <= 100_000, "The measured position must lie within ±100000 mm")
      .nullable()
      .optional(),
    note: safeText().trim().max(2000, "A note must be at most 2000 characters").nullable().optional(),
  })
  .refine((v) => v.done !== undefined || v.measuredPositionMm !== undefined || v.note !== undefined, { message: "Send done, a measured position or a note" });

export const observationInput = z
  .object({
    apertureId: safeText().min(1).max(64).nullable().optional(),
    centreSeen: z.enum(["bright", "dark", "between", "unclear"], { error: "The centre is bright, dark or between" }).nullable().optional(),
    spotDiameterMm: z
      .number({ error: "The spot or ring diameter must be a number of millimetres" })
      .refine((v) => Number.isFinite(v) && v > 0 && v <= 10_000, "The spot or ring diameter must be between 0 and 10000 mm")
      .nullable()
      .optional(),
    screenPowerMw: z
      .number({ error: "The power must be a number of milliwatts" })
      .refine((v) => Number.isFinite(v) && v >= 0 && v <= 1e9, "The power must be between 0 and 10⁹ mW")
      .nullable()
      .optional(),
    note: safeText().trim().max(2000, "A note must be at most 2000 characters").nullable().optional(),
  })
  .refine((v) => v.centreSeen != null || v.spotDiameterMm != null || v.screenPowerMw != null, { message: "Record at least one of: the centre, the spot or ring size, the power at the screen" });

// ── Uploads ───────────────────────────────────────────────────────────────────────────────────
export const uploadKindInput = z.enum(UPLOAD_KINDS, { error: `Say what the file shows: ${UPLOAD_KINDS.join(", ")}` });

// ── Reading a screen photo ────────────────────────────────────────────────────────────────────
export const photoReadingInput = z.object({
  uploadId: z.uuid({ error: "Choose the uploaded photo of the screen to read" }),
  apertureId: safeText({ error: "Say which aperture's pattern the photo shows" }).min(1, "Say which aperture's pattern the photo shows").max(64, "The aperture's id is at most 64 characters"),
  /** On a table whose aperture sends light to several screens: the screen the photo shows. */
  screenId: safeText({ error: "Say which screen the photo shows" }).min(1, "Say which screen the photo shows").max(64, "The screen's id is at most 64 characters").optional(),
});

type Centre = "bright" | "dark" | "between";

/** What a photo showed, as fitted, beside what the revision predicts; radii on the screen in mm, intensities relative to the open beam. */
export type PhotoReadingResult = {
  centre: Centre;
  centrePredicted: Centre;
  /** The screen the photo shows (absent in readings kept before it was recorded) and, on a table, the beam the aperture stands on. */
  screenId?: string;
  pathId?: string;
  centrePx: { x: number; y: number };
  imageWidthPx: number;
  imageHeightPx: number;
  /** The EXIF orientation applied before reading (1 = none). */
  orientation: number;
  zoneCount: number;
  predictedZoneCount: number;
  screenDistanceMm: number;
  drawnDistanceMm: number;
  distanceToleranceMm: number;
  mmPerPixel: number;
  ringRadiiPx: number[];
  ringRadiiMm: number[];
  /** The edge of the aperture's shadow on the screen as fitted (mm). */
  shadowRadiusMm: number;
  quality: number;
  /** The photo's profile (measured), the fitted pattern and the pattern predicted as drawn, relative to the open beam. */
  profile: { radiusMm: number[]; measured: number[]; fitted: number[]; predicted: number[] };
};

export type PhotoReadingView = {
  id: string;
  uploadId: string;
  apertureId: string;
  fileName: string;
  photoUrl: string;
  readByName: string;
  createdAt: string;
  /** Why the photo could not be read; null when it was. */
  refusal: string | null;
  result: PhotoReadingResult | null;
  observationId: string | null;
  mismatch: boolean | null;
  reasons: string[];
  predictionEngine: string;
};
