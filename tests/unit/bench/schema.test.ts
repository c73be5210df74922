// The bench document schema: the contract's rejections, each with a field path and a sentence.
import { describe, expect, it } from "vitest";
import { contentHash, canonicalJson } from "@/lib/bench/canonical";
import { benchDocumentSchema, describeIssues, type BenchDocument } from "@/lib/bench/schema";

const good: BenchDocument = {
  version: 1,
  elements: [
    { id: "l", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 0.8 },
    { id: "a", kind: "aperture", positionMm: 400, diameterMm: 2 },
    { id: "s", kind: "screen", positionMm: 1400 },
  ],
};

function problems(doc: unknown) {
  const r = benchDocumentSchema.safeParse(doc);
  return r.success ? [] : describeIssues(r.error);
}

describe("bench document v1", () => {
  it("accepts a plain HeNe bench", () => expect(problems(good)).toEqual([]));

  it.each([
    ["no laser", { version: 1, elements: [] }, "elements", /none/],
    ["two lasers", { version: 1, elements: [good.elements[0], { ...good.elements[0], id: "l2" }] }, "elements", /has 2/],
    ["an unknown kind", { ...good, elements: [...good.elements, { id: "m", kind: "mirror", positionMm: 5 }] }, "elements.3.kind", /must be one of/],
    ["a zero aperture", { ...good, elements: [good.elements[0], { id: "a", kind: "aperture", positionMm: 1, diameterMm: 0 }] }, "elements.1.diameterMm", /greater than 0/],
    ["a negative aperture", { ...good, elements: [good.elements[0], { id: "a", kind: "aperture", positionMm: 1, diameterMm: -2 }] }, "elements.1.diameterMm", /greater than 0/],
    ["a wavelength of 150 nm", { ...good, elements: [{ ...good.elements[0], wavelengthNm: 150 }] }, "elements.0.wavelengthNm", /between 180 nm and 1 mm/],
    ["a wavelength over 1 mm", { ...good, elements: [{ ...good.elements[0], wavelengthNm: 1_000_001 }] }, "elements.0.wavelengthNm", /between 180 nm/],
    ["NaN power", { ...good, elements: [{ ...good.elements[0], powerMw: Number.NaN }] }, "elements.0.powerMw", /number/],
    ["infinite position", { ...good, elements: [{ ...good.elements[0], positionMm: Number.POSITIVE_INFINITY }] }, "elements.0.positionMm", /number/],
    ["a duplicated id", { ...good, elements: [...good.elements, { id: "a", kind: "screen", positionMm: 9 }] }, "elements.3.id", /used twice/],
    ["a zero focal length", { ...good, elements: [...good.elements, { id: "f", kind: "lens", positionMm: 9, focalLengthMm: 0 }] }, "elements.3.focalLengthMm", /zero focal length/],
    ["version 2", { ...good, version: 2 }, "version", /must be 1/],
  ])("rejects %s", (_name, doc, path, message) => {
    const found = problems(doc);
    expect(found.map((p) => p.path)).toContain(path);
    expect(found.find((p) => p.path === path)!.message).toMatch(message);
  });

  it("rejects more than 200 elements", () => {
    const many = Array.from({ length: 201 }, (_, i) => ({ id: `s${i}`, kind: "screen", positionMm: i }));
    expect(problems({ version: 1, elements: [good.elements[0], ...many] })[0].message).toMatch(/at most 200/);
  });
});

describe("content hash", () => {
  it("does not depend on key order or element order", () => {
    const shuffled = { elements: [...good.elements].reverse().map((e) => Object.fromEntries(Object.entries(e).reverse())), version: 1 } as BenchDocument;
    expect(contentHash(shuffled)).toBe(contentHash(good));
    expect(canonicalJson(shuffled)).toBe(canonicalJson(good));
  });

  it("changes when any setting changes", () => {
    const moved = { ...good, elements: good.elements.map((e) => (e.id === "s" ? { ...e, positionMm: 1401 } : e)) };
    expect(contentHash(moved)).not.toBe(contentHash(good));
    expect(contentHash(good)).toMatch(/^[0-9a-f]{64}$/);
  });
});
