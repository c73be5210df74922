// Shared vocabulary of the laser hazard engine: hazard classes, wavelength bands, sourced figures.
// Source names follow ANSI Z136.1-2014, IEC 60825-1:2014 and Directive 2006/25/EC Annex II (ICNIRP limits).

export const HAZARD_CLASSES = ["1", "1M", "2", "2M", "3R", "3B", "4"] as const;
export type HazardClass = (typeof HAZARD_CLASSES)[number];

/** Rank for comparing classes: a higher rank is a more hazardous class. */
export function classRank(hazardClass: HazardClass): number {
  return HAZARD_CLASSES.indexOf(hazardClass);
}

/** uv < 400 nm ≤ visible ≤ 700 nm < near-ir ≤ 1400 nm < far-ir (the retinal hazard region is 400–1400 nm). */
export type WavelengthBand = "uv" | "visible" | "near-ir" | "far-ir";

export function wavelengthBand(wavelengthNm: number): WavelengthBand {
  if (wavelengthNm < 400) return "uv";
  if (wavelengthNm <= 700) return "visible";
  if (wavelengthNm <= 1400) return "near-ir";
  return "far-ir";
}

/** A number together with its unit and the standard + table/equation it came from. */
export type Figure = { value: number; unit: string; source: string };

/** The two standards the engine knows. Without a choice: MPE/NOHD/OD by ANSI, class by IEC. */
export const STANDARDS = ["ANSI Z136.1-2014", "IEC 60825-1:2014"] as const;
export type StandardId = (typeof STANDARDS)[number];
export const DEFAULT_MPE_STANDARD: StandardId = "ANSI Z136.1-2014";

/**
 * Every table value in lib/safety was written down from memory of the standards (they could not be read here);
 * user-visible sources say so with this phrase, never "from memory" and never a file name.
 */
export const UNCHECKED = "not yet checked against the standard's text — confirm with your laser safety officer";

/** Clause names; each user-visible source built from them ends with the UNCHECKED phrase. */
export const SOURCE = {
  ansiTable5: "ANSI Z136.1-2014 Table 5a (MPE, ocular, point source)",
  ansiTable6: "ANSI Z136.1-2014 Table 6 (correction factors C_A, C_B, C_C, C_E, C_P; T1, T2, t_min)",
  ansiTable7: "ANSI Z136.1-2014 Table 7 (MPE, skin)",
  ansiTable8: "ANSI Z136.1-2014 Table 8 (limiting apertures)",
  ansiRepetitive: "ANSI Z136.1-2014 §8.2.3 (repetitive pulses: rules 1–3, C_P = N^-0.25)",
  ansiAdditive: "ANSI Z136.1-2014 §8.2.4 and Table 4 (multiple wavelengths, additive effects: sum of exposure fractions)",
  ansiAppendixBNohd: "ANSI Z136.1-2014 Appendix B, NOHD = (√(4Φ/(π·MPE)) − a)/φ",
  ansiAppendixBLens: "ANSI Z136.1-2014 Appendix B, lens-on-laser NOHD = (f/b₀)·√(4Φ/(π·MPE))",
  ansiAppendixBDiffuse: "ANSI Z136.1-2014 Appendix B, diffuse NHZ = √(ρ·Φ·cos θ/(π·MPE))",
  iecMpe: "IEC 60825-1:2014 Annex A Table A.1 (MPE at the cornea, point source)",
  iecApertures: "IEC 60825-1:2014 Annex A Table A.4 (aperture diameters for the MPE)",
  iecRepetitive: "IEC 60825-1:2014 §4.3 f) and A.3 (repetitive pulses: rules 1–3, C5, T_i)",
  iecAdditive: "IEC 60825-1:2014 §4.3 (radiation of multiple wavelengths) and Table 1 (additive effects)",
  directiveAnnexII: "Directive 2006/25/EC Annex II (ICNIRP limits)",
  iecAel: "IEC 60825-1:2014 Tables 3–8 (accessible emission limits)",
  iecConditions: "IEC 60825-1:2014 Table 10 (measurement apertures and distances, conditions 1 and 3)",
  productOd: "OD = log10(E/MPE), E = P·(1 − exp(−2r²/w²))/(π r²) averaged over the limiting aperture",
} as const;

/** The source text with the "not yet checked" phrase appended (for every figure shown to a user). */
export function unchecked(source: string): string {
  return source.includes(UNCHECKED) ? source : `${source} — ${UNCHECKED}`;
}

/** The one sentence every hazard figure carries, on every screen, e-mail and sheet (components use it as it is). */
export const FINAL_SAY =
  "These figures are advice: the institution's laser safety officer and local regulations decide.";
