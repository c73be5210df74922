// The table's hazard figures behind a clipping iris come from the propagated field, as the rail's do (the bench document
// contract revision 2: E behind a clipping aperture from the propagated field, never a rescaled Gaussian), and the
// table analysis shares the field chains of its leaves' common beginnings without changing any answer.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import type { BenchDocument } from "@/lib/bench/schema";
import type { BenchDocumentV2, TableElement } from "@/lib/bench/schema-v2";
import { analyzeBench, analyzeRail, ChainPrefixCache, fieldPowerProbe, unfoldPath } from "@/lib/optics";
import { FieldChain } from "@/lib/optics/chain";
import { qAtWaist } from "@/lib/optics/gaussian";
import { assessBench } from "@/lib/safety";

const seed = process.env.FC_SEED === "random" ? undefined : 20261202;

/** A 2 W, 532 nm beam expanded 4× onto a 4 mm iris (it clips hard), a 7 mm-ish pupil downstream, a block at the end. */
const rail: BenchDocument = {
  version: 1,
  elements: [
    { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: 532, powerMw: 2000, beamDiameterMm: 2 },
    { id: "l1", kind: "lens", positionMm: 100, focalLengthMm: -50 },
    { id: "l2", kind: "lens", positionMm: 250, focalLengthMm: 200 },
    { id: "iris", kind: "aperture", positionMm: 400, diameterMm: 4 },
    { id: "f", kind: "filter", positionMm: 900, opticalDensity: 0.3 },
    { id: "block", kind: "beam-block", positionMm: 1400 },
  ],
};
/** The same along +x on a table. */
const table: BenchDocumentV2 = {
  version: 2,
  table: { widthMm: 2000, depthMm: 600, holePitchMm: 25 },
  elements: rail.elements.map((e): TableElement => {
    const { positionMm, ...rest } = e;
    return { ...rest, xMm: 100 + positionMm, yMm: 300, angleDeg: e.kind === "laser" ? 0 : 180 } as TableElement;
  }),
};

describe("table hazard figures behind a clipping iris", () => {
  it("match the rail's (which integrate the propagated field) and exceed the rescaled Gaussian's", () => {
    const railAnalysis = analyzeRail(rail);
    const withField = assessBench(rail, { elements: railAnalysis.elements, enclosedPowerMw: fieldPowerProbe(rail) });
    const gaussianOnly = assessBench(rail, { elements: railAnalysis.elements });
    const analysis = analyzeBench(table);
    expect(typeof analysis.fieldPower).toBe("function");
    expect(Object.keys(analysis)).not.toContain("fieldPower"); // not part of the JSON answer
    const t = assessBench(table, analysis);
    for (const id of ["f", "block"]) {
      const r = withField.points.find((p) => p.elementId === id && p.where === "element")!;
      const g = gaussianOnly.points.find((p) => p.elementId === id && p.where === "element")!;
      const tp = t.points.find((p) => p.elementId === id && p.where === "element")!;
      // never below the rail's field figure; the table integrates the same field (or a bound ≤ 1 % above it)
      expect(tp.opticalDensityRaw!).toBeGreaterThanOrEqual(r.opticalDensityRaw! - 1e-9);
      expect(tp.opticalDensityRaw!).toBeLessThanOrEqual(r.opticalDensityRaw! + Math.log10(1.011));
      // the diffracted beam puts more power into the pupil than a rescaled Gaussian
      expect(r.opticalDensityRaw!).toBeGreaterThan(g.opticalDensityRaw! + 0.05);
    }
    expect(t.notes.join(" ")).not.toMatch(/wholly inside the limiting aperture/);
  });

  it("without the field (an analysis read back from JSON), take all the light behind the iris as inside the limiting aperture, and say so", () => {
    const analysis = JSON.parse(JSON.stringify(analyzeBench(table)));
    const t = assessBench(table, analysis);
    const withField = assessBench(table, analyzeBench(table));
    const block = (a: typeof t) => a.points.find((p) => p.elementId === "block" && p.where === "element")!.opticalDensityRaw!;
    expect(block(t)).toBeGreaterThanOrEqual(block(withField));
    expect(t.notes.join(" ")).toMatch(/wholly inside the limiting aperture .* the cautious reading/);
  });
});

describe("shared beginnings of field chains", () => {
  it("property: a chain built from the cache gives the same numbers as one built alone", () => {
    const λ = 633e-9;
    fc.assert(
      fc.property(
        fc.array(fc.record({ kind: fc.constantFrom("lens", "aperture", "filter"), gap: fc.double({ min: 20, max: 300, noNaN: true }), value: fc.double({ min: 1, max: 8, noNaN: true }) }), { minLength: 2, maxLength: 7 }),
        fc.integer({ min: 1, max: 6 }),
        (spec, cut) => {
          let pos = 0;
          const elements = spec.map((s, i) => {
            pos += s.gap;
            if (s.kind === "lens") return { id: `e${i}`, kind: "lens" as const, positionMm: pos, focalLengthMm: s.value * 40 };
            if (s.kind === "aperture") return { id: `e${i}`, kind: "aperture" as const, positionMm: pos, diameterMm: s.value };
            return { id: `e${i}`, kind: "filter" as const, positionMm: pos, opticalDensity: s.value / 10 };
          });
          const start = { positionMm: 0, q: qAtWaist(1e-3, λ), powerMw: 10 };
          const cache = new ChainPrefixCache();
          // another chain sharing the first `cut` elements fills the cache first
          new FieldChain(start, [...elements.slice(0, cut), { id: "other", kind: "screen", positionMm: pos + 500 }], λ, 1, { prefixCache: cache });
          const full = [...elements, { id: "screen", kind: "screen" as const, positionMm: pos + 400 }];
          const alone = new FieldChain(start, full, λ, 1);
          const shared = new FieldChain(start, full, λ, 1, { prefixCache: cache });
          expect(shared.results).toEqual(alone.results);
          expect(shared.planes).toEqual(alone.planes);
          const last = full.length - 1;
          expect(shared.screenIntensity(last, [0, 1e-3])?.values).toEqual(alone.screenIntensity(last, [0, 1e-3])?.values);
          expect(shared.powerInsideMw(pos + 100, 3.5e-3)).toEqual(alone.powerInsideMw(pos + 100, 3.5e-3));
        },
      ),
      { seed, numRuns: 60 },
    );
  });

  it("a table analysed with shared chains gives the same answer as each leaf analysed on its own", () => {
    const elements: TableElement[] = [
      { id: "laser", kind: "laser", xMm: 50, yMm: 300, angleDeg: 0, wavelengthNm: 633, powerMw: 5, beamDiameterMm: 1 },
      { id: "iris", kind: "aperture", xMm: 200, yMm: 300, angleDeg: 180, diameterMm: 1.2 },
      { id: "bs", kind: "beam-splitter", xMm: 400, yMm: 300, angleDeg: 135, reflectance: 0.3 },
      { id: "lens", kind: "lens", xMm: 600, yMm: 300, angleDeg: 180, focalLengthMm: 200 },
      { id: "screen", kind: "screen", xMm: 1000, yMm: 300, angleDeg: 180 },
      { id: "iris2", kind: "aperture", xMm: 400, yMm: 450, angleDeg: 270, diameterMm: 1 },
      { id: "screen2", kind: "screen", xMm: 400, yMm: 800, angleDeg: 270 },
    ];
    const doc: BenchDocumentV2 = { version: 2, table: { widthMm: 1200, depthMm: 900, holePitchMm: 25 }, elements };
    const analysis = analyzeBench(doc);
    expect(analysis.apertures.length).toBeGreaterThanOrEqual(2);
    const byId = new Map(doc.elements.map((e) => [e.id, e]));
    const paths = new Map(analysis.paths.map((p) => [p.id, p]));
    const leaves = analysis.paths.filter((p) => !("continuesAs" in p.end) || p.end.continuesAs.length === 0);
    expect(leaves.length).toBeGreaterThanOrEqual(2);
    const cache = new ChainPrefixCache();
    const sharedRuns = leaves.map((leaf) => analyzeRail(unfoldPath(doc, byId, paths, leaf.id).doc, { chainCache: cache }));
    leaves.forEach((leaf, i) => {
      const alone = analyzeRail(unfoldPath(doc, byId, paths, leaf.id).doc);
      expect(JSON.stringify(sharedRuns[i])).toBe(JSON.stringify(alone));
    });
  });

  it("what an earlier leaf already gave is not worked out again, and every figure is the one its leaf gives in full", () => {
    // a clipping iris before a split, screens on both arms, a block behind a lens on one: each leaf run in full is the reference
    const elements: TableElement[] = [
      { id: "laser", kind: "laser", xMm: 50, yMm: 300, angleDeg: 0, wavelengthNm: 532, powerMw: 500, beamDiameterMm: 2 },
      { id: "iris", kind: "aperture", xMm: 200, yMm: 300, angleDeg: 180, diameterMm: 2.2 },
      { id: "lens", kind: "lens", xMm: 300, yMm: 300, angleDeg: 180, focalLengthMm: 150 },
      { id: "bs", kind: "beam-splitter", xMm: 500, yMm: 300, angleDeg: 135, reflectance: 0.4 },
      { id: "iris2", kind: "aperture", xMm: 800, yMm: 300, angleDeg: 180, diameterMm: 3 },
      { id: "screen", kind: "screen", xMm: 1100, yMm: 300, angleDeg: 180 },
      { id: "screen2", kind: "screen", xMm: 500, yMm: 800, angleDeg: 270 },
    ];
    const doc: BenchDocumentV2 = { version: 2, table: { widthMm: 1200, depthMm: 900, holePitchMm: 25 }, elements };
    const analysis = analyzeBench(doc);
    const safety = assessBench(doc, analysis);
    const byId = new Map(doc.elements.map((e) => [e.id, e]));
    const paths = new Map(analysis.paths.map((p) => [p.id, p]));
    const leaves = analysis.paths.filter((p) => !("continuesAs" in p.end) || p.end.continuesAs.length === 0);
    const seenApertures = new Set<string>();
    const seenPoints = new Set<string>();
    let checkedApertures = 0;
    let checkedPoints = 0;
    for (const leaf of leaves) {
      const chain = unfoldPath(doc, byId, paths, leaf.id);
      const full = analyzeRail(chain.doc);
      for (const a of full.apertures) {
        const o = chain.origin.get(a.id)!;
        const screenId = a.screenId === null ? null : chain.origin.get(a.screenId)!.elementId;
        const key = `${o.pathId}|${o.elementId}|${screenId}`;
        if (seenApertures.has(key)) continue;
        seenApertures.add(key);
        const mine = analysis.apertures.find((x) => x.pathId === o.pathId && x.id === o.elementId && x.screenId === screenId)!;
        expect(mine.centreIntensityRatio).toBe(a.centreIntensityRatio);
        expect(mine.transmittedFraction).toBe(a.transmittedFraction);
        expect(mine.fresnelNumber).toBe(a.fresnelNumber);
        checkedApertures++;
      }
      const railSafety = assessBench(chain.doc, { elements: full.elements, enclosedPowerMw: fieldPowerProbe(chain.doc) });
      for (const p of railSafety.points) {
        const o = chain.origin.get(p.elementId)!;
        if (o.role === "edge" || o.role === "laser" || p.where !== "element") continue;
        const key = `${o.pathId}|${o.elementId}`;
        if (seenPoints.has(key)) continue;
        seenPoints.add(key);
        const mine = safety.points.find((x) => x.pathId === o.pathId && x.elementId === o.elementId && x.where === "element")!;
        expect(mine.opticalDensityRaw).toBeCloseTo(p.opticalDensityRaw!, 12);
        expect(mine.averagedIrradianceWPerCm2).toBeCloseTo(p.averagedIrradianceWPerCm2, 12);
        checkedPoints++;
      }
    }
    expect(checkedApertures).toBe(3); // the iris once per screen its light reaches, iris2 once
    expect(checkedPoints).toBeGreaterThanOrEqual(6);
  });
});
