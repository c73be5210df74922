// Trains in bursts (pulsesPerBurst pulses at burstPulseRateHz inside each burst; pulseRepetitionRateHz the average pulse
// rate). Rules: ANSI Z136.1-2014 §8.2.3 and IEC 60825-1:2014 §4.3 f) / A.3 — rule 1 (any single pulse), rule 2 (the
// average), rule 3 (C_P = N^−0.25 with pulses within t_min grouped), and "any group of pulses ≤ the MPE for the group's
// duration" (from memory, not checked against the standards' text). Single-pulse values: ANSI Z136.1-2014 Table 5a
// (from memory): 1050–1400 nm, 10⁻¹¹–1.3×10⁻⁵ s: 2.0×10⁻⁶·C_C J/cm²; 1.3×10⁻⁵–10 s: 9.0×10⁻³·C_C·t^0.75 J/cm² (C_C = 1 at
// 1064 nm); t_min 13 µs (Table 6).
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { benchDocumentSchema, type BenchDocument } from "@/lib/bench/schema";
import { assessBench, classifyBeam } from "@/lib/safety";
import { pulsedEyeMpe } from "@/lib/safety/pulsed";
import { classRank } from "@/lib/safety/types";

const seed = process.env.FC_SEED === "random" ? undefined : 20261202;

describe("pulsed MPE of bursts", () => {
  it("1064 nm, 10 ns pulses, bursts of 10 at 1 MHz, 1000 bursts/s, 10 s: the pulses inside a burst are grouped", () => {
    // Worked by hand: N = 10 000 Hz · 10 s = 10⁵ pulses.
    // Rule 1: 2×10⁻⁶. Rule 2: 9.0×10⁻³·10^0.75 = 5.0611×10⁻² J/cm² over 10⁵ pulses = 5.0611×10⁻⁷.
    // Rule 3, every pulse: C_P = (10⁵)^−0.25 = 0.056234 → 1.1247×10⁻⁷.
    // Rule 3, grouped: 1 MHz × 13 µs = 13 > 10, so the 10 pulses of a burst are one group; 10⁴ groups → C_P = 0.1;
    //   the MPE for 13 µs is 9.0×10⁻³·(1.3×10⁻⁵)^0.75 = 1.94850×10⁻⁶, so 0.1 × 1.94850×10⁻⁶ ÷ 10 = 1.94850×10⁻⁸ per pulse ← lowest.
    // Whole burst: 9.01 µs long, MPE 2×10⁻⁶ ÷ 10 = 2×10⁻⁷; as a train of 10⁴ bursts: 0.1 × 2×10⁻⁶ ÷ 10 = 2×10⁻⁸.
    const m = pulsedEyeMpe({ wavelengthNm: 1064, pulseDurationS: 1e-8, pulseRepetitionRateHz: 1e4, burst: { pulsesPerBurst: 10, pulseRateHz: 1e6 }, exposureS: 10 });
    const grouped = (0.1 * 9.0e-3 * 1.3e-5 ** 0.75) / 10;
    expect(grouped).toBeCloseTo(1.9485e-8, 12);
    expect(m.perPulseJPerCm2).toBeCloseTo(grouped, 20);
    expect(m.rules.find((r) => r.rule === "burst")!.perPulseJPerCm2).toBeCloseTo(2e-8, 20);
    expect(m.effectiveIrradianceWPerCm2).toBeCloseTo(grouped * 1e4, 14);
    expect(m.rules.some((r) => r.rule === "burst")).toBe(true);
    expect(m.notes.join(" ")).toMatch(/Pulses in bursts/);
    // The same pulses spread evenly at 10 kHz are not grouped (10 kHz × 13 µs < 1): rule 3 with every pulse counted.
    const even = pulsedEyeMpe({ wavelengthNm: 1064, pulseDurationS: 1e-8, pulseRepetitionRateHz: 1e4, exposureS: 10 });
    expect(even.perPulseJPerCm2).toBeCloseTo(2e-6 * 1e5 ** -0.25, 18);
    expect(m.perPulseJPerCm2).toBeLessThan(even.perPulseJPerCm2 / 5);
  });

  it("property: bursts are never more lenient than the same pulses spread evenly at the average rate", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 400, max: 1400, noNaN: true }),
        fc.integer({ min: -11, max: -5 }),
        fc.integer({ min: 2, max: 1000 }),
        fc.double({ min: 1, max: 1e4, noNaN: true }),
        fc.integer({ min: 10, max: 1e5 }),
        (λ, logτ, n, burstsPerSecond, factor) => {
          const τ = 10 ** logτ;
          const prf = n * burstsPerSecond;
          const inside = prf * factor; // the rate inside a burst, above the average
          if (τ * inside >= 1 || (n - 1) / inside + τ >= 1 / burstsPerSecond) return;
          const exposureS = 10;
          const burst = pulsedEyeMpe({ wavelengthNm: λ, pulseDurationS: τ, pulseRepetitionRateHz: prf, burst: { pulsesPerBurst: n, pulseRateHz: inside }, exposureS });
          const even = pulsedEyeMpe({ wavelengthNm: λ, pulseDurationS: τ, pulseRepetitionRateHz: prf, exposureS });
          expect(burst.perPulseJPerCm2).toBeLessThanOrEqual(even.perPulseJPerCm2 * (1 + 1e-12));
        },
      ),
      { seed, numRuns: 300 },
    );
  });
});

describe("class and bench figures of bursts", () => {
  const laser = { wavelengthNm: 1064, beamDiameterMm: 2, divergenceMrad: 1, pulseDurationS: 1e-8, pulseEnergyJ: 1e-6 };

  it("property: the class of a burst laser is never below the class of the same pulses spread evenly", () => {
    fc.assert(
      fc.property(fc.integer({ min: -9, max: -2 }), fc.integer({ min: 2, max: 200 }), fc.double({ min: 1, max: 1000, noNaN: true }), (logE, n, burstsPerSecond) => {
        const prf = n * burstsPerSecond;
        const input = { ...laser, pulseEnergyJ: 10 ** logE, pulseRepetitionRateHz: prf };
        const burst = classifyBeam({ ...input, pulsesPerBurst: n, burstPulseRateHz: 1e7 });
        expect(classRank(burst.hazardClass)).toBeGreaterThanOrEqual(classRank(classifyBeam(input).hazardClass));
      }),
      { seed, numRuns: 100 },
    );
    const c = classifyBeam({ ...laser, pulseRepetitionRateHz: 1e4, pulsesPerBurst: 10, burstPulseRateHz: 1e6 });
    expect(c.reasons.join(" ")).toMatch(/Pulses in bursts \(10 at 1000000 Hz inside a burst, 1000 bursts per second\)/);
  });

  it("a bench with a burst laser needs at least the OD of the even train, and says how bursts were read", () => {
    const doc = (burst: boolean): BenchDocument => ({
      version: 1,
      elements: [
        { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: 1064, pulseEnergyJ: 1e-4, pulseDurationS: 1e-8, pulseRepetitionRateHz: 1e4, beamDiameterMm: 2, ...(burst ? { pulsesPerBurst: 10, burstPulseRateHz: 1e6 } : {}) },
        { id: "block", kind: "beam-block", positionMm: 500 },
      ],
    });
    const beam = (d: BenchDocument) => ({ elements: d.elements.map((e) => ({ id: e.id, kind: e.kind, positionMm: e.positionMm, incident: { radiusMm: 1, wavefrontRadiusMm: null, powerMw: 1000 } })) });
    const withBursts = assessBench(doc(true), beam(doc(true)));
    const even = assessBench(doc(false), beam(doc(false)));
    // 5.6× stricter per pulse (see above) → about log10(5.6) = 0.75 more OD
    expect(withBursts.governing!.opticalDensityRequired).toBeGreaterThan(even.governing!.opticalDensityRequired + 0.7);
    expect(withBursts.laser.notes.join(" ")).toMatch(/Pulses in bursts/);
  });

  it("the document refuses burst figures that cannot be, naming the field", () => {
    const base = { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: 1064, pulseEnergyJ: 1e-4, pulseDurationS: 1e-8, pulseRepetitionRateHz: 1e4, beamDiameterMm: 2 };
    const problems = (extra: Record<string, unknown>) => {
      const r = benchDocumentSchema.safeParse({ version: 1, elements: [{ ...base, ...extra }] });
      return r.success ? [] : r.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
    };
    expect(problems({ pulsesPerBurst: 10, burstPulseRateHz: 1e6 })).toEqual([]);
    expect(problems({ pulsesPerBurst: 10 }).join()).toMatch(/elements\.0\.burstPulseRateHz: Bursts need both/);
    expect(problems({ pulsesPerBurst: 2.5, burstPulseRateHz: 1e6 }).join()).toMatch(/pulsesPerBurst: Pulses per burst \(pulsesPerBurst\) must be a whole number/);
    expect(problems({ pulsesPerBurst: 10, burstPulseRateHz: 1e8 }).join()).toMatch(/burstPulseRateHz: Pulse duration × the rate inside a burst must be below 1/);
    expect(problems({ pulsesPerBurst: 10, burstPulseRateHz: 5e3 }).join()).toMatch(/burstPulseRateHz: The pulse rate inside a burst .* must be above the average/);
    const noTrain = benchDocumentSchema.safeParse({ version: 1, elements: [{ ...base, pulseRepetitionRateHz: undefined, pulsesPerBurst: 10, burstPulseRateHz: 1e6 }] });
    expect(noTrain.success).toBe(false);
  });
});
