// The compare page's marks between two revisions (built on lib/bench/diff.ts): moved with its distance, changed
// values, added, removed, and one rail range for both drawings. No published formula is involved.
import { describe, expect, it } from "vitest";
import type { BenchDocument } from "@/lib/bench/schema";
import { markTag, revisionMarks } from "@/components/benches/revision-marks";

const one: BenchDocument = {
  version: 1,
  elements: [
    { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 0.95, beamDiameterMm: 0.8 },
    { id: "lens-1", kind: "lens", positionMm: 100, focalLengthMm: -50 },
    { id: "iris-1", kind: "aperture", positionMm: 400, diameterMm: 2 },
    { id: "screen-1", kind: "screen", positionMm: 1000 },
  ],
};

describe("revision marks", () => {
  it("a moved screen is marked moved with the signed distance; nothing else is marked", () => {
    const two: BenchDocument = { ...one, elements: one.elements.map((e) => (e.id === "screen-1" ? { ...e, positionMm: 1322 } : e)) };
    const m = revisionMarks(one, two);
    expect(m.byId.get("screen-1")).toMatchObject({ marks: ["moved"], fromMm: 1000, toMm: 1322, changedFields: [] });
    expect(markTag(m.byId.get("screen-1")!, "to")).toBe("↔ moved +322 mm");
    expect(markTag(m.byId.get("screen-1")!, "from")).toBe("↔ moved");
    expect(m.byId.get("iris-1")!.marks).toEqual([]);
    expect(m.counts).toEqual({ moved: 1, changed: 0, added: 0, removed: 0 });
    expect(m.rangeMm).toEqual({ min: 0, max: 1322 });
  });

  it("moved and changed together, added and removed, in shape and word", () => {
    const two: BenchDocument = {
      version: 1,
      elements: [
        one.elements[0],
        { id: "lens-1", kind: "lens", positionMm: 90, focalLengthMm: -25 },
        { id: "filter-1", kind: "filter", positionMm: 250, opticalDensity: 1 },
        one.elements[3],
      ],
    };
    const m = revisionMarks(one, two);
    expect(m.byId.get("lens-1")).toMatchObject({ marks: ["moved", "changed"], changedFields: ["focalLengthMm"] });
    expect(markTag(m.byId.get("lens-1")!, "to")).toBe("↔ moved −10 mm · ~ changed");
    expect(markTag(m.byId.get("filter-1")!, "to")).toBe("+ added");
    expect(m.byId.get("iris-1")).toMatchObject({ marks: ["removed"], fromMm: 400, toMm: null });
    expect(markTag(m.byId.get("iris-1")!, "from")).toBe("− removed");
    expect(m.counts).toEqual({ moved: 1, changed: 1, added: 1, removed: 1 });
  });

  it("the same document has no marks", () => {
    const m = revisionMarks(one, structuredClone(one));
    expect(m.diff.identical).toBe(true);
    expect([...m.byId.values()].every((e) => e.marks.length === 0)).toBe(true);
  });
});
