// The assessBeam contract of the bench document contract: plain numbers, each figure with its source, 1/e conversions stated, cautions deferring to the LSO.
// Sources per check below; the input schema follows lib/bench/schema.ts (field paths, plain messages).
import { describe, expect, it } from "vitest";
import { describeIssues } from "@/lib/bench/schema";
import { CAUTION_FOOTER, LIMITATIONS, assessBeam, beamInputSchema } from "@/lib/safety";

describe("assessBeam: the bench document contract", () => {
  const heNe = assessBeam({ wavelengthNm: 633, powerMw: 1, beamDiameterMm: 0.8, divergenceMrad: 1.2 });

  it("returns the contract's plain numbers and class", () => {
    expect(heNe.hazardClass).toBe("2");
    expect(typeof heNe.mpeWPerCm2).toBe("number");
    expect(typeof heNe.nohdM).toBe("number");
    expect(typeof heNe.opticalDensityRequired).toBe("number");
    expect(Array.isArray(heNe.cautions)).toBe(true);
    // 633 nm, default 0.25 s: 1.8e-3 · 0.25^0.75 / 0.25 = 2.5456e-3 W/cm² (ANSI Z136.1-2014 Table 5a)
    expect(heNe.mpeWPerCm2).toBeCloseTo(2.5456e-3, 7);
    // Worked in hazard-distance.test.ts: 7.668 m, OD 0.0089
    expect(heNe.nohdM).toBeCloseTo(7.668, 2);
    expect(heNe.opticalDensityRequired).toBeCloseTo(0.008927, 5);
  });

  it("gives every figure a unit and a source naming the standard and table or equation", () => {
    expect(heNe.figures.mpe).toMatchObject({ unit: "W/cm²" });
    expect(heNe.figures.mpe.source).toMatch(/ANSI Z136\.1-2014 Table 5a/);
    expect(heNe.figures.nohd.source).toMatch(/Appendix B/);
    expect(heNe.figures.opticalDensity.source).toMatch(/log10\(E\/MPE\)/);
    expect(heNe.figures.hazardClass.source).toMatch(/IEC 60825-1:2014/);
    expect(heNe.figures.limitingAperture).toMatchObject({ value: 7, unit: "mm" });
    expect(heNe.figures.skinMpe.source).toMatch(/Table 7/);
    for (const f of Object.values(heNe.figures)) expect(f.source.length).toBeGreaterThan(10);
  });

  it("says that it converted 1/e² to 1/e by √2", () => {
    expect(heNe.conversions.join("\n")).toMatch(/1\/e² 0\.8 mm → 1\/e 0\.5657 mm \(÷ √2\)/);
    expect(heNe.conversions.join("\n")).toMatch(/1\/e² 1\.2 mrad → 1\/e 0\.8485 mrad/);
  });

  it("defaults the exposure to 0.25 s in the visible and 10 s outside (the bench document contract)", () => {
    expect(heNe.exposureS).toBe(0.25);
    expect(assessBeam({ wavelengthNm: 1064, powerMw: 1, beamDiameterMm: 1, divergenceMrad: 1 }).exposureS).toBe(10);
    expect(assessBeam({ wavelengthNm: 1064, powerMw: 1, beamDiameterMm: 1, divergenceMrad: 1, exposureS: 30_000 }).exposureS).toBe(30_000);
  });

  it("every caution defers to the LSO and local regulations", () => {
    expect(heNe.cautions.length).toBeGreaterThan(0);
    for (const c of heNe.cautions) expect(c.finalSay).toBe(CAUTION_FOOTER);
    expect(CAUTION_FOOTER).toMatch(/laser safety officer and local regulations have the final word/);
    expect(heNe.finalSay).toMatch(/laser safety officer/);
  });

  it("common practice: beams below eye level and alignment at the lowest power are among the cautions", () => {
    const ids = heNe.cautions.map((c) => c.id);
    expect(ids).toContain("beam-height"); // common practice
    expect(ids).toContain("alignment-low-power"); // common practice
    expect(heNe.cautions.find((c) => c.id === "beam-height")?.basis).toBe("common practice");
  });

  it("states the required OD in the eyewear caution, rounded up", () => {
    const yag = assessBeam({ wavelengthNm: 1064, powerMw: 2000, beamDiameterMm: 3, divergenceMrad: 1 });
    // OD 3.0115 (hazard-distance.test.ts) → stated as 3.1, never below the need
    expect(yag.hazardClass).toBe("4");
    const eyewear = yag.cautions.find((c) => c.id === "eyewear-od");
    expect(eyewear?.text).toMatch(/optical density of at least 3\.1 at 1064 nm/);
    expect(yag.cautions.map((c) => c.id)).toEqual(
      expect.arrayContaining(["engineering-controls", "sop-and-approval", "class4-skin-fire", "invisible-beam", "sign-warning"]),
    );
  });

  it("warns when the label class differs and keeps the computed class", () => {
    const r = assessBeam({ wavelengthNm: 532, powerMw: 4.5, beamDiameterMm: 1, divergenceMrad: 1, labelClass: "2" });
    expect(r.hazardClass).toBe("3R");
    expect(r.labelCheck?.labelClass).toBe("2");
    expect(r.warnings.join(" ")).toMatch(/label says Class 2.*estimates Class 3R/);
  });

  it("reports a negative raw OD but requires 0, and a zero NOHD, for a weak beam", () => {
    const r = assessBeam({ wavelengthNm: 633, powerMw: 0.05, beamDiameterMm: 0.8, divergenceMrad: 1.2 });
    expect(r.opticalDensityRequired).toBe(0);
    expect(r.opticalDensityRaw).toBeCloseTo(-1.2921, 4);
    expect(r.nohdM).toBe(0);
    expect(r.hazardClass).toBe("1");
  });

  it("pulsed lasers name the governing rule", () => {
    const r = assessBeam({ wavelengthNm: 1064, powerMw: 100, beamDiameterMm: 2, divergenceMrad: 1, pulseDurationS: 1e-8, pulseRepetitionRateHz: 1000 });
    expect(r.pulsedMpe?.governingRule).toBe("pulse-train");
    // 2e-7 J/cm² × 1000 Hz = 2e-4 W/cm² (pulsed.test.ts)
    expect(r.mpeWPerCm2).toBeCloseTo(2e-4, 12);
    expect(r.figures.mpe.source).toMatch(/governed by rule 3, each pulse of the train/);
    expect(r.cautions.map((c) => c.id)).toContain("pulsed");
  });

  it("carries the limitations list as data", () => {
    expect(heNe.limitations).toBe(LIMITATIONS);
    const ids = LIMITATIONS.map((l) => l.id);
    expect(ids).toEqual(expect.arrayContaining(["point-source", "lines", "scanning", "unchecked-values"]));
    // Never "from memory" or a file name in what a user reads
    for (const l of LIMITATIONS) {
      expect(l.text).not.toMatch(/from memory|\.tsx?\b|\.md\b/);
    }
  });
});

describe("beamInputSchema (same style as lib/bench/schema.ts)", () => {
  const problems = (input: unknown) => {
    const r = beamInputSchema.safeParse(input);
    return r.success ? [] : describeIssues(r.error);
  };

  it("accepts a datasheet beam", () => {
    expect(problems({ wavelengthNm: 532, powerMw: 5, beamDiameterMm: 1, divergenceMrad: 1 })).toEqual([]);
  });

  it("names the field and says what is wrong in plain words", () => {
    expect(problems({ wavelengthNm: 100, powerMw: 5, beamDiameterMm: 1, divergenceMrad: 1 })).toEqual([
      { path: "wavelengthNm", message: "Wavelength must be between 180 nm and 1 mm (1000000 nm)" },
    ]);
    expect(problems({ wavelengthNm: 532, powerMw: -1, beamDiameterMm: 1, divergenceMrad: 1 })).toEqual([
      { path: "powerMw", message: "Power must be greater than 0 mW" },
    ]);
    expect(problems({ wavelengthNm: 532, powerMw: 5, beamDiameterMm: "1", divergenceMrad: 1 })[0]).toEqual({
      path: "beamDiameterMm",
      message: "Beam diameter must be a number",
    });
    expect(problems({ wavelengthNm: 532, powerMw: 5, beamDiameterMm: 1, divergenceMrad: 0 })[0].path).toBe("divergenceMrad");
    expect(problems({ wavelengthNm: 532, powerMw: 5, beamDiameterMm: 1, divergenceMrad: 1, labelClass: "3a" })[0]).toEqual({
      path: "labelClass",
      message: "Label class must be one of: 1, 1M, 2, 2M, 3R, 3B, 4",
    });
  });

  it("checks the pulse fields against each other", () => {
    expect(problems({ wavelengthNm: 532, powerMw: 5, beamDiameterMm: 1, divergenceMrad: 1, pulseRepetitionRateHz: 10 })[0].path).toBe("pulseDurationS");
    expect(
      problems({ wavelengthNm: 532, powerMw: 5, beamDiameterMm: 1, divergenceMrad: 1, pulseDurationS: 0.2, pulseRepetitionRateHz: 10 })[0].path,
    ).toBe("pulseRepetitionRateHz");
    expect(
      problems({ wavelengthNm: 532, powerMw: 5, beamDiameterMm: 1, divergenceMrad: 1, pulseDurationS: 1, exposureS: 0.25 })[0].path,
    ).toBe("exposureS");
    expect(problems({ wavelengthNm: 1550, powerMw: 5, beamDiameterMm: 1, divergenceMrad: 1, pulseDurationS: 1e-12 })[0].message).toMatch(
      /shorter than 1 ns/,
    );
  });
});
