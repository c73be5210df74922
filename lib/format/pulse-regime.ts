// The pulse regime of a laser line in words, for the review screen, the editor and the build sheet: continuous-wave,
// a single pulse (energy, duration), a train (energy per pulse, rate, duration, average power) or bursts (pulses per
// burst, bursts per second, the rate inside a burst, energy per pulse), and which repetitive-pulse rule governs the
// line's MPE (the hazard engine names it: lib/safety/pulsed.ts). Presentation only; no published formula.
import { laserAveragePowerMw, laserPulseEnergyJ } from "@/lib/bench/laser-power";
import { PULSE_RULE_WORDS, type PulseRule } from "@/lib/safety/pulsed";
import { formatNumber } from "./number";

/** The governing rule names of lib/safety/pulsed.ts. */
export type PulseRuleName = PulseRule;
export { PULSE_RULE_WORDS };

export type PulseRegimeKind = "continuous" | "single-pulse" | "train" | "burst";

export type PulseRegimeWords = {
  kind: PulseRegimeKind;
  /** "Continuous-wave", "Single pulse", "Pulse train", "Pulses in bursts". */
  title: string;
  /** The figures of the regime, e.g. "10 µJ per pulse, 10 ns, 10 kHz (100 mW average)". */
  figures: string;
  /** "MPE governed by rule 3, …"; null for a continuous-wave line or when the engine gave no rule. */
  rule: string | null;
};

/** The pulse fields of a laser element (either document version). */
export type PulseFields = {
  powerMw?: number;
  pulseEnergyJ?: number;
  pulseDurationS?: number;
  pulseRepetitionRateHz?: number;
  pulsesPerBurst?: number;
  burstPulseRateHz?: number;
};

const n = (x: number) => formatNumber(x, { digits: 3 });

function scaled(value: number, units: readonly (readonly [number, string])[]): string {
  const abs = Math.abs(value);
  for (const [factor, unit] of units) if (abs >= factor) return `${n(value / factor)} ${unit}`;
  const [factor, unit] = units[units.length - 1];
  return `${n(value / factor)} ${unit}`;
}

/** An energy in J with a readable unit: 2 J, 200 mJ, 10 µJ, 5 nJ. */
export const energyWords = (joules: number) => scaled(joules, [[1, "J"], [1e-3, "mJ"], [1e-6, "µJ"], [1e-9, "nJ"], [1e-12, "pJ"]]);
/** A duration in s: 1 s, 10 ms, 8 ns, 100 fs. */
export const durationWords = (seconds: number) => scaled(seconds, [[1, "s"], [1e-3, "ms"], [1e-6, "µs"], [1e-9, "ns"], [1e-12, "ps"], [1e-15, "fs"]]);
/** A rate in Hz: 0.5 Hz, 10 Hz, 80 MHz. */
export const rateWords = (hertz: number) => scaled(hertz, [[1e12, "THz"], [1e9, "GHz"], [1e6, "MHz"], [1e3, "kHz"], [1, "Hz"]]);

/**
 * The regime of one line of a laser. `line` is the line as the hazard engine lists it: the main line (its energy is the
 * laser's own) or a further line sharing the main line's pulse timing, whose power is an average for a train and the
 * power during the pulse for a single pulse. `rule` is the engine's governing rule for that line (pulsedMpe.governingRule).
 */
export function pulseRegimeWords(laser: PulseFields, line: { main: boolean; powerMw: number }, rule: PulseRuleName | null | undefined): PulseRegimeWords {
  const τ = laser.pulseDurationS;
  const f = laser.pulseRepetitionRateHz;
  const ruleText = rule ? `MPE governed by ${PULSE_RULE_WORDS[rule]}` : null;
  // Pulses that overlap (duration × rate ≥ 1) are assessed as continuous-wave (the document refuses them anyway).
  if (τ === undefined || (f !== undefined && τ * f >= 1)) {
    return { kind: "continuous", title: "Continuous-wave", figures: `${n(line.powerMw)} mW`, rule: null };
  }
  if (f === undefined) {
    const energy = line.main ? (laserPulseEnergyJ(laser) ?? (line.powerMw / 1e3) * τ) : (line.powerMw / 1e3) * τ;
    return { kind: "single-pulse", title: "Single pulse", figures: `${energyWords(energy)} in ${durationWords(τ)}`, rule: ruleText };
  }
  const average = line.main ? (laserAveragePowerMw(laser) ?? line.powerMw) : line.powerMw;
  const energy = line.main ? (laserPulseEnergyJ(laser) ?? average / 1e3 / f) : average / 1e3 / f;
  const nb = laser.pulsesPerBurst;
  const fb = laser.burstPulseRateHz;
  if (nb !== undefined && fb !== undefined) {
    return {
      kind: "burst",
      title: "Pulses in bursts",
      figures: `${n(nb)} pulses per burst, ${n(f / nb)} bursts per second, ${rateWords(fb)} inside a burst; ${energyWords(energy)} per pulse, ${durationWords(τ)} pulses (${rateWords(f)}, ${n(average)} mW on average)`,
      rule: ruleText,
    };
  }
  return {
    kind: "train",
    title: "Pulse train",
    figures: `${energyWords(energy)} per pulse at ${rateWords(f)}, ${durationWords(τ)} pulses (${n(average)} mW average)`,
    rule: ruleText,
  };
}

/** One row per emission line: the laser, the line and its regime in words. */
export type RegimeRow = { laserId: string; wavelengthNm: number; main: boolean; powerMw: number; words: PulseRegimeWords };

/**
 * The rows of one laser: its lines as the hazard engine lists them (the main line first), each with the engine's
 * governing rule for that line (null for continuous-wave).
 */
export function regimeRows(laserId: string, laser: PulseFields, lines: readonly { wavelengthNm: number; main: boolean; powerMw: number; rule: PulseRuleName | null | undefined }[]): RegimeRow[] {
  return lines.map((l) => ({ laserId, wavelengthNm: l.wavelengthNm, main: l.main, powerMw: l.powerMw, words: pulseRegimeWords(laser, l, l.rule) }));
}
