// Hazard class check against IEC 60825-1:2014 accessible emission limits, boundary tests just under/over each limit.
// Class 2 = 1 mW and Class 3R = 5 mW for visible CW: IEC 60825-1:2014 (from memory; the same figures appear in the
// abstract "The risk of retinal injury from Class 2 and visible Class 3R lasers", found via the search tool). Other AELs from memory.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { class1AelMw, classLimits, classifyBeam, compareLabel } from "@/lib/safety/classify";
import { HAZARD_CLASSES, classRank } from "@/lib/safety/types";

// A small, well-collimated beam: all its power passes both the 7 mm and the 50 mm measurement apertures.
const narrow = (wavelengthNm: number, powerMw: number) =>
  classifyBeam({ wavelengthNm, powerMw, beamDiameterMm: 1, divergenceMrad: 0.5 });

describe("visible CW, 532 nm", () => {
  it("Class 1 up to 0.39 mW (3.9×10⁻⁴ W, thermal governs above 500 nm)", () => {
    // IEC 60825-1:2014 Table 3, t ≥ T2: 3.9×10⁻⁴ C4 C7 W (from memory); photochemical 3.9×10⁻⁵·C3 W with
    // C3 = 10^(0.02·82) = 43.65 → 1.70 mW, larger, so 0.39 mW governs
    expect(class1AelMw(532)).toBeCloseTo(0.39, 10);
    expect(narrow(532, 0.389).hazardClass).toBe("1");
    expect(narrow(532, 0.391).hazardClass).toBe("2");
  });
  it("Class 2 up to 1 mW", () => {
    // IEC 60825-1:2014 Table 5: C6 × 10⁻³ W for t ≥ 0.25 s
    expect(narrow(532, 0.999).hazardClass).toBe("2");
    expect(narrow(532, 1.001).hazardClass).toBe("3R");
  });
  it("Class 3R up to 5 mW (5 × Class 2)", () => {
    expect(narrow(532, 4.999).hazardClass).toBe("3R");
    expect(narrow(532, 5.001).hazardClass).toBe("3B");
  });
  it("Class 3B up to 0.5 W", () => {
    // IEC 60825-1:2014 Table 8, 315 nm – 1 mm, t ≥ 0.25 s: 0.5 W (from memory)
    expect(narrow(532, 499.9).hazardClass).toBe("3B");
    expect(narrow(532, 500.1).hazardClass).toBe("4");
  });
});

describe("blue CW: the photochemical Class 1 limit", () => {
  it("405 nm: Class 1 up to 39 µW (3.9×10⁻⁵ C3 W, C3 = 1), then Class 2", () => {
    // IEC 60825-1:2014 Table 3 (from memory)
    expect(class1AelMw(405)).toBeCloseTo(0.039, 10);
    expect(narrow(405, 0.0389).hazardClass).toBe("1");
    expect(narrow(405, 0.0391).hazardClass).toBe("2");
  });
});

describe("near-IR CW", () => {
  it("808 nm: Class 1 to 0.3900·C_A = 0.6413 mW; 3R to 5× = 3.207 mW", () => {
    // 3.9e-4 W · 10^0.216 = 3.9e-4 · 1.64437 = 6.4130e-4 W (IEC Table 3 from memory, C4 = C_A verified)
    expect(class1AelMw(808)).toBeCloseTo(0.6413, 4);
    expect(narrow(808, 0.64).hazardClass).toBe("1");
    expect(narrow(808, 0.65).hazardClass).toBe("3R");
    expect(narrow(808, 3.2).hazardClass).toBe("3R");
    expect(narrow(808, 3.21).hazardClass).toBe("3B");
  });
  it("980 nm: Class 1 to 1.416 mW", () => {
    // 3.9e-4 · 10^0.56 = 3.9e-4 · 3.63078 = 1.41600e-3 W
    expect(class1AelMw(980)).toBeCloseTo(1.416, 3);
  });
  it("1064 nm: Class 1 to 1.95 mW (C4 = 5), 3R to 9.75 mW, 3B to 500 mW", () => {
    // 3.9e-4 · 5 = 1.95e-3 W (from memory)
    expect(class1AelMw(1064)).toBeCloseTo(1.95, 10);
    expect(narrow(1064, 1.94).hazardClass).toBe("1");
    expect(narrow(1064, 1.96).hazardClass).toBe("3R");
    expect(narrow(1064, 9.74).hazardClass).toBe("3R");
    expect(narrow(1064, 9.76).hazardClass).toBe("3B");
    expect(narrow(1064, 501).hazardClass).toBe("4");
  });
  it("no Class 2 outside 400–700 nm", () => {
    expect(classLimits(850).class2Mw).toBeNull();
    expect(narrow(850, 1).hazardClass).toBe("3R");
  });
});

describe("band edges", () => {
  it("700 nm is visible (Class 2 exists); 700.1 nm is not", () => {
    expect(narrow(700, 0.9).hazardClass).toBe("2");
    expect(narrow(700.1, 0.9).hazardClass).toBe("3R");
  });
  it("400 nm takes the stricter UV Class 1 limit of 7.9 µW but keeps Class 2", () => {
    // 315–400 nm: 7.9×10⁻⁶ W (from memory); at the shared edge the lower neighbour applies
    expect(class1AelMw(400)).toBeCloseTo(0.0079, 10);
    expect(class1AelMw(399.9)).toBeCloseTo(0.0079, 10);
    expect(narrow(400, 0.5).hazardClass).toBe("2");
    // 399.9 nm: 3R = 5 × 7.9 µW = 39.5 µW
    expect(narrow(399.9, 0.039).hazardClass).toBe("3R");
    expect(narrow(399.9, 0.040).hazardClass).toBe("3B");
  });
  it("1400 nm takes the lower of the retinal and corneal (10 mW) Class 1 limits", () => {
    expect(class1AelMw(1400)).toBe(10);
    // 1399 nm: retinal 3.9e-4·5·(8 + 10^5.96) W is far above the corneal/lens 10 mW dual limit with the 2014 C7
    // (updated: with C7 = 8 it was 15.6 mW; IEC 60825-1:2014 C7 from memory)
    expect(class1AelMw(1399)).toBe(10);
    // 1250 nm: retinal 3.9e-4·5·9 = 17.55 mW vs corneal 10 mW
    expect(class1AelMw(1250)).toBe(10);
    expect(class1AelMw(1180)).toBeCloseTo(0.39 * 5 * 10 ** (0.018 * 30), 10);
    expect(narrow(1550, 9.9).hazardClass).toBe("1");
    expect(narrow(1550, 10.1).hazardClass).toBe("3R");
  });
  it("deep UV: 3B limit 1.5 mW below 315 nm", () => {
    expect(narrow(266, 1.49).hazardClass).toBe("3B");
    expect(narrow(266, 1.51).hazardClass).toBe("4");
  });
});

describe("measurement conditions: 1M and 2M", () => {
  it("an expanded 532 nm beam: 1M when the 7 mm aperture sees less than Class 1", () => {
    // 20 mm beam, 0.1 mrad, 1 mW. Condition 3 (7 mm at 100 mm): D = 20.00 mm, fraction 1 − exp(−2·49/400) = 0.2173 → 0.217 mW
    // ≤ 0.39 mW; Condition 1 (50 mm at 2 m): all 1 mW > 0.39 mW → 1M
    const c = classifyBeam({ wavelengthNm: 532, powerMw: 1, beamDiameterMm: 20, divergenceMrad: 0.1 });
    expect(c.accessibleEmission.find((a) => a.condition === "3")?.powerMw).toBeCloseTo(0.2173, 4);
    expect(c.hazardClass).toBe("1M");
  });
  it("the same beam at 4 mW: 2M (0.869 mW through 7 mm, 4 mW through 50 mm)", () => {
    const c = classifyBeam({ wavelengthNm: 532, powerMw: 4, beamDiameterMm: 20, divergenceMrad: 0.1 });
    expect(c.hazardClass).toBe("2M");
  });
  it("states the measurement conditions it applied", () => {
    const c = narrow(633, 1);
    expect(c.conditions.condition1).toMatch(/50 mm aperture at 2000 mm/);
    expect(c.conditions.condition3).toMatch(/7 mm at 100 mm in 400–1400 nm/);
    expect(c.source).toContain("IEC 60825-1:2014");
  });
});

describe("pulsed lasers", () => {
  it("a 1064 nm Q-switched laser at 100 mW average is Class 3B by its pulses (not 3R by its average)", () => {
    // 10 ns at 1 kHz, 100 mW → 0.1 mJ per pulse; per-pulse Class 1 limit = 2e-7 J/cm² · 0.3848 cm² = 7.7e-8 J → far above 5×
    const c = classifyBeam({ wavelengthNm: 1064, powerMw: 100, beamDiameterMm: 2, divergenceMrad: 1, pulseDurationS: 1e-8, pulseRepetitionRateHz: 1000 });
    expect(c.pulseEnergyMj).toBeCloseTo(0.1, 12);
    expect(c.hazardClass).toBe("3B");
  });
  it("a single 40 mJ pulse at 532 nm exceeds the recalled Class 3B per-pulse limit of 30 mJ → Class 4", () => {
    // 400 kW (4e8 mW) for 100 ns = 4e8 mW · 1e-7 s = 40 mJ
    const c = classifyBeam({ wavelengthNm: 532, powerMw: 4e8, beamDiameterMm: 5, divergenceMrad: 1, pulseDurationS: 1e-7 });
    expect(c.pulseEnergyMj).toBeCloseTo(40, 9);
    expect(c.hazardClass).toBe("4");
  });
});

describe("label check", () => {
  it("flags a mismatch and never changes the label", () => {
    const check = compareLabel("2", "3R");
    expect(check.matches).toBe(false);
    expect(check.labelClass).toBe("2");
    expect(check.warning).toMatch(/label says Class 2/);
    expect(check.warning).toMatch(/HIGHER/);
    expect(compareLabel("3B", "3B").warning).toBeNull();
  });
});

describe("properties", () => {
  it("more power never gives a lower class", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 180, max: 20_000, noNaN: true }),
        fc.double({ min: -4, max: 4, noNaN: true }),
        fc.double({ min: 0, max: 2, noNaN: true }),
        fc.double({ min: 0.1, max: 30, noNaN: true }),
        (λ, logP, step, d) => {
          const a = classifyBeam({ wavelengthNm: λ, powerMw: 10 ** logP, beamDiameterMm: d, divergenceMrad: 1 });
          const b = classifyBeam({ wavelengthNm: λ, powerMw: 10 ** (logP + step), beamDiameterMm: d, divergenceMrad: 1 });
          return classRank(b.hazardClass) >= classRank(a.hazardClass) && HAZARD_CLASSES.includes(a.hazardClass);
        },
      ),
      { numRuns: 1000 },
    );
  });
});
