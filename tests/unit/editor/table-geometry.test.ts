// The table editor's geometry: snapping to the hole grid (25 mm metric, 25.4 mm imperial, first hole half a pitch in),
// snapping onto a beam's axis, turning by the handle and by keys (45° steps and fine steps), moving by keys, and the
// table reducer's undo steps. Hand-worked values; the hole layout is the one the read-only table plan draws.
import { describe, expect, it } from "vitest";
import type { BenchDocumentV2 } from "@/lib/bench/schema-v2";
import { benchDocumentV2Schema } from "@/lib/bench/schema-v2";
import {
  arrowDelta,
  handleAngle,
  holeOf,
  movedBy,
  nearestBeam,
  normalDeg,
  placementFor,
  snapPlacement,
  snapToHole,
  turnBy,
  type BeamSegment,
} from "@/components/editor/table/table-geometry";
import { emptyTable, initialTableState, railToTable, tableReducer } from "@/components/editor/table/table-reducer";
import { traceBeams } from "@/components/editor/table/table-engine";

const metric = { widthMm: 900, depthMm: 600, holePitchMm: 25 };
const imperial = { widthMm: 914.4, depthMm: 609.6, holePitchMm: 25.4 };

describe("snapping to holes", () => {
  it("takes the nearest hole, the first half a pitch in from each edge", () => {
    expect(snapToHole({ xMm: 0, yMm: 0 }, metric)).toEqual({ xMm: 12.5, yMm: 12.5 });
    expect(snapToHole({ xMm: 50, yMm: 49 }, metric)).toEqual({ xMm: 62.5, yMm: 37.5 }); // 50 is (37.5+62.5)/2: rounds up; 49 nearer 37.5
    expect(snapToHole({ xMm: 101, yMm: 310 }, metric)).toEqual({ xMm: 112.5, yMm: 312.5 });
  });
  it("keeps to the grid inside the table", () => {
    expect(snapToHole({ xMm: 2000, yMm: -40 }, metric)).toEqual({ xMm: 887.5, yMm: 12.5 });
  });
  it("uses the inch on an imperial table", () => {
    // holes at 12.7 + 25.4 k: 100 mm is nearest 12.7 + 3·25.4 = 88.9 (11.1 away) rather than 114.3 (14.3 away)
    expect(snapToHole({ xMm: 100, yMm: 120 }, imperial)).toEqual({ xMm: 88.9, yMm: 114.3 });
  });
  it("names a hole by column and row from the left front corner", () => {
    expect(holeOf({ xMm: 12.5, yMm: 12.5 }, metric)).toEqual({ column: 1, row: 1 });
    expect(holeOf({ xMm: 112.5, yMm: 312.5 }, metric)).toEqual({ column: 5, row: 13 });
    expect(holeOf({ xMm: 100, yMm: 312.5 }, metric)).toBeNull();
  });
});

describe("snapping onto a beam", () => {
  const alongX: BeamSegment = { pathId: "p1", from: { xMm: 62.5, yMm: 312.5 }, to: { xMm: 900, yMm: 312.5 }, directionDeg: 0 };
  const slanted: BeamSegment = { pathId: "p2", from: { xMm: 400, yMm: 100 }, to: { xMm: 500, yMm: 200 }, directionDeg: 45 };

  it("puts an element near a beam along x on its axis, on the nearest hole along it", () => {
    const s = snapPlacement({ xMm: 305, yMm: 318 }, metric, [alongX], 10);
    expect(s.onBeam?.pathId).toBe("p1");
    expect(s.point).toEqual({ xMm: 312.5, yMm: 312.5 });
  });
  it("keeps an off-grid beam's axis: the element sits on the beam, not on the hole row beside it", () => {
    const offGrid = { ...alongX, from: { xMm: 62.5, yMm: 300 }, to: { xMm: 900, yMm: 300 } };
    const s = snapPlacement({ xMm: 330, yMm: 306 }, metric, [offGrid], 10);
    expect(s.point).toEqual({ xMm: 337.5, yMm: 300 });
  });
  it("takes the foot of the perpendicular on a slanted beam", () => {
    // (460, 140) onto the line y = x − 300: foot at (450, 150), 14.1 mm away
    const s = snapPlacement({ xMm: 460, yMm: 140 }, metric, [slanted], 15);
    expect(s.point.xMm).toBeCloseTo(450, 9);
    expect(s.point.yMm).toBeCloseTo(150, 9);
    expect(nearestBeam({ xMm: 460, yMm: 140 }, [slanted], 14)).toBeNull();
  });
  it("falls back to the holes away from every beam", () => {
    expect(snapPlacement({ xMm: 305, yMm: 395 }, metric, [alongX], 10)).toEqual({ point: { xMm: 312.5, yMm: 387.5 }, onBeam: null });
  });
  it("free mode keeps 0.1 mm and still goes onto a beam", () => {
    expect(snapPlacement({ xMm: 305.04, yMm: 400.06 }, metric, [alongX], 10, "free").point).toEqual({ xMm: 305, yMm: 400.1 });
    expect(snapPlacement({ xMm: 305.04, yMm: 315 }, metric, [alongX], 10, "free").point).toEqual({ xMm: 305.04, yMm: 312.5 });
  });
});

describe("turning", () => {
  it("the handle snaps to 45° steps, or to 0.1° held fine", () => {
    const c = { xMm: 100, yMm: 100 };
    expect(handleAngle(c, { xMm: 200, yMm: 110 }, false)).toBe(0);
    expect(handleAngle(c, { xMm: 150, yMm: 140 }, false)).toBe(45);
    expect(handleAngle(c, { xMm: 100, yMm: 40 }, false)).toBe(270);
    expect(handleAngle(c, { xMm: 200, yMm: 110 }, true)).toBe(5.7); // atan(0.1) = 5.711°
  });
  it("a coarse key step goes to the next multiple of 45° in its direction", () => {
    expect(turnBy(0, 1, "coarse")).toBe(45);
    expect(turnBy(30, 1, "coarse")).toBe(45);
    expect(turnBy(30, -1, "coarse")).toBe(0);
    expect(turnBy(0, -1, "coarse")).toBe(315);
    expect(turnBy(315, 1, "coarse")).toBe(0);
  });
  it("fine key steps add 1° or 0.1° and wrap into [0, 360)", () => {
    expect(turnBy(45, 1, "fine")).toBe(46);
    expect(turnBy(0, -1, "fine")).toBe(359);
    expect(turnBy(0, -1, "finest")).toBe(359.9);
    expect(normalDeg(-720.5)).toBe(359.5);
  });
});

describe("moving by keys", () => {
  const doc: BenchDocumentV2 = {
    version: 2,
    table: metric,
    elements: [
      { id: "laser-1", kind: "laser", xMm: 62.5, yMm: 312.5, angleDeg: 0, wavelengthNm: 632.8, powerMw: 5, beamDiameterMm: 0.8 },
      { id: "mirror-1", kind: "mirror", xMm: 887.5, yMm: 312.5, angleDeg: 135 },
    ],
  };
  it("an arrow moves one hole, Shift one millimetre; up is away from the viewer (+y)", () => {
    expect(arrowDelta("ArrowRight", 25, false)).toEqual({ xMm: 25, yMm: 0 });
    expect(arrowDelta("ArrowUp", 25.4, false)).toEqual({ xMm: 0, yMm: 25.4 });
    expect(arrowDelta("ArrowDown", 25, true)).toEqual({ xMm: 0, yMm: -1 });
    expect(arrowDelta("Enter", 25, true)).toBeNull();
  });
  it("moves only the selection and keeps it on the table", () => {
    expect(movedBy(doc.elements, ["mirror-1"], { xMm: 25, yMm: 0 }, metric)).toEqual({ "mirror-1": { xMm: 900, yMm: 312.5 } });
    expect(movedBy(doc.elements, ["laser-1", "mirror-1"], { xMm: 0, yMm: -25 }, metric)).toEqual({ "laser-1": { xMm: 62.5, yMm: 287.5 }, "mirror-1": { xMm: 887.5, yMm: 287.5 } });
  });
  it("a new element goes onto the last beam, facing it, on a free hole", () => {
    const beams = traceBeams(doc);
    const placed = placementFor("lens", { ...doc, elements: [doc.elements[0]] }, traceBeams({ ...doc, elements: [doc.elements[0]] }));
    expect(placed).toEqual({ xMm: 112.5, yMm: 312.5, angleDeg: 180 });
    expect(beams[0].to).toEqual({ xMm: 887.5, yMm: 312.5 });
  });
});

describe("the table reducer", () => {
  it("adds elements from the kind's record, one undo step per gesture", () => {
    let s = initialTableState(emptyTable("t"));
    s = tableReducer(s, { type: "add", kind: "beam-splitter", at: { xMm: 312.5, yMm: 312.5, angleDeg: 135 } });
    expect(s.doc.elements[0]).toEqual({ id: "splitter-1", kind: "beam-splitter", xMm: 312.5, yMm: 312.5, angleDeg: 135, reflectance: 0.5 });
    s = tableReducer(s, { type: "place", places: { "splitter-1": { xMm: 337.5, yMm: 312.5 } }, coalesce: "drag-1" });
    s = tableReducer(s, { type: "place", places: { "splitter-1": { xMm: 362.5, yMm: 312.5 } }, coalesce: "drag-1" });
    expect(s.past).toHaveLength(2);
    s = tableReducer(s, { type: "undo" });
    expect(s.doc.elements[0].xMm).toBe(312.5);
    s = tableReducer(s, { type: "redo" });
    expect(s.doc.elements[0].xMm).toBe(362.5);
  });
  it("moves a rail bench onto the table as a straight beam along +x on a hole row, values kept", () => {
    const table = railToTable({
      version: 1,
      title: "HeNe",
      elements: [
        { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 0.8 },
        { id: "iris", kind: "aperture", positionMm: 400, diameterMm: 2 },
        { id: "screen", kind: "screen", positionMm: 1400 },
      ],
    });
    expect(table.table).toEqual({ widthMm: 1800, depthMm: 600, holePitchMm: 25 });
    expect(table.elements.map((e) => [e.id, e.xMm, e.yMm, e.angleDeg])).toEqual([
      ["laser", 100, 312.5, 0],
      ["iris", 500, 312.5, 0],
      ["screen", 1500, 312.5, 0],
    ]);
    expect(table.elements[1]).toMatchObject({ diameterMm: 2 });
    expect(benchDocumentV2Schema.safeParse(table).success).toBe(true);
  });
});

describe("the browser's engine", () => {
  const folded: BenchDocumentV2 = {
    version: 2,
    table: metric,
    elements: [
      { id: "laser-1", kind: "laser", xMm: 137.5, yMm: 312.5, angleDeg: 0, wavelengthNm: 632.8, powerMw: 20, beamDiameterMm: 0.8 },
      { id: "mirror-1", kind: "mirror", xMm: 412.5, yMm: 312.5, angleDeg: 135 },
      { id: "splitter-1", kind: "beam-splitter", xMm: 412.5, yMm: 462.5, angleDeg: 315, reflectance: 0.5 },
    ],
  };
  it("gives the answer POST /api/analyze gives (the same engines; the fixed limitations left out)", async () => {
    const { predictTable } = await import("@/components/editor/table/table-engine");
    const { analyzeBench } = await import("@/lib/optics");
    const { assessBench } = await import("@/lib/safety");
    const { limitations: _l, ...safety } = assessBench(folded, analyzeBench(folded));
    expect(predictTable(folded)).toEqual({ analysis: analyzeBench(folded), safety });
    expect(() => predictTable({ ...folded, elements: [] })).toThrow("The table needs at least one laser; it has none");
  });
  it("traces the runs the drag draws: folded by the mirror, split into two arms that leave the table", () => {
    const beams = traceBeams(folded);
    expect(beams.map((b) => [b.from, b.to, b.directionDeg, b.open])).toEqual([
      [{ xMm: 137.5, yMm: 312.5 }, { xMm: 412.5, yMm: 312.5 }, 0, false],
      [{ xMm: 412.5, yMm: 312.5 }, { xMm: 412.5, yMm: 462.5 }, 90, false],
      [{ xMm: 412.5, yMm: 462.5 }, { xMm: 900, yMm: 462.5 }, 0, true],
      [{ xMm: 412.5, yMm: 462.5 }, { xMm: 412.5, yMm: 600 }, 90, true],
    ]);
    // 20 mW, 0.99 off the mirror, half each way at the splitter
    expect(beams.map((b) => Number(b.powerMw.toPrecision(6)))).toEqual([20, 19.8, 9.9, 9.9]);
  });
});
