// Fresnel zones: Hecht, Optics (5th ed.) §10.3; Born & Wolf, Principles of Optics (7th ed.) §8.2 and §8.8 (section numbers from memory).
import { describe, it, expect } from "vitest";
import type { BenchDocument } from "@/lib/bench/schema";
import { analyzeBench } from "@/lib/optics";
import {
  centreAppearance,
  centreIntensityRatio,
  diffractionRegime,
  fresnelNumber,
  transmittedFraction,
  uniformWaveRatio,
  zoneRadiiM,
} from "@/lib/optics/fresnel";

/** Adaptive Simpson on [a, b] — an independent quadrature, not the Gauss–Legendre panels of profile.ts. */
function adaptiveSimpson(f: (x: number) => number, a: number, b: number, tol: number): number {
  const simpson = (fa: number, fm: number, fb: number, h: number) => (h / 6) * (fa + 4 * fm + fb);
  const rec = (a: number, b: number, fa: number, fm: number, fb: number, whole: number, tol: number, depth: number): number => {
    const m = 0.5 * (a + b);
    const lm = 0.5 * (a + m);
    const rm = 0.5 * (m + b);
    const flm = f(lm);
    const frm = f(rm);
    const left = simpson(fa, flm, fm, m - a);
    const right = simpson(fm, frm, fb, b - m);
    if (depth > 40 || Math.abs(left + right - whole) <= 15 * tol) return left + right + (left + right - whole) / 15;
    return rec(a, m, fa, flm, fm, left, tol / 2, depth + 1) + rec(m, b, fm, frm, fb, right, tol / 2, depth + 1);
  };
  const fa = f(a);
  const fb = f(b);
  const fm = f(0.5 * (a + b));
  return rec(a, b, fa, fm, fb, simpson(fa, fm, fb, b - a), tol, 0);
}

const lambdaNm = 632.8;
const lambda = lambdaNm * 1e-9;

function bench(opts: { beamDiameterMm: number; lensMm?: number; focalMm?: number; apertureMm: number; diameterMm: number; screenMm: number }): BenchDocument {
  const elements: BenchDocument["elements"] = [
    { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: lambdaNm, powerMw: 5, beamDiameterMm: opts.beamDiameterMm },
    { id: "ap", kind: "aperture", positionMm: opts.apertureMm, diameterMm: opts.diameterMm },
    { id: "screen", kind: "screen", positionMm: opts.screenMm },
  ];
  if (opts.lensMm !== undefined) elements.push({ id: "lens", kind: "lens", positionMm: opts.lensMm, focalLengthMm: opts.focalMm ?? -25 });
  return { version: 1, elements };
}

describe("zone radii and the Fresnel number (Hecht §10.3; Born & Wolf §8.2)", () => {
  it("r_n = √(nλab/(a+b)) with a the incident wavefront radius (spherical wave from a point at a)", () => {
    const r = analyzeBench(bench({ beamDiameterMm: 0.8, lensMm: 100, focalMm: -25, apertureMm: 300, diameterMm: 2, screenMm: 800 }));
    const ap = r.apertures[0];
    const a = ap.incident.wavefrontRadiusMm as number;
    const b = ap.observationDistanceMm as number;
    expect(a).toBeGreaterThan(0);
    ap.zoneRadiiMm.forEach((rn, i) => {
      const n = i + 1;
      expect(rn / Math.sqrt((n * lambdaNm * 1e-6 * a * b) / (a + b))).toBeCloseTo(1, 12);
    });
    // The bench document contract: N = (R²/λ)(1/ρ + 1/b)
    expect(ap.fresnelNumber / ((1 / (lambdaNm * 1e-6)) * (1 / a + 1 / b))).toBeCloseTo(1, 12);
    expect(ap.zonesExposed).toBeCloseTo(Math.abs(ap.fresnelNumber), 15);
  });
  it("plane-wave limit: a flat wavefront gives r_n = √(nλb) and N = R²/(λb)", () => {
    const r = analyzeBench(bench({ beamDiameterMm: 20, apertureMm: 0, diameterMm: 2, screenMm: 500 }));
    const ap = r.apertures[0];
    expect(ap.incident.wavefrontRadiusMm).toBeNull();
    ap.zoneRadiiMm.forEach((rn, i) => expect(rn / Math.sqrt((i + 1) * lambdaNm * 1e-6 * 500)).toBeCloseTo(1, 12));
    expect(ap.fresnelNumber).toBeCloseTo(1 / (lambdaNm * 1e-6 * 500), 10);
  });
  it("a diverging beam exposes fewer zones than the plane-wave formula says (curvature matters)", () => {
    const ap = analyzeBench(bench({ beamDiameterMm: 0.8, lensMm: 100, focalMm: -25, apertureMm: 300, diameterMm: 2, screenMm: 800 })).apertures[0];
    expect(ap.fresnelNumber).toBeGreaterThan(1 / (lambdaNm * 1e-6 * 500)); // 1/ρ + 1/b > 1/b for ρ > 0
  });
  it("zones are empty when the screen is at the geometric focus (κ = 0)", () => expect(zoneRadiiM(lambda, 0)).toEqual([]));
});

describe("centre intensity (the bench document contract closed form; Born & Wolf §8.8, from memory)", () => {
  it("closed form |1 − exp(−R²/w² − iπN)|² equals an independent adaptive-Simpson quadrature of the Fresnel integral", () => {
    for (const [w, R, kappa] of [
      [3.6e-3, 1e-3, 1 / 0.5 + 1 / 0.225],
      [1e-3, 1e-3, 1 / 0.3],
      [0.5e-3, 2e-3, 1 / 1.2],
      [10e-3, 1e-3, -1 / 0.2 + 1 / 0.5],
      [2e-3, 1.5e-3, 1 / 0.05],
    ]) {
      const n = fresnelNumber(R, lambda, kappa);
      // U(0) ∝ ∫₀^R exp(−ρ²/w² + iπρ²κ/λ) ρ dρ, divided by the same integral to ∞, which is 1/(2α), α = 1/w² − iπκ/λ
      const re = adaptiveSimpson((p) => Math.exp(-(p * p) / (w * w)) * Math.cos((Math.PI * p * p * kappa) / lambda) * p, 0, R, 1e-16);
      const im = adaptiveSimpson((p) => Math.exp(-(p * p) / (w * w)) * Math.sin((Math.PI * p * p * kappa) / lambda) * p, 0, R, 1e-16);
      const aRe = 1 / (w * w);
      const aIm = (-Math.PI * kappa) / lambda;
      const uRe = 2 * (aRe * re - aIm * im);
      const uIm = 2 * (aRe * im + aIm * re);
      expect(centreIntensityRatio((R * R) / (w * w), n)).toBeCloseTo(uRe * uRe + uIm * uIm, 8);
    }
  });
  it("uniform-wave limit w ≫ R: the ratio tends to 4 sin²(πN/2) (Born & Wolf §8.8)", () => {
    for (const n of [0.5, 1, 1.5, 2, 3, 7.25, 10]) {
      expect(uniformWaveRatio(n)).toBeCloseTo(4 * Math.sin((Math.PI * n) / 2) ** 2, 12);
      expect(Math.abs(centreIntensityRatio(1e-8, n) - uniformWaveRatio(n))).toBeLessThan(1e-7);
    }
    // odd zone counts: 4× the unobstructed intensity; even: zero; the unobstructed wave is a quarter of one zone's
    expect(uniformWaveRatio(1)).toBeCloseTo(4, 12);
    expect(uniformWaveRatio(2)).toBeCloseTo(0, 12);
  });
  it("stays within [(1 − e^{−a})², (1 + e^{−a})²]", () => {
    for (let i = 0; i < 500; i++) {
      const a = Math.exp(Math.sin(i) * 5);
      const n = i * 0.37;
      const r = centreIntensityRatio(a, n);
      expect(r).toBeGreaterThanOrEqual((1 - Math.exp(-a)) ** 2 - 1e-12);
      expect(r).toBeLessThanOrEqual((1 + Math.exp(-a)) ** 2 + 1e-12);
    }
  });
  it("bright ≥ 2, dark ≤ 0.5, between otherwise (the bench document contract)", () => {
    expect(centreAppearance(2)).toBe("bright");
    expect(centreAppearance(0.5)).toBe("dark");
    expect(centreAppearance(1)).toBe("between");
  });
  it("keeps the phase at large N (N mod 2): N = 1e6 + 1 is as bright as N = 1", () => {
    expect(uniformWaveRatio(1e6 + 1)).toBeCloseTo(4, 6);
  });
});

describe("power through a circular aperture: 1 − exp(−2R²/w²) (Siegman ch. 17)", () => {
  it("matches a numerical integral of the Gaussian irradiance over the disc", () => {
    for (const [R, w] of [
      [1e-3, 1e-3],
      [0.5e-3, 2e-3],
      [3e-3, 1e-3],
    ]) {
      const numeric = adaptiveSimpson((p) => ((4 * p) / (w * w)) * Math.exp((-2 * p * p) / (w * w)), 0, R, 1e-14);
      expect(transmittedFraction(R, w)).toBeCloseTo(numeric, 10);
    }
    expect(transmittedFraction(1e-3, 1e-3)).toBeCloseTo(1 - Math.exp(-2), 15);
  });
});

describe("regimes (thresholds: Goodman, Introduction to Fourier Optics §4.3 — N ≪ 1 far field; ours: 0.1 and 100)", () => {
  it("classifies by |N|", () => {
    expect(diffractionRegime(0.05)).toBe("fraunhofer");
    expect(diffractionRegime(-0.05)).toBe("fraunhofer");
    expect(diffractionRegime(3)).toBe("fresnel");
    expect(diffractionRegime(1000)).toBe("geometric");
  });
});
