// Property tests (fast-check) over documents the schema accepts: the bench document contract invariants and energy conservation.
import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { benchDocumentSchema, type BenchDocument, type BenchElement } from "@/lib/bench/schema";
import { analyzeBench, screenProfile } from "@/lib/optics";

const sharedPositions = [0, 50, 100, 250, 500];
const position = fc.oneof(
  fc.double({ min: -1000, max: 5000, noNaN: true }),
  fc.constantFrom(...sharedPositions),
  fc.double({ min: -100_000, max: 100_000, noNaN: true }),
);
const id = fc.string({ minLength: 1, maxLength: 8 });

const elementArb: fc.Arbitrary<Omit<BenchElement, "id">> = fc.oneof(
  fc.record({ kind: fc.constant("aperture" as const), positionMm: position, diameterMm: fc.double({ min: 0.05, max: 20, noNaN: true }) }),
  fc.record({ kind: fc.constant("screen" as const), positionMm: fc.double({ min: 0, max: 20_000, noNaN: true }) }),
  fc.record({ kind: fc.constant("lens" as const), positionMm: position, focalLengthMm: fc.oneof(fc.double({ min: 0.1, max: 1e6, noNaN: true }), fc.double({ min: -1e6, max: -0.1, noNaN: true })) }),
  fc.record({ kind: fc.constant("aperture" as const), positionMm: position, diameterMm: fc.double({ min: 1e-6, max: 1000, noNaN: true }) }),
  fc.record({ kind: fc.constant("filter" as const), positionMm: position, opticalDensity: fc.double({ min: 0, max: 20, noNaN: true }) }),
  fc.record({ kind: fc.constant("beam-block" as const), positionMm: position }),
  fc.record({ kind: fc.constant("screen" as const), positionMm: position }),
);

const laserArb = fc.record({
  kind: fc.constant("laser" as const),
  // mostly upstream of everything, so that most documents light their elements
  positionMm: fc.oneof({ weight: 3, arbitrary: fc.constantFrom(-1000, 0) }, { weight: 1, arbitrary: position }),
  wavelengthNm: fc.double({ min: 180, max: 1_000_000, noNaN: true }),
  powerMw: fc.double({ min: 1e-6, max: 1e9, noNaN: true }),
  beamDiameterMm: fc.double({ min: 1e-6, max: 1000, noNaN: true }),
  m2: fc.option(fc.double({ min: 1, max: 1000, noNaN: true }), { nil: undefined }),
});

const docArb: fc.Arbitrary<BenchDocument> = fc
  .tuple(laserArb, fc.array(elementArb, { maxLength: 14 }), fc.uniqueArray(id, { minLength: 15, maxLength: 15 }))
  .map(([l, rest, ids]) => {
    const { m2, ...laser } = l;
    const elements = [{ ...laser, ...(m2 === undefined ? {} : { m2 }), id: ids[0] }, ...rest.map((e, i) => ({ ...e, id: ids[i + 1] }))] as BenchElement[];
    return { version: 1 as const, elements };
  })
  .filter((d) => benchDocumentSchema.safeParse(d).success);

function allFinite(value: unknown): boolean {
  if (typeof value === "number") return Number.isFinite(value);
  if (value === null || typeof value !== "object") return true;
  return Object.values(value as Record<string, unknown>).every(allFinite);
}

describe("properties over schema-valid documents", () => {
  it("any document the schema accepts analyses without throwing, with only finite numbers", () => {
    fc.assert(
      fc.property(docArb, (d) => {
        const r = analyzeBench(d);
        expect(allFinite(r)).toBe(true);
      }),
      { numRuns: 400 },
    );
  });
  it("power never grows along the bench", () => {
    fc.assert(
      fc.property(docArb, (d) => {
        const lit = analyzeBench(d).elements.filter((e) => e.status === "lit");
        for (let i = 1; i < lit.length; i++) expect(lit[i].incident.powerMw).toBeLessThanOrEqual(lit[i - 1].incident.powerMw * (1 + 1e-12));
        for (const e of lit) expect(e.outgoingPowerMw).toBeLessThanOrEqual(e.incident.powerMw * (1 + 1e-12));
      }),
      { numRuns: 300 },
    );
  });
  it("the centre ratio of an aperture with no clipping edge upstream stays in [0, (1 + e^{−R²/w²})²]", () => {
    // With apertures in series (the bench document contract revision 2) the ratio is the propagated field's and may pass this bound.
    fc.assert(
      fc.property(docArb, (d) => {
        const r = analyzeBench(d);
        const firstApertureId = r.elements.find((e) => e.kind === "aperture" && e.status === "lit")?.id;
        for (const ap of r.apertures) {
          expect(ap.centreIntensityRatio).toBeGreaterThanOrEqual(0);
          if (ap.id !== firstApertureId || r.m2 > 1) continue;
          const a = (ap.diameterMm / 2 / ap.incident.radiusMm) ** 2;
          expect(ap.centreIntensityRatio).toBeLessThanOrEqual((1 + Math.exp(-a)) ** 2 * (1 + 1e-12));
        }
      }),
      { numRuns: 300 },
    );
  });
  it("reordering the elements array changes nothing", () => {
    fc.assert(
      fc.property(docArb, fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 15, maxLength: 15 }), (d, keys) => {
        const shuffled = d.elements.map((e, i) => ({ e, k: keys[i] })).sort((x, y) => x.k - y.k).map((x) => x.e);
        expect(analyzeBench({ ...d, elements: shuffled })).toEqual(analyzeBench(d));
      }),
      { numRuns: 200 },
    );
  });
  it("the screen profile starts at centreIntensityRatio and is never negative", () => {
    fc.assert(
      fc.property(docArb, (d) => {
        for (const ap of analyzeBench(d).apertures) {
          if (ap.screenId === null) continue;
          const p = screenProfile(d, ap.id, { points: 16 });
          expect(p.relativeIntensity[0]).toBe(ap.centreIntensityRatio);
          for (const v of p.relativeIntensity) expect(v).toBeGreaterThanOrEqual(0);
        }
      }),
      { numRuns: 100 },
    );
  }, 30_000); // many profiles of extreme documents: seconds on a loaded machine
});
