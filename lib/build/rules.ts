// The build rules: whether a sign-off still holds, the checklist a bench asks for, the predictions an
// as-built record is compared with, the comparison itself, and which uploaded files are accepted.
// Pure (no database); the figures come from lib/optics (analyzeBench, screenProfile) and lib/safety, which name their sources.
import { laserPowerText } from "@/lib/bench/laser-power";
import type { ReviewState } from "@/db/schema";
import { kindTitle } from "@/lib/bench/kinds";
import type { AnyBenchDocument, BenchDocument, BenchDocumentV2 } from "@/lib/bench/schema";
import { screenProfile } from "@/lib/optics";
import { assessRevision, assessTableRevision } from "@/lib/review/hazard";
import { buildOrderV2, directionWords, edgeWords, tableElementSettings } from "@/lib/review/table-paths";
import type { BenchSafetyAssessment, TableSafetyAssessment } from "@/lib/safety";
import { capitalise, eyewearWords, formatDate } from "@/lib/format";
import { conditionLines } from "./conditions";
import { AppError } from "@/lib/errors";

/** How far a mount may sit from its drawn position and still count as placed (measured along the rail). */
export const POSITION_TOLERANCE_MM = 2;
/** A spot or ring diameter within this fraction of the prediction matches. */
export const SPOT_TOLERANCE_FRACTION = 0.25;
/** A power reading at the screen within this fraction of the prediction matches (meters and losses vary). */
export const POWER_TOLERANCE_FRACTION = 0.2;
export const UPLOAD_MAX_BYTES = 10 * 1024 * 1024;

// ── Sign-off status ───────────────────────────────────────────────────────────────────────────
export type SignOffStatus = "valid" | "expired" | "superseded" | "not-signed-off";

/** The officer's sign-off as a build sees it. */
export type SignOffRecord = {
  signerName: string;
  signerRole: string;
  meaning: string;
  conditions: string | null;
  validUntil: Date | null;
  decidedAt: Date;
  contentHash: string;
};

/** Whether the sign-off holds now. The review clock marks expiry in the database; the date is checked too, so a late clock never lets a build start. */
export function signOffStatus(r: { state: ReviewState; decision: { validUntil: Date | null } | null }, now = new Date()): SignOffStatus {
  if (r.state === "superseded") return "superseded";
  if (r.state === "expired") return "expired";
  if (r.state !== "approved" || !r.decision) return "not-signed-off";
  if (r.decision.validUntil && r.decision.validUntil.getTime() <= now.getTime()) return "expired";
  return "valid";
}

export function signOffSentence(r: { number: number; decision: { validUntil: Date | null } | null }, status: SignOffStatus): string {
  const until = r.decision?.validUntil ? formatDate(r.decision.validUntil) : null;
  switch (status) {
    case "valid":
      return until ? `Signed off, valid until ${until}.` : "Signed off.";
    case "expired":
      return `The sign-off of revision ${r.number} has expired${until ? ` (it held until ${until})` : ""}: do not build or switch on this setup until a revision is signed off again.`;
    case "superseded":
      return `Revision ${r.number} has been replaced by a newer signed-off revision: build the newer one instead.`;
    case "not-signed-off":
      return `Revision ${r.number} is not signed off, so it cannot be built.`;
  }
}

// ── The checklist, generated from the bench ───────────────────────────────────────────────────
export type ChecklistItem = {
  itemKey: string;
  group: "element" | "control" | "condition" | "eyewear";
  label: string;
  detail: string;
  elementId: string | null;
  expectedPositionMm: number | null;
};

export function elementSettings(e: BenchDocument["elements"][number]): string {
  switch (e.kind) {
    case "laser":
      return `${e.wavelengthNm} nm, ${laserPowerText(e)}, beam ⌀ ${e.beamDiameterMm} mm${e.m2 && e.m2 !== 1 ? `, M² ${e.m2}` : ""}`;
    case "lens":
      return `focal length ${e.focalLengthMm} mm (${e.focalLengthMm > 0 ? "converging" : "diverging"})`;
    case "aperture":
      return `opening ⌀ ${e.diameterMm} mm, centred on the beam`;
    case "filter":
      return `optical density ${e.opticalDensity} (passes ${Number((100 * 10 ** -e.opticalDensity).toPrecision(3))} %)`;
    case "beam-block":
      return "stops the beam";
    case "screen":
      return "observation plane";
    default:
      return "";
  }
}

/**
 * The items to tick: each element at its position (±POSITION_TOLERANCE_MM), each control the cautions call for, each
 * condition of the officer's sign-off, the eyewear (worded by the one OD rule, lib/format eyewearWords).
 */
export function checklistFor(doc: AnyBenchDocument, safety: BenchSafetyAssessment | TableSafetyAssessment | null, conditions?: string | null): ChecklistItem[] {
  if (doc.version === 2) return tableChecklist(doc, safety && "openBeams" in safety && Array.isArray(safety.openBeams) ? (safety as TableSafetyAssessment) : null, conditions);
  const railSafety = safety as BenchSafetyAssessment | null;
  const elements = [...doc.elements].sort((a, b) => a.positionMm - b.positionMm || a.id.localeCompare(b.id));
  const items: ChecklistItem[] = elements.map((e) => ({
    itemKey: `element:${e.id}`,
    group: "element",
    label: `${kindTitle(e.kind)} ${e.id} at ${e.positionMm} mm`,
    detail: `${elementSettings(e)}; within ±${POSITION_TOLERANCE_MM} mm of ${e.positionMm} mm`,
    elementId: e.id,
    expectedPositionMm: e.positionMm,
  }));
  for (const c of railSafety?.cautions ?? []) {
    if (c.id === "eyewear-od") continue; // the eyewear line below covers it, with the figure
    items.push({ itemKey: `control:${c.id}`, group: "control", label: c.title, detail: c.text, elementId: null, expectedPositionMm: null });
  }
  conditionLines(conditions).forEach((line, i) => {
    items.push({ itemKey: `condition:${i + 1}`, group: "condition", label: line, detail: "A condition of the laser safety officer's sign-off.", elementId: null, expectedPositionMm: null });
  });
  const od = railSafety?.governing?.opticalDensityRequired ?? 0;
  const wavelength = railSafety?.wavelengthNm ?? doc.elements.find((e) => e.kind === "laser")?.wavelengthNm;
  const eyewear = eyewearWords(od, wavelength);
  items.push({
    itemKey: "eyewear",
    group: "eyewear",
    label: eyewear.wholeOd > 0 ? `${eyewear.wear}, for everyone present` : eyewear.wear,
    detail: eyewear.wholeOd > 0 ? `${capitalise(eyewear.need)}. ${eyewear.check}` : `${capitalise(eyewear.need)}; follow local rules, which may ask for eyewear anyway.`,
    elementId: null,
    expectedPositionMm: null,
  });
  return items;
}

/**
 * A table's checklist: each element in the order the light reaches it, placed by hole and angle (the hole nearest its
 * centre, and its offset from that hole, on the table's grid; the angle counter-clockwise from +x, as drawn); each
 * open beam above the MPE to block or enclose; the cautions, the sign-off's conditions and the eyewear.
 */
function tableChecklist(doc: BenchDocumentV2, safety: TableSafetyAssessment | null, conditions?: string | null): ChecklistItem[] {
  const analysis = assessTableRevision(doc);
  const order = analysis.ok ? buildOrderV2(doc, analysis.analysis) : doc.elements.map((element, i) => ({ order: i + 1, element, hole: "", angleDeg: element.angleDeg, reached: true }));
  const items: ChecklistItem[] = order.map((s) => {
    const e = s.element;
    const settings = tableElementSettings(e);
    const facing = e.kind === "laser" ? `aimed ${directionWords(e.angleDeg)}` : `face normal ${Number(s.angleDeg.toFixed(2))}° from +x`;
    return {
      itemKey: `element:${e.id}`,
      group: "element",
      label: `${kindTitle(e.kind)} ${e.id} at ${s.hole || `(${e.xMm}, ${e.yMm}) mm`}, ${Number(s.angleDeg.toFixed(2))}°`,
      detail: `(${e.xMm}, ${e.yMm}) mm from the front left corner, ${facing}${settings ? `; ${settings}` : ""}${s.reached ? "" : "; no beam reaches it as drawn"}`,
      elementId: e.id,
      expectedPositionMm: null,
    };
  });
  for (const o of safety?.openBeams ?? []) {
    if (!o.exceedsMpe) continue;
    items.push({
      itemKey: `open-beam:${o.pathId}`,
      group: "control",
      label: `Block or enclose beam ${o.pathId}, which leaves the ${edgeWords(doc, o)} at (${Number(o.xMm.toFixed(1))}, ${Number(o.yMm.toFixed(1))}) mm`,
      detail: `${Number(o.powerMw.toPrecision(3))} mW heading ${directionWords(o.directionDeg)}, above the MPE; NOHD ${Number(o.nohdM.toPrecision(3))} m beyond the edge.`,
      elementId: o.startElementId,
      expectedPositionMm: null,
    });
  }
  for (const c of safety?.cautions ?? []) {
    if (c.id === "eyewear-od") continue;
    items.push({ itemKey: `control:${c.id}`, group: "control", label: c.title, detail: c.text, elementId: null, expectedPositionMm: null });
  }
  conditionLines(conditions).forEach((line, i) => {
    items.push({ itemKey: `condition:${i + 1}`, group: "condition", label: line, detail: "A condition of the laser safety officer's sign-off.", elementId: null, expectedPositionMm: null });
  });
  const od = safety?.governing?.opticalDensityRequired ?? 0;
  const lasers = doc.elements.filter((e) => e.kind === "laser");
  const eyewear = eyewearWords(od, lasers.length === 1 ? lasers[0].wavelengthNm : undefined);
  items.push({
    itemKey: "eyewear",
    group: "eyewear",
    label: eyewear.wholeOd > 0 ? `${eyewear.wear}, for everyone present${lasers.length > 1 ? " (per line: see the eyewear list)" : ""}` : eyewear.wear,
    detail: eyewear.wholeOd > 0 ? `${capitalise(eyewear.need)}. ${eyewear.check}` : `${capitalise(eyewear.need)}; follow local rules, which may ask for eyewear anyway.`,
    elementId: null,
    expectedPositionMm: null,
  });
  return items;
}

// ── Predictions the observations are compared with ────────────────────────────────────────────
export type AperturePrediction = {
  apertureId: string;
  diameterMm: number;
  screenId: string | null;
  observationDistanceMm: number | null;
  fresnelNumber: number;
  centre: "bright" | "dark" | "between";
  centreIntensityRatio: number;
  transmittedFraction: number;
  /** The lit pattern's diameter: the larger of the aperture's shadow and the first dark ring of the far-field pattern. */
  spotDiameterMm: number | null;
  screenPowerMw: number | null;
  /** On a table: every screen the light through the aperture reaches (a splitter behind it may send light to several). */
  screenIds?: string[];
};
export type ScreenPrediction = { screenId: string; positionMm: number; beamDiameterMm: number; powerMw: number };
export type Predictions = { apertures: AperturePrediction[]; screen: ScreenPrediction | null; problem: string | null };

export function predictionsFor(doc: AnyBenchDocument): Predictions {
  if (doc.version === 2) return tablePredictions(doc);
  const assessed = assessRevision(doc);
  if (!assessed.ok) return { apertures: [], screen: null, problem: assessed.problem };
  const { analysis } = assessed;
  const lambdaMm = (analysis.wavelengthNm ?? 0) * 1e-6;
  const powerAt = (id: string | null) => (id ? (analysis.elements.find((e) => e.id === id)?.incident.powerMw ?? null) : null);
  const apertures = analysis.apertures.map((a): AperturePrediction => {
    let spotDiameterMm: number | null = null;
    if (a.screenId) {
      try {
        const shadow = screenProfile(doc, a.id, { radiiMm: [0] }).shadowRadiusMm;
        const airy = a.observationDistanceMm ? (2 * 1.22 * lambdaMm * a.observationDistanceMm) / a.diameterMm : 0;
        spotDiameterMm = Math.max(2 * shadow, airy);
      } catch {
        spotDiameterMm = null;
      }
    }
    return {
      apertureId: a.id,
      diameterMm: a.diameterMm,
      screenId: a.screenId,
      observationDistanceMm: a.observationDistanceMm,
      fresnelNumber: a.fresnelNumber,
      centre: a.centre,
      centreIntensityRatio: a.centreIntensityRatio,
      transmittedFraction: a.transmittedFraction,
      spotDiameterMm,
      screenPowerMw: powerAt(a.screenId),
    };
  });
  const lit = analysis.elements.find((e) => e.kind === "screen" && e.status === "lit" && e.incident.powerMw > 0);
  const screen = lit ? { screenId: lit.id, positionMm: lit.positionMm, beamDiameterMm: 2 * lit.incident.radiusMm, powerMw: lit.incident.powerMw } : null;
  return { apertures, screen, problem: null };
}

/**
 * A table's predictions: each lit aperture on each path (spot size not given: the screen profile is a rail
 * computation), and the screen receiving the most power, its position the unfolded length from its laser.
 */
function tablePredictions(doc: BenchDocumentV2): Predictions {
  const assessed = assessTableRevision(doc);
  if (!assessed.ok) return { apertures: [], screen: null, problem: assessed.problem };
  const { analysis } = assessed;
  const screenEntry = (id: string | null, pathId: string) => (id ? analysis.elements.find((e) => e.id === id && e.kind === "screen") : undefined) ?? analysis.elements.find((e) => e.pathId === pathId && e.kind === "screen");
  const seen = new Set<string>();
  const apertures: AperturePrediction[] = [];
  for (const a of analysis.apertures) {
    if (seen.has(a.id)) continue;
    seen.add(a.id);
    const screen = a.screenId ? screenEntry(a.screenId, a.pathId) : undefined;
    apertures.push({
      apertureId: a.id,
      diameterMm: a.diameterMm,
      screenId: a.screenId,
      observationDistanceMm: a.observationDistanceMm,
      fresnelNumber: a.fresnelNumber,
      centre: a.centre,
      centreIntensityRatio: a.centreIntensityRatio,
      transmittedFraction: a.transmittedFraction,
      spotDiameterMm: null,
      screenPowerMw: screen ? screen.incident.powerMw : null,
      screenIds: [...new Set(analysis.apertures.flatMap((b) => (b.id === a.id && b.screenId !== null ? [b.screenId] : [])))],
    });
  }
  const lit = analysis.elements.filter((e) => e.kind === "screen" && e.incident.powerMw > 0).sort((a, b) => b.incident.powerMw - a.incident.powerMw)[0];
  const screen = lit ? { screenId: lit.id, positionMm: lit.positionMm, beamDiameterMm: 2 * lit.incident.radiusMm, powerMw: lit.incident.powerMw } : null;
  return { apertures, screen, problem: null };
}

const round3 = (v: number) => Number(v.toPrecision(3));

/** What an observation is compared with, kept with it so the record never changes when the engine does. */
export type ObservationPrediction = {
  centrePredicted: "bright" | "dark" | "between" | null;
  predictedSpotDiameterMm: number | null;
  predictedScreenPowerMw: number | null;
};

export type ObservationReading = { centreSeen?: "bright" | "dark" | "between" | "unclear" | null; spotDiameterMm?: number | null; screenPowerMw?: number | null };

/** The prediction for one aperture's pattern, or for the lit screen when no aperture is named. */
export function predictionFor(predictions: Predictions, apertureId: string | null | undefined): ObservationPrediction {
  const aperture = apertureId ? predictions.apertures.find((a) => a.apertureId === apertureId) : undefined;
  return {
    centrePredicted: aperture?.centre ?? null,
    predictedSpotDiameterMm: aperture ? aperture.spotDiameterMm : (predictions.screen?.beamDiameterMm ?? null),
    predictedScreenPowerMw: aperture ? aperture.screenPowerMw : (predictions.screen?.powerMw ?? null),
  };
}

/** Each difference between the reading and the prediction, as one sentence; none means they agree. */
export function differences(prediction: ObservationPrediction, seen: ObservationReading): string[] {
  const { centrePredicted, predictedSpotDiameterMm: spot, predictedScreenPowerMw: power } = prediction;
  const reasons: string[] = [];
  if (seen.centreSeen && centrePredicted && seen.centreSeen !== "unclear" && seen.centreSeen !== "between" && centrePredicted !== "between" && seen.centreSeen !== centrePredicted) {
    reasons.push(`Centre: predicted ${centrePredicted}, seen ${seen.centreSeen}.`);
  }
  if (seen.spotDiameterMm != null && spot != null && spot > 0 && Math.abs(seen.spotDiameterMm - spot) > SPOT_TOLERANCE_FRACTION * spot) {
    reasons.push(`Spot or ring diameter: predicted ${round3(spot)} mm, measured ${seen.spotDiameterMm} mm (more than ${SPOT_TOLERANCE_FRACTION * 100} % apart).`);
  }
  if (seen.screenPowerMw != null && power != null && Math.abs(seen.screenPowerMw - power) > POWER_TOLERANCE_FRACTION * power) {
    reasons.push(`Power at the screen: predicted ${round3(power)} mW, measured ${seen.screenPowerMw} mW (more than ${POWER_TOLERANCE_FRACTION * 100} % apart).`);
  }
  return reasons;
}

/** Compares what was seen with what was predicted: the prediction used and each difference as one sentence. */
export function compareObservation(predictions: Predictions, seen: ObservationReading & { apertureId?: string | null }): ObservationPrediction & { reasons: string[] } {
  const prediction = predictionFor(predictions, seen.apertureId);
  return { ...prediction, reasons: differences(prediction, seen) };
}

// ── Uploaded files ────────────────────────────────────────────────────────────────────────────
const FILE_TYPES = [
  { contentType: "image/png", extension: "png", magic: [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a] },
  { contentType: "image/jpeg", extension: "jpg", magic: [0xff, 0xd8, 0xff] },
  { contentType: "application/pdf", extension: "pdf", magic: [0x25, 0x50, 0x44, 0x46, 0x2d] }, // %PDF-
] as const;

/** The file's real type from its first bytes (its name and declared type are not trusted), or null. */
export function sniffFileType(bytes: Uint8Array): { contentType: string; extension: string } | null {
  const found = FILE_TYPES.find((t) => bytes.length >= t.magic.length && t.magic.every((b, i) => bytes[i] === b));
  return found ? { contentType: found.contentType, extension: found.extension } : null;
}


/** The file name to keep and show: the given one, or upload.<extension> when there is none. */
export function safeFileName(name: string, extension: string): string {
  // Kept exactly as the person's computer named it: it is only ever shown and sent back (RFC 6266
  // filename*), never used as a path (the storage key is the upload's id). The upload route refuses
  // what cannot be stored (NUL, lone surrogates) and names over 255 characters.
  return name || `upload.${extension}`;
}

// ── Positions and signing off a build ─────────────────────────────────────────────────────────
/** A measured mount position counts as placed within ±POSITION_TOLERANCE_MM of the drawn one; null when either is missing. */
export function positionWithinTolerance(expectedPositionMm: number | null, measuredPositionMm: number | null): boolean | null {
  if (expectedPositionMm === null || measuredPositionMm === null) return null;
  return Math.abs(measuredPositionMm - expectedPositionMm) <= POSITION_TOLERANCE_MM + 1e-9;
}

/** Why a build cannot be signed off yet, in a sentence, or null when it can. */
export function whyNotSignOff(
  build: { state: "in-progress" | "completed"; technicianId: string },
  revision: { number: number; state: ReviewState; decision: { validUntil: Date | null } | null },
  checklist: { done: boolean; group: ChecklistItem["group"]; elementId: string | null; withinTolerance: boolean | null }[],
  userId: string,
  now = new Date(),
): string | null {
  if (build.state === "completed") return "This build is already completed.";
  if (build.technicianId !== userId) return "Only the technician who started this build can complete it.";
  const status = signOffStatus(revision, now);
  if (status !== "valid") return signOffSentence(revision, status);
  const open = checklist.filter((c) => !c.done);
  if (open.length) return `${open.length} checklist item${open.length === 1 ? " is" : "s are"} not ticked yet.`;
  const off = checklist.filter((c) => c.group === "element" && c.withinTolerance !== true);
  if (off.length) return `${off.map((c) => c.elementId).join(", ")} ${off.length === 1 ? "is" : "are"} not measured within ±${POSITION_TOLERANCE_MM} mm of the drawn position.`;
  return null;
}

function tooBig(sizeBytes: number): AppError {
  return new AppError("payload-too-large", `The file is ${(sizeBytes / 1024 / 1024).toFixed(1)} MB; files may be at most ${UPLOAD_MAX_BYTES / 1024 / 1024} MB. Take a smaller photo or export a smaller PDF.`, [
    { path: "file", message: `At most ${UPLOAD_MAX_BYTES / 1024 / 1024} MB` },
  ]);
}

export function assertUploadSize(sizeBytes: number): void {
  if (sizeBytes > UPLOAD_MAX_BYTES) throw tooBig(sizeBytes);
}
