// The finder and its inverses, checked against the closed forms (Born & Wolf §8.8; Hecht §10.3: N = R²(1/ρ + 1/b)/λ).
import { describe, it, expect } from "vitest";
import type { BenchDocument } from "@/lib/bench/schema";
import { analyzeBench, findScreenPositions, solveApertureDiameter, solveAperturePosition } from "@/lib/optics";

const base = (apertureMm = 300, diameterMm = 2, screenMm = 800): BenchDocument => ({
  version: 1,
  elements: [
    { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 5, beamDiameterMm: 0.8 },
    { id: "neg", kind: "lens", positionMm: 100, focalLengthMm: -25 },
    { id: "ap", kind: "aperture", positionMm: apertureMm, diameterMm },
    { id: "s", kind: "screen", positionMm: screenMm },
  ],
});

describe("findScreenPositions", () => {
  const found = findScreenPositions(base(), "ap", { fromMm: 350, toMm: 3000, maxResults: 5 });
  it("finds odd counts for bright and even for dark, with N an integer to 1e-9", () => {
    for (const c of found.bright) {
      expect(c.zoneCount % 2).toBe(1);
      expect(Math.abs(Math.abs(c.fresnelNumber) - c.zoneCount)).toBeLessThan(1e-6);
    }
    for (const c of found.dark) expect(c.zoneCount % 2).toBe(0);
  });
  it("the ratio there is (1 ± e^{−a})², the extremes of the closed form", () => {
    const ap = analyzeBench(base()).apertures[0];
    const e = Math.exp(-((1 / ap.incident.radiusMm) ** 2));
    for (const c of found.bright) expect(c.centreIntensityRatio).toBeCloseTo((1 + e) ** 2, 8);
    for (const c of found.dark) expect(c.centreIntensityRatio).toBeCloseTo((1 - e) ** 2, 8);
  });
  it("lists the best (widest tolerance) first and agrees with analyzeBench at those positions", () => {
    for (let i = 1; i < found.bright.length; i++) expect(found.bright[i].toleranceMm).toBeLessThanOrEqual(found.bright[i - 1].toleranceMm);
    const c = found.bright[0];
    const ap = analyzeBench(base(300, 2, c.positionMm)).apertures[0];
    expect(ap.fresnelNumber).toBeCloseTo(c.fresnelNumber, 6);
    expect(ap.onAxisIrradianceWPerCm2!).toBeCloseTo(c.onAxisIrradianceWPerCm2, 10);
  });
  it("stops the search at a beam block", () => {
    const d = base();
    d.elements.push({ id: "block", kind: "beam-block", positionMm: 1000 });
    const r = findScreenPositions(d, "ap", { fromMm: 350, toMm: 3000 });
    expect(r.toMm).toBe(1000);
    for (const c of [...r.bright, ...r.dark]) expect(c.positionMm).toBeLessThanOrEqual(1000);
  });
});

describe("inverse solvers", () => {
  it("solveApertureDiameter gives the diameter for a wanted zone count (R = √(Nλ/κ))", () => {
    for (const zones of [1, 2, 3, 6]) {
      const sol = solveApertureDiameter(base(), "ap", zones);
      expect(sol.diameterMm).not.toBeNull();
      const ap = analyzeBench(base(300, sol.diameterMm!, 800)).apertures[0];
      expect(ap.fresnelNumber).toBeCloseTo(zones, 9);
    }
  });
  it("solveApertureDiameter honours a moved screen position", () => {
    const sol = solveApertureDiameter(base(), "ap", 5, { screenPositionMm: 1500 });
    const ap = analyzeBench(base(300, sol.diameterMm!, 1500)).apertures[0];
    expect(ap.fresnelNumber).toBeCloseTo(5, 9);
    expect(sol.centreIntensityRatio).toBeCloseTo(ap.centreIntensityRatio, 9);
  });
  it("solveAperturePosition finds positions giving the wanted count, nearest first", () => {
    const r = solveAperturePosition(base(), "ap", 12);
    expect(r.solutions.length).toBeGreaterThan(0);
    for (const s of r.solutions) {
      const ap = analyzeBench(base(s.positionMm, 2, 800)).apertures[0];
      expect(ap.fresnelNumber).toBeCloseTo(12, 6);
      expect(ap.centre).toBe("dark");
    }
    for (let i = 1; i < r.solutions.length; i++) expect(Math.abs(r.solutions[i].positionMm - 300)).toBeGreaterThanOrEqual(Math.abs(r.solutions[i - 1].positionMm - 300));
  });
  it("says so when no position can give the count", () => {
    const r = solveAperturePosition(base(), "ap", 7); // N never falls below ≈ 9 on this bench
    expect(r.solutions).toHaveLength(0);
    expect(r.notes.length).toBe(1);
  });
});
