// The screen pattern: Fresnel integral by Gauss–Legendre panels, checked against a 16× finer reference, the Lommel series
// (Born & Wolf §8.8, from memory) and the Airy pattern (Born & Wolf §8.5.2: first zero 1.21967 λ/D, 83.8 % inside it).
import { describe, it, expect } from "vitest";
import j1ref from "@stdlib/math-base-special-besselj1";
import type { BenchDocument } from "@/lib/bench/schema";
import { analyzeBench, ringImage, screenProfile } from "@/lib/optics";
import { fresnelRadialIntensity } from "@/lib/optics/profile";
import { besselJnArray } from "@/lib/optics/bessel";
import { centreIntensityRatio } from "@/lib/optics/fresnel";

const lambdaNm = 632.8;

const hene: BenchDocument = {
  version: 1,
  elements: [
    { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: lambdaNm, powerMw: 5, beamDiameterMm: 0.8 },
    { id: "lens", kind: "lens", positionMm: 100, focalLengthMm: -25 },
    { id: "ap", kind: "aperture", positionMm: 300, diameterMm: 2 },
    { id: "screen", kind: "screen", positionMm: 800 },
  ],
};

/** Lommel-type series: ∫₀¹ e^{−βs²} J₀(vs) s ds = (e^{−β}/v) Σ_{n≥1} (2β/v)^{n−1} J_n(v) (repeated integration by parts; U_n Lommel functions, Born & Wolf §8.8). */
function lommelIntensity(a: number, n: number, v: number): number {
  const bRe = a;
  const bIm = -Math.PI * n;
  const j = besselJnArray(200, v);
  // Σ (2β/v)^{k} J_{k+1}(v)
  let pRe = 1;
  let pIm = 0;
  let sRe = 0;
  let sIm = 0;
  const zRe = (2 * bRe) / v;
  const zIm = (2 * bIm) / v;
  for (let k = 0; k < 200; k++) {
    sRe += pRe * j[k + 1];
    sIm += pIm * j[k + 1];
    const t = pRe * zRe - pIm * zIm;
    pIm = pRe * zIm + pIm * zRe;
    pRe = t;
  }
  // F = e^{−β} S / v; I = |2β F|²
  const e = Math.exp(-bRe);
  const eRe = e * Math.cos(-bIm);
  const eIm = e * Math.sin(-bIm);
  const fRe = (eRe * sRe - eIm * sIm) / v;
  const fIm = (eRe * sIm + eIm * sRe) / v;
  const gRe = 2 * (bRe * fRe - bIm * fIm);
  const gIm = 2 * (bRe * fIm + bIm * fRe);
  return gRe * gRe + gIm * gIm;
}

describe("screenProfile contract (the bench document contract)", () => {
  it("its value at r = 0 is analyzeBench's centreIntensityRatio", () => {
    const ap = analyzeBench(hene).apertures[0];
    const p = screenProfile(hene, "ap");
    expect(p.radiusMm[0]).toBe(0);
    expect(p.relativeIntensity[0]).toBe(ap.centreIntensityRatio);
  });
  it("the quadrature itself at v = 0 reproduces the closed form (independent of the r = 0 shortcut)", () => {
    for (const [a, n] of [
      [0.075, 10.19],
      [1, 3],
      [0.01, 200],
      [30, 7.5],
    ]) {
      // absolute error against a peak of up to (1 + e^{−a})² ≤ 4
      expect(Math.abs(fresnelRadialIntensity(a, n, [0])[0] - centreIntensityRatio(a, n))).toBeLessThan(1e-8);
    }
  });
  it("evaluates exactly the given radii, in order; otherwise `points` radii from 0 to maxRadiusMm", () => {
    const radii = [3, 0.5, 0, 1.25];
    const p = screenProfile(hene, "ap", { radiiMm: radii });
    expect(p.radiusMm).toEqual(radii);
    expect(p.relativeIntensity).toHaveLength(4);
    const q = screenProfile(hene, "ap", { maxRadiusMm: 5, points: 11 });
    expect(q.radiusMm).toHaveLength(11);
    expect(q.radiusMm[10]).toBe(5);
    expect(screenProfile(hene, "ap", { radiiMm: [0.5] }).relativeIntensity[0]).toBeCloseTo(p.relativeIntensity[1], 12);
  });
  it("rejects an unknown aperture with a clear error", () => {
    expect(() => screenProfile(hene, "nope")).toThrow(/no aperture/);
  });
});

describe("accuracy of the Gauss–Legendre profile", () => {
  it("agrees with a 16× finer reference (exact J0) to 1e-5 of the peak, N from 0.3 to 300", () => {
    for (const [a, n] of [
      [0.075, 10.19],
      [0.01, 0.3],
      [1, 42],
      [0.0625, 300],
      [9, 25],
    ]) {
      const vs = Array.from({ length: 97 }, (_, i) => (i / 96) * 2 * Math.PI * Math.max(3, 1.4 * n));
      const fast = fresnelRadialIntensity(a, n, vs);
      const ref = fresnelRadialIntensity(a, n, vs, { refinement: 16, exactBessel: true });
      const peak = Math.max(...ref);
      for (let i = 0; i < vs.length; i++) expect(Math.abs(fast[i] - ref[i]) / peak).toBeLessThan(1e-5);
    }
  });
  it("agrees with the Lommel series where that converges (|2β| < v, outside the geometric shadow)", () => {
    let checked = 0;
    for (const [a, n] of [
      [0.075, 10.19],
      [0.5, 3.3],
      [0.01, 1],
      [2, 20],
    ]) {
      const beta = Math.hypot(a, Math.PI * n);
      for (const v of [1.25, 1.6, 2.2, 3].map((k) => k * 2 * beta)) {
        const q = fresnelRadialIntensity(a, n, [v], { refinement: 4, exactBessel: true })[0];
        expect(Math.abs(q - lommelIntensity(a, n, v))).toBeLessThan(1e-10);
        checked++;
      }
    }
    expect(checked).toBe(16);
  });
});

describe("Fraunhofer limit: the Airy pattern (Born & Wolf §8.5.2)", () => {
  // w = 50 mm ≫ R = 0.5 mm (uniform), N ≈ 0.01 ≪ 1
  const bMm = 39_500;
  const dMm = 1;
  const doc: BenchDocument = {
    version: 1,
    elements: [
      { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: lambdaNm, powerMw: 1, beamDiameterMm: 100 },
      { id: "ap", kind: "aperture", positionMm: 10, diameterMm: dMm },
      { id: "screen", kind: "screen", positionMm: 10 + bMm },
    ],
  };
  const firstZeroMm = (1.21967 * lambdaNm * 1e-6 * bMm) / dMm;
  it("is in the Fraunhofer regime", () => {
    const ap = analyzeBench(doc).apertures[0];
    expect(ap.regime).toBe("fraunhofer");
    expect(ap.fresnelNumber).toBeLessThan(0.011);
  });
  it("first dark ring at r = 1.21967 λb/D (within 0.2 %)", () => {
    const radii = Array.from({ length: 401 }, (_, i) => firstZeroMm * (0.9 + (0.2 * i) / 400));
    const p = screenProfile(doc, "ap", { radiiMm: radii });
    let k = 0;
    for (let i = 1; i < radii.length; i++) if (p.relativeIntensity[i] < p.relativeIntensity[k]) k = i;
    expect(Math.abs(radii[k] / firstZeroMm - 1)).toBeLessThan(0.002);
    expect(p.relativeIntensity[k] / analyzeBench(doc).apertures[0].centreIntensityRatio).toBeLessThan(1e-4);
  });
  it("shape follows (2J1(x)/x)² to 1 % of the peak", () => {
    const p = screenProfile(doc, "ap", { maxRadiusMm: 3 * firstZeroMm, points: 121 });
    const i0 = p.relativeIntensity[0];
    p.radiusMm.forEach((r, i) => {
      if (r === 0) return;
      const x = (Math.PI * dMm * r) / (lambdaNm * 1e-6 * bMm);
      expect(Math.abs(p.relativeIntensity[i] / i0 - (2 * j1ref(x) / x) ** 2)).toBeLessThan(0.01);
    });
  });
  it("83.8 % of the transmitted power falls inside the first dark ring", () => {
    const count = 4001;
    const radii = Array.from({ length: count }, (_, i) => (firstZeroMm * i) / (count - 1));
    const p = screenProfile(doc, "ap", { radiiMm: radii });
    let inside = 0;
    for (let i = 1; i < count; i++) {
      const f0 = p.relativeIntensity[i - 1] * radii[i - 1];
      const f1 = p.relativeIntensity[i] * radii[i];
      inside += 0.5 * (f0 + f1) * (radii[i] - radii[i - 1]) * 2 * Math.PI;
    }
    // total on the screen (relative units) = T · π w_s² / 2, w_s the unobstructed beam radius there
    const r = analyzeBench(doc);
    const wScreen = r.elements.find((e) => e.id === "screen")!.incident.radiusMm;
    const total = (r.apertures[0].transmittedFraction * Math.PI * wScreen * wScreen) / 2;
    expect(inside / total).toBeCloseTo(0.838, 2);
    expect(Math.abs(inside / total - 0.8378)).toBeLessThan(0.003);
  });
});

describe("ring image", () => {
  it("is a square, normalised image whose centre follows the profile", () => {
    const img = ringImage(hene, "ap", { sizePx: 64 });
    expect(img.widthPx).toBe(64);
    expect(img.intensity).toHaveLength(64 * 64);
    expect(Math.max(...img.intensity)).toBeCloseTo(1, 6);
    // pixels hold the profile at their centre's radius (interpolated at 4 samples per pixel)
    for (const [x, y] of [
      [32, 32],
      [40, 32],
      [50, 20],
      [3, 60],
    ]) {
      const r = Math.hypot(x + 0.5 - 32, y + 0.5 - 32) * img.pixelSizeMm;
      const expected = screenProfile(hene, "ap", { radiiMm: [r] }).relativeIntensity[0] / img.peakRelativeIntensity;
      expect(Math.abs(img.intensity[y * 64 + x] - expected)).toBeLessThan(0.03);
    }
  });
});

describe("very large Fresnel numbers", () => {
  it("falls back to the geometric shadow when the integral is too costly, keeping the exact centre", () => {
    const doc: BenchDocument = {
      version: 1,
      elements: [
        { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: lambdaNm, powerMw: 5, beamDiameterMm: 100 },
        { id: "ap", kind: "aperture", positionMm: 0, diameterMm: 50 },
        { id: "screen", kind: "screen", positionMm: 10 },
      ],
    };
    const ap = analyzeBench(doc).apertures[0];
    expect(ap.regime).toBe("geometric");
    const p = screenProfile(doc, "ap", { points: 64 });
    expect(p.method).toBe("geometric-shadow");
    expect(p.relativeIntensity[0]).toBe(ap.centreIntensityRatio);
    expect(p.relativeIntensity[63]).toBe(0);
  });
});
