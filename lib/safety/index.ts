// Public surface of the laser hazard engine: assessBeam (the PRODUCT.md contract), assessBench, the input schema, cautions and limitations.
// Formulas come from ANSI Z136.1-2014, IEC 60825-1:2014 and Directive 2006/25/EC Annex II; each module names its own.

export { assessBeam, beamInputSchema, type BeamAssessment, type BeamContext, type BeamInput } from "./beam";
export {
  assessBench,
  benchSafetyOptionsSchema,
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
export { APPLIED_CONDITIONS, classLimits, classifyBeam, compareLabel, type Classification, type ClassLimits, type LabelCheck } from "./classify";
export { diffuseReflectionNhz, directBeamNohd, lensNohd } from "./hazard-distance";
export { apertureAveragedIrradianceWPerCm2, opticalDensity, peakIrradianceWPerCm2 } from "./irradiance";
export { LIMITATIONS, type Limitation } from "./limitations";
export { correctionCA, correctionCB, correctionCC, correctionCP, defaultExposureS, eyeMpe, limitingAperture, skinMpe, timeT1S, timeT2S, type EyeMpe, type SkinMpe } from "./mpe";
export { pulsedEyeMpe, type PulseRule, type PulsedMpe } from "./pulsed";
export { FINAL_SAY, HAZARD_CLASSES, type Figure, type HazardClass } from "./types";
