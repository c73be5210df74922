// assessBeam: class, MPE, NOHD, diffuse NHZ, required eyewear OD and cautions for one beam given as a datasheet gives it.
// Formulas: ANSI Z136.1-2014 Tables 5a/7/8 and Appendix B, or IEC 60825-1:2014 Annex A; class by IEC 60825-1:2014 (values from memory).

import { z } from "zod";
import { checkLaserFields, laserSchema } from "@/lib/bench/schema";
import { selectCautions, type CautionSituation, type SelectedCaution } from "./cautions";
import { classifyBeam, compareLabel, type Classification, type LabelCheck } from "./classify";
import { exposureLimit, worstExceedance, type ExposureLimit, type SiteLimit } from "./exposure-limit";
import { SQRT2, diffuseReflectionNhz, directBeamNohd } from "./hazard-distance";
import { peakIrradianceWPerCm2 } from "./irradiance";
import { LIMITATIONS, type Limitation } from "./limitations";
import { MAX_EXPOSURE_S, MIN_EXPOSURE_S, directiveCorrectionCC, correctionCC, shortestCoveredPulseS, skinMpe, type EyeMpe } from "./mpe";
import type { PulsedMpe } from "./pulsed";
import { DEFAULT_MPE_STANDARD, FINAL_SAY, type Figure, type HazardClass, HAZARD_CLASSES, type StandardId, STANDARDS, UNCHECKED } from "./types";

const finite = (field: string) =>
  z.number({ error: `${field} must be a number` }).refine(Number.isFinite, `${field} must be a finite number`);

const positive = (field: string, unit: string, max: number) =>
  finite(field)
    .refine((v) => v > 0, `${field} must be greater than 0 ${unit}`)
    .refine((v) => v <= max, `${field} must be at most ${max} ${unit}`);

export const standardSchema = z.enum(STANDARDS, { error: `Standard must be one of: ${STANDARDS.join(", ")}` });

/** The assessBeam input as the API accepts it: field paths with plain messages, like lib/bench/schema.ts. */
export const beamInputSchema = z
  .object({
    wavelengthNm: finite("Wavelength").refine(
      (v) => v >= 180 && v <= 1e6,
      "Wavelength must be between 180 nm and 1 mm (1000000 nm)",
    ),
    /** CW power, or the average power of a pulse train; omitted for a single pulse given by pulseEnergyJ. */
    powerMw: positive("Power", "mW", 1e9).optional(),
    /** Energy of one pulse; peak power (energy ÷ duration) has no upper cap. */
    pulseEnergyJ: positive("Pulse energy", "J", 1e6).optional(),
    /** 1/e² diameter at the exit, as datasheets give it. */
    beamDiameterMm: positive("Beam diameter", "mm", 1000),
    /** 1/e² full-angle divergence, as datasheets give it. */
    divergenceMrad: positive("Divergence", "mrad", 1000),
    exposureS: finite("Exposure duration")
      .refine((v) => v >= MIN_EXPOSURE_S, "Exposure duration must be at least 1e-13 s")
      .refine((v) => v <= MAX_EXPOSURE_S, "Exposure duration must be at most 30000 s")
      .optional(),
    pulseDurationS: positive("Pulse duration", "s", 10)
      .refine((v) => v >= MIN_EXPOSURE_S, "Pulse duration must be at least 1e-13 s: no standard gives limits for shorter pulses")
      .optional(),
    pulseRepetitionRateHz: positive("Pulse repetition rate", "Hz", 1e12).optional(),
    /** Trains in bursts: pulses per burst and the pulse rate inside a burst (pulseRepetitionRateHz stays the average rate). */
    pulsesPerBurst: laserSchema.shape.pulsesPerBurst,
    burstPulseRateHz: laserSchema.shape.burstPulseRateHz,
    labelClass: z
      .enum(HAZARD_CLASSES, { error: `Label class must be one of: ${HAZARD_CLASSES.join(", ")}` })
      .optional(),
    /** Which standard's MPE tables to use (the class always follows IEC 60825-1:2014). */
    standard: standardSchema.optional(),
  })
  .superRefine((input, ctx) => {
    checkLaserFields(input, ctx);
    const τ = input.pulseDurationS;
    if (τ !== undefined && input.exposureS !== undefined && input.exposureS < τ) {
      ctx.addIssue({ code: "custom", path: ["exposureS"], message: "Exposure duration must be at least the pulse duration" });
    }
    const problem = coverageProblem(input.wavelengthNm, τ, input.standard ?? DEFAULT_MPE_STANDARD);
    if (problem) ctx.addIssue({ code: "custom", path: ["pulseDurationS"], message: problem });
  });

export type BeamInput = z.input<typeof beamInputSchema>;

/** A sentence when the pulse is shorter than the chosen standard's MPE table covers at this wavelength; null when covered. */
export function coverageProblem(wavelengthNm: number, pulseDurationS: number | undefined, standard: StandardId): string | null {
  if (pulseDurationS === undefined) return null;
  const shortest = shortestCoveredPulseS(wavelengthNm, standard);
  if (pulseDurationS >= shortest) return null;
  return shortest > MIN_EXPOSURE_S
    ? `${standard} gives no exposure limits for pulses shorter than 1 ns outside 400–1400 nm; assess this laser under IEC 60825-1:2014 (which covers pulses down to 10⁻¹³ s) and ask your laser safety officer`
    : "No standard gives exposure limits for pulses shorter than 10⁻¹³ s";
}

export type BeamAssessment = {
  wavelengthNm: number;
  /** The beam as given: 1/e² diameter at the exit and 1/e² full-angle divergence. */
  beam: { beamDiameterMm: number; divergenceMrad: number };
  /** The standard the MPE, NOHD and OD follow (the class always follows IEC 60825-1:2014). */
  standard: StandardId;
  hazardClass: HazardClass;
  /**
   * Eye MPE as an irradiance averaged over the limiting aperture; for a train the governing rule's per-pulse MPE ×
   * the repetition rate (an average irradiance); null for a single pulse (see pulsedMpe.perPulseJPerCm2).
   */
  mpeWPerCm2: number | null;
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
  /** Average power in mW (null for a single pulse) and energy per pulse in J (null for CW). */
  averagePowerMw: number | null;
  pulseEnergyJ: number | null;
  /**
   * The pair the OD compares, in the engine's working units: the beam power (average power; for a single pulse the
   * energy ÷ the pulse duration) and the MPE in the same terms, for each site of the eye whose limits apply.
   */
  odReference: { beamPowerMw: number; limit: ExposureLimit };
  /** The same figures under the other standard, and whether they differ (a note says how). */
  otherStandard: { standard: StandardId; mpeWPerCm2: number | null; perPulseJPerCm2: number | null; opticalDensityRequired: number; nohdM: number; limitingApertureMm: number; differs: boolean };
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

/** Extra situations a caller (the bench assessment) knows about, and the standard for MPE/NOHD/OD. */
export type BeamContext = {
  situations?: readonly CautionSituation[];
  standard?: StandardId;
  /** Skip the cautions and the other-standard comparison (the bench assessment does both itself for further lines). */
  lean?: boolean;
  /** Skip the cautions only (the bench assessment selects its own for the whole bench). */
  skipCautions?: boolean;
};

/** Validates the input (a ZodError with field paths when it is refused) and assesses the beam. */
export function assessBeam(input: BeamInput, context: BeamContext = {}): BeamAssessment {
  const standard = context.standard ?? input.standard ?? DEFAULT_MPE_STANDARD;
  const parsed = beamInputSchema.parse({ ...input, standard });
  return assessBeamUnchecked(parsed, { ...context, standard });
}

type Figures = { mpe: number | null; perPulse: number | null; od: number; odRaw: number; nohd: number; aperture: number; governing: SiteLimit };

/** The MPE, OD and NOHD figures of one beam under one standard. */
function hazardFigures(input: BeamInput, beamPowerMw: number, standard: StandardId): Figures & { limit: ExposureLimit; nohdInfo: ReturnType<typeof directBeamNohd> } {
  const limit = exposureLimit(input, standard);
  const radiusMm = input.beamDiameterMm / 2;
  const worst = worstExceedance(limit, beamPowerMw, radiusMm);
  const odRaw = worst.raw ?? Number.NEGATIVE_INFINITY;
  let nohdInfo: ReturnType<typeof directBeamNohd> | null = null;
  for (const site of limit.sites) {
    const n = directBeamNohd({
      powerMw: beamPowerMw,
      mpeWPerCm2: site.effectiveWPerCm2,
      beamDiameter1eMm: input.beamDiameterMm / SQRT2,
      divergence1eMrad: input.divergenceMrad / SQRT2,
      limitingApertureMm: site.limitingApertureMm,
    });
    if (nohdInfo === null || n.distanceM > nohdInfo.distanceM) nohdInfo = n;
  }
  const g = worst.site;
  const train = g.pulsed !== null && g.pulsed.pulseRepetitionRateHz !== null;
  const single = g.pulsed !== null && !train;
  return {
    limit,
    nohdInfo: nohdInfo as ReturnType<typeof directBeamNohd>,
    mpe: single ? null : g.effectiveWPerCm2,
    perPulse: g.perPulseJPerCm2,
    od: Math.max(0, odRaw),
    odRaw,
    nohd: (nohdInfo as ReturnType<typeof directBeamNohd>).distanceM,
    aperture: g.limitingApertureMm,
    governing: g,
  };
}

/** The beam power the figures work with: average power, or for a single pulse energy ÷ duration. */
function beamPowerOf(c: Classification, input: BeamInput): number {
  if (c.averagePowerMw !== null) return c.averagePowerMw;
  if (c.pulseEnergyMj !== null && input.pulseDurationS !== undefined) return c.pulseEnergyMj / input.pulseDurationS;
  return input.powerMw ?? 0;
}

/** assessBeam without validation, for callers that validated already (the bench assessment). */
export function assessBeamUnchecked(input: BeamInput, context: BeamContext = {}): BeamAssessment {
  const λ = input.wavelengthNm;
  const standard = context.standard ?? input.standard ?? DEFAULT_MPE_STANDARD;
  const classification = classifyBeam(input);
  const beamPowerMw = beamPowerOf(classification, input);
  const main = hazardFigures(input, beamPowerMw, standard);
  const otherId: StandardId = standard === "ANSI Z136.1-2014" ? "IEC 60825-1:2014" : "ANSI Z136.1-2014";
  const otherCovered = coverageProblem(λ, input.pulseDurationS, otherId) === null;
  const other = otherCovered && !context.lean ? hazardFigures(input, beamPowerMw, otherId) : null;
  const g = main.governing;
  const apertureMm = g.limitingApertureMm;
  const limit = main.limit;

  const beamDiameter1eMm = input.beamDiameterMm / SQRT2;
  const divergence1eMrad = input.divergenceMrad / SQRT2;
  const conversions = [
    `Beam diameter 1/e² ${fmt(input.beamDiameterMm)} mm → 1/e ${fmt(beamDiameter1eMm)} mm (÷ √2) for the ANSI Z136.1 Appendix B NOHD formula.`,
    `Divergence 1/e² ${fmt(input.divergenceMrad)} mrad → 1/e ${fmt(divergence1eMrad)} mrad (÷ √2) for the ANSI Z136.1 Appendix B NOHD formula.`,
  ];

  const radiusMm = input.beamDiameterMm / 2;
  const averaged = worstExceedance(limit, beamPowerMw, radiusMm).averagedWPerCm2;
  const peak = peakIrradianceWPerCm2(beamPowerMw, radiusMm);
  const nohd = main.nohdInfo;
  const diffuse = diffuseReflectionNhz({ powerMw: beamPowerMw, mpeWPerCm2: Math.min(...limit.sites.map((x) => x.effectiveWPerCm2)) });
  const skin = skinMpe(λ, limit.exposureS);
  const labelCheck = input.labelClass ? compareLabel(input.labelClass, classification.hazardClass) : null;

  const notes = [limit.exposureSource, `MPE, NOHD and OD follow ${standard}; the class follows IEC 60825-1:2014.`];
  if (g.pulsed) {
    notes.push(...g.pulsed.notes, `Pulsed: the governing repetitive-pulse rule is "${g.pulsed.governingRule}"; OD and NOHD compare the energy per pulse with the per-pulse MPE.`);
    if (input.pulseEnergyJ === undefined && input.pulseRepetitionRateHz === undefined) {
      notes.push("Single pulse given by power: the pulse energy is taken as the stated power × the pulse duration.");
    }
  }
  if (g.continuous?.terms.some((t) => t.mechanism === "photochemical") && g.continuous.terms.some((t) => t.mechanism === "thermal")) {
    notes.push(`Thermal and photochemical limits both apply; the ${g.continuous.governing} limit is stricter and governs.`);
  }
  if (limit.sites.length > 1) notes.push("Both the retinal and the corneal/lens limits apply at this wavelength, each over its own limiting aperture; the one giving the higher OD governs.");
  if (λ >= 1200 && λ <= 1400 && correctionCC(λ) !== directiveCorrectionCC(λ)) {
    notes.push(
      `C_C here is ${fmt(correctionCC(λ))} as the 2014 editions give it; Directive 2006/25/EC Annex II keeps C_C = 8.0 in 1200–1400 nm, a stricter retinal limit that local regulations may require (${UNCHECKED}).`,
    );
  }
  if (nohd.belowMpeEverywhere) notes.push("NOHD is 0: the full power spread over the limiting aperture is within the MPE.");
  const differs =
    other !== null &&
    (relDiff(other.mpe ?? other.perPulse ?? 0, main.mpe ?? main.perPulse ?? 0) > 1e-6 || Math.abs(other.od - main.od) > 1e-6 || relDiff(other.nohd, main.nohd) > 1e-6);
  if (other && differs) {
    notes.push(
      `Where the other standard differs: under ${otherId} the MPE is ${other.mpe !== null ? `${fmt(other.mpe)} W/cm²` : `${fmt(other.perPulse ?? 0)} J/cm² per pulse`} (here ${main.mpe !== null ? `${fmt(main.mpe)} W/cm²` : `${fmt(main.perPulse ?? 0)} J/cm² per pulse`}), the limiting aperture ${fmt(other.aperture)} mm (here ${fmt(main.aperture)} mm), the OD needed ${fmt(other.od)} (here ${fmt(main.od)}) and the NOHD ${fmt(other.nohd)} m (here ${fmt(main.nohd)} m). Your laser safety officer decides which standard applies.`,
    );
  } else if (!otherCovered && !context.lean) {
    notes.push(`Where the other standard differs: ${coverageProblem(λ, input.pulseDurationS, otherId)}.`);
  }
  const warnings: string[] = [];
  if (labelCheck?.warning) warnings.push(labelCheck.warning);
  if (!Number.isFinite(nohd.distanceM)) warnings.push("The beam has no divergence, so the hazard distance is unbounded.");

  const situations = new Set<CautionSituation>(context.situations ?? []);
  if (main.odRaw > 0) situations.add("eyewear-needed");
  if (input.pulseDurationS !== undefined) situations.add("pulsed");
  const cautions = context.lean || context.skipCautions
    ? []
    : selectCautions({
        hazardClass: classification.hazardClass,
        wavelengthNm: λ,
        situations: [...situations],
        opticalDensityRequired: main.od,
      });
  const train = input.pulseRepetitionRateHz !== undefined;

  return {
    wavelengthNm: λ,
    beam: { beamDiameterMm: input.beamDiameterMm, divergenceMrad: input.divergenceMrad },
    standard,
    hazardClass: classification.hazardClass,
    mpeWPerCm2: main.mpe,
    nohdM: nohd.distanceM,
    opticalDensityRequired: main.od,
    opticalDensityRaw: main.odRaw,
    cautions,
    figures: {
      hazardClass: { value: classification.hazardClass, source: classification.source },
      mpe: g.mpe,
      nohd: { value: nohd.distanceM, unit: "m", source: `${nohd.source}, a and φ the 1/e diameter and divergence${g.pulsed ? "; Φ the energy per pulse against the per-pulse MPE" : ""} — ${UNCHECKED}` },
      opticalDensity: {
        value: main.od,
        unit: "",
        source: `${g.pulsed ? "OD = log10(H/MPE_H), H the energy per pulse" : "OD = log10(E/MPE), E the power"} averaged over the ${fmt(apertureMm)} mm limiting aperture at the exit, P·(1 − exp(−2r²/w²))/(π r²); raw ${fmt(main.odRaw)}, floored at 0 — ${UNCHECKED}`,
      },
      exposure: { value: limit.exposureS, unit: "s", source: limit.exposureSource },
      limitingAperture: g.limitingAperture,
      peakIrradiance: {
        value: peak,
        unit: "W/cm²",
        source: g.pulsed && !train ? "Gaussian peak 2P/(π w²) during the pulse (P = energy ÷ duration), w the 1/e² radius at the exit" : "Gaussian peak 2P/(π w²), w the 1/e² radius at the exit",
      },
      averagedIrradiance: { value: averaged, unit: "W/cm²", source: `P·(1 − exp(−2r²/w²))/(π r²) over the ${fmt(apertureMm)} mm limiting aperture` },
      diffuseReflectionNhz: { value: diffuse.distanceM, unit: "m", source: `${diffuse.source}, ρ = 1, θ = 0 (worst case) — ${UNCHECKED}` },
      skinMpe: { value: skin.irradianceWPerCm2, unit: "W/cm²", source: `${skin.source} — ${UNCHECKED}` },
    },
    exposureS: limit.exposureS,
    limitingApertureMm: apertureMm,
    continuousMpe: g.continuous,
    pulsedMpe: g.pulsed,
    averagePowerMw: classification.averagePowerMw,
    pulseEnergyJ: classification.pulseEnergyMj === null ? null : classification.pulseEnergyMj / 1e3,
    odReference: { beamPowerMw, limit },
    otherStandard: {
      standard: otherId,
      mpeWPerCm2: other?.mpe ?? null,
      perPulseJPerCm2: other?.perPulse ?? null,
      opticalDensityRequired: other?.od ?? Number.NaN,
      nohdM: other?.nohd ?? Number.NaN,
      limitingApertureMm: other?.aperture ?? Number.NaN,
      differs: other === null ? !context.lean : differs,
    },
    classification,
    labelCheck,
    conversions,
    notes,
    warnings,
    limitations: LIMITATIONS,
    finalSay: FINAL_SAY,
  };
}

function relDiff(a: number, b: number): number {
  if (a === b) return 0;
  return Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b));
}

function fmt(x: number): string {
  return Number.isFinite(x) ? Number(x.toPrecision(4)).toString() : String(x);
}
