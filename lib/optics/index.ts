// The optics engine's public face: analyzeBench, screenProfile, ringImage, the finder and their types.
// Formulas live in the modules re-exported here, each naming its published source (Siegman; Self 1983; Born & Wolf; Hecht; Collins 1970).
import type { AnyBenchDocument, BenchDocument, BenchDocumentV2 } from "@/lib/bench/schema";
import { analyzeBench as analyzeRail, type AnalyzeOptions, type BenchAnalysis } from "./analyze";
import { analyzeTable, type TableAnalysis } from "./table";

/**
 * The optics of a bench document. Version 1 (a straight rail) gives exactly the rail engine's answer; version 2 (the
 * table plan) traces every path and analyses each along its unfolded length (lib/optics/table.ts).
 */
export function analyzeBench(doc: BenchDocument, options?: AnalyzeOptions): BenchAnalysis;
export function analyzeBench(doc: BenchDocumentV2, options?: AnalyzeOptions): TableAnalysis;
export function analyzeBench(doc: AnyBenchDocument, options?: AnalyzeOptions): BenchAnalysis | TableAnalysis;
export function analyzeBench(doc: AnyBenchDocument, options: AnalyzeOptions = {}): BenchAnalysis | TableAnalysis {
  return doc.version === 2 ? analyzeTable(doc, options) : analyzeRail(doc, options);
}
export { analyzeRail, analyzeTable };
export { OpticsInputError } from "./analyze";
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
export { ChainPrefixCache, FieldChain } from "./chain";
export type { AnalyzeOptions } from "./analyze";
export type { ChainElement, ChainStart, ClipPlane } from "./chain";
export { MAX_GENERATIONS, MAX_PATHS, MIN_SHARE_OF_LASER } from "./table";
export type { TableAnalysis, TableApertureAnalysis, TableElementAnalysis, TablePath, TablePathEnd, TablePoint, TableScreenAnalysis, TableWarning } from "./table";
export { traceTable } from "./table-trace";
export type { TableTrace, TracedPath } from "./table-trace";
export { unfoldPath } from "./table-unfold";
export type { OpticsWarning, WarningCode } from "./warnings";
export { readScreenPhoto, PhotoReadError } from "./photo";
export type { PhotoContext, PhotoImage, ScreenPhotoReading } from "./photo";
