// M² > 1 as a Gaussian Schell-model beam: checks against the GSM formulas (Friberg & Sudol, Opt. Commun. 41, 383 (1982);
// Mandel & Wolf, Optical Coherence and Quantum Optics (1995) §5.6.4: M² = √(1 + 4σ_S²/σ_g²), both widths spreading alike)
// and against an independent evaluation of the same pattern (the coherent profile blurred on a fine Simpson grid).
import { describe, expect, it } from "vitest";
import type { BenchDocument } from "@/lib/bench/schema";
import { analyzeBench, screenProfile } from "@/lib/optics";
import { gsmBlurWidth, gsmCentreRatio, scaledBesselI0 } from "@/lib/optics/coherence";
import { fresnelRadialIntensity } from "@/lib/optics/profile";

/** Independent: ∫₀^∞ I_coh(v)(1/t²)e^{−v²/(2t²)} v dv on a uniform Simpson grid, over the unobstructed centre σ_v²/(σ_v² + t²). */
function blurredCentre(a: number, n: number, t: number, sigmaV: number): number {
  const vMax = 10 * t;
  const steps = 4000;
  const h = vMax / steps;
  const vs = Array.from({ length: steps + 1 }, (_, i) => i * h);
  const coherent = fresnelRadialIntensity(a, n, vs, { exactBessel: true, refinement: 4 });
  let sum = 0;
  for (let i = 0; i <= steps; i++) {
    const c = i === 0 || i === steps ? 1 : i % 2 ? 4 : 2;
    sum += c * coherent[i] * Math.exp((-0.5 * vs[i] * vs[i]) / (t * t)) * vs[i];
  }
  return ((sum * h) / 3 / (t * t)) / ((sigmaV * sigmaV) / (sigmaV * sigmaV + t * t));
}

describe("Gaussian Schell-model centre", () => {
  it("e^{−x}I₀(x) against its series and asymptote (A&S 9.6.12, 9.7.1)", () => {
    expect(scaledBesselI0(0)).toBe(1);
    expect(scaledBesselI0(1)).toBeCloseTo(1.2660658777520082 * Math.exp(-1), 14);
    expect(scaledBesselI0(50) * Math.sqrt(2 * Math.PI * 50)).toBeCloseTo(1 + 1 / 400 + 9 / (2 * 400 ** 2) + 225 / (6 * 400 ** 3) + 11025 / (24 * 400 ** 4) + 893025 / (120 * 400 ** 5), 10);
    // series and asymptote agree where they meet
    expect(Math.abs(scaledBesselI0(30 - 1e-9) - scaledBesselI0(30 + 1e-9))).toBeLessThan(1e-11);
  });
  it("tends to the coherent closed form |1 − e^{−β}|² as the coherence width grows (t → 0)", () => {
    for (const [a, n] of [[0.3, 1], [1, 2], [0.1, 7.3]]) {
      const closed = 1 - 2 * Math.exp(-a) * Math.cos(Math.PI * n) + Math.exp(-2 * a);
      expect(gsmCentreRatio(a, n, 1e-4, 50)).toBeCloseTo(closed, 6);
    }
  });
  it("equals the coherent pattern blurred by the pseudo-mode Gaussian (independent quadrature)", () => {
    for (const [a, n, t] of [[0.3, 1, 0.8], [1, 2, 2], [0.2, 5, 3.5], [0.5, 1, 6]]) {
      expect(gsmCentreRatio(a, n, t, 40)).toBeCloseTo(blurredCentre(a, n, t, 40), 5);
    }
  }, 60_000);
  it("t = R/σ_g with σ_g = W/√(M⁴ − 1) (Mandel & Wolf §5.6.4, σ_S = W/2; the document's m2 is M²)", () => {
    expect(gsmBlurWidth(4, 1)).toBe(0);
    expect(gsmBlurWidth(4, 2)).toBeCloseTo(2 * Math.sqrt(3), 12);
  });
});

describe("M² > 1 on a bench", () => {
  const lambdaNm = 632.8;
  /** A collimated beam (waist 1 mm) on a 1 mm-radius aperture, the screen where N = 1 (a bright centre when coherent). */
  const bench = (m2: number, zones = 1): BenchDocument => {
    const bMm = (1e-6 / (lambdaNm * 1e-9 * zones)) * 1000;
    return {
      version: 1,
      elements: [
        { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: lambdaNm, powerMw: 1, beamDiameterMm: 3, ...(m2 === 1 ? {} : { m2 }) },
        { id: "ap", kind: "aperture", positionMm: 0, diameterMm: 2 },
        { id: "s", kind: "screen", positionMm: bMm },
      ],
    };
  };
  it("the unobstructed GSM beam has the real (M²) beam's size on the screen: w² = w_coh²(1 + t²/σ_v²)", () => {
    for (const m2 of [1.5, 3]) {
      const doc = bench(m2);
      const r = analyzeBench(doc);
      const wReal = r.elements.find((e) => e.id === "s")!.incident.radiusMm * 1e-3;
      // the coherent Gaussian of the same W and curvature on the screen (true λ)
      const w = r.apertures[0].incident.radiusMm * 1e-3;
      const rho = r.apertures[0].incident.wavefrontRadiusMm;
      const b = r.apertures[0].observationDistanceMm! * 1e-3;
      const lambda = lambdaNm * 1e-9;
      const zr = (Math.PI * w * w) / lambda;
      // w(b)² = W²[(1 + b/ρ)² + (bλ/(πW²))²] (Siegman ch. 17, q + b)
      const wCoh = w * Math.sqrt((1 + b / (rho === null ? Infinity : rho * 1e-3)) ** 2 + (b / zr) ** 2);
      const t = gsmBlurWidth((1e-3 / w) ** 2, m2);
      const sigmaV = (Math.PI * 1e-3 * wCoh) / (lambda * b);
      expect(wCoh * Math.sqrt(1 + (t * t) / (sigmaV * sigmaV))).toBeCloseTo(wReal, 9);
    }
  });
  it("the centre contrast falls as M² rises; M² = 1 keeps the coherent answer; bright only while the contrast allows", () => {
    const m2s = [1, 1.05, 1.2, 1.5, 2, 3];
    const bright = m2s.map((m) => analyzeBench(bench(m)).apertures[0]);
    for (let i = 1; i < bright.length; i++) expect(bright[i].centreIntensityRatio).toBeLessThan(bright[i - 1].centreIntensityRatio);
    const a = 1 / 1.5 ** 2;
    expect(bright[0].centreIntensityRatio).toBeCloseTo((1 + Math.exp(-a)) ** 2, 12);
    expect(bright[0].centre).toBe("bright");
    expect(bright[bright.length - 1].centre).toBe("between");
    const dark = m2s.map((m) => analyzeBench(bench(m, 2)).apertures[0]);
    for (let i = 1; i < dark.length; i++) expect(dark[i].centreIntensityRatio).toBeGreaterThan(dark[i - 1].centreIntensityRatio);
  });
  it("the profile of a partially coherent beam starts at its centre ratio and is blurred (shallower rings)", () => {
    const coherent = screenProfile(bench(1), "ap", { points: 64 });
    const partial = screenProfile(bench(2), "ap", { points: 64, maxRadiusMm: coherent.radiusMm[63] });
    expect(partial.relativeIntensity[0]).toBe(analyzeBench(bench(2)).apertures[0].centreIntensityRatio);
    const swing = (xs: number[]) => Math.max(...xs) - Math.min(...xs);
    expect(swing(partial.relativeIntensity)).toBeLessThan(swing(coherent.relativeIntensity));
  });
});
