// The optics engine's public face: analyzeBench, screenProfile, ringImage, the finder and their types.
// Formulas live in the modules re-exported here, each naming its published source (Siegman; Self 1983; Born & Wolf; Hecht; Collins 1970).
export { analyzeBench, OpticsInputError } from "./analyze";
export type {
  ApertureAnalysis,
  BenchAnalysis,
  ElementAnalysis,
  IncidentBeam,
  ScreenAnalysis,
  OpticsInputErrorCode,
} from "./analyze";
export type { ElementStatus, EnvelopePoint, Waist } from "./propagate";
export type { CentreAppearance, DiffractionRegime } from "./fresnel";
export { FRAUNHOFER_MAX_FRESNEL_NUMBER, GEOMETRIC_MIN_FRESNEL_NUMBER } from "./fresnel";
export { screenProfile, ringImage, DEFAULT_PROFILE_POINTS, MAX_PROFILE_POINTS, DEFAULT_RING_IMAGE_PX, MAX_RING_IMAGE_PX } from "./profile";
export type { ProfileOptions, RingImage, ScreenProfile } from "./profile";
export { findScreenPositions, solveApertureDiameter, solveAperturePosition } from "./finder";
export type { DiameterSolution, PositionSolution, ScreenCandidate, ScreenSearch } from "./finder";
export { WARNING_CODES } from "./warnings";
export { fieldPowerProbe } from "./field-power";
export type { FieldPowerProbe } from "./field-power";
export { FieldChain } from "./chain";
export type { ChainElement, ChainStart, ClipPlane } from "./chain";
export type { OpticsWarning, WarningCode } from "./warnings";
