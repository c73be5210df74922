// Version 1 documents keep their answers and their content hash; the same bench laid on a table as a straight run along +x
// gives the same figures through the tracer and the unfolding (an independent route to the same numbers).
import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { canonicalJson, contentHash } from "@/lib/bench/canonical";
import type { BenchDocument } from "@/lib/bench/schema";
import { anyBenchDocumentSchema, tableFromRail } from "@/lib/bench/schema-v2";
import { analyzeBench, analyzeRail } from "@/lib/optics";
import { analyzeBench as analyzeBenchDirect } from "@/lib/optics/analyze";
import { assessBench, assessRail } from "@/lib/safety";

const rail: BenchDocument = {
  version: 1,
  title: "Two-lens telescope and an iris",
  elements: [
    { id: "screen", kind: "screen", positionMm: 1400 },
    { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 5, beamDiameterMm: 0.8 },
    { id: "l1", kind: "lens", positionMm: 100, focalLengthMm: -25 },
    { id: "nd", kind: "filter", positionMm: 150, opticalDensity: 0.3 },
    { id: "l2", kind: "lens", positionMm: 200, focalLengthMm: 100 },
    { id: "iris", kind: "aperture", positionMm: 400, diameterMm: 2 },
  ],
};

describe("version 1 documents", () => {
  it("parse through the either-version schema unchanged", () => {
    const parsed = anyBenchDocumentSchema.parse(rail);
    expect(parsed).toEqual(rail);
  });
  it("give exactly the rail engine's answer through the dispatching analyzeBench and assessBench", () => {
    const a = analyzeBench(rail);
    expect(a).toEqual(analyzeBenchDirect(rail));
    expect(a).toEqual(analyzeRail(rail));
    expect(assessBench(rail, a)).toEqual(assessRail(rail, a));
  });
  it("keep their content hash: SHA-256 of keys sorted, elements by position then id", () => {
    // written out by hand in the canonical form the stored revisions were hashed with
    const expected =
      '{"elements":[' +
      '{"beamDiameterMm":0.8,"id":"laser","kind":"laser","positionMm":0,"powerMw":5,"wavelengthNm":632.8},' +
      '{"focalLengthMm":-25,"id":"l1","kind":"lens","positionMm":100},' +
      '{"id":"nd","kind":"filter","opticalDensity":0.3,"positionMm":150},' +
      '{"focalLengthMm":100,"id":"l2","kind":"lens","positionMm":200},' +
      '{"diameterMm":2,"id":"iris","kind":"aperture","positionMm":400},' +
      '{"id":"screen","kind":"screen","positionMm":1400}],' +
      '"title":"Two-lens telescope and an iris","version":1}';
    expect(canonicalJson(rail)).toBe(expected);
    expect(contentHash(rail)).toBe(createHash("sha256").update(expected).digest("hex"));
  });
});

describe("the same bench as a straight run on a table", () => {
  const v1 = analyzeBench(rail);
  const table = tableFromRail(rail, { yMm: 50 });
  const v2 = analyzeBench(table);
  it("is one path from the laser to the screen with every element in beam order", () => {
    expect(v2.paths).toHaveLength(1);
    expect(v2.paths[0].elementIds).toEqual(["l1", "nd", "l2", "iris", "screen"]);
    expect(v2.paths[0].end).toEqual({ elementId: "screen" });
  });
  it("gives every element the incident beam of the rail engine", () => {
    for (const e of v1.elements) {
      const t = v2.elements.find((x) => x.id === e.id);
      expect(t, e.id).toBeDefined();
      expect(t?.positionMm).toBeCloseTo(e.positionMm, 9);
      expect(t?.incident.radiusMm).toBeCloseTo(e.incident.radiusMm, 9);
      expect(t?.incident.powerMw).toBeCloseTo(e.incident.powerMw, 9);
      if (e.incident.wavefrontRadiusMm === null) expect(t?.incident.wavefrontRadiusMm).toBeNull();
      else expect(t?.incident.wavefrontRadiusMm).toBeCloseTo(e.incident.wavefrontRadiusMm, 6);
    }
  });
  it("gives the aperture the same Fresnel analysis, with its path and screen", () => {
    expect(v2.apertures).toHaveLength(1);
    const [a] = v2.apertures;
    const [b] = v1.apertures;
    expect(a.pathId).toBe("p1");
    expect(a.screenId).toBe("screen");
    expect(a.fresnelNumber).toBeCloseTo(b.fresnelNumber, 9);
    expect(a.centreIntensityRatio).toBeCloseTo(b.centreIntensityRatio, 9);
    expect(a.centre).toBe(b.centre);
    expect(a.observationDistanceMm).toBeCloseTo(b.observationDistanceMm as number, 9);
  });
  it("names the real elements in its warnings, never the unfolded stand-ins", () => {
    for (const w of v2.warnings) expect(w.message).not.toMatch(/⟨/);
    const v1Codes = new Set(v1.warnings.map((w) => w.code));
    for (const w of v2.warnings.filter((x) => x.code !== "element-not-reached")) expect(v1Codes.has(w.code as never), w.code).toBe(true);
  });
  it("has a content hash of its own, independent of element order", () => {
    const shuffled = { ...table, elements: [...table.elements].reverse() };
    expect(contentHash(shuffled)).toBe(contentHash(table));
    expect(contentHash(table)).not.toBe(contentHash(rail));
  });
});
