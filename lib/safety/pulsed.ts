// Eye MPE for pulsed lasers: single pulse, and the three repetitive-pulse rules with the governing rule named.
// Rules and C_P = N^−0.25 from ANSI Z136.1-2014 §8.2.3 and Directive 2006/25/EC Annex II Table 2.6; t_min from ANSI 2014 (recalled).

// ANSI Z136.1-2014 and ICNIRP 2013 relaxed rule 3 for some pulse regimes (C_P = 1 for many short pulses in
// 400–1400 nm); IEC 60825-1:2014 made the same change to C5. The engine keeps C_P = N^−0.25 everywhere (stricter).

import { correctionCP, eyeMpe, type EyeMpe } from "./mpe";
import { SOURCE } from "./types";

export type PulseRule = "single-pulse" | "average-power" | "pulse-train";

export type PulseRuleResult = {
  rule: PulseRule;
  /** The per-pulse radiant exposure this rule allows. */
  perPulseJPerCm2: number;
  explanation: string;
};

export type PulsedMpe = {
  wavelengthNm: number;
  pulseDurationS: number;
  pulseRepetitionRateHz: number | null;
  exposureS: number;
  /** Pulses in the exposure (1 for a single pulse). */
  pulseCount: number;
  rules: PulseRuleResult[];
  governingRule: PulseRule;
  /** The lowest per-pulse limit of the rules. */
  perPulseJPerCm2: number;
  /**
   * The same limit as an average irradiance, so it can be compared with the average power the bench document
   * carries: per-pulse limit × repetition rate; for a single pulse, the limit ÷ pulse duration (peak irradiance).
   */
  effectiveIrradianceWPerCm2: number;
  notes: string[];
  source: string;
};

/**
 * t_min: pulses closer together than this act on the retina or cornea as one pulse (ANSI Z136.1-2014 Table 6 as
 * recalled: 5 µs in 400–1050 nm, 13 µs in 1050–1400 nm; beyond 1400 nm the Directive 2006/25/EC Table 2.6 values).
 */
export function minimumPulseGroupS(wavelengthNm: number): number | null {
  const λ = wavelengthNm;
  if (λ < 315) return null; // photochemical only: rule 3 does not apply
  if (λ <= 400) return 1e-9;
  if (λ <= 1050) return 5e-6;
  if (λ <= 1400) return 1.3e-5;
  if (λ <= 1500) return 1e-3;
  if (λ <= 1800) return 10;
  if (λ <= 2600) return 1e-3;
  return 1e-7;
}

export type PulsedInput = {
  wavelengthNm: number;
  pulseDurationS: number;
  /** Omit for a single pulse. */
  pulseRepetitionRateHz?: number;
  exposureS: number;
};

export function pulsedEyeMpe(input: PulsedInput): PulsedMpe {
  const { wavelengthNm: λ, pulseDurationS: τ, exposureS: T } = input;
  const prf = input.pulseRepetitionRateHz ?? null;
  const notes: string[] = [];
  const single: EyeMpe = eyeMpe(λ, τ);
  const rules: PulseRuleResult[] = [
    {
      rule: "single-pulse",
      perPulseJPerCm2: single.radiantExposureJPerCm2,
      explanation: `Rule 1: any single pulse ≤ the MPE for its duration ${τ} s (${single.governingRow})`,
    },
  ];

  if (prf === null) {
    notes.push("Single pulse: the pulse energy is taken as the stated power × the pulse duration.");
    return finish(1);
  }

  const pulseCount = Math.max(1, prf * T);
  const train = eyeMpe(λ, T);
  rules.push({
    rule: "average-power",
    perPulseJPerCm2: train.radiantExposureJPerCm2 / pulseCount,
    explanation: `Rule 2: the whole train in ${T} s ≤ the MPE for ${T} s (${train.governingRow}), shared over N = ${fmt(pulseCount)} pulses`,
  });

  const tMin = minimumPulseGroupS(λ);
  if (tMin !== null && single.thermalJPerCm2 !== null) {
    if (prf * tMin > 1) {
      // Several pulses fall inside t_min: treat each group of n pulses as one pulse of duration t_min.
      const perGroup = prf * tMin;
      const groups = Math.max(1, T / tMin);
      const groupMpe = eyeMpe(λ, tMin).thermalJPerCm2 ?? single.thermalJPerCm2;
      rules.push({
        rule: "pulse-train",
        perPulseJPerCm2: (correctionCP(groups) * groupMpe) / perGroup,
        explanation: `Rule 3: ${fmt(perGroup)} pulses fall within t_min = ${tMin} s and count as one; C_P = N^−0.25 with N = ${fmt(groups)} groups`,
      });
      notes.push(`Pulses closer than t_min = ${tMin} s were grouped and treated as one pulse.`);
    } else {
      rules.push({
        rule: "pulse-train",
        perPulseJPerCm2: correctionCP(pulseCount) * single.thermalJPerCm2,
        explanation: `Rule 3: single-pulse thermal MPE × C_P, C_P = N^−0.25 = ${fmt(correctionCP(pulseCount))} for N = ${fmt(pulseCount)}`,
      });
    }
  } else {
    notes.push("Rule 3 (C_P) applies to thermal limits only; below 315 nm the photochemical limit governs and rule 3 is not used.");
  }
  return finish(pulseCount);

  function finish(pulseCount: number): PulsedMpe {
    let governing = rules[0];
    for (const r of rules) if (r.perPulseJPerCm2 < governing.perPulseJPerCm2) governing = r;
    return {
      wavelengthNm: λ,
      pulseDurationS: τ,
      pulseRepetitionRateHz: prf,
      exposureS: T,
      pulseCount,
      rules,
      governingRule: governing.rule,
      perPulseJPerCm2: governing.perPulseJPerCm2,
      effectiveIrradianceWPerCm2: prf === null ? governing.perPulseJPerCm2 / τ : governing.perPulseJPerCm2 * prf,
      notes,
      source: `${SOURCE.ansiRepetitive}; ${SOURCE.directiveAnnexII} Table 2.6; single-pulse values ${SOURCE.ansiTable5}`,
    };
  }
}

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}
