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
  type LineAssessment,
  type TissueGroup,
} from "./lines";
export {
  assessBench,
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
