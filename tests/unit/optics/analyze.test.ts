// analyzeBench against the bench document contract's contract; facts of the trade marked "common practice"; Gaussian power 1 − exp(−2R²/w²) (Siegman ch. 17).
import { describe, it, expect } from "vitest";
import type { BenchDocument, BenchElement } from "@/lib/bench/schema";
import { analyzeBench, findScreenPositions } from "@/lib/optics";

const laser: BenchElement = { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 5, beamDiameterMm: 0.8 };
const doc = (...rest: BenchElement[]): BenchDocument => ({ version: 1, elements: [laser, ...rest] });
const codes = (d: BenchDocument) => analyzeBench(d).warnings.map((w) => w.code);

describe("elements in beam order (the bench document contract)", () => {
  it("sorts by position and gives radius, wavefront radius and power at each", () => {
    const r = analyzeBench(
      doc(
        { id: "screen", kind: "screen", positionMm: 900 },
        { id: "lens", kind: "lens", positionMm: 100, focalLengthMm: 200 },
        { id: "nd", kind: "filter", positionMm: 50, opticalDensity: 1 },
      ),
    );
    expect(r.elements.map((e) => e.id)).toEqual(["laser", "nd", "lens", "screen"]);
    expect(r.elements[0].incident).toEqual({ radiusMm: 0.4, wavefrontRadiusMm: null, powerMw: 5 });
    expect(r.elements[2].incident.powerMw).toBeCloseTo(0.5, 12); // 10^−1
    expect(r.elements[2].incident.wavefrontRadiusMm).toBeGreaterThan(0); // diverging from the laser waist
    // after a positive lens with f < R the beam converges: at 300 mm (before the waist near 300 mm) it is < 0
    const r2 = analyzeBench(doc({ id: "lens", kind: "lens", positionMm: 100, focalLengthMm: 200 }, { id: "s", kind: "screen", positionMm: 200 }));
    expect(r2.elements[2].incident.wavefrontRadiusMm).toBeLessThan(0);
  });
  it("ignores elements upstream of the laser, with a warning", () => {
    const r = analyzeBench(doc({ id: "early", kind: "aperture", positionMm: -10, diameterMm: 1 }, { id: "s", kind: "screen", positionMm: 100 }));
    expect(r.elements[0].id).toBe("early");
    expect(r.elements[0].status).toBe("upstream-of-laser");
    expect(r.apertures).toHaveLength(0);
    expect(r.warnings.find((w) => w.code === "element-upstream-of-laser")?.elementId).toBe("early");
  });
  it("stops at the first screen or beam block; apertures beyond are not reached", () => {
    const r = analyzeBench(
      doc({ id: "block", kind: "beam-block", positionMm: 200 }, { id: "ap", kind: "aperture", positionMm: 300, diameterMm: 1 }, { id: "s", kind: "screen", positionMm: 400 }),
    );
    expect(r.stopId).toBe("block");
    expect(r.apertures).toHaveLength(0);
    expect(r.elements.find((e) => e.id === "s")!.incident.powerMw).toBe(0);
    expect(codes(doc({ id: "block", kind: "beam-block", positionMm: 200 }, { id: "ap", kind: "aperture", positionMm: 300, diameterMm: 1 }, { id: "s", kind: "screen", positionMm: 400 }))).toEqual(
      expect.arrayContaining(["aperture-not-reached", "screen-not-reached", "element-beyond-stop"]),
    );
  });
  it("warns when there is no screen, and gives an aperture without one screenId null and N with 1/b = 0", () => {
    const r = analyzeBench(doc({ id: "ap", kind: "aperture", positionMm: 500, diameterMm: 1 }));
    expect(r.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(["no-screen", "aperture-without-screen"]));
    const ap = r.apertures[0];
    expect(ap.screenId).toBeNull();
    expect(ap.observationDistanceMm).toBeNull();
    expect(ap.onAxisIrradianceWPerM2).toBeNull();
    const rho = ap.incident.wavefrontRadiusMm as number;
    expect(ap.fresnelNumber).toBeCloseTo((0.25 / (632.8e-6 * rho)), 10);
  });
  it("warns about elements at the same position and resolves the tie by kind, then id, whatever the input order", () => {
    const a: BenchElement = { id: "ap", kind: "aperture", positionMm: 100, diameterMm: 1 };
    const l: BenchElement = { id: "lens", kind: "lens", positionMm: 100, focalLengthMm: 50 };
    const s: BenchElement = { id: "s", kind: "screen", positionMm: 400 };
    const r1 = analyzeBench({ version: 1, elements: [laser, a, l, s] });
    const r2 = analyzeBench({ version: 1, elements: [s, l, a, laser] });
    expect(r1).toEqual(r2);
    expect(r1.elements.map((e) => e.id)).toEqual(["laser", "lens", "ap", "s"]);
    expect(r1.warnings.map((w) => w.code)).toContain("same-position");
  });
});

describe("apertures", () => {
  it("transmittedFraction = 1 − exp(−2R²/w²) and the power after is multiplied by it (Siegman ch. 17)", () => {
    const r = analyzeBench(doc({ id: "ap", kind: "aperture", positionMm: 0, diameterMm: 0.8 }, { id: "s", kind: "screen", positionMm: 100 }));
    const ap = r.apertures[0];
    expect(ap.transmittedFraction).toBeCloseTo(1 - Math.exp(-2), 14);
    expect(r.elements.find((e) => e.id === "s")!.incident.powerMw).toBeCloseTo(5 * (1 - Math.exp(-2)), 12);
  });
  it("warns when the aperture clips less than 1 % (zone analysis moot)", () => {
    expect(codes(doc({ id: "ap", kind: "aperture", positionMm: 0, diameterMm: 5 }, { id: "s", kind: "screen", positionMm: 100 }))).toContain("aperture-clips-little");
    expect(codes(doc({ id: "ap", kind: "aperture", positionMm: 0, diameterMm: 0.8 }, { id: "s", kind: "screen", positionMm: 100 }))).not.toContain("aperture-clips-little");
  });
  it("absolute on-axis irradiance: unobstructed 2P/(πw_s²) × ratio, with filters after the aperture counted", () => {
    const wide: BenchElement = { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 10, beamDiameterMm: 20 };
    const base = [wide, { id: "ap", kind: "aperture", positionMm: 0, diameterMm: 2 } as BenchElement, { id: "s", kind: "screen", positionMm: 500 } as BenchElement];
    const r = analyzeBench({ version: 1, elements: base });
    const ap = r.apertures[0];
    const wsM = r.elements.find((e) => e.id === "s")!.incident.radiusMm * 1e-3;
    const expected = ((2 * 10e-3) / (Math.PI * wsM * wsM)) * ap.centreIntensityRatio;
    expect(ap.onAxisIrradianceWPerM2! / expected).toBeCloseTo(1, 12);
    expect(ap.onAxisIrradianceWPerCm2! / (expected * 1e-4)).toBeCloseTo(1, 12);
    const filtered = analyzeBench({ version: 1, elements: [...base, { id: "nd", kind: "filter", positionMm: 200, opticalDensity: 2 }] }).apertures[0];
    expect(filtered.onAxisIrradianceWPerM2! / (expected * 1e-2)).toBeCloseTo(1, 12);
    // a filter before the aperture too
    const before = analyzeBench({ version: 1, elements: [...base.slice(0, 1), { id: "nd", kind: "filter", positionMm: -0, opticalDensity: 1 }, ...base.slice(1)] }).apertures[0];
    expect(before.onAxisIrradianceWPerM2! / (expected * 1e-1)).toBeCloseTo(1, 12);
  });
});

describe("lenses", () => {
  it("warns that a lens inside the Rayleigh range makes a small-waist focus (Self 1983)", () => {
    expect(codes(doc({ id: "f", kind: "lens", positionMm: 50, focalLengthMm: 50 }, { id: "s", kind: "screen", positionMm: 300 }))).toContain("lens-focus-in-rayleigh-range");
    // a diverging lens makes no focus
    expect(codes(doc({ id: "f", kind: "lens", positionMm: 50, focalLengthMm: -50 }, { id: "s", kind: "screen", positionMm: 300 }))).not.toContain("lens-focus-in-rayleigh-range");
  });
  it("reports the waist after each lens", () => {
    const r = analyzeBench(doc({ id: "f", kind: "lens", positionMm: 100, focalLengthMm: -25 }, { id: "s", kind: "screen", positionMm: 300 }));
    const w = r.waists.find((x) => x.afterElementId === "f")!;
    expect(w.virtual).toBe(true);
    expect(w.positionMm).toBeLessThan(100);
  });
});

describe("facts of the trade (common practice)", () => {
  // HeNe laser, a diverging lens, an aperture of about 2 mm, a screen moved along the bench
  const setup = (screenMm: number): BenchDocument =>
    doc(
      { id: "neg", kind: "lens", positionMm: 100, focalLengthMm: -25 },
      { id: "ap", kind: "aperture", positionMm: 300, diameterMm: 2 },
      { id: "s", kind: "screen", positionMm: screenMm },
    );
  it("moving the screen changes the number of exposed zones", () => {
    const counts = [400, 600, 800, 1200, 2000].map((z) => analyzeBench(setup(z)).apertures[0].nearestZoneCount);
    expect(new Set(counts).size).toBe(counts.length);
    for (let i = 1; i < counts.length; i++) expect(counts[i]).toBeLessThan(counts[i - 1]); // farther screen, fewer zones
  });
  it("an odd zone count gives a bright centre, an even one a dark centre", () => {
    const found = findScreenPositions(setup(800), "ap", { fromMm: 400, toMm: 3000 });
    expect(found.bright.length).toBeGreaterThan(2);
    expect(found.dark.length).toBeGreaterThan(2);
    for (const c of found.bright) {
      const ap = analyzeBench(setup(c.positionMm)).apertures[0];
      expect(ap.nearestZoneCount % 2).toBe(1);
      expect(ap.centre).toBe("bright");
    }
    for (const c of found.dark) {
      const ap = analyzeBench(setup(c.positionMm)).apertures[0];
      expect(ap.nearestZoneCount % 2).toBe(0);
      expect(ap.centre).toBe("dark");
    }
  });
  it("with very many zones the centre tends to the unobstructed value: |ratio − 1| ≤ 2e^{−a} + e^{−2a}, a = R²/w² growing with N", () => {
    // Exact statement: opening the aperture (R ↑) raises N ∝ R² and a ∝ R² together, so the ratio → 1.
    // For a uniform wave (a → 0) it does not: it keeps swinging between 0 and 4 (mean 2 over a period of N).
    let prevBound = Infinity;
    for (const d of [2, 4, 8, 16, 24, 32]) {
      const ap = analyzeBench(doc(
        { id: "neg", kind: "lens", positionMm: 100, focalLengthMm: -25 },
        { id: "ap", kind: "aperture", positionMm: 300, diameterMm: d },
        { id: "s", kind: "screen", positionMm: 800 },
      )).apertures[0];
      const a = (d / 2 / ap.incident.radiusMm) ** 2;
      const bound = 2 * Math.exp(-a) + Math.exp(-2 * a);
      expect(Math.abs(ap.centreIntensityRatio - 1)).toBeLessThanOrEqual(bound + 1e-12);
      expect(bound).toBeLessThan(prevBound);
      prevBound = bound;
    }
    expect(prevBound).toBeLessThan(1e-3);
  });
});
