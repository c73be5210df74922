// The beam drawn by hazard: OD bands (under 1, 1 to under 3, 3 or more) and the stretches of beam between the
// safety engine's points (the bench document contract: OD = log10(E/MPE) at every element; a filter transmits 10^−OD).
import { describe, expect, it } from "vitest";
import type { BenchDocument } from "@/lib/bench/schema";
import { analyzeBench } from "@/lib/optics";
import { assessBench, type HazardPoint } from "@/lib/safety";
import { HAZARD_BANDS, bandFor, envelopeSlice, hazardSegments } from "@/components/editor/hazard-bands";

const point = (elementId: string, kind: string, positionMm: number, od: number | null, where: HazardPoint["where"] = "element"): HazardPoint => ({
  elementId,
  kind,
  where,
  positionMm,
  powerMw: od === null ? 0 : 1,
  radiusMm: 1,
  peakIrradianceWPerCm2: 0,
  averagedIrradianceWPerCm2: 0,
  opticalDensityRaw: od,
  opticalDensityRequired: od === null ? 0 : Math.max(0, od),
});

const doc = (elements: BenchDocument["elements"]): BenchDocument => ({ version: 1, elements });

describe("bands", () => {
  it("are three, named in words, each with a pattern besides its colour", () => {
    expect(HAZARD_BANDS.map((b) => b.words)).toEqual(["OD under 1", "OD 1 to under 3", "OD 3 or more"]);
    for (const b of HAZARD_BANDS) expect(b.pattern.length).toBeGreaterThan(5);
  });

  it.each([
    [0, "low"],
    [0.99, "low"],
    [1, "medium"],
    [2.999, "medium"],
    [3, "high"],
    [7.2, "high"],
  ])("OD %s is %s", (od, band) => expect(bandFor(od).id).toBe(band));
});

describe("stretches of beam", () => {
  it("each stretch takes the higher OD of its ends (the focus between 100 and 300 mm governs both sides); a filter takes its own OD off what leaves it", () => {
    const d = doc([
      { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 532, powerMw: 500, beamDiameterMm: 1 },
      { id: "lens-1", kind: "lens", positionMm: 100, focalLengthMm: 50 },
      { id: "filter-1", kind: "filter", positionMm: 300, opticalDensity: 2 },
      { id: "screen-1", kind: "screen", positionMm: 600 },
    ]);
    const points = [point("laser-1", "laser", 0, 3.2), point("lens-1", "lens", 100, 3.2), point("lens-1", "lens", 150, 3.4, "focus"), point("filter-1", "filter", 300, 3.2), point("screen-1", "screen", 600, 0.9)];
    const s = hazardSegments(points, d, 600);
    expect(s.map((x) => [x.fromMm, x.toMm, x.opticalDensity, x.band.id])).toEqual([
      [0, 100, 3.2, "high"],
      [100, 300, 3.4, "high"],
      [300, 600, 1.2000000000000002, "medium"],
    ]);
  });

  it("neighbouring stretches with the same OD read as one", () => {
    const d = doc([{ id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 633, powerMw: 1, beamDiameterMm: 1 }]);
    const s = hazardSegments([point("laser-1", "laser", 0, 0.5), point("iris-1", "aperture", 100, 0.5), point("screen-1", "screen", 200, 0.5)], d);
    expect(s.map((x) => [x.fromMm, x.toMm])).toEqual([[0, 200]]);
  });

  it("below the MPE (negative raw OD) counts as OD 0, in the lowest band", () => {
    const d = doc([]);
    const s = hazardSegments([point("laser-1", "laser", 0, -1.3), point("screen-1", "screen", 500, -2)], d);
    expect(s).toHaveLength(1);
    expect(s[0]).toMatchObject({ opticalDensity: 0, band: { id: "low" } });
  });

  it("stops at a screen or beam block, skips elements no light reaches, and runs past an open end to endMm", () => {
    const d = doc([]);
    const stopped = hazardSegments([point("laser-1", "laser", 0, 2), point("block-1", "beam-block", 300, 2), point("screen-1", "screen", 600, null)], d, 900);
    expect(stopped.map((x) => [x.fromMm, x.toMm])).toEqual([[0, 300]]);
    const open = hazardSegments([point("laser-1", "laser", 0, 2), point("lens-1", "lens", 300, 2.5)], d, 450);
    expect(open.map((x) => [x.fromMm, x.toMm, x.opticalDensity])).toEqual([[0, 450, 2.5]]);
    const dimmer = hazardSegments([point("laser-1", "laser", 0, 2), point("lens-1", "lens", 300, 1.5)], d, 450);
    expect(dimmer.map((x) => [x.fromMm, x.toMm, x.opticalDensity])).toEqual([
      [0, 300, 2],
      [300, 450, 1.5],
    ]);
  });

  it("follows the real engines: a 50 mW green beam needs eyewear until the OD 2 filter, not after it", () => {
    const d = doc([
      { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 532, powerMw: 50, beamDiameterMm: 1 },
      { id: "lens-1", kind: "lens", positionMm: 100, focalLengthMm: 100 },
      { id: "filter-1", kind: "filter", positionMm: 400, opticalDensity: 2 },
      { id: "iris-1", kind: "aperture", positionMm: 500, diameterMm: 2 },
      { id: "screen-1", kind: "screen", positionMm: 900 },
    ]);
    const analysis = analyzeBench(d);
    const safety = assessBench(d, analysis);
    const s = hazardSegments(safety.points, d, analysis.envelope.at(-1)!.positionMm);
    expect(s[0].fromMm).toBe(0);
    expect(s.at(-1)!.toMm).toBe(900);
    const before = s.filter((x) => x.toMm <= 400);
    const after = s.filter((x) => x.fromMm >= 400);
    expect(before.every((x) => x.band.id === "medium")).toBe(true);
    expect(after.every((x) => x.band.id === "low")).toBe(true);
    // the governing OD shows on the drawing
    expect(Math.max(...s.map((x) => x.opticalDensity))).toBeCloseTo(safety.governing!.opticalDensityRequired, 9);
  });
});

describe("envelope slice", () => {
  const env = [
    { positionMm: 0, radiusMm: 1 },
    { positionMm: 100, radiusMm: 2 },
    { positionMm: 200, radiusMm: 4 },
  ];
  it("interpolates the ends and keeps the samples in between", () => {
    expect(envelopeSlice(env, 50, 150)).toEqual([
      { positionMm: 50, radiusMm: 1.5 },
      { positionMm: 100, radiusMm: 2 },
      { positionMm: 150, radiusMm: 3 },
    ]);
  });
  it("leaves out ends that are off the envelope", () => {
    expect(envelopeSlice(env, 150, 300)).toEqual([
      { positionMm: 150, radiusMm: 3 },
      { positionMm: 200, radiusMm: 4 },
    ]);
  });
});
