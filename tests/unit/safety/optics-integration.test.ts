// Integration-style unit test: the optics engine's analyzeBench output fed straight into assessBench.
// Checks against Gaussian-beam formulas (Siegman, Lasers, ch. 17) and the bench document contract's OD rule.
import { describe, expect, it } from "vitest";
import type { BenchDocument } from "@/lib/bench/schema";
import { analyzeBench } from "@/lib/optics";
import { assessBench } from "@/lib/safety";

describe("analyzeBench → assessBench", () => {
  const doc: BenchDocument = {
    version: 1,
    elements: [
      { id: "L", kind: "laser", positionMm: 0, wavelengthNm: 532, powerMw: 50, beamDiameterMm: 20 },
      { id: "F", kind: "filter", positionMm: 50, opticalDensity: 1 },
      { id: "lens", kind: "lens", positionMm: 100, focalLengthMm: 200 },
      { id: "S", kind: "screen", positionMm: 600 },
    ],
  };

  it("accepts the optics engine's elements as they are and finds the focus between lens and screen", () => {
    const r = assessBench(doc, analyzeBench(doc));
    // At the laser: 0.2173 of 50 mW in 7 mm → OD 1.045 (bench.test.ts); after OD 1 the focus passes all 5 mW → OD 0.7079
    expect(r.points.find((p) => p.elementId === "L")?.opticalDensityRaw).toBeCloseTo(1.045, 3);
    expect(r.governing?.elementId).toBe("L");
    const focus = r.points.find((p) => p.where === "focus");
    expect(focus?.positionMm).toBeCloseTo(300, 0);
    expect(focus?.opticalDensityRaw).toBeCloseTo(0.7079, 3);
    expect(r.openBeamEnd).toBeNull();
    expect(r.screenHazards.map((s) => s.elementId)).toEqual(["S"]);
  });

  it("without the filter the focus governs", () => {
    const noFilter: BenchDocument = { ...doc, elements: doc.elements.filter((e) => e.id !== "F") };
    const r = assessBench(noFilter, analyzeBench(noFilter));
    expect(r.governing?.where).toBe("focus");
    expect(r.governing?.opticalDensityRaw).toBeCloseTo(1.7079, 3);
  });
});
