// assessBench: irradiance and required eyewear OD (per emission line) at every element, at foci and beyond an open end;
// diffuse viewing of screens and blocks (C_E) and the skin near foci of Class 4 beams.
// Formulas: OD = log10(E/MPE) over the limiting aperture; Gaussian q-parameter (Siegman, Lasers, ch. 17); ANSI Z136.1-2014
// Appendix B and Tables 6/7 (C_E, skin MPE); sum of fractions across lines per lib/safety/lines (values from memory).

import { z } from "zod";
import { laserBeamPowerMw } from "@/lib/bench/laser-power";
import type { BenchDocument, FilterElement, LaserElement } from "@/lib/bench/schema";
import { assessBeamUnchecked, coverageProblem, standardSchema, type BeamAssessment, type BeamInput } from "./beam";
import { selectCautions, type CautionSituation, type SelectedCaution } from "./cautions";
import { compareLabel } from "./classify";
import { type ExposureLimit, worstExceedance } from "./exposure-limit";
import { SQRT2, diffuseReflectionNhz, lensNohd } from "./hazard-distance";
import { apertureAveragedIrradianceWPerCm2, peakIrradianceWPerCm2 } from "./irradiance";
import { combineLines, lineInput, type LaserLinesAssessment } from "./lines";
import { LIMITATIONS, type Limitation } from "./limitations";
import { MAX_EXPOSURE_S, MIN_EXPOSURE_S, correctionCE, skinMpe } from "./mpe";
import { DEFAULT_MPE_STANDARD, FINAL_SAY, type Figure, HAZARD_CLASSES, SOURCE, type StandardId, UNCHECKED } from "./types";

/** The beam arriving at an element, as the optics engine's analyzeBench reports it (the bench document contract). */
export type IncidentBeam = {
  /** 1/e² radius. */
  radiusMm: number;
  /** > 0 diverging, < 0 converging, null flat. */
  wavefrontRadiusMm: number | null;
  powerMw: number;
};

/** Structural match of one entry of analyzeBench(doc).elements, so this module does not depend on lib/optics. */
export type BeamAtElement = {
  id: string;
  kind: string;
  positionMm: number;
  /** null (or power 0) where no light arrives. */
  incident: IncidentBeam | null;
};

/**
 * Power (mW) inside a centred circle of radius radiusMm on the beam axis at positionMm (arriving at elementId when
 * given), from the propagated field behind a clipping aperture; null where the plain Gaussian holds. The caller hands
 * it in (lib/optics fieldPowerProbe), so this module never depends on lib/optics. the bench document contract revision 2.
 */
export type EnclosedPowerMw = (positionMm: number, radiusMm: number, elementId?: string) => number | null;

export type BenchBeam = {
  elements: readonly BeamAtElement[];
  enclosedPowerMw?: EnclosedPowerMw;
  /**
   * Points the caller already holds (the table's leaves share every element upstream of their split, and the light
   * arriving there is the same in each): true leaves that element's point, or that focus, out of `points` (and a lens's
   * hazard distance with it). The bench's own answer never sets it.
   */
  skipPoint?: (elementId: string, where: HazardPoint["where"]) => boolean;
  /** The laser's own figures by laser id, filled on first use: leaves of one table (same options) share them. */
  laserFigures?: Map<string, LaserFigures>;
  /** true: the caller chooses the cautions over the whole table (a leaf's own list is left empty). */
  ownCautions?: boolean;
};

/** Options as the API accepts them (field paths with plain messages). */
export const benchSafetyOptionsSchema = z.object({
  exposureS: z
    .number({ error: "Exposure duration must be a number" })
    .refine(Number.isFinite, "Exposure duration must be a finite number")
    .refine((v) => v >= MIN_EXPOSURE_S, "Exposure duration must be at least 1e-13 s")
    .refine((v) => v <= MAX_EXPOSURE_S, "Exposure duration must be at most 30000 s")
    .optional(),
  /** The class on the laser's label (from the laser register), compared with the estimate. */
  labelClass: z.enum(HAZARD_CLASSES, { error: `Label class must be one of: ${HAZARD_CLASSES.join(", ")}` }).optional(),
  /** The standard for MPE, NOHD and OD (the lab's choice); the class always follows IEC 60825-1:2014. */
  standard: standardSchema.optional(),
});

export type BenchSafetyOptions = z.infer<typeof benchSafetyOptionsSchema>;

export type HazardPoint = {
  /** The element there, or for a focus the element just upstream of it. */
  elementId: string;
  kind: string;
  where: "element" | "focus" | "open-end-focus";
  positionMm: number;
  powerMw: number;
  radiusMm: number;
  peakIrradianceWPerCm2: number;
  averagedIrradianceWPerCm2: number;
  /** log10(E/MPE), the worst over the laser's lines (with their sum-of-fractions share); null where no light arrives. */
  opticalDensityRaw: number | null;
  /** The raw value floored at 0. */
  opticalDensityRequired: number;
  /** Per emission line (the main line first): its power here and the OD it needs here. */
  lines?: { wavelengthNm: number; powerMw: number; opticalDensityRaw: number | null; opticalDensityRequired: number }[];
};

/** A screen or beam block seen diffusely: the spot as an extended source (C_E from the angle it subtends). */
export type DiffuseViewing = {
  elementId: string;
  kind: string;
  wavelengthNm: number;
  spotDiameterMm: number;
  viewingDistanceMm: number;
  angularSubtenseMrad: number;
  cE: number;
  /** Irradiance at the eye from the spot (Lambertian, ρ = 1, on the normal), in the MPE's terms. */
  irradianceWPerCm2: number;
  extendedMpeWPerCm2: number;
  opticalDensityRaw: number;
  exceedsMpe: boolean;
  source: string;
};

/** Skin near a focus of a Class 4 beam. */
export type SkinHazard = {
  elementId: string;
  where: "element" | "focus" | "open-end-focus";
  positionMm: number;
  wavelengthNm: number;
  /** Irradiance over the 3.5 mm skin aperture ÷ skin MPE (worst of average and per pulse). */
  ratio: number;
  exceedsSkinMpe: boolean;
  source: string;
};

export type BenchSafetyAssessment = {
  laserId: string;
  wavelengthNm: number;
  standard: StandardId;
  /** assessBeam of the laser's main line (class of that line, MPE, NOHD of the free beam, label check). */
  laser: BeamAssessment;
  /** Class over all lines and per line MPE, NOHD and OD of the free beam. */
  lines: LaserLinesAssessment;
  /** Class over all lines (the main line's class when it has no further lines). */
  hazardClass: BeamAssessment["hazardClass"];
  /**
   * The same shape as version 2's lasers[]: the one laser with its class and, per line, MPE, NOHD of the free beam and
   * the OD that line needs anywhere on the bench (the maximum over every element, focus and open end).
   */
  lasers: {
    laserId: string;
    hazardClass: BeamAssessment["hazardClass"];
    lines: {
      wavelengthNm: number;
      main: boolean;
      powerMw: number;
      hazardClass: BeamAssessment["hazardClass"];
      mpeWPerCm2: number | null;
      perPulseJPerCm2: number | null;
      nohdM: number;
      opticalDensityRequired: number;
      source: string;
    }[];
  }[];
  mpe: Figure;
  limitingAperture: Figure;
  points: HazardPoint[];
  /** The highest OD anywhere on the bench and where it occurs; null when no light reaches anything. */
  governing: (HazardPoint & { source: string }) | null;
  lensHazards: { elementId: string; fromFocusM: number; fromLensM: number; source: string }[];
  screenHazards: { elementId: string; diffuseReflectionNhzM: number; source: string }[];
  diffuseViewing: DiffuseViewing[];
  skinHazards: SkinHazard[];
  openBeamEnd: { afterElementId: string; positionMm: number } | null;
  cautions: SelectedCaution[];
  warnings: { code: string; elementId?: string; message: string }[];
  limitations: readonly Limitation[];
  finalSay: string;
};

type BeamState = { radiusMm: number; wavefrontRadiusMm: number | null; powerMw: number };

/** Waist of the Gaussian beam through a plane: signed distance from the plane (> 0 downstream) and waist radius. */
export function waistFrom(beam: BeamState, wavelengthNm: number, m2: number): { distanceMm: number; radiusMm: number } {
  // 1/q = 1/R − i·λM²/(π w²); q = z + i z_R with z measured from the waist, so the waist lies at −z.
  const invR = beam.wavefrontRadiusMm === null ? 0 : 1 / beam.wavefrontRadiusMm;
  const b = (wavelengthNm * 1e-6 * m2) / (Math.PI * beam.radiusMm * beam.radiusMm);
  const denom = invR * invR + b * b;
  const z = invR / denom;
  const zR = b / denom;
  return { distanceMm: -z, radiusMm: Math.sqrt((wavelengthNm * 1e-6 * m2 * zR) / Math.PI) };
}

const STOPS = new Set(["beam-block", "screen"]);

/** Closest distance at which the eye can focus on a spot: the diffuse-viewing figure is worked there (common practice). */
export const DIFFUSE_VIEWING_DISTANCE_MM = 100;
/** Exposure of the skin near a focus (common practice: a hand in the beam for up to 10 s). */
export const SKIN_EXPOSURE_S = 10;

/** OD of a filter at a wavelength: the band's OD where a band covers it, else the filter's single OD. */
export function filterOpticalDensityAt(filter: Pick<FilterElement, "opticalDensity" | "opticalDensityBands">, wavelengthNm: number): number {
  for (const b of filter.opticalDensityBands ?? []) if (wavelengthNm >= b.fromNm && wavelengthNm <= b.toNm) return b.opticalDensity;
  return filter.opticalDensity;
}

type Line = { wavelengthNm: number; share: number; limit: ExposureLimit; assessment: BeamAssessment };

export function assessBench(doc: BenchDocument, beam: BenchBeam, options: BenchSafetyOptions = {}): BenchSafetyAssessment {
  const laser = doc.elements.find((e): e is LaserElement => e.kind === "laser");
  if (!laser) throw new RangeError("The bench needs a laser to assess");
  const λ = laser.wavelengthNm;
  const m2 = laser.m2 ?? 1;
  const w0 = laser.beamDiameterMm / 2;
  // Far-field 1/e² full-angle divergence of the laser: θ = 2M²λ/(π w0).
  const divergenceFor = (wavelengthNm: number) => ((2 * m2 * wavelengthNm * 1e-6) / (Math.PI * w0)) * 1000;
  const byId = new Map(doc.elements.map((e) => [e.id, e]));

  const situations = new Set<CautionSituation>();
  const warnings: BenchSafetyAssessment["warnings"] = [];
  const points: HazardPoint[] = [];
  const lensHazards: BenchSafetyAssessment["lensHazards"] = [];
  const screenHazards: BenchSafetyAssessment["screenHazards"] = [];
  const diffuseViewing: DiffuseViewing[] = [];
  const skinHazards: SkinHazard[] = [];

  // the laser's own figures: the same for every leaf of a table, so a caller may hand in the ones it already has
  const cached = beam.laserFigures?.get(laser.id);
  const own = cached ?? laserFigures(laser, options, divergenceFor);
  if (!cached) beam.laserFigures?.set(laser.id, own);
  const { standard, pulseDurationS, pulseRepetitionRateHz, laserAssessment, further, lineList, linesAssessment, allocation } = own;
  for (const w of own.warnings) warnings.push({ ...w });

  // Filter correction per line, accumulated along the beam (in beam order).
  const filterFactor = lineList.map(() => 1);
  const correctionAt = new Map<string, readonly number[]>();

  const point = (elementId: string, kind: string, where: HazardPoint["where"], positionMm: number, b: BeamState, factors: readonly number[]): HazardPoint => {
    // behind a clipping aperture: the share of the beam inside each limiting aperture from the propagated field, never a rescaled Gaussian
    const enclosed = beam.enclosedPowerMw;
    const shareInside =
      enclosed === undefined
        ? undefined
        : (apertureMm: number): number | null => {
            const inside = enclosed(positionMm, apertureMm / 2, where === "element" ? elementId : undefined);
            return inside === null ? null : b.powerMw > 0 ? Math.min(1, inside / b.powerMw) : 0;
          };
    return hazardPoint(lineList, allocation, elementId, kind, where, positionMm, b, factors, shareInside);
  };
  const dark = (e: BeamAtElement, radiusMm: number): HazardPoint => ({
    elementId: e.id, kind: e.kind, where: "element", positionMm: e.positionMm, powerMw: 0, radiusMm,
    peakIrradianceWPerCm2: 0, averagedIrradianceWPerCm2: 0, opticalDensityRaw: null, opticalDensityRequired: 0,
    lines: lineList.map((l) => ({ wavelengthNm: l.wavelengthNm, powerMw: 0, opticalDensityRaw: null, opticalDensityRequired: 0 })),
  });

  const lit = (e: BeamAtElement): BeamState | null => {
    if (e.kind === "laser" && e.id === laser.id) return e.incident ?? { radiusMm: w0, wavefrontRadiusMm: null, powerMw: laserBeamPowerMw(laser) };
    return e.incident && e.incident.powerMw > 0 && e.incident.radiusMm > 0 ? e.incident : null;
  };

  const elements = beam.elements;
  let lastLit: { element: BeamAtElement; state: BeamState } | null = null;
  let stopped = false;
  const skipped = new Set<string>();
  for (let i = 0; i < elements.length; i++) {
    const e = elements[i];
    const state = lit(e);
    const factors: readonly number[] = filterFactor.slice();
    correctionAt.set(e.id, factors);
    const docElement = byId.get(e.id);
    if (docElement?.kind === "filter" && docElement.opticalDensityBands && docElement.opticalDensityBands.length > 0) {
      for (let j = 0; j < lineList.length; j++) {
        filterFactor[j] *= 10 ** (docElement.opticalDensity - filterOpticalDensityAt(docElement, lineList[j].wavelengthNm));
      }
    }
    if (!state) {
      points.push(dark(e, e.incident?.radiusMm ?? 0));
      continue;
    }
    // A focus between the previous element and this one: the beam arriving here diverges from a waist inside the gap.
    if (i > 0 && state.wavefrontRadiusMm !== null && state.wavefrontRadiusMm > 0) {
      const waist = waistFrom(state, λ, m2);
      const gapMm = e.positionMm - elements[i - 1].positionMm;
      const back = -waist.distanceMm;
      // The tolerance keeps the laser's own waist (at the laser) from counting as a focus in the gap.
      if (back > 1e-6 && back < gapMm - 1e-6 * Math.max(1, gapMm)) {
        const prev = elements[i - 1];
        if (!beam.skipPoint?.(prev.id, "focus")) points.push(point(prev.id, prev.kind, "focus", e.positionMm - back, { ...state, radiusMm: waist.radiusMm }, factors));
        situations.add("focusing-optics");
      }
    }
    lastLit = { element: e, state };
    if (beam.skipPoint?.(e.id, "element")) {
      skipped.add(e.id);
      if (!STOPS.has(e.kind)) continue;
      stopped = true;
      break;
    }
    points.push(point(e.id, e.kind, "element", e.positionMm, state, factors));

    if (docElement?.kind === "lens") {
      if (docElement.focalLengthMm > 0) situations.add("focusing-optics");
      let fromFocusM = 0;
      let fromLensM = 0;
      let source = "";
      for (let j = 0; j < lineList.length; j++) {
        const line = lineList[j];
        for (const site of line.limit.sites) {
          const h = lensNohd({
            powerMw: state.powerMw * line.share * factors[j] * 10 ** allocation[j],
            mpeWPerCm2: site.effectiveWPerCm2,
            focalLengthMm: docElement.focalLengthMm,
            beamDiameterOnLens1eMm: (2 * state.radiusMm) / SQRT2,
            limitingApertureMm: site.limitingApertureMm,
          });
          if (h.fromLensM >= fromLensM) {
            fromLensM = h.fromLensM;
            fromFocusM = h.fromFocusM;
            source = h.source;
          }
        }
      }
      lensHazards.push({ elementId: e.id, fromFocusM, fromLensM, source: `${source || SOURCE.ansiAppendixBLens}; b₀ = 1/e² diameter ÷ √2; the worst line — ${UNCHECKED}` });
    }
    if (e.kind === "screen" || e.kind === "beam-block") {
      if (e.kind === "screen") {
        situations.add("screen-in-beam");
        let nhzM = 0;
        for (let j = 0; j < lineList.length; j++) {
          const line = lineList[j];
          let mpe = Number.POSITIVE_INFINITY;
          for (const x of line.limit.sites) mpe = Math.min(mpe, x.effectiveWPerCm2);
          nhzM = Math.max(nhzM, diffuseReflectionNhz({ powerMw: state.powerMw * line.share * factors[j] * 10 ** allocation[j], mpeWPerCm2: mpe }).distanceM);
        }
        screenHazards.push({ elementId: e.id, diffuseReflectionNhzM: nhzM, source: `${SOURCE.ansiAppendixBDiffuse}, ρ = 1, θ = 0 (worst case); the worst line — ${UNCHECKED}` });
      }
      for (let j = 0; j < lineList.length; j++) {
        const line = lineList[j];
        const v = diffuseView(e, state, line, state.powerMw * line.share * factors[j] * 10 ** allocation[j]);
        diffuseViewing.push(v);
        if (v.exceedsMpe) {
          warnings.push({
            code: "diffuse-viewing",
            elementId: e.id,
            message: `Looking at the spot on ${e.id} from ${DIFFUSE_VIEWING_DISTANCE_MM / 10} cm exceeds the MPE at ${fmt(line.wavelengthNm)} nm even though it is diffuse (extended source, C_E = ${fmt(v.cE)}); eyewear with OD ≥ ${fmt(Math.ceil(v.opticalDensityRaw * 10) / 10)} at that wavelength is needed to watch it.`,
          });
        }
      }
    }
    if (STOPS.has(e.kind)) {
      stopped = true;
      break;
    }
  }

  let openBeamEnd: BenchSafetyAssessment["openBeamEnd"] = null;
  if (!stopped && lastLit) {
    situations.add("open-beam-end");
    openBeamEnd = { afterElementId: lastLit.element.id, positionMm: lastLit.element.positionMm };
    warnings.push({
      code: "open-beam-end",
      elementId: lastLit.element.id,
      message: "Light leaves the bench after this element without reaching a beam block or screen.",
    });
    const lastDoc = byId.get(lastLit.element.id);
    const out = outgoing(lastLit.state, lastDoc);
    if (out.powerMw > 0) {
      const waist = waistFrom(out, λ, m2);
      if (waist.distanceMm > 1e-9) {
        const factors = [...(correctionAt.get(lastLit.element.id) ?? filterFactor)];
        if (lastDoc?.kind === "filter") lineList.forEach((line, j) => (factors[j] *= 10 ** (lastDoc.opticalDensity - filterOpticalDensityAt(lastDoc, line.wavelengthNm))));
        points.push(point(lastLit.element.id, lastLit.element.kind, "open-end-focus", lastLit.element.positionMm + waist.distanceMm, { ...out, radiusMm: waist.radiusMm }, factors));
        situations.add("focusing-optics");
      }
    }
  }
  // Elements after a stop receive no light (the optics engine should agree; if not, the stop wins here).
  const listed = new Set(points.filter((p) => p.where === "element").map((p) => p.elementId));
  for (const id of skipped) listed.add(id);
  for (const e of elements) if (!listed.has(e.id)) points.push(dark(e, 0));

  let governing: HazardPoint | null = null;
  for (const p of points) {
    if (p.opticalDensityRaw === null) continue;
    if (governing === null || (governing.opticalDensityRaw as number) < p.opticalDensityRaw) governing = p;
  }
  if (governing && governing.opticalDensityRaw !== null && governing.opticalDensityRaw > 0) situations.add("eyewear-needed");
  if (pulseDurationS !== undefined) situations.add("pulsed");

  // Skin near foci of Class 4 beams (ANSI Z136.1-2014 Table 7, 3.5 mm aperture).
  if (linesAssessment.hazardClass === "4") {
    for (const p of points) {
      if (p.where === "element" || p.opticalDensityRaw === null) continue;
      let ratio = 0;
      let wl = λ;
      lineList.forEach((line, j) => {
        const r = skinRatio(line, p.lines?.[j]?.powerMw ?? 0, p.radiusMm, pulseDurationS, pulseRepetitionRateHz);
        if (r > ratio) {
          ratio = r;
          wl = line.wavelengthNm;
        }
      });
      skinHazards.push({
        elementId: p.elementId, where: p.where, positionMm: p.positionMm, wavelengthNm: wl, ratio, exceedsSkinMpe: ratio > 1,
        source: `${SOURCE.ansiTable7}, averaged over the 3.5 mm skin aperture, ${SKIN_EXPOSURE_S} s (and per pulse) — ${UNCHECKED}`,
      });
      if (ratio > 1) {
        warnings.push({
          code: "skin-hazard-focus",
          elementId: p.elementId,
          message: `Near the focus at ${fmt(p.positionMm)} mm the beam exceeds the skin MPE ${fmt(ratio)}-fold: keep hands and sleeves out of it, and nothing flammable near it.`,
        });
      }
    }
  }

  // With further lines, screens that read laser.hazardClass must see the class over all lines, never the main line's
  // alone (which can be lower); the label is compared with that class too.
  const overall = linesAssessment.hazardClass;
  const shownLaser: BeamAssessment =
    further.length === 0
      ? laserAssessment
      : {
          ...laserAssessment,
          hazardClass: overall,
          figures: { ...laserAssessment.figures, hazardClass: { value: overall, source: linesAssessment.classSource } },
          labelCheck: options.labelClass ? compareLabel(options.labelClass, overall) : null,
        };
  if (shownLaser.labelCheck?.warning) {
    warnings.push({ code: "label-class-mismatch", elementId: laser.id, message: shownLaser.labelCheck.warning });
  }

  const cautions = beam.ownCautions
    ? []
    : selectCautions({
        hazardClass: linesAssessment.hazardClass,
        wavelengthNm: λ,
        situations: [...situations],
        opticalDensityRequired: governing?.opticalDensityRequired ?? 0,
      });

  const lasers: BenchSafetyAssessment["lasers"] = [
    {
      laserId: laser.id,
      hazardClass: linesAssessment.hazardClass,
      lines: linesAssessment.lines.map((l, j) => ({
        wavelengthNm: l.wavelengthNm,
        main: l.main,
        powerMw: l.powerMw,
        hazardClass: l.hazardClass,
        mpeWPerCm2: l.mpeWPerCm2,
        perPulseJPerCm2: l.perPulseJPerCm2,
        nohdM: l.nohdM,
        opticalDensityRequired: Math.max(0, ...points.map((p) => p.lines?.[j]?.opticalDensityRequired ?? 0)),
        source: `${l.assessment.figures.mpe.source}; OD the maximum over the bench, with the sum-of-fractions share across lines`,
      })),
    },
  ];

  return {
    laserId: laser.id,
    wavelengthNm: λ,
    standard,
    lasers,
    laser: shownLaser,
    lines: linesAssessment,
    hazardClass: linesAssessment.hazardClass,
    mpe: laserAssessment.figures.mpe,
    limitingAperture: laserAssessment.figures.limitingAperture,
    points,
    governing: governing ? { ...governing, source: `${SOURCE.productOd}; the maximum over every element, focus, open end and emission line — ${UNCHECKED}` } : null,
    lensHazards,
    screenHazards,
    diffuseViewing,
    skinHazards,
    openBeamEnd,
    cautions,
    warnings,
    limitations: LIMITATIONS,
    finalSay: FINAL_SAY,
  };
}

/** What assessBench works out of the laser alone: its pulse figures as assessed, its lines, their limits and shares. */
export type LaserFigures = {
  warnings: BenchSafetyAssessment["warnings"];
  standard: StandardId;
  pulseDurationS: number | undefined;
  pulseRepetitionRateHz: number | undefined;
  laserAssessment: BeamAssessment;
  further: BeamAssessment[];
  lineList: Line[];
  linesAssessment: LaserLinesAssessment;
  allocation: number[];
};

function laserFigures(laser: LaserElement, options: BenchSafetyOptions, divergenceFor: (wavelengthNm: number) => number): LaserFigures {
  const λ = laser.wavelengthNm;
  const divergenceMrad = divergenceFor(λ);
  let standard: StandardId = options.standard ?? DEFAULT_MPE_STANDARD;
  const laserWarnings: BenchSafetyAssessment["warnings"] = [];
  // The document schema refuses these; a document stored before the rules existed is resolved toward the stricter
  // reading, and the user is told.
  let pulseDurationS = laser.pulseDurationS;
  let pulseRepetitionRateHz = pulseDurationS === undefined ? undefined : laser.pulseRepetitionRateHz;
  let pulseEnergyJ = pulseDurationS === undefined ? undefined : laser.pulseEnergyJ;
  let powerMw = laser.powerMw;
  if (pulseDurationS !== undefined && pulseRepetitionRateHz !== undefined && pulseDurationS * pulseRepetitionRateHz >= 1) {
    laserWarnings.push({ code: "pulses-overlap", elementId: laser.id, message: "Pulse duration × repetition rate is 1 or more: the pulses would overlap. The laser is assessed as continuous-wave at its average power; correct the pulse figures." });
    powerMw = laserBeamPowerMw(laser);
    pulseDurationS = undefined;
    pulseRepetitionRateHz = undefined;
    pulseEnergyJ = undefined;
  }
  // Bursts (the document schema checks them; a stored document that breaks the rules is assessed as the even train,
  // with every pulse counted, and the user is told).
  let burst = pulseRepetitionRateHz !== undefined && laser.pulsesPerBurst !== undefined && laser.burstPulseRateHz !== undefined ? { pulsesPerBurst: laser.pulsesPerBurst, burstPulseRateHz: laser.burstPulseRateHz } : undefined;
  if (burst && pulseDurationS !== undefined && pulseRepetitionRateHz !== undefined) {
    const lengthS = (burst.pulsesPerBurst - 1) / burst.burstPulseRateHz + pulseDurationS;
    if (burst.burstPulseRateHz <= pulseRepetitionRateHz || pulseDurationS * burst.burstPulseRateHz >= 1 || lengthS >= burst.pulsesPerBurst / pulseRepetitionRateHz) {
      laserWarnings.push({ code: "burst-not-modelled", elementId: laser.id, message: "The burst figures are inconsistent (pulses or bursts would overlap), so the bursts could not be modelled: the laser is assessed as an even train at its average pulse rate. Correct the burst figures and ask your laser safety officer." });
      burst = undefined;
    }
  }
  if (pulseEnergyJ !== undefined && powerMw !== undefined) {
    // Both given and (per the document schema) consistent: the energy is the figure the pulse rules use.
    if (pulseRepetitionRateHz === undefined) powerMw = undefined;
  }
  if (pulseDurationS !== undefined && pulseDurationS < MIN_EXPOSURE_S) {
    laserWarnings.push({ code: "pulse-too-short", elementId: laser.id, message: "Pulses shorter than 10⁻¹³ s are beyond every standard's tables; they are assessed as 10⁻¹³ s pulses. Ask your laser safety officer." });
    pulseDurationS = MIN_EXPOSURE_S;
  }
  const gap = coverageProblem(λ, pulseDurationS, standard);
  if (gap) {
    laserWarnings.push({ code: "pulse-not-covered", elementId: laser.id, message: `${gap}. The figures below use IEC 60825-1:2014.` });
    standard = "IEC 60825-1:2014";
  }
  const mainInput: BeamInput = {
    wavelengthNm: λ,
    powerMw,
    pulseEnergyJ,
    beamDiameterMm: laser.beamDiameterMm,
    divergenceMrad,
    exposureS: options.exposureS,
    pulseDurationS,
    pulseRepetitionRateHz,
    ...(burst ?? {}),
    labelClass: options.labelClass,
    standard,
  };
  const laserAssessment = assessBeamUnchecked(mainInput, { standard, skipCautions: true });
  const mainBeamPowerMw = laserAssessment.odReference.beamPowerMw;
  // Further lines: the optics engine carries the main line's power; a line's power is a fixed share of it, corrected
  // for filters whose OD differs at the line's wavelength from the single OD the optics engine applied.
  const further = (laser.lines ?? []).map((l) => {
    let input = lineInput(mainInput, l);
    input = { ...input, divergenceMrad: divergenceFor(l.wavelengthNm) };
    if (coverageProblem(l.wavelengthNm, pulseDurationS, standard)) input = { ...input, standard: "IEC 60825-1:2014" };
    return assessBeamUnchecked(input, { standard: input.standard, lean: true });
  });
  const lineList: Line[] = [laserAssessment, ...further].map((a) => ({
    wavelengthNm: a.wavelengthNm,
    share: mainBeamPowerMw > 0 ? a.odReference.beamPowerMw / mainBeamPowerMw : 0,
    limit: a.odReference.limit,
    assessment: a,
  }));
  const linesAssessment = combineLines([laserAssessment, ...further], standard);
  const allocation = linesAssessment.lines.map((l) => Math.log10(l.linesInGroup));
  return { warnings: laserWarnings, standard, pulseDurationS, pulseRepetitionRateHz, laserAssessment, further, lineList, linesAssessment, allocation };
}

/** OD per line and overall at one point; plain loops (this runs for every element, focus and line). */
function hazardPoint(
  lineList: readonly Line[],
  allocation: readonly number[],
  elementId: string,
  kind: string,
  where: HazardPoint["where"],
  positionMm: number,
  b: BeamState,
  factors: readonly number[],
  shareInside?: (limitingApertureMm: number) => number | null,
): HazardPoint {
  const lines: NonNullable<HazardPoint["lines"]> = [];
  let raw: number | null = null;
  let averagedMain = 0;
  for (let i = 0; i < lineList.length; i++) {
    const line = lineList[i];
    const p = b.powerMw * line.share * factors[i];
    const worst = worstExceedance(line.limit, p, b.radiusMm, shareInside);
    const r = worst.raw === null ? null : worst.raw + allocation[i];
    if (i === 0) averagedMain = worst.averagedWPerCm2;
    if (r !== null && (raw === null || r > raw)) raw = r;
    lines.push({ wavelengthNm: line.wavelengthNm, powerMw: Math.max(0, p), opticalDensityRaw: r, opticalDensityRequired: r === null ? 0 : Math.max(0, r) });
  }
  return {
    elementId,
    kind,
    where,
    positionMm,
    powerMw: Math.max(0, b.powerMw),
    radiusMm: b.radiusMm,
    peakIrradianceWPerCm2: Math.max(peakIrradianceWPerCm2(b.powerMw, b.radiusMm), averagedMain),
    averagedIrradianceWPerCm2: averagedMain,
    opticalDensityRaw: raw,
    opticalDensityRequired: raw === null ? 0 : Math.max(0, raw),
    lines,
  };
}

/** The spot on a screen or block as an extended source seen from the closest focusing distance, for one line. */
function diffuseView(e: BeamAtElement, state: BeamState, line: Line, powerMw: number): DiffuseViewing {
  const spotDiameterMm = 2 * state.radiusMm;
  const r = DIFFUSE_VIEWING_DISTANCE_MM;
  const angularSubtenseMrad = (spotDiameterMm / r) * 1000;
  const retinal = line.wavelengthNm >= 400 && line.wavelengthNm <= 1400;
  let worstRaw = Number.NEGATIVE_INFINITY;
  let cEUsed = 1;
  let irradiance = 0;
  let extendedMpe = Number.POSITIVE_INFINITY;
  for (const site of line.limit.sites) {
    // C_E applies to retinal thermal limits only; photochemical and corneal limits keep the point-source value (stricter).
    const thermal = site.site === "retina" && (site.continuous?.governing ?? "thermal") === "thermal";
    const cE = retinal && thermal ? correctionCE(angularSubtenseMrad) : 1;
    // Lambertian: E = ρ·P·cos θ/(π r²), ρ = 1, θ = 0, r in cm.
    const E = powerMw / 1000 / (Math.PI * (r / 10) ** 2);
    const mpe = site.effectiveWPerCm2 * cE;
    const raw = E > 0 ? Math.log10(E / mpe) : Number.NEGATIVE_INFINITY;
    if (raw > worstRaw) {
      worstRaw = raw;
      cEUsed = cE;
      irradiance = E;
      extendedMpe = mpe;
    }
  }
  return {
    elementId: e.id,
    kind: e.kind,
    wavelengthNm: line.wavelengthNm,
    spotDiameterMm,
    viewingDistanceMm: r,
    angularSubtenseMrad,
    cE: cEUsed,
    irradianceWPerCm2: irradiance,
    extendedMpeWPerCm2: extendedMpe,
    opticalDensityRaw: worstRaw,
    exceedsMpe: worstRaw > 0,
    source: `${SOURCE.ansiAppendixBDiffuse} (Lambertian, ρ = 1, on the normal) at ${r / 10} cm; C_E per ${SOURCE.ansiTable6} (α_min 1.5 mrad, α_max 100 mrad) — ${UNCHECKED}`,
  };
}

/** Skin: irradiance over 3.5 mm vs the skin MPE at 10 s, and per pulse vs the skin MPE for the pulse; the worse ratio. */
function skinRatio(line: Line, powerMw: number, radiusMm: number, pulseDurationS: number | undefined, rateHz: number | undefined): number {
  const averaged = apertureAveragedIrradianceWPerCm2(powerMw, radiusMm, 3.5);
  if (pulseDurationS === undefined) return averaged / skinMpe(line.wavelengthNm, SKIN_EXPOSURE_S).irradianceWPerCm2;
  // powerMw is the average power for a train and energy ÷ duration for a single pulse.
  const perPulseJPerCm2 = rateHz !== undefined ? averaged / rateHz : averaged * pulseDurationS;
  const pulse = perPulseJPerCm2 / skinMpe(line.wavelengthNm, pulseDurationS).radiantExposureJPerCm2;
  const average = rateHz !== undefined ? averaged / skinMpe(line.wavelengthNm, SKIN_EXPOSURE_S).irradianceWPerCm2 : 0;
  return Math.max(pulse, average);
}

function fmt(x: number): string {
  return Number.isFinite(x) ? Number(x.toPrecision(3)).toString() : String(x);
}

/** The beam leaving an element (thin lens, filter, aperture; the laser passes its own beam). */
function outgoing(state: BeamState, element: BenchDocument["elements"][number] | undefined): BeamState {
  if (!element) return state;
  switch (element.kind) {
    case "lens": {
      // Thin lens: 1/R' = 1/R − 1/f with R > 0 diverging.
      const invR = (state.wavefrontRadiusMm === null ? 0 : 1 / state.wavefrontRadiusMm) - 1 / element.focalLengthMm;
      return { ...state, wavefrontRadiusMm: invR === 0 ? null : 1 / invR };
    }
    case "filter":
      return { ...state, powerMw: state.powerMw * 10 ** -element.opticalDensity };
    case "aperture": {
      const a = element.diameterMm / 2;
      return { ...state, powerMw: state.powerMw * -Math.expm1((-2 * a * a) / (state.radiusMm * state.radiusMm)) };
    }
    default:
      return state;
  }
}
