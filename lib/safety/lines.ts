// Several emission lines of one laser: the class over all lines, and per line the MPE, NOHD and eyewear OD, with the
// sum-of-fractions rule across lines acting on the same tissue (ANSI Z136.1-2014 §8.2.4 / Table 4; IEC 60825-1:2014 §4.3, Table 1; from memory).

// Grouping (from memory, conservative): the standards' tables of additive effects treat the retinal region (400–1400 nm)
// as one group for the eye; the engine puts every other line (UV and IR beyond 1400 nm, which act on the cornea and
// lens) into a second group, even where the tables would keep some of them apart — summing more is never less cautious.
// OD per line: with k lines in a group, each line is brought to 1/k of its MPE: OD_i = log10(k·E_i/MPE_i), so the
// fractions after the eyewear sum to at most 1 and adding a line never lowers the OD any line needs.

import { z } from "zod";
import { type BeamAssessment, type BeamInput, assessBeamUnchecked, beamInputSchema, standardSchema } from "./beam";
import { type ClassRatios, classFromRatios, hasCondition1At } from "./classify";
import { SQRT2, directBeamNohd } from "./hazard-distance";
import { DEFAULT_MPE_STANDARD, FINAL_SAY, type HazardClass, SOURCE, type StandardId, UNCHECKED } from "./types";

export type EmissionLine = { wavelengthNm: number; powerMw: number };

export const lineSchema = z.object({
  wavelengthNm: z
    .number({ error: "Line wavelength must be a number" })
    .refine((v) => Number.isFinite(v) && v >= 180 && v <= 1e6, "Line wavelength must be between 180 nm and 1 mm (1000000 nm)"),
  powerMw: z
    .number({ error: "Line power must be a number" })
    .refine((v) => Number.isFinite(v) && v > 0, "Line power must be greater than 0 mW")
    .refine((v) => v <= 1e9, "Line power must be at most 1000000000 mW"),
});

export const laserLinesInputSchema = z.object({
  lines: z.array(lineSchema, { error: "lines must be a list" }).max(16, "A laser may list at most 16 further lines").optional(),
  standard: standardSchema.optional(),
});

export type LaserLinesInput = BeamInput & { lines?: readonly EmissionLine[] };
export type LaserLinesOptions = { standard?: StandardId };

/** The tissue a line acts on, for the sum-of-fractions rule. */
export type TissueGroup = "retina" | "cornea-lens";

export function tissueGroup(wavelengthNm: number): TissueGroup {
  return wavelengthNm >= 400 && wavelengthNm <= 1400 ? "retina" : "cornea-lens";
}

export type LineAssessment = {
  wavelengthNm: number;
  /** true for the laser's own (first) line. */
  main: boolean;
  /** The line's power as given (average power; for a single pulse the power during the pulse). */
  powerMw: number;
  group: TissueGroup;
  /** Lines in the same group (the k of the sum-of-fractions allocation). */
  linesInGroup: number;
  /** The class of this line on its own. */
  hazardClass: HazardClass;
  mpeWPerCm2: number | null;
  perPulseJPerCm2: number | null;
  /** E/MPE of this line alone at the exit, averaged over its limiting aperture. */
  exposureFraction: number;
  /** OD this line needs with the other lines of its group present: log10(k·E/MPE), floored at 0. */
  opticalDensityRequired: number;
  /** OD this line would need on its own. */
  opticalDensityAlone: number;
  /** NOHD with the group's sum-of-fractions allocation (the line's MPE shared k ways). */
  nohdM: number;
  nohdAloneM: number;
  assessment: BeamAssessment;
};

export type LaserLinesAssessment = {
  standard: StandardId;
  /** Class over all lines: the worst class, with the Class limit fractions summed over lines of one group. */
  hazardClass: HazardClass;
  classSource: string;
  lines: LineAssessment[];
  /** Σ E_i/MPE_i per group at the exit. */
  exposureFractionSums: Record<TissueGroup, number>;
  /** The highest OD any line needs, and the longest NOHD. */
  opticalDensityRequired: number;
  nohdM: number;
  notes: string[];
  finalSay: string;
};

/** Line input for one further line: the main line's beam and pulse timing, the line's own wavelength and power. */
export function lineInput(input: BeamInput, line: EmissionLine): BeamInput {
  return {
    wavelengthNm: line.wavelengthNm,
    powerMw: line.powerMw,
    beamDiameterMm: input.beamDiameterMm,
    divergenceMrad: input.divergenceMrad,
    exposureS: input.exposureS,
    pulseDurationS: input.pulseDurationS,
    pulseRepetitionRateHz: input.pulseRepetitionRateHz,
    ...(input.pulsesPerBurst !== undefined && input.burstPulseRateHz !== undefined ? { pulsesPerBurst: input.pulsesPerBurst, burstPulseRateHz: input.burstPulseRateHz } : {}),
    standard: input.standard,
  };
}

/**
 * Class over all lines and per line MPE, NOHD and OD. Validates like assessBeam (a ZodError when refused); further
 * lines share the main line's beam size, divergence and pulse timing.
 */
export function assessLaserLines(input: LaserLinesInput, options: LaserLinesOptions = {}): LaserLinesAssessment {
  const standard = options.standard ?? input.standard ?? DEFAULT_MPE_STANDARD;
  const { lines = [], ...main } = input;
  const parsedMain = beamInputSchema.parse({ ...main, standard });
  const parsedLines = laserLinesInputSchema.parse({ lines: [...lines], standard }).lines ?? [];
  for (const line of parsedLines) beamInputSchema.parse(lineInput(parsedMain, line));
  const assessed = [parsedMain, ...parsedLines.map((l) => lineInput(parsedMain, l))].map((x) => assessBeamUnchecked(x, { standard }));
  return combineLines(assessed, standard);
}

/** Combines per-line assessments (the first is the main line) into the class and per-line figures. */
export function combineLines(assessed: readonly BeamAssessment[], standard: StandardId): LaserLinesAssessment {
  const groups = assessed.map((a) => tissueGroup(a.wavelengthNm));
  const count = (g: TissueGroup) => groups.filter((x) => x === g).length;

  // Class: per group, the sum of each line's accessible-emission ÷ limit fractions; the worst group decides.
  const sums: Record<TissueGroup, ClassRatios> = { retina: zeroRatios(), "cornea-lens": zeroRatios() };
  assessed.forEach((a, i) => {
    const r = a.classification.ratios;
    for (const k of ["1", "2", "3R", "3B"] as const) {
      sums[groups[i]][k].all += r[k].all;
      sums[groups[i]][k].condition3 += r[k].condition3;
    }
  });
  const combined = zeroRatios();
  for (const g of ["retina", "cornea-lens"] as const) {
    for (const k of ["1", "2", "3R", "3B"] as const) {
      combined[k].all = Math.max(combined[k].all, sums[g][k].all);
      combined[k].condition3 = Math.max(combined[k].condition3, sums[g][k].condition3);
    }
  }
  const hasCondition1 = assessed.some((a) => hasCondition1At(lineWavelength(a)));
  let hazardClass = classFromRatios(combined, hasCondition1);
  // Never below the class of any line on its own.
  for (const a of assessed) if (rank(a.hazardClass) > rank(hazardClass)) hazardClass = a.hazardClass;

  const fractionSums: Record<TissueGroup, number> = { retina: 0, "cornea-lens": 0 };
  const lines: LineAssessment[] = assessed.map((a, i) => {
    const k = count(groups[i]);
    const raw = a.opticalDensityRaw;
    const fraction = Number.isFinite(raw) ? 10 ** raw : 0;
    fractionSums[groups[i]] += fraction;
    const share = k > 1 ? scaledNohd(a, k) : a.nohdM;
    return {
      wavelengthNm: lineWavelength(a),
      main: i === 0,
      powerMw: a.odReference.beamPowerMw,
      group: groups[i],
      linesInGroup: k,
      hazardClass: a.hazardClass,
      mpeWPerCm2: a.mpeWPerCm2,
      perPulseJPerCm2: a.pulsedMpe?.perPulseJPerCm2 ?? null,
      exposureFraction: fraction,
      opticalDensityRequired: Math.max(0, raw + Math.log10(k)),
      opticalDensityAlone: a.opticalDensityRequired,
      nohdM: share,
      nohdAloneM: a.nohdM,
      assessment: a,
    };
  });
  const clause = `${SOURCE.ansiAdditive}; ${SOURCE.iecAdditive}`;
  const notes = [
    `Lines acting on the same tissue add up: the sum of each line's exposure ÷ its MPE must stay within 1 (${clause}). Each of the k lines of a group is brought to 1/k of its MPE, so OD = log10(k·E/MPE) per line — ${UNCHECKED}.`,
    "The class sums each line's share of the class limit over lines acting on the same tissue, and is never below any line's own class.",
  ];
  if (assessed.length > 1) notes.push("Further lines are taken with the main line's beam diameter, divergence and pulse timing.");
  return {
    standard,
    hazardClass,
    classSource: `${assessed[0].classification.source}; lines combined per ${SOURCE.iecAdditive}`,
    lines,
    exposureFractionSums: fractionSums,
    opticalDensityRequired: Math.max(...lines.map((l) => l.opticalDensityRequired)),
    nohdM: Math.max(...lines.map((l) => l.nohdM)),
    notes,
    finalSay: FINAL_SAY,
  };
}

function lineWavelength(a: BeamAssessment): number {
  return a.wavelengthNm;
}

function zeroRatios(): ClassRatios {
  return { "1": { all: 0, condition3: 0 }, "2": { all: 0, condition3: 0 }, "3R": { all: 0, condition3: 0 }, "3B": { all: 0, condition3: 0 } };
}

const ORDER: readonly HazardClass[] = ["1", "1M", "2", "2M", "3R", "3B", "4"];
const rank = (c: HazardClass) => ORDER.indexOf(c);

/** NOHD with the MPE shared k ways (the power × k), the worst over the line's sites. */
function scaledNohd(a: BeamAssessment, k: number): number {
  const ref = a.odReference;
  let best = 0;
  for (const site of ref.limit.sites) {
    const n = directBeamNohd({
      powerMw: ref.beamPowerMw * k,
      mpeWPerCm2: site.effectiveWPerCm2,
      beamDiameter1eMm: a.beam.beamDiameterMm / SQRT2,
      divergence1eMrad: a.beam.divergenceMrad / SQRT2,
      limitingApertureMm: site.limitingApertureMm,
    });
    best = Math.max(best, n.distanceM);
  }
  return best;
}
