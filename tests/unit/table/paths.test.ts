// The table's beams in words (lib/review/table-paths.ts): headings, holes, where every beam ends, the build order
// following the light; and the element diff of two tables (lib/bench/diff.ts). Geometry checked by hand.
import { describe, expect, it } from "vitest";
import { diffBenches } from "@/lib/bench/diff";
import type { BenchDocumentV2 } from "@/lib/bench/schema-v2";
import { assessTableRevision } from "@/lib/review/hazard";
import { beamEnds, buildOrderV2, directionWords, holeOf, pathRows } from "@/lib/review/table-paths";
import { checklistFor } from "@/lib/build/rules";

const folded = (withBlock: boolean): BenchDocumentV2 => ({
  version: 2,
  table: { widthMm: 1200, depthMm: 900, holePitchMm: 25 },
  elements: [
    { id: "green", kind: "laser", xMm: 112.5, yMm: 112.5, angleDeg: 0, wavelengthNm: 532, powerMw: 20, beamDiameterMm: 1 },
    { id: "M1", kind: "mirror", xMm: 512.5, yMm: 112.5, angleDeg: 135 },
    { id: "BS", kind: "beam-splitter", xMm: 512.5, yMm: 412.5, angleDeg: 315, reflectance: 0.5 },
    { id: "screen", kind: "screen", xMm: 1112.5, yMm: 412.5, angleDeg: 180 },
    ...(withBlock ? [{ id: "block", kind: "beam-block" as const, xMm: 512.5, yMm: 812.5, angleDeg: 270 }] : []),
  ],
});

describe("words for a table's beams", () => {
  it("names headings seen from the front of the table, with the exact angle", () => {
    expect(directionWords(0)).toBe("to the right (+x), 0°");
    expect(directionWords(90)).toBe("away from the viewer (+y), 90°");
    expect(directionWords(-90)).toBe("toward the viewer (−y), 270°");
    expect(directionWords(135)).toBe("left and away, 135°");
    expect(directionWords(400)).toBe("right and away, 40°");
  });

  it("finds the hole under an element, half a pitch in from the corner, and the offset from it", () => {
    const doc = folded(true);
    expect(holeOf(doc, { xMm: 12.5, yMm: 12.5 })).toMatchObject({ column: 1, row: 1, onHole: true });
    expect(holeOf(doc, { xMm: 512.5, yMm: 412.5 })).toMatchObject({ column: 21, row: 17, onHole: true });
    const off = holeOf({ ...doc, table: { ...doc.table, holePitchMm: 25.4 } }, { xMm: 100, yMm: 40 });
    // holes at 12.7 + 25.4 k: 88.9 (k = 3) and 38.1 (k = 1)
    expect(off.column).toBe(4);
    expect(off.row).toBe(2);
    expect(off.dxMm).toBeCloseTo(11.1, 9);
    expect(off.dyMm).toBeCloseTo(1.9, 9);
  });

  it("says where every beam ends: the splitter's other arm off the back edge, then into the block once it is there", () => {
    for (const withBlock of [false, true]) {
      const doc = folded(withBlock);
      const a = assessTableRevision(doc);
      if (!a.ok) throw new Error(a.problem);
      const ends = beamEnds(pathRows(doc, a.analysis, a.safety));
      expect(ends.map((r) => r.id).sort()).toEqual(["p3", "p4"]);
      const back = ends.find((r) => r.id === "p4")!;
      if (withBlock) {
        expect(back.end).toMatchObject({ kind: "stop", elementId: "block" });
      } else {
        expect(back.end.kind).toBe("edge");
        expect(back.end.words).toBe("OPEN BEAM above the MPE: leaves the table at the back edge, (512.5, 900) mm, heading away from the viewer (+y), 90°");
        // open beams come first in the list
        expect(ends[0].id).toBe("p4");
      }
      expect(ends.find((r) => r.id === "p3")!.end.words).toBe("ends on screen screen");
    }
  });

  it("orders the build as the light goes: laser, mirror, splitter, then each arm; unreached elements last", () => {
    const doc: BenchDocumentV2 = { ...folded(true), elements: [...folded(true).elements, { id: "spare", kind: "beam-block", xMm: 1000, yMm: 800, angleDeg: 0 }] };
    const a = assessTableRevision(doc);
    if (!a.ok) throw new Error(a.problem);
    const steps = buildOrderV2(doc, a.analysis);
    expect(steps.map((s) => s.element.id)).toEqual(["green", "M1", "BS", "screen", "block", "spare"]);
    expect(steps.at(-1)).toMatchObject({ reached: false, pathId: null });
    expect(steps[1]).toMatchObject({ hole: "hole 21, 5", angleDeg: 135, pathId: "p1" });
  });

  it("gives the technician one item per element by hole and angle, and one per open beam above the MPE", () => {
    const doc = folded(false);
    const a = assessTableRevision(doc);
    if (!a.ok) throw new Error(a.problem);
    const items = checklistFor(doc, a.safety);
    expect(items.filter((i) => i.group === "element").map((i) => i.label)).toEqual([
      "Laser green at hole 5, 5, 0°",
      "Mirror M1 at hole 21, 5, 135°",
      "Beam splitter BS at hole 21, 17, 315°",
      "Screen screen at hole 45, 17, 180°",
    ]);
    expect(items.filter((i) => i.itemKey.startsWith("open-beam:")).map((i) => i.itemKey)).toEqual(["open-beam:p4"]);
  });
});

describe("the element diff of two tables", () => {
  it("marks what moved, what was added, and a change of table", () => {
    const before = folded(false);
    const after: BenchDocumentV2 = { ...folded(true), table: { ...before.table, depthMm: 1000 } };
    after.elements = after.elements.map((e) => (e.id === "M1" ? { ...e, angleDeg: 140 } : e));
    const diff = diffBenches(before, after);
    expect(diff.identical).toBe(false);
    expect(diff.tableChange).toMatchObject({ field: "table" });
    expect(diff.elements.find((e) => e.id === "block")?.change).toBe("added");
    expect(diff.elements.find((e) => e.id === "M1")).toMatchObject({ change: "changed", fields: [{ field: "angleDeg", before: 135, after: 140 }] });
    expect(diffBenches(before, before).identical).toBe(true);
  });
});
