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

export const SOURCE = {
  ansiTable5: "ANSI Z136.1-2014 Table 5a (MPE, ocular, point source)",
  ansiTable6: "ANSI Z136.1-2014 Table 6 (correction factors C_A, C_B, C_C; T1, T2)",
  ansiTable7: "ANSI Z136.1-2014 Table 7 (MPE, skin)",
  ansiTable8: "ANSI Z136.1-2014 Table 8 (limiting apertures)",
  ansiRepetitive: "ANSI Z136.1-2014 §8.2.3 (repetitive pulses: rules 1–3, C_P = N^-0.25)",
  ansiAppendixBNohd: "ANSI Z136.1-2014 Appendix B, NOHD = (√(4Φ/(π·MPE)) − a)/φ",
  ansiAppendixBLens: "ANSI Z136.1-2014 Appendix B, lens-on-laser NOHD = (f/b₀)·√(4Φ/(π·MPE))",
  ansiAppendixBDiffuse: "ANSI Z136.1-2014 Appendix B, diffuse NHZ = √(ρ·Φ·cos θ/(π·MPE))",
  directiveAnnexII: "Directive 2006/25/EC Annex II (ICNIRP limits)",
  iecAel: "IEC 60825-1:2014 Tables 3–8 (accessible emission limits)",
  iecConditions: "IEC 60825-1:2014 Table 10 (measurement apertures and distances)",
  productOd: "PRODUCT.md: OD = log10(E/MPE), E = P·(1 − exp(−2r²/w²))/(π r²) over the limiting aperture",
} as const;

/** The one sentence every hazard figure carries, on every screen, e-mail and sheet (components use it as it is). */
export const FINAL_SAY =
  "These figures are advice: the institution's laser safety officer and local regulations decide.";
