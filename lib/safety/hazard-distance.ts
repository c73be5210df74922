// Hazard distances: NOHD of the direct beam, NOHD after a focusing or diverging lens, nominal hazard zone of a diffuse reflection.
// Formulas: ANSI Z136.1-2014 Appendix B (beam diameters and divergences there are 1/e values; callers convert from 1/e²).

import { SOURCE } from "./types";

export const SQRT2 = Math.SQRT2;

/** √(4P/(π·MPE)) in cm: the 1/e beam diameter at which the peak irradiance equals the MPE. */
export function hazardDiameterCm(powerW: number, mpeWPerCm2: number): number {
  return Math.sqrt((4 * powerW) / (Math.PI * mpeWPerCm2));
}

export type Nohd = {
  /** Metres; Infinity for a beam with zero divergence that exceeds the MPE. */
  distanceM: number;
  hazardDiameterCm: number;
  /** True when the beam averaged over the limiting aperture can never exceed the MPE. */
  belowMpeEverywhere: boolean;
  source: string;
};

/**
 * NOHD = (√(4P/(π·MPE)) − a)/φ, a the 1/e beam diameter at the exit and φ the 1/e full-angle divergence
 * (ANSI Z136.1-2014 Appendix B). Zero when √(4P/(π·MPE)) ≤ the limiting aperture diameter, or when the beam
 * is already wider than the hazard diameter at the exit.
 */
export function directBeamNohd(args: {
  powerMw: number;
  mpeWPerCm2: number;
  beamDiameter1eMm: number;
  divergence1eMrad: number;
  limitingApertureMm: number;
}): Nohd {
  const dHaz = hazardDiameterCm(args.powerMw / 1000, args.mpeWPerCm2);
  const source = SOURCE.ansiAppendixBNohd;
  if (dHaz <= args.limitingApertureMm / 10) return { distanceM: 0, hazardDiameterCm: dHaz, belowMpeEverywhere: true, source };
  const excessCm = dHaz - args.beamDiameter1eMm / 10;
  if (excessCm <= 0) return { distanceM: 0, hazardDiameterCm: dHaz, belowMpeEverywhere: false, source };
  if (args.divergence1eMrad <= 0) return { distanceM: Infinity, hazardDiameterCm: dHaz, belowMpeEverywhere: false, source };
  const distanceCm = excessCm / (args.divergence1eMrad / 1000);
  return { distanceM: distanceCm / 100, hazardDiameterCm: dHaz, belowMpeEverywhere: false, source };
}

export type LensNohd = {
  /** Distance from the focus (real or virtual) beyond which the peak irradiance is below the MPE. */
  fromFocusM: number;
  /** The same, measured from the lens (f + r for a converging lens, r − |f| for a diverging one, floored at 0). */
  fromLensM: number;
  source: string;
};

/**
 * Lens-on-laser NOHD r = (f/b₀)·√(4P/(π·MPE)), b₀ the 1/e beam diameter on the lens (ANSI Z136.1-2014 Appendix B).
 * The formula takes the beam as diverging from a point focus at full angle b₀/|f|, which over-states the irradiance
 * near the focus and so errs on the safe side. Zero when √(4P/(π·MPE)) ≤ the limiting aperture diameter.
 */
export function lensNohd(args: {
  powerMw: number;
  mpeWPerCm2: number;
  focalLengthMm: number;
  beamDiameterOnLens1eMm: number;
  limitingApertureMm: number;
}): LensNohd {
  const dHaz = hazardDiameterCm(args.powerMw / 1000, args.mpeWPerCm2);
  const source = SOURCE.ansiAppendixBLens;
  if (dHaz <= args.limitingApertureMm / 10) return { fromFocusM: 0, fromLensM: 0, source };
  const fCm = Math.abs(args.focalLengthMm) / 10;
  const rCm = (fCm / (args.beamDiameterOnLens1eMm / 10)) * dHaz;
  const fromLensCm = args.focalLengthMm > 0 ? fCm + rCm : Math.max(0, rCm - fCm);
  return { fromFocusM: rCm / 100, fromLensM: fromLensCm / 100, source };
}

/**
 * Nominal hazard zone of a diffuse (Lambertian) reflection: r = √(ρ·P·cos θ/(π·MPE)) (ANSI Z136.1-2014 Appendix B),
 * ρ the diffuse reflectance (default 1, the worst case) and θ the viewing angle from the normal (default 0).
 * Uses the point-source MPE, which is stricter than the extended-source MPE a large spot would allow.
 */
export function diffuseReflectionNhz(args: {
  powerMw: number;
  mpeWPerCm2: number;
  reflectance?: number;
  viewingAngleRad?: number;
}): { distanceM: number; source: string } {
  const ρ = args.reflectance ?? 1;
  const cosθ = Math.cos(args.viewingAngleRad ?? 0);
  const rCm = Math.sqrt((ρ * (args.powerMw / 1000) * cosθ) / (Math.PI * args.mpeWPerCm2));
  return { distanceM: rCm / 100, source: SOURCE.ansiAppendixBDiffuse };
}
