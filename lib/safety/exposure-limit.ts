// The eye exposure limit that applies to one laser: exposure duration, CW or pulsed MPE as an average irradiance, limiting aperture.
// Formulas: ANSI Z136.1-2014 Tables 5a and 8 and §8.2.3 via mpe.ts and pulsed.ts; defaults per PRODUCT.md.

import { defaultExposureS, eyeMpe, limitingAperture, type EyeMpe } from "./mpe";
import { pulsedEyeMpe, type PulsedMpe } from "./pulsed";
import type { Figure } from "./types";

export type LaserEmission = {
  wavelengthNm: number;
  exposureS?: number;
  pulseDurationS?: number;
  pulseRepetitionRateHz?: number;
};

export type ExposureLimit = {
  exposureS: number;
  exposureSource: string;
  /** The MPE as an average irradiance over the limiting aperture, comparable with average power. */
  mpeWPerCm2: number;
  mpe: Figure;
  limitingApertureMm: number;
  limitingAperture: Figure;
  continuous: EyeMpe | null;
  pulsed: PulsedMpe | null;
};

export function exposureLimit(emission: LaserEmission): ExposureLimit {
  const λ = emission.wavelengthNm;
  const given = emission.exposureS !== undefined;
  const τ = emission.pulseDurationS;
  // A default exposure shorter than the pulse would make no sense; the pulse itself is then the exposure.
  const exposureS = given ? (emission.exposureS as number) : Math.max(defaultExposureS(λ), τ ?? 0);
  const exposureSource = given
    ? "Exposure duration as entered"
    : "Default exposure duration: 0.25 s in 400–700 nm (aversion response), 10 s outside (PRODUCT.md, after ANSI Z136.1-2014 §8)";

  if (τ === undefined) {
    const continuous = eyeMpe(λ, exposureS);
    const aperture = limitingAperture(λ, exposureS);
    return {
      exposureS,
      exposureSource,
      mpeWPerCm2: continuous.irradianceWPerCm2,
      mpe: { value: continuous.irradianceWPerCm2, unit: "W/cm²", source: continuous.source },
      limitingApertureMm: aperture.diameterMm,
      limitingAperture: { value: aperture.diameterMm, unit: "mm", source: aperture.source },
      continuous,
      pulsed: null,
    };
  }
  const pulsed = pulsedEyeMpe({
    wavelengthNm: λ,
    pulseDurationS: τ,
    pulseRepetitionRateHz: emission.pulseRepetitionRateHz,
    exposureS,
  });
  // The aperture for the shortest duration in play is the smallest, hence the stricter.
  const aperture = limitingAperture(λ, Math.min(τ, exposureS));
  const unitNote =
    pulsed.pulseRepetitionRateHz === null
      ? "per-pulse MPE ÷ pulse duration (compare with the power during the pulse)"
      : "per-pulse MPE × repetition rate (compare with the average power)";
  return {
    exposureS,
    exposureSource,
    mpeWPerCm2: pulsed.effectiveIrradianceWPerCm2,
    mpe: {
      value: pulsed.effectiveIrradianceWPerCm2,
      unit: "W/cm²",
      source: `${pulsed.source}; governing rule: ${pulsed.governingRule}; ${unitNote}`,
    },
    limitingApertureMm: aperture.diameterMm,
    limitingAperture: { value: aperture.diameterMm, unit: "mm", source: aperture.source },
    continuous: null,
    pulsed,
  };
}

