// The hazard picture of one revision for the review screen, and the compact summary kept with a
// signature. Figures come from the engines (lib/optics analyzeBench, lib/safety assessBench), which name their sources.
import { laserBeamPowerMw } from "@/lib/bench/laser-power";
import { benchDocumentSchema, type BenchDocument, type LaserElement } from "@/lib/bench/schema";
import type { HazardSummary } from "@/db/schema";
import { analyzeBench, ChainPrefixCache, fieldPowerProbe, type BenchAnalysis } from "@/lib/optics";
import { assessBench, type BenchSafetyAssessment, type BenchSafetyOptions } from "@/lib/safety";

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

/** What is stored with a signature: enough to show, years later, what the officer saw. */
export function hazardSummary(doc: BenchDocument, options: AssessOptions = {}): HazardSummary {
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
