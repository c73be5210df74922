// The hazard picture of one revision for the review screen, and the compact summary kept with a
// signature. Figures come from the engines (lib/optics analyzeBench, lib/safety assessBench), which name their sources.
import { laserBeamPowerMw } from "@/lib/bench/laser-power";
import { benchDocumentSchema, type AnyBenchDocument, type BenchDocument, type LaserElement } from "@/lib/bench/schema";
import { HAZARD_CLASSES, type HazardClass } from "@/lib/safety/types";
import type { HazardSummary } from "@/db/schema";
import { analyzeBench, ChainPrefixCache, fieldPowerProbe, type BenchAnalysis } from "@/lib/optics";
import { assessBench, type BenchSafetyAssessment, type BenchSafetyOptions, type TableSafetyAssessment } from "@/lib/safety";
import { benchDocumentV2Schema, type BenchDocumentV2 } from "@/lib/bench/schema-v2";
import type { TableAnalysis } from "@/lib/optics/table";

export type RevisionAssessment =
  | { ok: true; analysis: BenchAnalysis; safety: BenchSafetyAssessment }
  | { ok: false; problem: string };

/** What a caller may ask of the engines: the lab's chosen standard (passed through to assessBench). */
export type AssessOptions = { standard?: "ANSI Z136.1-2014" | "IEC 60825-1:2014" };

/** Runs both engines on the document; a document they cannot take gets a sentence instead. */
export function assessRevision(doc: BenchDocument, options: AssessOptions = {}): RevisionAssessment {
  const parsed = benchDocumentSchema.safeParse(doc);
  if (!parsed.success) return { ok: false, problem: parsed.error.issues[0]?.message ?? "The bench document is not complete." };
  try {
    // one field chain for the optics and the safety engine's power probe
    const chainCache = new ChainPrefixCache();
    const analysis = analyzeBench(parsed.data, { chainCache });
    const safetyOptions = (options.standard ? { standard: options.standard } : {}) as BenchSafetyOptions;
    const safety = assessBench(parsed.data, { elements: analysis.elements, enclosedPowerMw: fieldPowerProbe(parsed.data, { chainCache }) }, safetyOptions);
    return { ok: true, analysis, safety };
  } catch (error) {
    return { ok: false, problem: error instanceof Error ? error.message : "The hazard engines could not assess this bench." };
  }
}

export type TableAssessment =
  | { ok: true; doc: BenchDocumentV2; analysis: TableAnalysis; safety: TableSafetyAssessment }
  | { ok: false; problem: string };

/** Runs both engines on a table (version 2): every path, its end, the open beams; a table they cannot take gets a sentence. */
export function assessTableRevision(doc: unknown, options: AssessOptions = {}): TableAssessment {
  const parsed = benchDocumentV2Schema.safeParse(doc);
  if (!parsed.success) return { ok: false, problem: parsed.error.issues[0]?.message ?? "The table document is not complete." };
  try {
    const analysis = analyzeBench(parsed.data);
    const safetyOptions = (options.standard ? { standard: options.standard } : {}) as BenchSafetyOptions;
    return { ok: true, doc: parsed.data, analysis, safety: assessBench(parsed.data, analysis, safetyOptions) };
  } catch (error) {
    return { ok: false, problem: error instanceof Error ? error.message : "The hazard engines could not assess this table." };
  }
}

/** An analysis with nothing in it, for drawing a table whose document is not complete yet (no laser, say). */
export const EMPTY_TABLE_ANALYSIS: TableAnalysis = { version: 2, lasers: [], paths: [], elements: [], apertures: [], screens: [], warnings: [] };

/** Either engine's picture, chosen by the document's version. */
export function assessAnyRevision(doc: AnyBenchDocument, options: AssessOptions = {}): RevisionAssessment | TableAssessment {
  return doc.version === 2 ? assessTableRevision(doc, options) : assessRevision(doc, options);
}

/** The most hazardous of some classes (1 < 1M < 2 < 2M < 3R < 3B < 4). */
export function worstClass(classes: readonly HazardClass[]): HazardClass | null {
  let worst: HazardClass | null = null;
  for (const c of classes) if (worst === null || HAZARD_CLASSES.indexOf(c) > HAZARD_CLASSES.indexOf(worst)) worst = c;
  return worst;
}

/** The summary kept with a table's signature: every laser's class and lines, every path's end, the open beams. */
function tableHazardSummary(doc: BenchDocumentV2, options: AssessOptions): HazardSummary {
  const lasers = doc.elements.flatMap((e) => (e.kind === "laser" ? [{ id: e.id, wavelengthNm: e.wavelengthNm, powerMw: laserBeamPowerMw(e), beamDiameterMm: e.beamDiameterMm, m2: e.m2 ?? 1, registerId: e.registerId ?? null }] : []));
  const assessed = assessTableRevision(doc, options);
  if (!assessed.ok) return { engine: "unavailable", version: 2, problem: assessed.problem, laser: lasers[0] ?? null, lasers };
  const { safety, analysis } = assessed;
  const worst = worstClass(safety.lasers.map((l) => l.hazardClass));
  const nohd = Math.max(0, ...safety.lasers.flatMap((l) => l.lines.map((line) => line.nohdM)).filter(Number.isFinite));
  return {
    engine: "lib/safety assessBench + lib/optics analyzeBench (table)",
    version: 2,
    standard: options.standard ?? null,
    laser: lasers[0] ?? null,
    lasers: safety.lasers.map((l) => ({ ...lasers.find((x) => x.id === l.laserId), hazardClass: l.hazardClass, lines: l.lines })),
    hazardClass: { value: worst, source: "the most hazardous class of the lasers on the table (IEC 60825-1:2014)" },
    nohd: { value: nohd, unit: "m", source: "the largest NOHD of any laser's line (ANSI Z136.1-2014 Appendix B)" },
    governingOd: safety.governing
      ? { value: safety.governing.opticalDensityRequired, elementId: safety.governing.elementId, pathId: safety.governing.pathId, where: safety.governing.where, unfoldedMm: safety.governing.positionMm, source: "log10(E/MPE) with E averaged over the limiting aperture (the bench document contract OD rule)" }
      : null,
    paths: analysis.paths.map((p) => ({ id: p.id, laserId: p.laserId, startElementId: p.startElementId, powerMw: p.powerMw, end: p.end })),
    openBeams: safety.openBeams,
    cautions: safety.cautions.map((c) => ({ id: c.id, title: c.title, text: c.text, reference: c.reference, catalogueVersion: c.catalogueVersion })),
    warnings: [...safety.warnings, ...analysis.warnings.map((w) => ({ code: w.code, elementId: w.elementId, message: w.message }))],
    finalSay: safety.finalSay,
  };
}

/** What is stored with a signature: enough to show, years later, what the officer saw. */
export function hazardSummary(doc: AnyBenchDocument, options: AssessOptions = {}): HazardSummary {
  if (doc.version === 2) return tableHazardSummary(doc, options);
  const laser = doc.elements.find((e): e is LaserElement => e.kind === "laser");
  const laserFacts = laser
    ? { id: laser.id, wavelengthNm: laser.wavelengthNm, powerMw: laserBeamPowerMw(laser), beamDiameterMm: laser.beamDiameterMm, m2: laser.m2 ?? 1, registerId: laser.registerId ?? null }
    : null;
  const assessed = assessRevision(doc, options);
  if (!assessed.ok) return { engine: "unavailable", problem: assessed.problem, laser: laserFacts };
  const { safety, analysis } = assessed;
  return {
    engine: "lib/safety assessBench + lib/optics analyzeBench",
    standard: (safety as { standard?: string }).standard ?? options.standard ?? null,
    laser: laserFacts,
    hazardClass: { value: safety.laser.hazardClass, source: safety.laser.figures.hazardClass.source },
    labelCheck: safety.laser.labelCheck ? { warning: safety.laser.labelCheck.warning ?? null } : null,
    mpe: safety.mpe,
    nohd: safety.laser.figures.nohd,
    limitingAperture: safety.limitingAperture,
    governingOd: safety.governing
      ? {
          value: safety.governing.opticalDensityRequired,
          elementId: safety.governing.elementId,
          where: safety.governing.where,
          positionMm: safety.governing.positionMm,
          source: safety.governing.source,
        }
      : null,
    openBeamEnd: safety.openBeamEnd,
    cautions: safety.cautions.map((c) => ({ id: c.id, title: c.title, text: c.text, reference: c.reference, catalogueVersion: c.catalogueVersion })),
    warnings: [...safety.warnings, ...analysis.warnings.map((w) => ({ code: w.code, elementId: w.elementId, message: w.message }))],
    finalSay: safety.finalSay,
  };
}
