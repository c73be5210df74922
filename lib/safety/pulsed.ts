// Eye MPE for pulsed lasers: single pulse, and the three repetitive-pulse rules with the governing rule named.
// Rules, C_P = N^−0.25 and t_min (T_i) from ANSI Z136.1-2014 §8.2.3 / Table 6 and IEC 60825-1:2014 §4.3 f), A.3 (from memory).

// ANSI Z136.1-2014 and IEC 60825-1:2014 (C5) relax rule 3 for some regimes (from memory: IEC's C5 = 1 for a small
// source, α ≤ 5 mrad, in 400–1400 nm; ANSI's C_P for pulses shorter than t_min). The engine keeps C_P = N^−0.25
// everywhere (the conservative reading) and says so in a note wherever a relaxation could apply.

import { correctionCP, eyeMpe, type EyeMpe, type MpeSite } from "./mpe";
import { type StandardId, DEFAULT_MPE_STANDARD, SOURCE, UNCHECKED } from "./types";

export type PulseRule = "single-pulse" | "average-power" | "pulse-train" | "burst";

/** What the governing rule means, in words (rules 1–3 as the repetitive-pulse clauses number them, and the burst rule). */
export const PULSE_RULE_WORDS: Record<PulseRule, string> = {
  "single-pulse": "rule 1, any single pulse against the MPE for its duration",
  "average-power": "rule 2, the average power over the exposure",
  "pulse-train": "rule 3, each pulse of the train with C_P = N^−0.25",
  burst: "the burst rule, each burst taken as one pulse of its energy and length",
};

/**
 * Pulses in bursts: `pulsesPerBurst` pulses at `pulseRateHz` inside each burst. The train's pulseRepetitionRateHz stays
 * the average number of pulses per second (pulses per burst × bursts per second), so energy × rate is the average power.
 */
export type Burst = { pulsesPerBurst: number; pulseRateHz: number };

/** Length of one burst: from the start of its first pulse to the end of its last. */
export const burstDurationS = (burst: Burst, pulseDurationS: number): number => (burst.pulsesPerBurst - 1) / burst.pulseRateHz + pulseDurationS;

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
  /** Omit for a single pulse. For bursts, the average number of pulses per second. */
  pulseRepetitionRateHz?: number;
  /** Pulses grouped in bursts (with pulseRepetitionRateHz only). */
  burst?: Burst;
  exposureS: number;
  standard?: StandardId;
  /** Only the retinal or only the corneal/lens limits (dual limits with different apertures). */
  site?: MpeSite;
  /** false: leave the rules' explanations empty (the class check needs only the numbers). */
  explain?: boolean;
};

export function pulsedEyeMpe(input: PulsedInput): PulsedMpe {
  const { wavelengthNm: λ, pulseDurationS: τ, exposureS: T } = input;
  const standard = input.standard ?? DEFAULT_MPE_STANDARD;
  const mpeOptions = { standard, site: input.site };
  const prf = input.pulseRepetitionRateHz ?? null;
  const notes: string[] = [];
  const explain = input.explain !== false;
  const say = (text: () => string) => (explain ? text() : "");
  const single: EyeMpe = eyeMpe(λ, τ, mpeOptions);
  const rules: PulseRuleResult[] = [
    {
      rule: "single-pulse",
      perPulseJPerCm2: single.radiantExposureJPerCm2,
      explanation: say(() => `Rule 1: any single pulse ≤ the MPE for its duration ${τ} s (${single.governingRow})`),
    },
  ];

  if (prf === null) {
    return finish(1);
  }

  const pulseCount = Math.max(1, prf * T);
  const train = eyeMpe(λ, T, mpeOptions);
  rules.push({
    rule: "average-power",
    perPulseJPerCm2: train.radiantExposureJPerCm2 / pulseCount,
    explanation: say(() => `Rule 2: the whole train in ${T} s ≤ the MPE for ${T} s (${train.governingRow}), shared over N = ${fmt(pulseCount)} pulses`),
  });

  const tMin = minimumPulseGroupS(λ);
  // Inside a burst the pulses follow each other at the burst's own rate: grouping within t_min goes by that rate.
  const burst = input.burst && input.burst.pulsesPerBurst >= 2 && input.burst.pulseRateHz > prf ? input.burst : undefined;
  const closeRate = burst ? burst.pulseRateHz : prf;
  if (tMin !== null && single.thermalJPerCm2 !== null) {
    if (closeRate * tMin > 1) {
      // Several pulses fall inside t_min: treat each group of n pulses as one pulse of duration t_min. In bursts, a group
      // is the pulses of one burst inside t_min, or the average count in t_min when bursts crowd closer (the larger).
      const perGroup = burst ? Math.max(Math.min(burst.pulsesPerBurst, closeRate * tMin), prf * tMin) : prf * tMin;
      if (burst) {
        // the even train's count as well (every pulse counted, C_P = N^−0.25): the stricter of the two governs
        rules.push({
          rule: "pulse-train",
          perPulseJPerCm2: correctionCP(pulseCount) * single.thermalJPerCm2,
          explanation: say(() => `Rule 3: single-pulse thermal MPE × C_P, C_P = N^−0.25 = ${fmt(correctionCP(pulseCount))} for N = ${fmt(pulseCount)}`),
        });
      }
      const groups = Math.max(1, pulseCount / perGroup);
      const groupMpe = eyeMpe(λ, tMin, mpeOptions).thermalJPerCm2 ?? single.thermalJPerCm2;
      rules.push({
        rule: "pulse-train",
        perPulseJPerCm2: (correctionCP(groups) * groupMpe) / perGroup,
        explanation: say(() => `Rule 3: ${fmt(perGroup)} pulses fall within t_min = ${tMin} s and count as one; C_P = N^−0.25 with N = ${fmt(groups)} groups`),
      });
      notes.push(`Pulses closer than t_min = ${tMin} s were grouped and treated as one pulse.`);
    } else {
      rules.push({
        rule: "pulse-train",
        perPulseJPerCm2: correctionCP(pulseCount) * single.thermalJPerCm2,
        explanation: say(() => `Rule 3: single-pulse thermal MPE × C_P, C_P = N^−0.25 = ${fmt(correctionCP(pulseCount))} for N = ${fmt(pulseCount)}`),
      });
    }
    if (pulseCount > 1) {
      notes.push(
        λ >= 400 && λ <= 1400
          ? `Rule 3 uses C_P = N^−0.25 for every train (the conservative reading). The 2014 editions relax it here: IEC 60825-1:2014 sets C5 = 1 for a small source (α ≤ 5 mrad), and ANSI Z136.1-2014 relaxes C_P for pulses shorter than t_min; the figure shown is stricter than either (${UNCHECKED}).`
          : `Rule 3 uses C_P = N^−0.25 for every train (the conservative reading); where a 2014 edition relaxes it, the figure shown is the stricter one (${UNCHECKED}).`,
      );
    }
  } else {
    notes.push("Rule 3 (C_P) applies to thermal limits only; below 315 nm the photochemical limit governs and rule 3 is not used.");
  }
  if (burst) {
    // Any group of pulses together ≤ the MPE for the group's duration (ANSI Z136.1-2014 §8.2.3, IEC 60825-1:2014
    // §4.3 f) and A.3 — from memory): each burst as one pulse of n pulses' energy over its length D, and (thermal
    // limits) the bursts as a train of such pulses with C_P = N_b^−0.25. Never more lenient than the groups within t_min.
    const n = burst.pulsesPerBurst;
    const D = burstDurationS(burst, τ);
    const whole = eyeMpe(λ, Math.min(D, T), mpeOptions);
    const burstsInT = Math.max(1, (prf / n) * T);
    let perPulse = whole.radiantExposureJPerCm2 / n;
    if (whole.thermalJPerCm2 !== null && burstsInT > 1) perPulse = Math.min(perPulse, (correctionCP(burstsInT) * whole.thermalJPerCm2) / n);
    rules.push({
      rule: "burst",
      perPulseJPerCm2: perPulse,
      explanation: say(
        () =>
          `Bursts: each burst of ${fmt(n)} pulses (${fmt(D)} s long) ≤ the MPE for its length (${whole.governingRow}), and the ${fmt(burstsInT)} bursts in ${T} s as a train with C_P = N^−0.25 = ${fmt(correctionCP(burstsInT))}; shared over the ${fmt(n)} pulses of a burst`,
      ),
    });
    notes.push(
      `Pulses in bursts (${fmt(n)} at ${fmt(burst.pulseRateHz)} Hz inside each burst, ${fmt(prf / n)} bursts per second): rules 1–3 with every pulse counted and pulses grouped at the rate inside a burst, and each burst also taken as one pulse of its total energy and length; the strictest governs (the conservative reading, ${UNCHECKED}).`,
    );
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
      source: `${standard === "IEC 60825-1:2014" ? SOURCE.iecRepetitive : SOURCE.ansiRepetitive}; single-pulse values ${standard === "IEC 60825-1:2014" ? SOURCE.iecMpe : SOURCE.ansiTable5} — ${UNCHECKED}`,
    };
  }
}

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}
