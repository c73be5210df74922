// Public surface of the laser hazard engine: assessBeam, assessLaserLines, assessBench, the input schema, cautions and limitations.
// Formulas come from ANSI Z136.1-2014, IEC 60825-1:2014 and Directive 2006/25/EC Annex II; each module names its own.

export { assessBeam, assessBeamUnchecked, beamInputSchema, coverageProblem, standardSchema, type BeamAssessment, type BeamContext, type BeamInput } from "./beam";
export {
  assessLaserLines,
  combineLines,
  laserLinesInputSchema,
  tissueGroup,
  type EmissionLine,
  type LaserLinesAssessment,
  type LaserLinesInput,
  type LaserLinesOptions,
  type LineAssessment as LaserLineAssessment,
  type TissueGroup,
} from "./lines";
import type { AnyBenchDocument, BenchDocument, BenchDocumentV2 } from "@/lib/bench/schema";
import { assessBench as assessRail, type BenchBeam, type BenchSafetyAssessment, type BenchSafetyOptions } from "./bench";
import { assessTable, type TableBeam, type TableSafetyAssessment } from "./table";

/**
 * The laser safety of a bench document, given the optics engine's analyzeBench answer for it. Version 1 (a straight
 * rail) gives exactly the rail assessment; version 2 (the table plan) is assessed per path with open beams and one
 * entry per laser (lib/safety/table.ts). This is the one entry point callers use for either version.
 */
export function assessBench(doc: BenchDocument, beam: BenchBeam, options?: BenchSafetyOptions): BenchSafetyAssessment;
export function assessBench(doc: BenchDocumentV2, beam: TableBeam, options?: BenchSafetyOptions): TableSafetyAssessment;
export function assessBench(doc: AnyBenchDocument, beam: BenchBeam | TableBeam, options?: BenchSafetyOptions): BenchSafetyAssessment | TableSafetyAssessment;
export function assessBench(doc: AnyBenchDocument, beam: BenchBeam | TableBeam, options: BenchSafetyOptions = {}): BenchSafetyAssessment | TableSafetyAssessment {
  if (doc.version === 2) {
    if (!("paths" in beam)) throw new RangeError("A version 2 bench is assessed with the analysis of the same table (analyzeBench of lib/optics)");
    return assessTable(doc, beam, options);
  }
  return assessRail(doc, beam as BenchBeam, options);
}
export { assessRail, assessTable };
export type { TableLineFigures, OpenBeam, TableBeam, TableHazardPoint, TableLaserAssessment, TableSafetyAssessment } from "./table";
export {
  benchSafetyOptionsSchema,
  filterOpticalDensityAt,
  DIFFUSE_VIEWING_DISTANCE_MM,
  SKIN_EXPOSURE_S,
  type DiffuseViewing,
  type SkinHazard,
  waistFrom,
  type BeamAtElement,
  type BenchBeam,
  type BenchSafetyAssessment,
  type BenchSafetyOptions,
  type HazardPoint,
  type IncidentBeam,
} from "./bench";
export {
  CAUTION_CATALOGUE,
  CAUTION_CATALOGUE_VERSION,
  CAUTION_FOOTER,
  selectCautions,
  type CautionEntry,
  type CautionSituation,
  type SelectedCaution,
} from "./cautions";
export {
  APPLIED_CONDITIONS,
  class1AelMw,
  class3BAelMw,
  class3BPulseAelJ,
  classFromRatios,
  classLimits,
  classifyBeam,
  compareLabel,
  type ClassRatios,
  type Classification,
  type ClassLimits,
  type LabelCheck,
} from "./classify";
export { exposureLimit, worstExceedance, type ExposureLimit, type SiteLimit } from "./exposure-limit";
export { diffuseReflectionNhz, directBeamNohd, lensNohd } from "./hazard-distance";
export { apertureAveragedIrradianceWPerCm2, opticalDensity, peakIrradianceWPerCm2 } from "./irradiance";
export { LIMITATIONS, type Limitation } from "./limitations";
export {
  correctionCA,
  correctionCB,
  correctionCC,
  correctionCE,
  correctionCP,
  defaultExposureS,
  directiveCorrectionCC,
  eyeMpe,
  limitingAperture,
  shortestCoveredPulseS,
  skinMpe,
  timeT1S,
  timeT2S,
  type EyeMpe,
  type SkinMpe,
} from "./mpe";
export { pulsedEyeMpe, type PulseRule, type PulsedMpe } from "./pulsed";
export { DEFAULT_MPE_STANDARD, FINAL_SAY, HAZARD_CLASSES, STANDARDS, UNCHECKED, type Figure, type HazardClass, type StandardId } from "./types";
