// The version 2 document: bad input refused with a sentence naming the element (the bench document contract "The table in two dimensions").
import { describe, expect, it } from "vitest";
import { describeIssues } from "@/lib/bench/schema";
import { anyBenchDocumentSchema, benchDocumentV2Schema, MAX_TABLE_ELEMENTS } from "@/lib/bench/schema-v2";

const base = {
  version: 2,
  table: { widthMm: 900, depthMm: 600, holePitchMm: 25 },
  elements: [
    { id: "L", kind: "laser", xMm: 50, yMm: 50, angleDeg: 0, wavelengthNm: 532, powerMw: 5, beamDiameterMm: 1 },
    { id: "M", kind: "mirror", xMm: 300, yMm: 50, angleDeg: 135 },
  ],
};
const problems = (doc: unknown) => {
  const r = anyBenchDocumentSchema.safeParse(doc);
  return r.success ? [] : describeIssues(r.error);
};

describe("version 2 schema", () => {
  it("accepts a table with defaults left out and keeps the document as written", () => {
    const r = benchDocumentV2Schema.safeParse(base);
    expect(r.success).toBe(true);
    expect(r.data).toEqual(base);
  });
  it("takes the v1 laser fields, several lasers and further lines", () => {
    const doc = {
      ...base,
      elements: [
        ...base.elements,
        { id: "L2", kind: "laser", xMm: 50, yMm: 300, angleDeg: 90, wavelengthNm: 1064, powerMw: 100, beamDiameterMm: 2, m2: 1.2, lines: [{ wavelengthNm: 808, powerMw: 3 }] },
      ],
    };
    expect(problems(doc)).toEqual([]);
  });
  it("refuses an element off the table, naming it", () => {
    const p = problems({ ...base, elements: [...base.elements, { id: "far", kind: "beam-block", xMm: 950, yMm: 10, angleDeg: 180 }] });
    expect(p).toEqual([{ path: "elements.2.xMm", message: expect.stringContaining('Beam block "far" at (950, 10) mm is off the table') }]);
  });
  it("refuses two elements on the same spot, naming both", () => {
    const p = problems({ ...base, elements: [...base.elements, { id: "B", kind: "beam-block", xMm: 300.4, yMm: 50, angleDeg: 180 }] });
    expect(p).toHaveLength(1);
    expect(p[0].message).toContain('"B"');
    expect(p[0].message).toContain('"M"');
    expect(p[0].message).toContain("same spot");
  });
  it("refuses a splitter reflectance outside 0–1 and requires it", () => {
    const bad = problems({ ...base, elements: [...base.elements, { id: "BS", kind: "beam-splitter", xMm: 300, yMm: 300, angleDeg: 45, reflectance: 1.2 }] });
    expect(bad).toEqual([{ path: "elements.2.reflectance", message: 'Beam splitter "BS": reflectance must be between 0 and 1 (it is 1.2)' }]);
    const missing = problems({ ...base, elements: [...base.elements, { id: "BS", kind: "beam-splitter", xMm: 300, yMm: 300, angleDeg: 45 }] });
    expect(missing[0].path).toBe("elements.2.reflectance");
  });
  it(`refuses more than ${MAX_TABLE_ELEMENTS} elements`, () => {
    const many = Array.from({ length: MAX_TABLE_ELEMENTS }, (_, i) => ({ id: `b${i}`, kind: "beam-block", xMm: 10 + (i % 40) * 20, yMm: 100 + Math.floor(i / 40) * 20, angleDeg: 0 }));
    const p = problems({ ...base, elements: [base.elements[0], ...many] });
    expect(p).toContainEqual({ path: "elements", message: `A table may hold at most ${MAX_TABLE_ELEMENTS} elements` });
  });
  it("refuses an unknown kind and a table without size", () => {
    expect(problems({ ...base, elements: [...base.elements, { id: "x", kind: "prism", xMm: 1, yMm: 1, angleDeg: 0 }] })[0].message).toContain("mirror, beam-splitter, window");
    expect(problems({ ...base, table: undefined })[0].path).toBe("table");
  });
  it("names the versions it knows", () => {
    expect(problems({ version: 3, elements: [] })).toEqual([{ path: "version", message: "version must be 1 (a straight rail) or 2 (an optical table)" }]);
  });
});
