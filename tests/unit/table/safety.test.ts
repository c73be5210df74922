// Safety on the table plan: open beams at the edge with their irradiance checked by hand, per-laser and per-line figures.
// E over the limiting aperture = P·(1 − exp(−2r²/w²))/(π r²) (the bench document contract; ANSI Z136.1-2014 limiting aperture 7 mm for
// 400–1400 nm, Table 8); w(z) = w0·√(1 + (z/zR)²), zR = π w0²/λ (Siegman, Lasers, 1986, §17.1); the class and MPE of each
// line are compared with assessBeam called on that line alone.
import { describe, expect, it } from "vitest";
import type { BenchDocumentV2, TableElement } from "@/lib/bench/schema-v2";
import { analyzeBench } from "@/lib/optics";
import { assessBeam, assessBench, HAZARD_CLASSES } from "@/lib/safety";

const classRank = (c: string) => HAZARD_CLASSES.indexOf(c as (typeof HAZARD_CLASSES)[number]);

const table = { widthMm: 1000, depthMm: 600, holePitchMm: 25 };
const doc = (elements: TableElement[]): BenchDocumentV2 => ({ version: 2, table, elements });
const green: TableElement = { id: "G", kind: "laser", xMm: 100, yMm: 100, angleDeg: 0, wavelengthNm: 532, powerMw: 20, beamDiameterMm: 1 };
const splitTable = (withBlock: boolean) =>
  doc([
    green,
    { id: "BS", kind: "beam-splitter", xMm: 400, yMm: 100, angleDeg: 135, reflectance: 0.5 },
    { id: "S", kind: "screen", xMm: 800, yMm: 100, angleDeg: 180 },
    ...(withBlock ? [{ id: "B", kind: "beam-block", xMm: 400, yMm: 500, angleDeg: 270 } as TableElement] : []),
  ]);

describe("open beams", () => {
  it("names the splitter port that leaves the table, where, and whether it exceeds the MPE (checked by hand)", () => {
    const d = splitTable(false);
    const s = assessBench(d, analyzeBench(d));
    expect(s.openBeams).toHaveLength(1);
    const [open] = s.openBeams;
    expect(open).toMatchObject({ pathId: "p2", laserId: "G", startElementId: "BS", role: "reflected", directionDeg: 90 });
    expect(open.xMm).toBeCloseTo(400, 9);
    expect(open.yMm).toBeCloseTo(600, 9);
    // by hand: 300 mm to the splitter + 500 mm to the edge; 10 mW; 7 mm aperture
    const zR = (Math.PI * 0.5 * 0.5) / (532e-6);
    const w = 0.5 * Math.sqrt(1 + (800 / zR) ** 2);
    expect(open.powerMw).toBeCloseTo(10, 9);
    const r = 0.35; // cm
    const eWPerCm2 = (0.01 * (1 - Math.exp((-2 * 3.5 * 3.5) / (w * w)))) / (Math.PI * r * r);
    const mpe = assessBeam({ wavelengthNm: 532, powerMw: 20, beamDiameterMm: 1, divergenceMrad: 1 }).mpeWPerCm2 as number;
    expect(open.exceedsMpe).toBe(eWPerCm2 > mpe);
    expect(open.exceedsMpe).toBe(true);
    expect(open.opticalDensityRequired).toBeCloseTo(Math.log10(eWPerCm2 / mpe), 6);
    expect(open.nohdM).toBeGreaterThan(0);
    const w1 = s.warnings.find((x) => x.code === "open-beam");
    expect(w1?.elementId).toBe("BS");
    expect(w1?.message).toContain("beam splitter");
    expect(w1?.message).toContain("heading 90°");
  });
  it("clears once a beam block stands in the port", () => {
    const d = splitTable(true);
    const s = assessBench(d, analyzeBench(d));
    expect(s.openBeams).toEqual([]);
    expect(s.warnings.some((w) => w.code.startsWith("open-beam"))).toBe(false);
  });
  it("says a weak ghost that leaves the table is below the MPE", () => {
    const d = doc([
      { ...green, powerMw: 1 } as TableElement,
      { id: "W", kind: "window", xMm: 400, yMm: 100, angleDeg: 170 },
      { id: "B", kind: "beam-block", xMm: 900, yMm: 100, angleDeg: 180 },
    ]);
    const s = assessBench(d, analyzeBench(d));
    expect(s.openBeams.map((o) => o.role)).toEqual(["front-ghost", "rear-ghost"]);
    // 0.04 mW at most, below the visible MPE over 7 mm (≈ 1 mW)
    for (const o of s.openBeams) expect(o.exceedsMpe).toBe(false);
  });
});

describe("every laser, every line", () => {
  it("assesses each line with assessBeam and takes the most hazardous class", () => {
    const d = doc([
      { id: "pump", kind: "laser", xMm: 100, yMm: 300, angleDeg: 0, wavelengthNm: 1064, powerMw: 0.2, beamDiameterMm: 2, lines: [{ wavelengthNm: 532, powerMw: 30 }] },
      { ...green, powerMw: 0.5 } as TableElement,
      { id: "B1", kind: "beam-block", xMm: 900, yMm: 300, angleDeg: 180 },
      { id: "B2", kind: "beam-block", xMm: 900, yMm: 100, angleDeg: 180 },
    ]);
    const s = assessBench(d, analyzeBench(d));
    expect(s.lasers.map((l) => l.laserId)).toEqual(["G", "pump"]);
    const pump = s.lasers[1];
    expect(pump.lines.map((l) => l.wavelengthNm)).toEqual([1064, 532]);
    // a further line shares the main beam's size; its divergence is that of its own wavelength: 2M²λ/(π w0)
    const alone532 = assessBeam({ wavelengthNm: 532, powerMw: 30, beamDiameterMm: 2, divergenceMrad: ((2 * 532e-6) / (Math.PI * 1)) * 1000 });
    const alone1064 = assessBeam({ wavelengthNm: 1064, powerMw: 0.2, beamDiameterMm: 2, divergenceMrad: ((2 * 1064e-6) / (Math.PI * 1)) * 1000 });
    expect(pump.lines[0].hazardClass).toBe(alone1064.hazardClass);
    expect(pump.lines[0].mpeWPerCm2).toBeCloseTo(alone1064.mpeWPerCm2 as number, 12);
    expect(pump.lines[1].hazardClass).toBe(alone532.hazardClass);
    expect(pump.lines[1].mpeWPerCm2).toBeCloseTo(alone532.mpeWPerCm2 as number, 12);
    const worst = classRank(alone532.hazardClass) > classRank(alone1064.hazardClass) ? alone532.hazardClass : alone1064.hazardClass;
    expect(pump.hazardClass).toBe(worst);
    expect(s.openBeams).toEqual([]);
    expect(s.finalSay).toMatch(/laser safety officer/);
  });
});
