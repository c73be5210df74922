// Eyewear on the lab's shelf: validates an eyewear item (wavelength bands, each with an OD and an optional EN 207 scale number) and says which items cover the OD a line needs.
// Sources: OD = −log10(τ) (ANSI Z136.1-2014 §4.6.2.5 / Appendix B, "optical density"); EN 207:2009 scale numbers LB n ⇒ τ ≤ 10^−n (from memory).

import { z } from "zod";
import { safeText } from "@/lib/validation/text";

/** Highest optical density an item may declare; eyewear is not rated beyond this (common practice). */
export const MAX_EYEWEAR_OD = 10;
/** Wavelength range the hazard engine covers (ANSI Z136.1-2014 Table 5a: 180 nm – 1 mm). */
export const EYEWEAR_MIN_NM = 180;
export const EYEWEAR_MAX_NM = 1_000_000;
/** EN 207 scale numbers run from LB1 to LB10 (from memory). */
export const EN207_MIN_SCALE = 1;
export const EN207_MAX_SCALE = 10;

/**
 * The EN 207 scale number's meaning used here: LB n guarantees a spectral transmittance of at most 10^−n at the
 * marked wavelength, i.e. an OD of at least n (EN 207:2009 Table 1 — from memory, not yet checked against the
 * standard's text). Shown on screens with the "confirm with your laser safety officer" note.
 */
export const EN207_NOTE =
  "An EN 207 scale number LB n is counted as an optical density of at least n; where both are given, the smaller one counts. Not yet checked against the standard's text — confirm with your laser safety officer.";

export type EyewearBand = {
  fromNm: number;
  toNm: number;
  opticalDensity: number;
  /** EN 207 scale number (n of LB n); null or absent when not marked. */
  en207ScaleNumber?: number | null;
};

export type EyewearItem = { id: string; name: string; bands: readonly EyewearBand[] };

const num = (field: string) => z.number({ error: `${field} must be a number` }).refine(Number.isFinite, `${field} must be a finite number`);

export const eyewearBandSchema = z
  .object({
    fromNm: num("Band start (fromNm)")
      .refine((v) => v >= EYEWEAR_MIN_NM, `Band start (fromNm) must be at least ${EYEWEAR_MIN_NM} nm`)
      .refine((v) => v <= EYEWEAR_MAX_NM, `Band start (fromNm) must be at most ${EYEWEAR_MAX_NM} nm`),
    toNm: num("Band end (toNm)")
      .refine((v) => v >= EYEWEAR_MIN_NM, `Band end (toNm) must be at least ${EYEWEAR_MIN_NM} nm`)
      .refine((v) => v <= EYEWEAR_MAX_NM, `Band end (toNm) must be at most ${EYEWEAR_MAX_NM} nm`),
    opticalDensity: num("Optical density (opticalDensity)")
      .refine((v) => v >= 0, "Optical density (opticalDensity) must be at least 0")
      .refine((v) => v <= MAX_EYEWEAR_OD, `Optical density (opticalDensity) must be at most ${MAX_EYEWEAR_OD}`),
    en207ScaleNumber: z
      .number({ error: "EN 207 scale number (en207ScaleNumber) must be a whole number from 1 to 10" })
      .int("EN 207 scale number (en207ScaleNumber) must be a whole number from 1 to 10")
      .min(EN207_MIN_SCALE, "EN 207 scale number (en207ScaleNumber) must be a whole number from 1 to 10")
      .max(EN207_MAX_SCALE, "EN 207 scale number (en207ScaleNumber) must be a whole number from 1 to 10")
      .nullish()
      .transform((v) => v ?? null),
  })
  .superRefine((b, ctx) => {
    if (Number.isFinite(b.fromNm) && Number.isFinite(b.toNm) && b.fromNm >= b.toNm) {
      ctx.addIssue({ code: "custom", path: ["toNm"], message: `Band end (toNm) must be greater than its start (${b.fromNm} nm); a band cannot be empty` });
    }
  });

/** Bands of one item: at least one, at most 16, none overlapping another (touching ends are allowed). */
export const eyewearBandsSchema = z
  .array(eyewearBandSchema, { error: "Bands (bands) must be a list of wavelength bands" })
  .min(1, "Bands (bands): give at least one wavelength band the eyewear protects")
  .max(16, "Bands (bands): at most 16 bands per item")
  .superRefine((bands, ctx) => {
    const order = bands.map((b, i) => ({ b, i })).sort((x, y) => x.b.fromNm - y.b.fromNm);
    for (let k = 1; k < order.length; k++) {
      const prev = order[k - 1];
      const cur = order[k];
      if (cur.b.fromNm < prev.b.toNm) {
        ctx.addIssue({
          code: "custom",
          path: [cur.i, "fromNm"],
          message: `Bands (bands) overlap: ${cur.b.fromNm}–${cur.b.toNm} nm overlaps ${prev.b.fromNm}–${prev.b.toNm} nm; give each wavelength one OD`,
        });
      }
    }
  });

export const eyewearNameSchema = safeText({ error: "Name (name) must be text" })
  .trim()
  .min(1, "Name (name) must not be empty")
  .max(200, "Name (name) must be at most 200 characters");

/** The effective protection a band gives: its OD, capped by its EN 207 scale number when one is marked (the more cautious reading). */
export function bandProtectionOd(band: EyewearBand): number {
  const scale = band.en207ScaleNumber ?? null;
  return scale === null ? band.opticalDensity : Math.min(band.opticalDensity, scale);
}

/**
 * The protection an item gives at a wavelength: the band containing it (ends included). Where two bands meet at
 * exactly this wavelength, the lower protection counts. null when no band contains the wavelength (no protection claimed).
 */
export function protectionAt(item: Pick<EyewearItem, "bands">, wavelengthNm: number): { opticalDensity: number; band: EyewearBand } | null {
  let best: { opticalDensity: number; band: EyewearBand } | null = null;
  for (const band of item.bands) {
    if (wavelengthNm < band.fromNm || wavelengthNm > band.toNm) continue;
    const od = bandProtectionOd(band);
    if (best === null || od < best.opticalDensity) best = { opticalDensity: od, band };
  }
  return best;
}

/** Does the item give at least the OD needed at the wavelength? An OD needed of 0 or less needs no eyewear. */
export function itemCovers(item: Pick<EyewearItem, "bands">, wavelengthNm: number, odRequired: number): boolean {
  if (!(odRequired > 0)) return true;
  const p = protectionAt(item, wavelengthNm);
  return p !== null && p.opticalDensity >= odRequired;
}

/** One emission line and the OD it needs (the highest anywhere on the bench for that line). */
export type LineNeed = {
  laserId: string;
  wavelengthNm: number;
  /** null when the engine could not give a figure for the line (then no item is said to cover it). */
  opticalDensityRequired: number | null;
  /** Which line of the laser: "main" or "line 2", … */
  label?: string;
};

export type CoveringItem = { id: string; name: string; opticalDensity: number; en207ScaleNumber: number | null };

export type LineCoverage = LineNeed & {
  /** "none-needed": OD needed ≤ 0; "covered": at least one item gives enough; "not-covered": none does; "unknown": no figure. */
  status: "none-needed" | "covered" | "not-covered" | "unknown";
  /** Items that cover the line, best protection first. */
  coveredBy: CoveringItem[];
  /** Items with a band at this wavelength whose OD falls short, for the "why not" line on screens. */
  shortOf: CoveringItem[];
};

export type EyewearCoverage = {
  lines: LineCoverage[];
  /** Items that cover every line at once (what to wear for the whole bench); empty when none does. */
  coversAll: { id: string; name: string }[];
  /** True when every line needing eyewear is covered by at least one item the lab owns. */
  everyLineCovered: boolean;
  note: string;
};

/** Which of the lab's items cover each line; and which single items cover all lines together. */
export function eyewearCoverage(items: readonly EyewearItem[], lines: readonly LineNeed[]): EyewearCoverage {
  const out: LineCoverage[] = lines.map((line) => {
    const od = line.opticalDensityRequired;
    const coveredBy: CoveringItem[] = [];
    const shortOf: CoveringItem[] = [];
    for (const item of items) {
      const p = protectionAt(item, line.wavelengthNm);
      if (!p) continue;
      const entry = { id: item.id, name: item.name, opticalDensity: p.opticalDensity, en207ScaleNumber: p.band.en207ScaleNumber ?? null };
      if (od !== null && Number.isFinite(od) && (od <= 0 || p.opticalDensity >= od)) coveredBy.push(entry);
      else shortOf.push(entry);
    }
    coveredBy.sort((a, b) => b.opticalDensity - a.opticalDensity || a.name.localeCompare(b.name));
    shortOf.sort((a, b) => b.opticalDensity - a.opticalDensity || a.name.localeCompare(b.name));
    const status: LineCoverage["status"] =
      od === null || !Number.isFinite(od) ? "unknown" : od <= 0 ? "none-needed" : coveredBy.length ? "covered" : "not-covered";
    return { ...line, status, coveredBy, shortOf };
  });
  const needing = out.filter((l) => l.status !== "none-needed");
  const coversAll = needing.some((l) => l.status === "unknown")
    ? []
    : items
        .filter((item) => needing.every((l) => itemCovers(item, l.wavelengthNm, l.opticalDensityRequired ?? Infinity)))
        .map((i) => ({ id: i.id, name: i.name }));
  return {
    lines: out,
    coversAll: needing.length ? coversAll : [],
    everyLineCovered: out.every((l) => l.status === "covered" || l.status === "none-needed"),
    note: EN207_NOTE,
  };
}

type LineFigure = { wavelengthNm: number; opticalDensityRequired?: number | null; source?: string; main?: boolean };
type LaserWithLines = { laserId?: string; id?: string; lines?: readonly LineFigure[]; governing?: { opticalDensityRequired: number } | null };
type PointLines = { lines?: readonly { wavelengthNm: number; opticalDensityRequired: number }[] };
/** What lineNeeds reads of a hazard answer: the rail assessment (one laser, `lines.lines` and per-point lines) or the table's (lasers with lines). */
export type HazardAnswerLines = {
  laserId?: string;
  wavelengthNm?: number;
  governing?: { opticalDensityRequired: number } | null;
  /** The rail assessment's per-line figures of the free beam (LaserLinesAssessment). */
  lines?: { lines?: readonly LineFigure[] } | null;
  /** The rail assessment's points, each with the OD every line needs there. */
  points?: readonly PointLines[];
  /** The table assessment's lasers. */
  lasers?: readonly LaserWithLines[];
};

const finiteOrNull = (v: unknown): number | null => (typeof v === "number" && Number.isFinite(v) ? v : null);
const sameNm = (a: number, b: number) => Math.abs(a - b) < 1e-9;

/**
 * The lines of a bench and the OD each needs, from the hazard engine's answer: per line, the highest OD anywhere on the
 * bench (every point's per-line figure and the free beam's), never below what the engine gives for the line alone.
 * For the table assessment (lasers with lines), a laser's main line never counts below the highest OD on its paths.
 * Without per-line figures, the laser's one line with the bench's highest OD. An OD the engine could not give (not
 * finite) stays "unknown": no item is said to cover it.
 */
export function lineNeeds(safety: HazardAnswerLines): LineNeed[] {
  const laserId0 = safety.laserId ?? "laser";
  const railLines = safety.lines && !Array.isArray(safety.lines) ? safety.lines.lines : undefined;
  if (Array.isArray(railLines) && railLines.length > 0) {
    return railLines.map((line, i) => {
      const main = line.main ?? i === 0;
      let od = finiteOrNull(line.opticalDensityRequired);
      if (od === null && line.opticalDensityRequired !== undefined) return { laserId: laserId0, wavelengthNm: line.wavelengthNm, opticalDensityRequired: null, label: main ? "main line" : `line ${i + 1}` };
      let perPoint = false;
      for (const p of safety.points ?? []) {
        for (const pl of p.lines ?? []) {
          if (!sameNm(pl.wavelengthNm, line.wavelengthNm)) continue;
          perPoint = true;
          const v = finiteOrNull(pl.opticalDensityRequired);
          if (v === null) return { laserId: laserId0, wavelengthNm: line.wavelengthNm, opticalDensityRequired: null, label: main ? "main line" : `line ${i + 1}` };
          od = Math.max(od ?? 0, v);
        }
      }
      // Without per-point figures, the main line takes the bench's highest OD (a focus may need more than the free beam).
      if (main && !perPoint && safety.governing) od = Math.max(od ?? 0, safety.governing.opticalDensityRequired);
      return { laserId: laserId0, wavelengthNm: line.wavelengthNm, opticalDensityRequired: od ?? 0, label: main ? "main line" : `line ${i + 1}` };
    });
  }
  const lasers = safety.lasers;
  if (Array.isArray(lasers) && lasers.some((l) => Array.isArray(l.lines) && l.lines.length > 0)) {
    const out: LineNeed[] = [];
    for (const l of lasers) {
      const laserId = l.laserId ?? l.id ?? laserId0;
      const highest = l.governing?.opticalDensityRequired ?? (lasers.length === 1 ? safety.governing?.opticalDensityRequired : undefined);
      (l.lines ?? []).forEach((line: LineFigure, i: number) => {
        const main = line.source ? line.source === "main" : (line.main ?? i === 0);
        let od = finiteOrNull(line.opticalDensityRequired);
        if (od !== null && main && typeof highest === "number" && Number.isFinite(highest)) od = Math.max(od, highest);
        out.push({ laserId, wavelengthNm: line.wavelengthNm, opticalDensityRequired: od, label: main ? "main line" : `line ${i + 1}` });
      });
    }
    return out;
  }
  const od = safety.governing ? safety.governing.opticalDensityRequired : 0;
  return [{ laserId: laserId0, wavelengthNm: safety.wavelengthNm ?? Number.NaN, opticalDensityRequired: od, label: "main line" }];
}
