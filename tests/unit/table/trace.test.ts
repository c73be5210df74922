// The table tracer against geometry worked by hand: folds by 45° mirrors, a splitter's two arms, a window's ghosts,
// a miss beyond half the clear aperture, two lasers, a mirror ring. Reflection law d' = d − 2(d·n)n (Hecht, Optics,
// 5th ed., §4.3); shares per the bench document contract "The table in two dimensions"; Gaussian radius w(z) = w0·√(1 + (z/zR)²),
// zR = π·w0²/(M²·λ) (Siegman, Lasers, 1986, §17.1) — computed here by hand, not by the engine.
import { describe, expect, it } from "vitest";
import type { BenchDocumentV2, TableElement } from "@/lib/bench/schema-v2";
import { analyzeBench, MAX_GENERATIONS, MAX_PATHS, type TableAnalysis } from "@/lib/optics";

const table = { widthMm: 1200, depthMm: 900, holePitchMm: 25 };
const laser = (over: Partial<Extract<TableElement, { kind: "laser" }>> = {}): TableElement => ({
  id: "L", kind: "laser", xMm: 100, yMm: 100, angleDeg: 0, wavelengthNm: 632.8, powerMw: 10, beamDiameterMm: 1, ...over,
});
const doc = (elements: TableElement[]): BenchDocumentV2 => ({ version: 2, table, elements });
const path = (a: TableAnalysis, id: string) => {
  const p = a.paths.find((x) => x.id === id);
  if (!p) throw new Error(`no path ${id}`);
  return p;
};
const gaussianRadiusMm = (w0Mm: number, zMm: number, wavelengthNm: number, m2 = 1) => {
  const zR = (Math.PI * w0Mm * w0Mm) / (m2 * wavelengthNm * 1e-6);
  return w0Mm * Math.sqrt(1 + (zMm / zR) ** 2);
};

describe("fold by two 45° mirrors", () => {
  const d = doc([
    laser(),
    { id: "M1", kind: "mirror", xMm: 400, yMm: 100, angleDeg: 135 },
    { id: "M2", kind: "mirror", xMm: 400, yMm: 400, angleDeg: 315, reflectance: 0.95 },
    { id: "S", kind: "screen", xMm: 800, yMm: 400, angleDeg: 180 },
  ]);
  const a = analyzeBench(d);
  it("turns +x into +y into +x, each run starting on the mirror it leaves", () => {
    expect(a.paths.map((p) => p.id)).toEqual(["p1", "p2", "p3"]);
    expect(path(a, "p1")).toMatchObject({ parentPathId: null, startElementId: "L", elementIds: ["M1"], end: { continuesAs: ["p2"] }, directionDeg: 0 });
    expect(path(a, "p2")).toMatchObject({ parentPathId: "p1", startElementId: "M1", elementIds: ["M2"], end: { continuesAs: ["p3"] }, directionDeg: 90 });
    expect(path(a, "p3")).toMatchObject({ parentPathId: "p2", startElementId: "M2", elementIds: ["S"], end: { elementId: "S" }, directionDeg: 0 });
    expect(path(a, "p2").start.xMm).toBeCloseTo(400, 9);
    expect(path(a, "p2").start.yMm).toBeCloseTo(100, 9);
    expect(path(a, "p3").start.yMm).toBeCloseTo(400, 9);
  });
  it("carries R·P on (default 0.99, then 0.95) and the Gaussian along the unfolded 1000 mm", () => {
    expect(path(a, "p2").powerMw).toBeCloseTo(10 * 0.99, 9);
    expect(path(a, "p3").powerMw).toBeCloseTo(10 * 0.99 * 0.95, 9);
    const screen = a.elements.find((e) => e.id === "S");
    expect(screen?.pathId).toBe("p3");
    expect(screen?.positionMm).toBeCloseTo(300 + 300 + 400, 9);
    expect(screen?.incident.powerMw).toBeCloseTo(10 * 0.99 * 0.95, 9);
    expect(screen?.incident.radiusMm).toBeCloseTo(gaussianRadiusMm(0.5, 1000, 632.8), 9);
  });
  it("absorbs the missing share of a mirror (no run for it) and raises no unfolding artefacts", () => {
    expect(a.paths).toHaveLength(3);
    expect(a.warnings.filter((w) => w.code === "same-position")).toEqual([]);
  });
});

describe("a run starts where the axis meets the face, not at the element's centre", () => {
  it("a beam 5 mm off the centre of a 45° mirror leaves it 5 mm along the face", () => {
    const a = analyzeBench(doc([laser({ yMm: 105 }), { id: "M", kind: "mirror", xMm: 400, yMm: 100, angleDeg: 135 }]));
    // face line through (400, 100) with normal (−1, 1)/√2: y − 100 = x − 400, so y = 105 at x = 405
    expect(path(a, "p2").start.xMm).toBeCloseTo(405, 9);
    expect(path(a, "p2").start.yMm).toBeCloseTo(105, 9);
    expect(path(a, "p2").end).toEqual({ edge: { xMm: 405, yMm: 900 } });
  });
});

describe("a beam splitter's two arms", () => {
  const a = analyzeBench(
    doc([
      laser(),
      { id: "BS", kind: "beam-splitter", xMm: 300, yMm: 100, angleDeg: 135, reflectance: 0.3 },
      { id: "B", kind: "beam-block", xMm: 300, yMm: 500, angleDeg: 270 },
      { id: "S", kind: "screen", xMm: 700, yMm: 100, angleDeg: 180 },
    ]),
  );
  it("reflects R·P about the normal and sends (1 − R)·P straight on", () => {
    expect(path(a, "p1").end).toEqual({ continuesAs: ["p2", "p3"] });
    expect(path(a, "p2")).toMatchObject({ role: "reflected", directionDeg: 90, elementIds: ["B"], end: { elementId: "B" } });
    expect(path(a, "p3")).toMatchObject({ role: "transmitted", directionDeg: 0, elementIds: ["S"], end: { elementId: "S" } });
    expect(path(a, "p2").powerMw).toBeCloseTo(3, 9);
    expect(path(a, "p3").powerMw).toBeCloseTo(7, 9);
    expect(a.elements.find((e) => e.id === "B")?.incident.powerMw).toBeCloseTo(3, 9);
    expect(a.elements.find((e) => e.id === "S")?.incident.powerMw).toBeCloseTo(7, 9);
    expect(a.elements.find((e) => e.id === "BS")?.outgoingPowerMw).toBeCloseTo(10, 9);
  });
});

describe("a window's ghosts", () => {
  // normal at 170°: 10° incidence; the reflection law gives 2·170° − 0° + 180° = 520° ≡ 160°
  const a = analyzeBench(doc([laser(), { id: "W", kind: "window", xMm: 400, yMm: 100, angleDeg: 170 }, { id: "B", kind: "beam-block", xMm: 900, yMm: 100, angleDeg: 180 }]));
  it("transmits (1 − r)²·P and sends r·P and r(1 − r)²·P back about the normal", () => {
    const r = 0.04;
    expect(path(a, "p1").end).toEqual({ continuesAs: ["p2", "p3", "p4"] });
    expect(path(a, "p2")).toMatchObject({ role: "transmitted", directionDeg: 0, end: { elementId: "B" } });
    expect(path(a, "p3")).toMatchObject({ role: "front-ghost", startElementId: "W" });
    expect(path(a, "p4")).toMatchObject({ role: "rear-ghost", startElementId: "W" });
    expect(path(a, "p3").directionDeg).toBeCloseTo(160, 9);
    expect(path(a, "p4").directionDeg).toBeCloseTo(160, 9);
    expect(path(a, "p2").powerMw).toBeCloseTo(10 * (1 - r) ** 2, 9);
    expect(path(a, "p3").powerMw).toBeCloseTo(10 * r, 9);
    expect(path(a, "p4").powerMw).toBeCloseTo(10 * r * (1 - r) ** 2, 9);
    // the ghost heads up and left from (400, 100): it leaves the left edge x = 0 at y = 100 + 400·tan 20°
    const end = path(a, "p3").end as { edge: { xMm: number; yMm: number } };
    expect(end.edge.xMm).toBeCloseTo(0, 9);
    expect(end.edge.yMm).toBeCloseTo(100 + 400 * Math.tan((20 * Math.PI) / 180), 6);
  });
  it("takes the given reflectance per surface", () => {
    const b = analyzeBench(doc([laser(), { id: "W", kind: "window", xMm: 400, yMm: 100, angleDeg: 170, reflectancePerSurface: 0.1 }]));
    expect(path(b, "p3").powerMw).toBeCloseTo(1, 9);
    expect(path(b, "p4").powerMw).toBeCloseTo(10 * 0.1 * 0.81, 9);
  });
});

describe("the clear aperture", () => {
  const screenAt = (yMm: number, clearApertureMm?: number) =>
    analyzeBench(doc([laser(), { id: "S", kind: "screen", xMm: 600, yMm, angleDeg: 180, ...(clearApertureMm === undefined ? {} : { clearApertureMm }) }]));
  it("an axis 13 mm from the centre misses a 25.4 mm face (more than half of it) and the beam leaves the table", () => {
    const a = screenAt(113);
    expect(path(a, "p1").elementIds).toEqual([]);
    expect(path(a, "p1").end).toEqual({ edge: { xMm: 1200, yMm: 100 } });
    expect(a.warnings.some((w) => w.code === "element-not-reached" && w.elementId === "S")).toBe(true);
    expect(a.warnings.some((w) => w.code === "laser-aimed-off-table" && w.elementId === "L")).toBe(true);
  });
  it("12.6 mm from the centre is still on the face", () => {
    expect(path(screenAt(112.6), "p1").end).toEqual({ elementId: "S" });
  });
  it("a 30 mm clear aperture catches the axis 13 mm off", () => {
    expect(path(screenAt(113, 30), "p1").end).toEqual({ elementId: "S" });
  });
  it("a beam running along a face does not meet it", () => {
    const a = analyzeBench(doc([laser(), { id: "S", kind: "screen", xMm: 600, yMm: 100, angleDeg: 90 }]));
    expect(path(a, "p1").elementIds).toEqual([]);
  });
});

describe("two lasers on one table", () => {
  it("traces each laser's own paths", () => {
    const a = analyzeBench(
      doc([
        laser({ id: "red" }),
        laser({ id: "green", xMm: 100, yMm: 600, wavelengthNm: 532, powerMw: 50 }),
        { id: "B1", kind: "beam-block", xMm: 900, yMm: 100, angleDeg: 180 },
        { id: "M", kind: "mirror", xMm: 500, yMm: 600, angleDeg: 225 },
        { id: "B2", kind: "beam-block", xMm: 500, yMm: 300, angleDeg: 90 },
      ]),
    );
    expect(a.lasers.map((l) => l.id)).toEqual(["green", "red"]);
    const byLaser = (id: string) => a.paths.filter((p) => p.laserId === id).map((p) => p.end);
    expect(byLaser("red")).toEqual([{ elementId: "B1" }]);
    expect(byLaser("green")).toEqual([{ continuesAs: [expect.any(String)] }, { elementId: "B2" }]);
    expect(a.elements.find((e) => e.id === "B2")?.incident.powerMw).toBeCloseTo(50 * 0.99, 9);
    expect(a.elements.find((e) => e.id === "B1")?.incident.powerMw).toBeCloseTo(10, 9);
  });
});

describe("a ring of mirrors", () => {
  it("stops after 64 generations with a warning naming a mirror", () => {
    // laser inside a square of perfect mirrors: +x → M1 → +y → M2 → −x → M3 → −y → M4 → +x → M1 …
    const a = analyzeBench(
      doc([
        laser({ xMm: 300, yMm: 100 }),
        { id: "M1", kind: "mirror", xMm: 500, yMm: 100, angleDeg: 135, reflectance: 1 },
        { id: "M2", kind: "mirror", xMm: 500, yMm: 500, angleDeg: 225, reflectance: 1 },
        { id: "M3", kind: "mirror", xMm: 200, yMm: 500, angleDeg: 315, reflectance: 1 },
        { id: "M4", kind: "mirror", xMm: 200, yMm: 100, angleDeg: 45, reflectance: 1 },
      ]),
    );
    expect(a.paths).toHaveLength(MAX_GENERATIONS + 1);
    const last = a.paths[a.paths.length - 1];
    expect(last.cut).toBe("generations");
    expect(last.end).toEqual({ continuesAs: [] });
    const w = a.warnings.find((x) => x.code === "trace-generation-limit");
    expect(w?.elementId).toMatch(/^M[1-4]$/);
    expect(w?.message).toContain("64");
    // unfolded: 200 mm to M1, then runs of 400 (odd generations) and 300 mm (even): 200 + 32·400 + 31·300 before generation 64
    expect(last.generation).toBe(MAX_GENERATIONS);
    expect(last.startLengthMm).toBeCloseTo(200 + 32 * 400 + 31 * 300, 6);
  });
  it("stops a lossy ring once a run falls below 1e-6 of the laser's power", () => {
    const a = analyzeBench(
      doc([
        laser({ xMm: 300, yMm: 100 }),
        { id: "M1", kind: "mirror", xMm: 500, yMm: 100, angleDeg: 135, reflectance: 0.5 },
        { id: "M2", kind: "mirror", xMm: 500, yMm: 500, angleDeg: 225, reflectance: 0.5 },
        { id: "M3", kind: "mirror", xMm: 200, yMm: 500, angleDeg: 315, reflectance: 0.5 },
        { id: "M4", kind: "mirror", xMm: 200, yMm: 100, angleDeg: 45, reflectance: 0.5 },
      ]),
    );
    // 0.5^19 ≈ 1.9e-6 is followed, 0.5^20 ≈ 9.5e-7 is not: 20 runs
    expect(a.paths).toHaveLength(20);
    expect(a.paths[19].cut).toBe("power");
    expect(a.warnings.some((w) => w.code === "trace-power-limit")).toBe(true);
  });
});

describe("a grid of splitters", () => {
  it(`stops at ${MAX_PATHS} beam segments with a warning instead of branching on`, () => {
    // 8 × 8 splitters at 45°: every run goes +x or +y and splits at the next one, so runs multiply like lattice paths
    const grid: TableElement[] = [laser({ xMm: 20, yMm: 100 })];
    for (let i = 0; i < 8; i++) for (let j = 0; j < 8; j++) grid.push({ id: `s${i}-${j}`, kind: "beam-splitter", xMm: 100 + 100 * i, yMm: 100 + 100 * j, angleDeg: 135, reflectance: 0.5 });
    const a = analyzeBench(doc(grid));
    expect(a.paths.length).toBe(MAX_PATHS);
    expect(a.paths.some((p) => p.cut === "path-limit")).toBe(true);
    expect(a.warnings.some((w) => w.code === "trace-path-limit")).toBe(true);
  });
});
