// assessBeam: class, MPE, NOHD, diffuse NHZ, required eyewear OD and cautions for one beam given as a datasheet gives it.
// Formulas: ANSI Z136.1-2014 Tables 5a/7/8 and Appendix B; IEC 60825-1:2014 class limits; OD and defaults per PRODUCT.md.

import { z } from "zod";
import { selectCautions, type CautionSituation, type SelectedCaution } from "./cautions";
import { classifyBeam, compareLabel, type Classification, type LabelCheck } from "./classify";
import { exposureLimit } from "./exposure-limit";
import { SQRT2, diffuseReflectionNhz, directBeamNohd } from "./hazard-distance";
import { apertureAveragedIrradianceWPerCm2, opticalDensity, peakIrradianceWPerCm2 } from "./irradiance";
import { LIMITATIONS, type Limitation } from "./limitations";
import { MAX_EXPOSURE_S, MIN_EXPOSURE_S, skinMpe, type EyeMpe } from "./mpe";
import type { PulsedMpe } from "./pulsed";
import { FINAL_SAY, type Figure, type HazardClass, HAZARD_CLASSES } from "./types";

const finite = (field: string) =>
  z.number({ error: `${field} must be a number` }).refine(Number.isFinite, `${field} must be a finite number`);

const positive = (field: string, unit: string, max: number) =>
  finite(field)
    .refine((v) => v > 0, `${field} must be greater than 0 ${unit}`)
    .refine((v) => v <= max, `${field} must be at most ${max} ${unit}`);

/** The assessBeam input as the API accepts it: field paths with plain messages, like lib/bench/schema.ts. */
export const beamInputSchema = z
  .object({
    wavelengthNm: finite("Wavelength").refine(
      (v) => v >= 180 && v <= 1e6,
      "Wavelength must be between 180 nm and 1 mm (1000000 nm)",
    ),
    /** CW power, or the average power of a pulsed laser. */
    powerMw: positive("Power", "mW", 1e9),
    /** 1/e² diameter at the exit, as datasheets give it. */
    beamDiameterMm: positive("Beam diameter", "mm", 1000),
    /** 1/e² full-angle divergence, as datasheets give it. */
    divergenceMrad: positive("Divergence", "mrad", 1000),
    exposureS: finite("Exposure duration")
      .refine((v) => v >= MIN_EXPOSURE_S, "Exposure duration must be at least 1e-13 s")
      .refine((v) => v <= MAX_EXPOSURE_S, "Exposure duration must be at most 30000 s")
      .optional(),
    pulseDurationS: positive("Pulse duration", "s", 10)
      .refine((v) => v >= MIN_EXPOSURE_S, "Pulse duration must be at least 1e-13 s")
      .optional(),
    pulseRepetitionRateHz: positive("Pulse repetition rate", "Hz", 1e12).optional(),
    labelClass: z
      .enum(HAZARD_CLASSES, { error: `Label class must be one of: ${HAZARD_CLASSES.join(", ")}` })
      .optional(),
  })
  .superRefine((input, ctx) => {
    const τ = input.pulseDurationS;
    if (input.pulseRepetitionRateHz !== undefined && τ === undefined) {
      ctx.addIssue({ code: "custom", path: ["pulseDurationS"], message: "A pulse repetition rate needs a pulse duration" });
    }
    if (τ !== undefined && input.pulseRepetitionRateHz !== undefined && τ * input.pulseRepetitionRateHz >= 1) {
      ctx.addIssue({
        code: "custom",
        path: ["pulseRepetitionRateHz"],
        message: "Pulse duration × repetition rate must be below 1 (the pulses would overlap); enter the laser as continuous-wave",
      });
    }
    if (τ !== undefined && input.exposureS !== undefined && input.exposureS < τ) {
      ctx.addIssue({ code: "custom", path: ["exposureS"], message: "Exposure duration must be at least the pulse duration" });
    }
    if (τ !== undefined && τ < 1e-9 && (input.wavelengthNm < 400 || input.wavelengthNm > 1400)) {
      ctx.addIssue({
        code: "custom",
        path: ["pulseDurationS"],
        message: "Pulses shorter than 1 ns are covered only between 400 nm and 1400 nm",
      });
    }
  });

export type BeamInput = z.infer<typeof beamInputSchema>;

export type BeamAssessment = {
  hazardClass: HazardClass;
  /** Eye MPE as an irradiance averaged over the limiting aperture (pulsed: the governing rule, as an average). */
  mpeWPerCm2: number;
  nohdM: number;
  /** log10(E/MPE) floored at 0. */
  opticalDensityRequired: number;
  /** log10(E/MPE) unfloored; negative when the beam at the exit is below the MPE. */
  opticalDensityRaw: number;
  cautions: SelectedCaution[];
  /** Every figure with its unit and the standard and table or equation it came from. */
  figures: {
    hazardClass: { value: HazardClass; source: string };
    mpe: Figure;
    nohd: Figure;
    opticalDensity: Figure;
    exposure: Figure;
    limitingAperture: Figure;
    peakIrradiance: Figure;
    averagedIrradiance: Figure;
    diffuseReflectionNhz: Figure;
    skinMpe: Figure;
  };
  exposureS: number;
  limitingApertureMm: number;
  continuousMpe: EyeMpe | null;
  pulsedMpe: PulsedMpe | null;
  classification: Classification;
  labelCheck: LabelCheck | null;
  /** The 1/e² → 1/e conversions made for ANSI's formulas. */
  conversions: string[];
  notes: string[];
  /** For the safety officer's eye: label mismatch and the like. */
  warnings: string[];
  limitations: readonly Limitation[];
  finalSay: string;
};

/** Extra situations a caller (the bench assessment) knows about. */
export type BeamContext = { situations?: readonly CautionSituation[] };

export function assessBeam(input: BeamInput, context: BeamContext = {}): BeamAssessment {
  const λ = input.wavelengthNm;
  const limit = exposureLimit(input);
  const mpe = limit.mpeWPerCm2;
  const apertureMm = limit.limitingApertureMm;

  const beamDiameter1eMm = input.beamDiameterMm / SQRT2;
  const divergence1eMrad = input.divergenceMrad / SQRT2;
  const conversions = [
    `Beam diameter 1/e² ${fmt(input.beamDiameterMm)} mm → 1/e ${fmt(beamDiameter1eMm)} mm (÷ √2) for the ANSI Z136.1 Appendix B NOHD formula.`,
    `Divergence 1/e² ${fmt(input.divergenceMrad)} mrad → 1/e ${fmt(divergence1eMrad)} mrad (÷ √2) for the ANSI Z136.1 Appendix B NOHD formula.`,
  ];

  // Irradiance at the exit, where a freely spreading beam is narrowest.
  const radiusMm = input.beamDiameterMm / 2;
  const averaged = apertureAveragedIrradianceWPerCm2(input.powerMw, radiusMm, apertureMm);
  const peak = peakIrradianceWPerCm2(input.powerMw, radiusMm);
  const od = opticalDensity(averaged, mpe);
  const odRaw = od.raw ?? Number.NEGATIVE_INFINITY;

  // For a single pulse the "power" is the power during the pulse; the MPE was turned into a matching peak irradiance.
  const nohd = directBeamNohd({ powerMw: input.powerMw, mpeWPerCm2: mpe, beamDiameter1eMm, divergence1eMrad, limitingApertureMm: apertureMm });
  const diffuse = diffuseReflectionNhz({ powerMw: input.powerMw, mpeWPerCm2: mpe });
  const skin = skinMpe(λ, limit.exposureS);

  const classification = classifyBeam(input);
  const labelCheck = input.labelClass ? compareLabel(input.labelClass, classification.hazardClass) : null;

  const notes = [limit.exposureSource];
  if (limit.pulsed) notes.push(...limit.pulsed.notes, `Pulsed: governing repetitive-pulse rule is "${limit.pulsed.governingRule}".`);
  if (limit.continuous?.terms.some((t) => t.mechanism === "photochemical") && limit.continuous.terms.some((t) => t.mechanism === "thermal")) {
    notes.push(`Thermal and photochemical limits both apply; the ${limit.continuous.governing} limit is stricter and governs.`);
  }
  if (nohd.belowMpeEverywhere) notes.push("NOHD is 0: the full power spread over the limiting aperture is within the MPE.");
  const warnings: string[] = [];
  if (labelCheck?.warning) warnings.push(labelCheck.warning);
  if (!Number.isFinite(nohd.distanceM)) warnings.push("The beam has no divergence, so the hazard distance is unbounded.");

  const situations = new Set<CautionSituation>(context.situations ?? []);
  if (odRaw > 0) situations.add("eyewear-needed");
  if (input.pulseDurationS !== undefined) situations.add("pulsed");
  const cautions = selectCautions({
    hazardClass: classification.hazardClass,
    wavelengthNm: λ,
    situations: [...situations],
    opticalDensityRequired: od.required,
  });

  return {
    hazardClass: classification.hazardClass,
    mpeWPerCm2: mpe,
    nohdM: nohd.distanceM,
    opticalDensityRequired: od.required,
    opticalDensityRaw: odRaw,
    cautions,
    figures: {
      hazardClass: { value: classification.hazardClass, source: classification.source },
      mpe: limit.mpe,
      nohd: { value: nohd.distanceM, unit: "m", source: `${nohd.source}, a and φ the 1/e diameter and divergence` },
      opticalDensity: {
        value: od.required,
        unit: "",
        source: `${od.source}; averaged over the ${fmt(apertureMm)} mm limiting aperture at the exit; raw ${fmt(odRaw)}, floored at 0`,
      },
      exposure: { value: limit.exposureS, unit: "s", source: limit.exposureSource },
      limitingAperture: limit.limitingAperture,
      peakIrradiance: { value: peak, unit: "W/cm²", source: "Gaussian peak 2P/(π w²), w the 1/e² radius at the exit" },
      averagedIrradiance: { value: averaged, unit: "W/cm²", source: od.source },
      diffuseReflectionNhz: { value: diffuse.distanceM, unit: "m", source: `${diffuse.source}, ρ = 1, θ = 0 (worst case)` },
      skinMpe: { value: skin.irradianceWPerCm2, unit: "W/cm²", source: skin.source },
    },
    exposureS: limit.exposureS,
    limitingApertureMm: apertureMm,
    continuousMpe: limit.continuous,
    pulsedMpe: limit.pulsed,
    classification,
    labelCheck,
    conversions,
    notes,
    warnings,
    limitations: LIMITATIONS,
    finalSay: FINAL_SAY,
  };
}

function fmt(x: number): string {
  return Number.isFinite(x) ? Number(x.toPrecision(4)).toString() : String(x);
}
