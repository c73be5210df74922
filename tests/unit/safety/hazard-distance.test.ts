// NOHD, lens-on-laser NOHD, diffuse NHZ and OD with worked numbers of our own derivation (arithmetic in the comments).
// Formulas: ANSI Z136.1-2014 Appendix B (from memory; the direct-beam NOHD as the bench document contract states it) and the bench document contract (OD).
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { diffuseReflectionNhz, directBeamNohd, lensNohd } from "@/lib/safety/hazard-distance";
import { apertureAveragedIrradianceWPerCm2, opticalDensity, peakIrradianceWPerCm2 } from "@/lib/safety/irradiance";

// 1064 nm CW, 10 s: MPE = 9e-3 · 10^0.75 / 10 = 9e-3 · 5.623413 / 10 = 5.0610719e-3 W/cm²
const MPE_1064_10S = 5.0610719e-3;
// 633 nm, 0.25 s: MPE = 1.8e-3 · 0.25^0.75 / 0.25 = 2.5455844e-3 W/cm²
const MPE_VIS_025S = 2.5455844e-3;

describe("OD = log10(E/MPE), E averaged over the limiting aperture (the bench document contract)", () => {
  it("1064 nm, 2 W, 3 mm (1/e²) beam, 7 mm aperture: OD 3.011", () => {
    // w = 0.15 cm, r = 0.35 cm: 2r²/w² = 2·0.1225/0.0225 = 10.889; 1 − e^−10.889 = 0.99998136
    // E = 2 W · 0.99998136 / (π · 0.1225 cm²) = 1.99996272 / 0.38484510 = 5.196799 W/cm²
    const e = apertureAveragedIrradianceWPerCm2(2000, 1.5, 7);
    expect(e).toBeCloseTo(5.196799, 5);
    // OD = log10(5.196799 / 5.0610719e-3) = log10(1026.818) = 3.01149
    const od = opticalDensity(e, MPE_1064_10S);
    expect(od.raw).toBeCloseTo(3.01149, 4);
    expect(od.required).toBeCloseTo(3.01149, 4);
  });

  it("633 nm, 1 mW, 0.8 mm beam: OD 0.0089 (just above the MPE)", () => {
    // The whole beam fits in 7 mm: E = 1e-3 W / 0.38484510 cm² = 2.598448e-3 W/cm²
    // OD = log10(2.598448e-3 / 2.5455844e-3) = log10(1.020767) = 0.008927
    const e = apertureAveragedIrradianceWPerCm2(1, 0.4, 7);
    expect(e).toBeCloseTo(2.598448e-3, 9);
    expect(opticalDensity(e, MPE_VIS_025S).raw).toBeCloseTo(0.008927, 5);
  });

  it("a beam below the MPE needs OD 0, and the negative raw value is kept", () => {
    // 0.05 mW: E = 5e-5 / 0.38484510 = 1.29922e-4 W/cm²; log10(1.29922e-4 / 2.5455844e-3) = log10(0.051039) = −1.29210
    const od = opticalDensity(apertureAveragedIrradianceWPerCm2(0.05, 0.4, 7), MPE_VIS_025S);
    expect(od.raw).toBeCloseTo(-1.2921, 4);
    expect(od.required).toBe(0);
    expect(opticalDensity(0, MPE_VIS_025S)).toMatchObject({ raw: null, required: 0 });
  });

  it("peak irradiance 2P/(πw²)", () => {
    // 5 mW, w = 0.05 cm: 2 · 5e-3 / (π · 0.0025) = 0.01 / 7.853982e-3 = 1.273240 W/cm²
    expect(peakIrradianceWPerCm2(5, 0.5)).toBeCloseTo(1.27324, 5);
  });
});

describe("direct-beam NOHD = (√(4P/(π·MPE)) − a)/φ, a and φ 1/e values (ANSI Z136.1-2014 Appendix B)", () => {
  it("1064 nm, 2 W, 3 mm and 1 mrad (1/e²): 314.2 m", () => {
    // √(4·2/(π·5.0610719e-3)) = √(8/0.01589976) = √503.152 = 22.4310 cm
    // a = 0.3 cm/√2 = 0.212132 cm; φ = 1e-3/√2 = 7.071068e-4 rad
    // NOHD = (22.4310 − 0.2121)/7.071068e-4 = 22.2189/7.071068e-4 = 31422.2 cm = 314.22 m
    const n = directBeamNohd({ powerMw: 2000, mpeWPerCm2: MPE_1064_10S, beamDiameter1eMm: 3 / Math.SQRT2, divergence1eMrad: 1 / Math.SQRT2, limitingApertureMm: 7 });
    expect(n.hazardDiameterCm).toBeCloseTo(22.431, 3);
    expect(n.distanceM).toBeCloseTo(314.22, 1);
  });

  it("633 nm HeNe, 1 mW, 0.8 mm, 1.2 mrad: 7.67 m", () => {
    // √(4e-3/(π·2.5455844e-3)) = √(4e-3/7.997184e-3) = √0.500176 = 0.707231 cm
    // a = 0.08/√2 = 0.0565685 cm; φ = 1.2e-3/√2 = 8.485281e-4 rad
    // NOHD = (0.707231 − 0.056569)/8.485281e-4 = 0.650662/8.485281e-4 = 766.81 cm = 7.668 m
    const n = directBeamNohd({ powerMw: 1, mpeWPerCm2: MPE_VIS_025S, beamDiameter1eMm: 0.8 / Math.SQRT2, divergence1eMrad: 1.2 / Math.SQRT2, limitingApertureMm: 7 });
    expect(n.distanceM).toBeCloseTo(7.668, 2);
  });

  it("is 0 when √(4P/(π·MPE)) ≤ the 7 mm limiting aperture; the boundary is P = MPE·π·(0.35 cm)²", () => {
    // P = 2.5455844e-3 W/cm² · 0.38484510 cm² = 9.79656e-4 W = 0.979656 mW
    const base = { mpeWPerCm2: MPE_VIS_025S, beamDiameter1eMm: 0.8 / Math.SQRT2, divergence1eMrad: 1.2 / Math.SQRT2, limitingApertureMm: 7 };
    const under = directBeamNohd({ ...base, powerMw: 0.9796 });
    expect(under.distanceM).toBe(0);
    expect(under.belowMpeEverywhere).toBe(true);
    const over = directBeamNohd({ ...base, powerMw: 0.9798 });
    expect(over.distanceM).toBeGreaterThan(0);
  });

  it("a beam already wider than the hazard diameter gives 0", () => {
    // 2 W over a 300 mm (1/e) beam: 30 cm > 22.43 cm
    expect(directBeamNohd({ powerMw: 2000, mpeWPerCm2: MPE_1064_10S, beamDiameter1eMm: 300, divergence1eMrad: 1, limitingApertureMm: 7 }).distanceM).toBe(0);
  });
});

describe("lens-on-laser NOHD = (f/b₀)·√(4P/(π·MPE)) (ANSI Z136.1-2014 Appendix B)", () => {
  it("1064 nm, 2 W, f = 100 mm, b₀ = 3 mm/√2: 10.57 m from the focus, 10.67 m from the lens", () => {
    // f/b₀ = 10 cm / 0.212132 cm = 47.1405; × 22.4310 cm = 1057.42 cm = 10.574 m; + f = 10.674 m
    const h = lensNohd({ powerMw: 2000, mpeWPerCm2: MPE_1064_10S, focalLengthMm: 100, beamDiameterOnLens1eMm: 3 / Math.SQRT2, limitingApertureMm: 7 });
    expect(h.fromFocusM).toBeCloseTo(10.574, 2);
    expect(h.fromLensM).toBeCloseTo(10.674, 2);
  });
  it("a diverging lens measures from its virtual focus behind the lens", () => {
    const h = lensNohd({ powerMw: 2000, mpeWPerCm2: MPE_1064_10S, focalLengthMm: -100, beamDiameterOnLens1eMm: 3 / Math.SQRT2, limitingApertureMm: 7 });
    expect(h.fromLensM).toBeCloseTo(10.474, 2);
  });
});

describe("diffuse reflection NHZ = √(ρ·P·cos θ/(π·MPE)) (ANSI Z136.1-2014 Appendix B)", () => {
  it("1064 nm, 2 W, ρ = 1, θ = 0: 0.112 m", () => {
    // √(2/(π·5.0610719e-3)) = √(2/0.01589976) = √125.788 = 11.2155 cm
    expect(diffuseReflectionNhz({ powerMw: 2000, mpeWPerCm2: MPE_1064_10S }).distanceM).toBeCloseTo(0.112155, 5);
  });
  it("ρ = 0.5 and 60° viewing quarter the product under the root", () => {
    // √(0.5·0.5) = 0.5 of the worst case
    const r = diffuseReflectionNhz({ powerMw: 2000, mpeWPerCm2: MPE_1064_10S, reflectance: 0.5, viewingAngleRad: Math.PI / 3 });
    expect(r.distanceM).toBeCloseTo(0.112155 * 0.5, 5);
  });
});

describe("properties", () => {
  it("the aperture-averaged irradiance never exceeds the peak", () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-6, max: 1e9, noNaN: true }), fc.double({ min: 1e-3, max: 1e3, noNaN: true }), fc.constantFrom(1, 3.5, 7, 11), (p, w, a) => {
        return apertureAveragedIrradianceWPerCm2(p, w, a) <= peakIrradianceWPerCm2(p, w) * (1 + 1e-12);
      }),
    );
  });
  it("NOHD grows with power and shrinks with divergence", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-3, max: 1e6, noNaN: true }),
        fc.double({ min: 1.01, max: 100, noNaN: true }),
        fc.double({ min: 0.01, max: 100, noNaN: true }),
        (p, k, φ) => {
          const base = { mpeWPerCm2: MPE_VIS_025S, beamDiameter1eMm: 1, limitingApertureMm: 7 };
          const a = directBeamNohd({ ...base, powerMw: p, divergence1eMrad: φ }).distanceM;
          const morePower = directBeamNohd({ ...base, powerMw: p * k, divergence1eMrad: φ }).distanceM;
          const moreSpread = directBeamNohd({ ...base, powerMw: p, divergence1eMrad: φ * k }).distanceM;
          return morePower >= a && moreSpread <= a;
        },
      ),
    );
  });
});
