// Contract revision 2, pulsed lasers: pulseEnergyJ, single pulses without powerMw, peak powers above 1 GW, per-pulse OD and NOHD,
// powerMw consistency, overlap and coverage refusals, the UV default and the standard option. Every table value here is from memory
// of ANSI Z136.1-2014 / IEC 60825-1:2014 (named beside each check); the arithmetic is redone independently in each test.
import { describe, expect, it } from "vitest";
import { benchDocumentSchema, describeIssues } from "@/lib/bench/schema";
import { assessBeam, beamInputSchema } from "@/lib/safety";

/** Power through a centred aperture of radius r (cm) of a Gaussian of 1/e² radius w (cm), ÷ the aperture area: independent form. */
function averagedOver(powerOrEnergy: number, wCm: number, rCm: number): number {
  // Integrate the Gaussian 2P/(πw²)·exp(−2ρ²/w²) over the disc numerically (midpoint rule, 20 000 rings).
  const n = 20_000;
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const ρ = ((i + 0.5) / n) * rCm;
    sum += ((2 * powerOrEnergy) / (Math.PI * wCm * wCm)) * Math.exp((-2 * ρ * ρ) / (wCm * wCm)) * 2 * Math.PI * ρ * (rCm / n);
  }
  return sum / (Math.PI * rCm * rCm);
}

describe("single pulse given by its energy (powerMw omitted)", () => {
  // 532 nm, 1 mJ, 10 ns, 5 mm, 1 mrad. ANSI Z136.1-2014 Table 5a, 400–700 nm, 10⁻¹¹–5×10⁻⁶ s: 2×10⁻⁷ J/cm² (from memory).
  const r = assessBeam({ wavelengthNm: 532, pulseEnergyJ: 1e-3, pulseDurationS: 1e-8, beamDiameterMm: 5, divergenceMrad: 1 });

  it("mpeWPerCm2 is null for a single pulse; pulsedMpe carries the per-pulse MPE and the governing rule", () => {
    expect(r.mpeWPerCm2).toBeNull();
    expect(r.pulsedMpe?.perPulseJPerCm2).toBeCloseTo(2e-7, 15);
    expect(r.pulsedMpe?.governingRule).toBe("single-pulse");
    expect(r.figures.mpe.unit).toBe("J/cm²");
    expect(r.averagePowerMw).toBeNull();
    expect(r.pulseEnergyJ).toBe(1e-3);
  });

  it("OD = log10(H/MPE_H), H the energy per pulse averaged over the 7 mm aperture (numerical integration)", () => {
    const H = averagedOver(1e-3, 0.25, 0.35);
    expect(r.opticalDensityRequired).toBeCloseTo(Math.log10(H / 2e-7), 4);
  });

  it("NOHD = (√(4Q/(π·MPE_H)) − a)/φ with the energy per pulse (ANSI Z136.1-2014 Appendix B, 1/e values)", () => {
    const dCm = Math.sqrt((4 * 1e-3) / (Math.PI * 2e-7));
    const expectedM = (dCm - 0.5 / Math.SQRT2) / (1e-3 / Math.SQRT2) / 100;
    expect(r.nohdM).toBeCloseTo(expectedM, 6);
  });

  it("is Class 3B: above 5 × the Class 1 per-pulse AEL, below the 0.03 J Class 3B per-pulse AEL (IEC 60825-1:2014 Tables 3, 8)", () => {
    // Class 1: 2×10⁻⁷ J/cm² × π(0.35 cm)² = 7.70×10⁻⁸ J (the tabulated 7.7×10⁻⁸ J, from memory)
    expect(r.classification.limits.class1PulseMj).toBeCloseTo(2e-7 * Math.PI * 0.35 ** 2 * 1e3, 12);
    expect(r.classification.limits.class3BPulseMj).toBeCloseTo(30, 10);
    expect(r.hazardClass).toBe("3B");
    expect(assessBeam({ wavelengthNm: 532, pulseEnergyJ: 0.031, pulseDurationS: 1e-8, beamDiameterMm: 5, divergenceMrad: 1 }).hazardClass).toBe("4");
  });

  it("accepts peak powers far above 1 GW: 10 mJ in 100 fs is 10¹¹ W (Class 4 by the sub-ns 3B limit 3×10⁷ C4 W)", () => {
    const fs = assessBeam({ wavelengthNm: 800, pulseEnergyJ: 1e-2, pulseDurationS: 1e-13, beamDiameterMm: 5, divergenceMrad: 1 });
    expect(fs.hazardClass).toBe("4");
    // 3B per pulse below 1 ns: 3×10⁷·C4 W × 10⁻¹³ s, C4 = 10^(0.002·100) = 1.585 → 4.755 µJ (IEC 60825-1:2014 Table 8, from memory)
    expect(fs.classification.limits.class3BPulseMj).toBeCloseTo(3e7 * 10 ** 0.2 * 1e-13 * 1e3, 12);
    expect(fs.figures.peakIrradiance.value).toBeGreaterThan(1e11);
  });
});

describe("a train given by energy + rate or by average power + rate", () => {
  const byEnergy = assessBeam({ wavelengthNm: 1064, pulseEnergyJ: 1e-4, pulseRepetitionRateHz: 1000, pulseDurationS: 1e-8, beamDiameterMm: 2, divergenceMrad: 1 });
  const byPower = assessBeam({ wavelengthNm: 1064, powerMw: 100, pulseRepetitionRateHz: 1000, pulseDurationS: 1e-8, beamDiameterMm: 2, divergenceMrad: 1 });

  it("gives the same answer both ways; mpeWPerCm2 = per-pulse MPE × rate", () => {
    expect(byEnergy.hazardClass).toBe(byPower.hazardClass);
    expect(byEnergy.opticalDensityRequired).toBeCloseTo(byPower.opticalDensityRequired, 12);
    expect(byEnergy.mpeWPerCm2).toBeCloseTo((byEnergy.pulsedMpe?.perPulseJPerCm2 ?? 0) * 1000, 15);
  });

  it("the governing rule at 1 kHz, 10 s, 1064 nm is rule 3 with C_P = N^−0.25 (ANSI Z136.1-2014 §8.2.3)", () => {
    // Rule 1: 2e-6·C_C(=1) = 2e-6 J/cm²; rule 3: 2e-6·(10⁴)^−0.25 = 2e-7; rule 2: 5e-3·10 W... 9e-3·10^0.75/10⁴ = 5.06e-6
    expect(byEnergy.pulsedMpe?.governingRule).toBe("pulse-train");
    expect(byEnergy.pulsedMpe?.perPulseJPerCm2).toBeCloseTo(2e-6 * 1e4 ** -0.25, 15);
  });

  it("says where the 2014 editions relax rule 3 (a note, never silent)", () => {
    expect(byEnergy.notes.join(" ")).toMatch(/relax/);
    expect(byEnergy.notes.join(" ")).toMatch(/C5 = 1/);
  });

  it("refuses powerMw, pulseEnergyJ and rate that disagree by more than 1 %, naming powerMw", () => {
    const bad = beamInputSchema.safeParse({ wavelengthNm: 1064, powerMw: 102, pulseEnergyJ: 1e-4, pulseRepetitionRateHz: 1000, pulseDurationS: 1e-8, beamDiameterMm: 2, divergenceMrad: 1 });
    expect(bad.success).toBe(false);
    const issue = bad.error?.issues.find((i) => i.path.join(".") === "powerMw");
    expect(issue?.message).toMatch(/powerMw/);
    // 0.5 % apart is accepted
    expect(beamInputSchema.safeParse({ wavelengthNm: 1064, powerMw: 100.5, pulseEnergyJ: 1e-4, pulseRepetitionRateHz: 1000, pulseDurationS: 1e-8, beamDiameterMm: 2, divergenceMrad: 1 }).success).toBe(true);
    expect(() => assessBeam({ wavelengthNm: 1064, powerMw: 200, pulseEnergyJ: 1e-4, pulseRepetitionRateHz: 1000, pulseDurationS: 1e-8, beamDiameterMm: 2, divergenceMrad: 1 })).toThrow(/powerMw/);
  });

  it("the laser element takes pulseEnergyJ, omits powerMw for a single pulse and refuses a disagreement at elements.i.powerMw", () => {
    const ok = benchDocumentSchema.safeParse({ version: 1, elements: [{ id: "L", kind: "laser", positionMm: 0, wavelengthNm: 532, pulseEnergyJ: 0.2, pulseDurationS: 5e-9, beamDiameterMm: 6 }] });
    expect(ok.success).toBe(true);
    const bad = benchDocumentSchema.safeParse({ version: 1, elements: [{ id: "L", kind: "laser", positionMm: 0, wavelengthNm: 532, powerMw: 3000, pulseEnergyJ: 0.2, pulseRepetitionRateHz: 10, pulseDurationS: 5e-9, beamDiameterMm: 6 }] });
    expect(bad.success).toBe(false);
    const problems = describeIssues(bad.error as never);
    expect(problems.find((p) => p.path === "elements.0.powerMw")?.message).toMatch(/powerMw/);
    const none = benchDocumentSchema.safeParse({ version: 1, elements: [{ id: "L", kind: "laser", positionMm: 0, wavelengthNm: 532, beamDiameterMm: 6 }] });
    expect(none.success).toBe(false);
  });
});

describe("refusals with a sentence", () => {
  it("overlapping pulses (duration × rate ≥ 1)", () => {
    const r = beamInputSchema.safeParse({ wavelengthNm: 532, powerMw: 10, pulseDurationS: 1e-3, pulseRepetitionRateHz: 1000, beamDiameterMm: 1, divergenceMrad: 1 });
    expect(r.success).toBe(false);
    expect(r.error?.issues.find((i) => i.path[0] === "pulseRepetitionRateHz")?.message).toMatch(/overlap/);
  });

  it("a pulse shorter than the standard's table covers in its band: ANSI below 1 ns outside 400–1400 nm; IEC covers it", () => {
    // ANSI Z136.1-2014 Table 5a starts at 10⁻⁹ s in the UV and beyond 1400 nm; IEC 60825-1:2014 Table A.1 at 10⁻¹³ s (from memory)
    const input = { wavelengthNm: 355, pulseEnergyJ: 1e-6, pulseDurationS: 1e-13, beamDiameterMm: 1, divergenceMrad: 1 };
    const r = beamInputSchema.safeParse(input);
    expect(r.success).toBe(false);
    expect(r.error?.issues.find((i) => i.path[0] === "pulseDurationS")?.message).toMatch(/shorter than 1 ns/);
    expect(beamInputSchema.safeParse({ ...input, standard: "IEC 60825-1:2014" }).success).toBe(true);
    expect(assessBeam(input, { standard: "IEC 60825-1:2014" }).standard).toBe("IEC 60825-1:2014");
    // below 10⁻¹³ s no standard applies
    expect(beamInputSchema.safeParse({ ...input, pulseDurationS: 1e-14, standard: "IEC 60825-1:2014" }).success).toBe(false);
  });

  it("a pulse energy must be > 0", () => {
    const r = beamInputSchema.safeParse({ wavelengthNm: 532, pulseEnergyJ: 0, pulseDurationS: 1e-8, beamDiameterMm: 1, divergenceMrad: 1 });
    expect(r.error?.issues.find((i) => i.path[0] === "pulseEnergyJ")?.message).toMatch(/greater than 0/);
  });
});

describe("ultraviolet default exposure and the two standards", () => {
  // 355 nm CW 1 mW, 1 mm beam. Default 30 000 s (contract revision 2). ANSI Z136.1-2014 Table 5a 315–400 nm, 10–3×10⁴ s:
  // 1.0 J/cm² → 3.333×10⁻⁵ W/cm². Aperture: ANSI Table 8 3.5 mm beyond 10 s; IEC Table A.4 1 mm (both from memory).
  const ansi = assessBeam({ wavelengthNm: 355, powerMw: 1, beamDiameterMm: 1, divergenceMrad: 1 });
  const iec = assessBeam({ wavelengthNm: 355, powerMw: 1, beamDiameterMm: 1, divergenceMrad: 1 }, { standard: "IEC 60825-1:2014" });

  it("defaults to 30 000 s and ANSI's 3.5 mm aperture; IEC's 1 mm gives a higher OD", () => {
    expect(ansi.exposureS).toBe(30_000);
    expect(ansi.standard).toBe("ANSI Z136.1-2014");
    expect(ansi.mpeWPerCm2).toBeCloseTo(1 / 30_000, 12);
    expect(ansi.limitingApertureMm).toBe(3.5);
    expect(iec.limitingApertureMm).toBe(1);
    expect(ansi.opticalDensityRequired).toBeCloseTo(Math.log10(averagedOver(1e-3, 0.05, 0.175) / (1 / 30_000)), 4);
    expect(iec.opticalDensityRequired).toBeCloseTo(Math.log10(averagedOver(1e-3, 0.05, 0.05) / (1 / 30_000)), 4);
    expect(iec.opticalDensityRequired).toBeGreaterThan(ansi.opticalDensityRequired);
  });

  it("says where the other standard differs, and the class is IEC's either way", () => {
    expect(ansi.notes.some((n) => n.startsWith("Where the other standard differs") && n.includes("IEC 60825-1:2014"))).toBe(true);
    expect(iec.notes.some((n) => n.startsWith("Where the other standard differs") && n.includes("ANSI Z136.1-2014"))).toBe(true);
    expect(ansi.otherStandard.differs).toBe(true);
    expect(ansi.hazardClass).toBe(iec.hazardClass);
  });

  it("no note when both standards agree (632.8 nm, 0.25 s)", () => {
    const heNe = assessBeam({ wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 0.8, divergenceMrad: 1.2 });
    expect(heNe.otherStandard.differs).toBe(false);
    expect(heNe.notes.some((n) => n.startsWith("Where the other standard differs"))).toBe(false);
  });

  it("user-visible text never says 'from memory' or names a file, and marks unchecked values", () => {
    const text = JSON.stringify({ f: ansi.figures, n: ansi.notes, c: ansi.classification.reasons, k: ansi.classification.conditions, l: ansi.limitations });
    expect(text).not.toMatch(/from memory|\.tsx?\b|\.md\b|lib\//);
    expect(ansi.figures.mpe.source).toMatch(/not yet checked against the standard's text — confirm with your laser safety officer/);
    expect(ansi.figures.hazardClass.source).toMatch(/not yet checked/);
  });
});
