// The eye exposure limit that applies to one emission line: exposure duration, CW or pulsed MPE, limiting aperture, per standard.
// Formulas: ANSI Z136.1-2014 Tables 5a, 8 and §8.2.3, or IEC 60825-1:2014 Tables A.1, A.4 and §4.3 f), via mpe.ts and pulsed.ts (from memory).

import { apertureAveragedIrradianceWPerCm2 } from "./irradiance";
import { defaultExposureS, eyeMpe, limitingAperture, type EyeMpe, type MpeSite } from "./mpe";
import { PULSE_RULE_WORDS, pulsedEyeMpe, type PulsedMpe } from "./pulsed";
import { type Figure, type StandardId, DEFAULT_MPE_STANDARD, UNCHECKED, unchecked } from "./types";

export type LaserEmission = {
  wavelengthNm: number;
  exposureS?: number;
  pulseDurationS?: number;
  pulseRepetitionRateHz?: number;
  /** Trains in bursts: pulses per burst and the pulse rate inside a burst. */
  pulsesPerBurst?: number;
  burstPulseRateHz?: number;
};

/** The limit protecting one site of the eye (the retina, or the cornea/lens), with its own limiting aperture. */
export type SiteLimit = {
  site: MpeSite;
  /**
   * The MPE as an irradiance comparable with the beam power the engine carries: the average irradiance for CW and
   * trains; for a single pulse the per-pulse MPE ÷ the pulse duration (compared with energy ÷ duration).
   */
  effectiveWPerCm2: number;
  /** The governing MPE as radiant exposure per pulse (pulsed only). */
  perPulseJPerCm2: number | null;
  limitingApertureMm: number;
  mpe: Figure;
  limitingAperture: Figure;
  continuous: EyeMpe | null;
  pulsed: PulsedMpe | null;
};

export type ExposureLimit = {
  standard: StandardId;
  exposureS: number;
  exposureSource: string;
  /** One entry per site whose limits apply (two only in 1200–1400 nm and at 400 nm). */
  sites: SiteLimit[];
};

export function exposureLimit(emission: LaserEmission, standard: StandardId = DEFAULT_MPE_STANDARD): ExposureLimit {
  const λ = emission.wavelengthNm;
  const given = emission.exposureS !== undefined;
  const τ = emission.pulseDurationS;
  // A default exposure shorter than the pulse would make no sense; the pulse itself is then the exposure.
  const exposureS = given ? (emission.exposureS as number) : Math.max(defaultExposureS(λ), τ ?? 0);
  const exposureSource = given
    ? "Exposure duration as entered"
    : `Default exposure duration: 0.25 s in 400–700 nm (aversion response), 30 000 s below 400 nm (a working day), 10 s above 700 nm (after ANSI Z136.1-2014 §8.2 — ${UNCHECKED})`;
  const sites: MpeSite[] = [];
  if (λ >= 400 && λ <= 1400) sites.push("retina");
  if (λ <= 400 || λ >= 1200) sites.push("anterior");
  return { standard, exposureS, exposureSource, sites: sites.map((site) => siteLimit(λ, site, exposureS, emission, standard)) };
}

function siteLimit(λ: number, site: MpeSite, exposureS: number, emission: LaserEmission, standard: StandardId): SiteLimit {
  const τ = emission.pulseDurationS;
  if (τ === undefined) {
    const continuous = eyeMpe(λ, exposureS, { site, standard });
    const aperture = limitingAperture(λ, exposureS, "eye", standard, site);
    return {
      site,
      effectiveWPerCm2: continuous.irradianceWPerCm2,
      perPulseJPerCm2: null,
      limitingApertureMm: aperture.diameterMm,
      mpe: { value: continuous.irradianceWPerCm2, unit: "W/cm²", source: unchecked(continuous.source) },
      limitingAperture: { value: aperture.diameterMm, unit: "mm", source: `${aperture.source} — ${UNCHECKED}` },
      continuous,
      pulsed: null,
    };
  }
  const burst =
    emission.pulsesPerBurst !== undefined && emission.burstPulseRateHz !== undefined ? { pulsesPerBurst: emission.pulsesPerBurst, pulseRateHz: emission.burstPulseRateHz } : undefined;
  const pulsed = pulsedEyeMpe({ wavelengthNm: λ, pulseDurationS: τ, pulseRepetitionRateHz: emission.pulseRepetitionRateHz, ...(burst ? { burst } : {}), exposureS, standard, site });
  // The aperture for the pulse duration: the smallest in play, so the averaged exposure is never understated.
  const aperture = limitingAperture(λ, Math.min(τ, exposureS), "eye", standard, site);
  const train = pulsed.pulseRepetitionRateHz !== null;
  return {
    site,
    effectiveWPerCm2: pulsed.effectiveIrradianceWPerCm2,
    perPulseJPerCm2: pulsed.perPulseJPerCm2,
    limitingApertureMm: aperture.diameterMm,
    mpe: train
      ? {
          value: pulsed.effectiveIrradianceWPerCm2,
          unit: "W/cm²",
          source: `${pulsed.source}; governed by ${PULSE_RULE_WORDS[pulsed.governingRule]}; per-pulse MPE × repetition rate, an average irradiance`,
        }
      : { value: pulsed.perPulseJPerCm2, unit: "J/cm²", source: `${pulsed.source}; governed by ${PULSE_RULE_WORDS[pulsed.governingRule]}; radiant exposure of the single pulse` },
    limitingAperture: { value: aperture.diameterMm, unit: "mm", source: `${aperture.source}, for the pulse duration — ${UNCHECKED}` },
    continuous: null,
    pulsed,
  };
}

/**
 * log10(E/MPE) for a Gaussian beam of the given power (the power the limit's effectiveWPerCm2 compares with) and 1/e²
 * radius, the worst over the sites; null when no light arrives.
 */
export function worstExceedance(
  limit: ExposureLimit,
  powerMw: number,
  radiusMm: number,
  /** Optional: the share of the power inside a limiting aperture of this diameter from the propagated field (behind a clipping aperture); null → the Gaussian. */
  shareInside?: (limitingApertureMm: number) => number | null,
): { raw: number | null; site: SiteLimit; averagedWPerCm2: number } {
  let best: { raw: number | null; site: SiteLimit; averagedWPerCm2: number } | null = null;
  for (const site of limit.sites) {
    const share = shareInside?.(site.limitingApertureMm) ?? null;
    const averaged =
      share === null || powerMw <= 0
        ? apertureAveragedIrradianceWPerCm2(powerMw, radiusMm, site.limitingApertureMm)
        : (powerMw * share) / 1000 / (Math.PI * (site.limitingApertureMm / 20) ** 2);
    const raw = averaged > 0 ? Math.log10(averaged / site.effectiveWPerCm2) : null;
    if (best === null || (raw !== null && (best.raw === null || raw > best.raw))) best = { raw, site, averagedWPerCm2: averaged };
  }
  return best as { raw: number | null; site: SiteLimit; averagedWPerCm2: number };
}
