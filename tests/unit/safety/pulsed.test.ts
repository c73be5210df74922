// Repetitive-pulse MPE: the three rules and the governing rule, with worked numbers.
// Rules and C_P = N^−0.25: Directive 2006/25/EC Annex II Table 2.6 (verified); single-pulse values ANSI Z136.1-2014 Table 5a (from memory).
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { minimumPulseGroupS, pulsedEyeMpe } from "@/lib/safety/pulsed";

describe("pulsed eye MPE", () => {
  it("Q-switched 532 nm, 10 ns at 10 Hz for 0.25 s: rule 3 governs", () => {
    // Rule 1: 2.0e-7 J/cm² (10 ps – 5 µs, ANSI 2014, from memory)
    // Rule 2: 1.8e-3·0.25^0.75 = 6.364e-4 J/cm² over N = 2.5 pulses → 2.546e-4 J/cm² per pulse
    // Rule 3: C_P = 2.5^−0.25 = 0.795271 → 1.590541e-7 J/cm²  ← lowest
    const m = pulsedEyeMpe({ wavelengthNm: 532, pulseDurationS: 1e-8, pulseRepetitionRateHz: 10, exposureS: 0.25 });
    expect(m.pulseCount).toBeCloseTo(2.5, 12);
    expect(m.rules.find((r) => r.rule === "single-pulse")?.perPulseJPerCm2).toBeCloseTo(2e-7, 15);
    expect(m.rules.find((r) => r.rule === "average-power")?.perPulseJPerCm2).toBeCloseTo(2.5456e-4, 8);
    expect(m.governingRule).toBe("pulse-train");
    expect(m.perPulseJPerCm2).toBeCloseTo(2e-7 * 2.5 ** -0.25, 15);
    // As an average irradiance: 1.590541e-7 J/cm² × 10 Hz = 1.590541e-6 W/cm²
    expect(m.effectiveIrradianceWPerCm2).toBeCloseTo(1.590541e-6, 11);
  });

  it("1064 nm, 10 ns at 1 kHz for 10 s: rule 3 governs with C_P = 0.1", () => {
    // N = 1000 · 10 = 10 000 → C_P = 10000^−0.25 = 0.1; 2e-6 J/cm² · 0.1 = 2e-7 J/cm²
    // Rule 2: 5.061e-2 J/cm² / 10 000 = 5.061e-6 J/cm²; rule 1: 2e-6 J/cm²
    const m = pulsedEyeMpe({ wavelengthNm: 1064, pulseDurationS: 1e-8, pulseRepetitionRateHz: 1000, exposureS: 10 });
    expect(m.governingRule).toBe("pulse-train");
    expect(m.perPulseJPerCm2).toBeCloseTo(2e-7, 15);
    expect(m.effectiveIrradianceWPerCm2).toBeCloseTo(2e-4, 12);
  });

  it("blue pulse trains: rule 2 carries the photochemical limit; rule 3 can still be lower", () => {
    // 445 nm, 1 µs at 1 kHz, 1000 s: rule 2 = C_B·1e-4·1000 J/cm² / 1e6 pulses = 1e-7 J/cm²
    // rule 3 = 2e-7 · (1e6)^−0.25 = 2e-7 · 0.03162 = 6.32e-9 J/cm² → rule 3 still lower here
    const long = pulsedEyeMpe({ wavelengthNm: 445, pulseDurationS: 1e-6, pulseRepetitionRateHz: 1000, exposureS: 1000 });
    expect(long.rules.find((r) => r.rule === "average-power")?.perPulseJPerCm2).toBeCloseTo(1e-7, 14);
    // A 0.1 s pulse at 1 Hz for 1000 s: rule 3 = 1.8e-3·0.1^0.75·1000^−0.25 = 1.8e-3·0.17783·0.17783 = 5.69e-5 J/cm²,
    // rule 2 = 0.1 J/cm² / 1000 = 1e-4 J/cm² → rule 3; at 30 000 s rule 2 = 3 J/cm²/30 000 = 1e-4 vs rule 3 = 2.43e-5.
    const slow = pulsedEyeMpe({ wavelengthNm: 445, pulseDurationS: 0.1, pulseRepetitionRateHz: 1, exposureS: 1000 });
    expect(slow.governingRule).toBe("pulse-train");
    expect(slow.perPulseJPerCm2).toBeCloseTo(1.8e-3 * 0.1 ** 0.75 * 1000 ** -0.25, 10);
  });

  it("high repetition rates: pulses inside t_min count as one (ANSI Z136.1-2014, t_min = 5 µs from memory)", () => {
    // 80 MHz, 100 fs, 800 nm, 0.25 s: 400 pulses per 5 µs; groups N = 0.25/5e-6 = 50 000 → C_P = 50000^−0.25 = 0.06687
    // group MPE = 1.8e-3·C_A·(5e-6)^0.75 with C_A = 10^0.2 = 1.5849: 1.8e-3·1.5849·1.0574e-4 = 3.0166e-7 J/cm²
    // per pulse = 0.06687 · 3.0166e-7 / 400 = 5.043e-11 J/cm²
    const m = pulsedEyeMpe({ wavelengthNm: 800, pulseDurationS: 1e-13, pulseRepetitionRateHz: 8e7, exposureS: 0.25 });
    const rule3 = m.rules.find((r) => r.rule === "pulse-train");
    expect(rule3?.perPulseJPerCm2).toBeCloseTo(5.043e-11, 13);
    expect(m.notes.join(" ")).toMatch(/grouped/);
    expect(minimumPulseGroupS(800)).toBe(5e-6);
    expect(minimumPulseGroupS(1064)).toBe(1.3e-5);
  });

  it("a single pulse: rule 1 only, and the effective irradiance is the per-pulse MPE over the pulse duration", () => {
    const m = pulsedEyeMpe({ wavelengthNm: 694, pulseDurationS: 1e-3, exposureS: 1e-3 });
    // 1.8e-3 · (1e-3)^0.75 = 1.8e-3 · 5.6234e-3 = 1.01222e-5 J/cm²; ÷ 1e-3 s = 1.01222e-2 W/cm²
    expect(m.rules).toHaveLength(1);
    expect(m.governingRule).toBe("single-pulse");
    expect(m.perPulseJPerCm2).toBeCloseTo(1.01222e-5, 9);
    expect(m.effectiveIrradianceWPerCm2).toBeCloseTo(1.01222e-2, 6);
  });

  it("UV below 315 nm: rule 3 is not used (photochemical limits)", () => {
    const m = pulsedEyeMpe({ wavelengthNm: 266, pulseDurationS: 1e-8, pulseRepetitionRateHz: 10, exposureS: 10 });
    expect(m.rules.map((r) => r.rule)).toEqual(["single-pulse", "average-power"]);
    // rule 2: 3e-3 J/cm² / 100 pulses = 3e-5 J/cm²
    expect(m.perPulseJPerCm2).toBeCloseTo(3e-5, 12);
    expect(m.governingRule).toBe("average-power");
  });

  it("property: the governing per-pulse limit never exceeds the single-pulse limit", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 400, max: 1400, noNaN: true }),
        fc.double({ min: -12, max: -2, noNaN: true }),
        fc.double({ min: 0, max: 6, noNaN: true }),
        (λ, logTau, logPrf) => {
          const τ = 10 ** logTau;
          const prf = Math.min(10 ** logPrf, 0.5 / τ);
          const m = pulsedEyeMpe({ wavelengthNm: λ, pulseDurationS: τ, pulseRepetitionRateHz: prf, exposureS: 10 });
          const single = m.rules[0].perPulseJPerCm2;
          return m.perPulseJPerCm2 <= single && m.perPulseJPerCm2 > 0;
        },
      ),
      { numRuns: 1000 },
    );
  });
});
