// The build rules for the printed sheet: its parts, the numbered build order, and the expected ring images
// and profiles. Pure; the figures come from lib/optics (screenProfile, ringImage) and lib/safety, which name their sources.
import { laserPowerText } from "@/lib/bench/laser-power";
import type { BenchDocument, LaserElement } from "@/lib/bench/schema";
import { kindTitle } from "@/lib/bench/kinds";
import { ringImage, screenProfile, type ApertureAnalysis, type BenchAnalysis } from "@/lib/optics";
import { greyPng, pngDataUrl } from "@/lib/pdf/png";
import { assessRevision } from "@/lib/review/hazard";
import type { BenchSafetyAssessment } from "@/lib/safety";
import { eyewearWords } from "@/lib/format/eyewear";
import { elementSettings, POSITION_TOLERANCE_MM, type ChecklistItem, type SignOffRecord, type SignOffStatus } from "./rules";
import type { BenchDocumentV2 } from "@/lib/bench/schema-v2";
import type { TableAnalysis } from "@/lib/optics/table";
import type { TableSafetyAssessment } from "@/lib/safety/table";
import type { BuildStepV2, PathRow } from "@/lib/review/table-paths";

// ── The sheet's content, for the print route ──────────────────────────────────────────────────
export type RegisterEntry = {
  id: string;
  model: string;
  serialNumber: string | null;
  labelClass: string;
  wavelengthsNm: number[];
  maxPowerMw: number;
  beamDiameterMm: number;
  divergenceMrad: number;
  location: string | null;
  status: string;
};

export type SheetPart = { id: string; kind: string; kindWord: string; positionMm: number; fromLaserMm: number; settings: string };
export type SheetStep = { title: string; lines: string[] };
export type SheetAperture = ApertureAnalysis & {
  spotDiameterMm: number | null;
  screenPowerMw: number | null;
  profile: { radiusMm: number[]; relativeIntensity: number[]; shadowRadiusMm: number } | null;
  ringPng: string | null;
  ringMaxRadiusMm: number | null;
};

export type SheetContent = {
  revision: { id: string; number: number; contentHash: string; benchTitle: string; labName: string; authorName: string; status: SignOffStatus; statusSentence: string };
  decision: SignOffRecord | null;
  document: BenchDocument;
  laser: LaserElement | null;
  register: { registerId: string; entry: RegisterEntry | null } | null;
  parts: SheetPart[];
  checklist: ChecklistItem[];
  steps: SheetStep[];
  analysis: BenchAnalysis | null;
  safety: BenchSafetyAssessment | null;
  problem: string | null;
  apertures: SheetAperture[];
  screen: { screenId: string; positionMm: number; beamDiameterMm: number; powerMw: number } | null;
  toleranceMm: number;
  verifyUrl: string;
  qrSvg: string;
};

/** The printed sheet of a table (bench document version 2): the plan, the build order following the light, where every beam ends. */
export type TableSheetContent = Pick<SheetContent, "revision" | "decision" | "checklist" | "problem" | "toleranceMm" | "verifyUrl" | "qrSvg"> & {
  kind: "table";
  document: BenchDocumentV2;
  analysis: TableAnalysis | null;
  safety: TableSafetyAssessment | null;
  /** Every path: power, band, OD, end. */
  rows: PathRow[];
  /** The paths that end (block, screen, table edge, cut), open beams first. */
  ends: PathRow[];
  /** Each element in the order the light reaches it, with its hole and angle. */
  steps: BuildStepV2[];
  /** Each laser's register entry, where it names one. */
  registers: { laserId: string; registerId: string; entry: RegisterEntry | null }[];
};

export const isTableSheet = (sheet: SheetContent | TableSheetContent): sheet is TableSheetContent => "kind" in sheet && sheet.kind === "table";

const RING_PX = 220;
/** Points of the printed radial profile: a smooth line at 90 mm wide, without a path of a thousand segments. */
export const PROFILE_POINTS = 200;
const RING_GAMMA = 0.6;
/** Radius of the disc painted with the on-axis value (pixels). */
const RING_CENTRE_PX = 2.5;

export function ringPngFor(doc: BenchDocument, apertureId: string, maxRadiusMm: number): string | null {
  try {
    const image = ringImage(doc, apertureId, { sizePx: RING_PX, maxRadiusMm });
    const levels = Float32Array.from(image.intensity, (v) => Math.pow(Math.max(0, v), RING_GAMMA));
    // The central spot can be smaller than a pixel, and pixel centres never sit on the axis: paint a small disc with
    // the on-axis value so a dark centre reads dark and a bright one bright, whatever the resolution.
    const onAxis = screenProfile(doc, apertureId, { radiiMm: [0] }).relativeIntensity[0];
    if (image.peakRelativeIntensity > 0 && Number.isFinite(onAxis)) {
      const centreLevel = Math.pow(Math.min(1, Math.max(0, onAxis / image.peakRelativeIntensity)), RING_GAMMA);
      const half = image.widthPx / 2;
      for (let y = 0; y < image.heightPx; y++)
        for (let x = 0; x < image.widthPx; x++)
          if (Math.hypot(x + 0.5 - half, y + 0.5 - half) <= RING_CENTRE_PX) levels[y * image.widthPx + x] = centreLevel;
    }
    return pngDataUrl(greyPng(image.widthPx, image.heightPx, levels));
  } catch {
    return null;
  }
}

/** The numbered build order: prepare, mount in beam order, align at the lowest practical power with blocks in place, then open up. */
export function buildSteps(doc: BenchDocument, safety: BenchSafetyAssessment | null): SheetStep[] {
  const elements = [...doc.elements].sort((a, b) => a.positionMm - b.positionMm || a.id.localeCompare(b.id));
  const laser = elements.find((e): e is LaserElement => e.kind === "laser");
  const od = safety?.governing?.opticalDensityRequired ?? 0;
  const words = eyewearWords(od, laser?.wavelengthNm);
  const eyewear = words.wholeOd > 0 ? `eyewear of OD ${words.wholeOd} or more at ${laser?.wavelengthNm} nm (${words.need})` : "the eyewear your local rules ask for (no eyewear needed for the direct beam)";
  const cautionIds = new Set(safety?.cautions.map((c) => c.id) ?? []);
  const prep = safety?.cautions.filter((c) => ["sign-caution", "sign-warning", "no-reflective-items", "engineering-controls", "sop-and-approval", "local-rules-sop", "beam-height"].includes(c.id)).map((c) => c.title) ?? [];
  const stops = elements.filter((e) => e.kind === "beam-block" || e.kind === "screen");
  const steps: SheetStep[] = [
    {
      title: "Prepare the area, laser off",
      lines: [`Laser switched off${cautionIds.has("engineering-controls") ? ", key removed" : ""}. Have ${eyewear} ready for everyone present.`, ...prep],
    },
  ];
  for (const e of elements) {
    const at = `at ${e.positionMm} mm (±${POSITION_TOLERANCE_MM} mm)`;
    const settings = elementSettings(e);
    const lines =
      e.kind === "laser"
        ? [`${settings}. Leave it off.`, "Every position on this sheet is measured along the beam on the same scale as the laser's position."]
        : e.kind === "screen"
          ? [settings, ...(cautionIds.has("screen-backstop") ? ["Mount a beam block directly behind the screen."] : [])]
          : [settings];
    steps.push({ title: `Mount ${kindTitle(e.kind).toLowerCase()} ${e.id} ${at}`, lines });
  }
  const first = elements.find((e) => e.kind !== "laser");
  steps.push({
    title: "Switch on at the lowest practical power, beam blocked",
    lines: [
      `Put on ${eyewear}.`,
      `Put a temporary beam block right after the laser${first ? `, before ${first.id}` : ""}.`,
      "Switch the laser on at the lowest power that still lets you see the beam on a viewing card (or use a low-power alignment laser).",
    ],
  });
  steps.push({
    title: "Align in beam order",
    lines: [
      "For each element from the laser onward: move the temporary block to just behind it, centre the beam on it at the working height, lock the mount.",
      `Order: ${elements.map((e) => e.id).join(" → ")}.`,
    ],
  });
  steps.push({
    title: "Open up",
    lines: [
      `Take the temporary block away. Check that the beam ends on ${stops.length ? stops.map((s) => s.id).join(" / ") : "a beam block (this bench has an open end — add one first)"}.`,
      laser ? `Raise the power to the drawn ${laserPowerText(laser)} only now.` : "Raise the power to the drawn value only now.",
      "Compare the screen with the predictions page.",
    ],
  });
  steps.push({
    title: "Record what was built and seen",
    lines: ["Enter the measured positions, the ticks, the observations and photos in the build record in Benchwarden."],
  });
  return steps;
}

/** The expected ring image (PNG data URL) and radial profile of every aperture with a screen, for the build page. */
export function predictionImages(doc: BenchDocument): Record<string, { ringPng: string | null; profile: { radiusMm: number[]; relativeIntensity: number[]; shadowRadiusMm: number } | null; acrossMm: number | null }> {
  const assessed = assessRevision(doc);
  if (!assessed.ok) return {};
  const out: ReturnType<typeof predictionImages> = {};
  for (const a of assessed.analysis.apertures) {
    if (!a.screenId) continue;
    try {
      const s = screenProfile(doc, a.id, { points: 200 });
      const maxMm = s.radiusMm[s.radiusMm.length - 1];
      out[a.id] = { ringPng: ringPngFor(doc, a.id, maxMm), profile: { radiusMm: s.radiusMm, relativeIntensity: s.relativeIntensity, shadowRadiusMm: s.shadowRadiusMm }, acrossMm: 2 * maxMm };
    } catch {
      out[a.id] = { ringPng: null, profile: null, acrossMm: null };
    }
  }
  return out;
}
