// assessBench: irradiance and required eyewear OD at every element, at foci between elements and beyond an open end; the governing OD.
// Formulas: PRODUCT.md (OD = log10(E/MPE) over the limiting aperture), Gaussian beam q-parameter (Siegman, Lasers, ch. 17), ANSI Z136.1-2014 Appendix B.

import { z } from "zod";
import type { BenchDocument, LaserElement } from "@/lib/bench/schema";
import { assessBeam, type BeamAssessment } from "./beam";
import { selectCautions, type CautionSituation, type SelectedCaution } from "./cautions";
import { SQRT2, diffuseReflectionNhz, lensNohd } from "./hazard-distance";
import { apertureAveragedIrradianceWPerCm2, opticalDensity, peakIrradianceWPerCm2 } from "./irradiance";
import { LIMITATIONS, type Limitation } from "./limitations";
import { MAX_EXPOSURE_S, MIN_EXPOSURE_S } from "./mpe";
import { FINAL_SAY, type Figure, HAZARD_CLASSES, SOURCE } from "./types";

/** The beam arriving at an element, as the optics engine's analyzeBench reports it (PRODUCT.md). */
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
 * it in (lib/optics fieldPowerProbe), so this module never depends on lib/optics. PRODUCT.md revision 2.
 */
export type EnclosedPowerMw = (positionMm: number, radiusMm: number, elementId?: string) => number | null;

export type BenchBeam = { elements: readonly BeamAtElement[]; enclosedPowerMw?: EnclosedPowerMw };

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
  /** log10(E/MPE); null where no light arrives. */
  opticalDensityRaw: number | null;
  /** The raw value floored at 0. */
  opticalDensityRequired: number;
};

export type BenchSafetyAssessment = {
  laserId: string;
  wavelengthNm: number;
  /** assessBeam of the laser itself (class, MPE, NOHD of the free beam, label check). */
  laser: BeamAssessment;
  mpe: Figure;
  limitingAperture: Figure;
  points: HazardPoint[];
  /** The highest OD anywhere on the bench and where it occurs; null when no light reaches anything. */
  governing: (HazardPoint & { source: string }) | null;
  lensHazards: { elementId: string; fromFocusM: number; fromLensM: number; source: string }[];
  screenHazards: { elementId: string; diffuseReflectionNhzM: number; source: string }[];
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

export function assessBench(doc: BenchDocument, beam: BenchBeam, options: BenchSafetyOptions = {}): BenchSafetyAssessment {
  const laser = doc.elements.find((e): e is LaserElement => e.kind === "laser");
  if (!laser) throw new RangeError("The bench needs a laser to assess");
  const λ = laser.wavelengthNm;
  const m2 = laser.m2 ?? 1;
  const w0 = laser.beamDiameterMm / 2;
  // Far-field 1/e² full-angle divergence of the laser: θ = 2M²λ/(π w0).
  const divergenceMrad = ((2 * m2 * λ * 1e-6) / (Math.PI * w0)) * 1000;
  const byId = new Map(doc.elements.map((e) => [e.id, e]));

  const situations = new Set<CautionSituation>();
  const warnings: BenchSafetyAssessment["warnings"] = [];
  const points: HazardPoint[] = [];
  const lensHazards: BenchSafetyAssessment["lensHazards"] = [];
  const screenHazards: BenchSafetyAssessment["screenHazards"] = [];

  // The bench schema allows pulse fields the MPE tables cannot take; resolve them toward the stricter reading and say so.
  let pulseDurationS = laser.pulseDurationS;
  let pulseRepetitionRateHz = pulseDurationS === undefined ? undefined : laser.pulseRepetitionRateHz;
  if (pulseDurationS !== undefined && pulseRepetitionRateHz !== undefined && pulseDurationS * pulseRepetitionRateHz >= 1) {
    warnings.push({ code: "pulses-overlap", elementId: laser.id, message: "Pulse duration × repetition rate is 1 or more; the laser is assessed as continuous-wave at its average power." });
    pulseDurationS = undefined;
    pulseRepetitionRateHz = undefined;
  }
  if (pulseDurationS !== undefined && pulseDurationS < MIN_EXPOSURE_S) {
    warnings.push({ code: "pulse-too-short", elementId: laser.id, message: "Pulses shorter than 10⁻¹³ s are beyond the MPE tables; they are assessed as 10⁻¹³ s pulses. Ask the safety officer." });
    pulseDurationS = MIN_EXPOSURE_S;
  }
  if (pulseDurationS !== undefined && pulseDurationS < 1e-9 && (λ < 400 || λ > 1400)) {
    warnings.push({ code: "pulse-not-covered", elementId: laser.id, message: "Pulses shorter than 1 ns outside 400–1400 nm are not covered by this engine; the result is indicative only. Ask the safety officer." });
  }
  // The laser's own assessment fixes the MPE and aperture; cautions are chosen once the bench situations are known.
  const laserAssessment = assessBeam({
    wavelengthNm: λ,
    powerMw: laser.powerMw,
    beamDiameterMm: laser.beamDiameterMm,
    divergenceMrad,
    exposureS: options.exposureS,
    pulseDurationS,
    pulseRepetitionRateHz,
    labelClass: options.labelClass,
  });
  const mpe = laserAssessment.mpeWPerCm2;
  const apertureMm = laserAssessment.limitingApertureMm;

  const point = (elementId: string, kind: string, where: HazardPoint["where"], positionMm: number, b: BeamState): HazardPoint => {
    // behind a clipping aperture: the propagated field's power inside the limiting aperture, never a rescaled Gaussian
    const fieldMw = beam.enclosedPowerMw?.(positionMm, apertureMm / 2, where === "element" ? elementId : undefined) ?? null;
    const averaged = fieldMw === null ? apertureAveragedIrradianceWPerCm2(b.powerMw, b.radiusMm, apertureMm) : fieldMw / 1000 / (Math.PI * (apertureMm / 20) ** 2);
    const od = opticalDensity(averaged, mpe);
    return {
      elementId,
      kind,
      where,
      positionMm,
      powerMw: Math.max(0, b.powerMw),
      radiusMm: b.radiusMm,
      peakIrradianceWPerCm2: Math.max(peakIrradianceWPerCm2(b.powerMw, b.radiusMm), averaged),
      averagedIrradianceWPerCm2: averaged,
      opticalDensityRaw: od.raw,
      opticalDensityRequired: od.required,
    };
  };

  const lit = (e: BeamAtElement): BeamState | null => {
    if (e.kind === "laser" && e.id === laser.id) return e.incident ?? { radiusMm: w0, wavefrontRadiusMm: null, powerMw: laser.powerMw };
    return e.incident && e.incident.powerMw > 0 && e.incident.radiusMm > 0 ? e.incident : null;
  };

  const elements = beam.elements;
  let lastLit: { element: BeamAtElement; state: BeamState } | null = null;
  let stopped = false;
  for (let i = 0; i < elements.length; i++) {
    const e = elements[i];
    const state = lit(e);
    if (!state) {
      points.push({
        elementId: e.id, kind: e.kind, where: "element", positionMm: e.positionMm, powerMw: 0, radiusMm: e.incident?.radiusMm ?? 0,
        peakIrradianceWPerCm2: 0, averagedIrradianceWPerCm2: 0, opticalDensityRaw: null, opticalDensityRequired: 0,
      });
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
        points.push(point(prev.id, prev.kind, "focus", e.positionMm - back, { ...state, radiusMm: waist.radiusMm }));
        situations.add("focusing-optics");
      }
    }
    points.push(point(e.id, e.kind, "element", e.positionMm, state));
    lastLit = { element: e, state };

    const docElement = byId.get(e.id);
    if (docElement?.kind === "lens") {
      if (docElement.focalLengthMm > 0) situations.add("focusing-optics");
      const h = lensNohd({
        powerMw: state.powerMw,
        mpeWPerCm2: mpe,
        focalLengthMm: docElement.focalLengthMm,
        beamDiameterOnLens1eMm: (2 * state.radiusMm) / SQRT2,
        limitingApertureMm: apertureMm,
      });
      lensHazards.push({ elementId: e.id, fromFocusM: h.fromFocusM, fromLensM: h.fromLensM, source: `${h.source}; b₀ = 1/e² diameter ÷ √2` });
    }
    if (e.kind === "screen") {
      situations.add("screen-in-beam");
      const nhz = diffuseReflectionNhz({ powerMw: state.powerMw, mpeWPerCm2: mpe });
      screenHazards.push({ elementId: e.id, diffuseReflectionNhzM: nhz.distanceM, source: `${nhz.source}, ρ = 1, θ = 0 (worst case)` });
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
    const out = outgoing(lastLit.state, byId.get(lastLit.element.id));
    if (out.powerMw > 0) {
      const waist = waistFrom(out, λ, m2);
      if (waist.distanceMm > 1e-9) {
        points.push(point(lastLit.element.id, lastLit.element.kind, "open-end-focus", lastLit.element.positionMm + waist.distanceMm, { ...out, radiusMm: waist.radiusMm }));
        situations.add("focusing-optics");
      }
    }
  }
  // Elements after a stop receive no light (the optics engine should agree; if not, the stop wins here).
  const listed = new Set(points.filter((p) => p.where === "element").map((p) => p.elementId));
  for (const e of elements) {
    if (!listed.has(e.id)) {
      points.push({
        elementId: e.id, kind: e.kind, where: "element", positionMm: e.positionMm, powerMw: 0, radiusMm: 0,
        peakIrradianceWPerCm2: 0, averagedIrradianceWPerCm2: 0, opticalDensityRaw: null, opticalDensityRequired: 0,
      });
    }
  }

  let governing: HazardPoint | null = null;
  for (const p of points) {
    if (p.opticalDensityRaw === null) continue;
    if (governing === null || (governing.opticalDensityRaw as number) < p.opticalDensityRaw) governing = p;
  }
  if (governing && governing.opticalDensityRaw !== null && governing.opticalDensityRaw > 0) situations.add("eyewear-needed");
  if (pulseDurationS !== undefined) situations.add("pulsed");

  if (laserAssessment.labelCheck?.warning) {
    warnings.push({ code: "label-class-mismatch", elementId: laser.id, message: laserAssessment.labelCheck.warning });
  }

  const cautions = selectCautions({
    hazardClass: laserAssessment.hazardClass,
    wavelengthNm: λ,
    situations: [...situations],
    opticalDensityRequired: governing?.opticalDensityRequired ?? 0,
  });

  return {
    laserId: laser.id,
    wavelengthNm: λ,
    laser: laserAssessment,
    mpe: laserAssessment.figures.mpe,
    limitingAperture: laserAssessment.figures.limitingAperture,
    points,
    governing: governing ? { ...governing, source: `${SOURCE.productOd}; the maximum over every element, focus and open end` } : null,
    lensHazards,
    screenHazards,
    openBeamEnd,
    cautions,
    warnings,
    limitations: LIMITATIONS,
    finalSay: FINAL_SAY,
  };
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
