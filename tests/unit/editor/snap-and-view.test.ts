// Snapping (off, 1 mm, 25 mm metric hole pitch, 1 inch), number entry, placement of new elements, and the view:
// zoom about a point, fit all, and the two-finger pinch.
import { describe, expect, it } from "vitest";
import { SNAP_CHOICES, roundMm, snapMm } from "@/components/editor/element-kinds";
import { parseNumber } from "@/components/editor/number-parse";
import { placementFor } from "@/components/editor/placement";
import { MAX_PX_PER_MM, MIN_PX_PER_MM, fitAll, mmAt, pinchZoom, touchPair, zoomAbout } from "@/components/editor/view";

describe("snapping", () => {
  it("offers off, 1 mm, 25 mm and 1 inch", () => expect(SNAP_CHOICES.map((c) => c.value)).toEqual([0, 1, 25, 25.4]));

  it.each([
    // [position, step, snapped]
    [123.4567891, 0, 123.457],
    [-0.0004, 0, -0],
    [123.4, 1, 123],
    [123.5, 1, 124],
    [-2.6, 1, -3],
    [37.4, 25, 25],
    [37.5, 25, 50],
    [-12.6, 25, -25],
    [0, 25, 0],
    [12.6, 25.4, 0],
    [12.8, 25.4, 25.4],
    [100, 25.4, 101.6],
    [254.1, 25.4, 254],
    [1000, 25.4, 990.6],
    [1004, 25.4, 1016],
  ])("%s mm with a %s mm step → %s mm", (mm, step, expected) => {
    expect(snapMm(mm, step)).toBe(expected);
  });

  it("inch multiples stay exact to the micrometre however far along the rail", () => {
    for (let k = -400; k <= 4000; k += 37) expect(snapMm(k * 25.4 + 3, 25.4)).toBe(roundMm(k * 25.4));
  });
});

describe("number entry", () => {
  it.each([
    ["2.5", 2.5],
    [" -25 ", -25],
    ["\u221225", -25],
    ["1,5", 1.5],
    ["1e3", 1000],
  ])("reads %j as %s", (text, value) => expect(parseNumber(text, false)).toEqual({ value }));

  it("an empty field is 'not set' only where the value is optional", () => {
    expect(parseNumber("", true)).toEqual({ value: undefined });
    expect(parseNumber("  ", false)).toEqual({ error: "Enter a number." });
  });

  it("says why text is not a number", () => {
    expect(parseNumber("2 mm", false)).toEqual({ error: "“2 mm” is not a number; write it like 2.5 or -25." });
    expect(parseNumber("Infinity", false)).toHaveProperty("error");
  });
});

describe("placing a new element", () => {
  const rail = [
    { kind: "laser", positionMm: 0 },
    { kind: "aperture", positionMm: 300 },
    { kind: "screen", positionMm: 900 },
  ];
  it("optics go between the last optic and the first stop; stops go after everything", () => {
    expect(placementFor("lens", rail)).toBe(600);
    expect(placementFor("screen", rail)).toBe(1100);
    expect(placementFor("laser", rail)).toBe(-100);
    expect(placementFor("lens", [])).toBe(0);
    expect(placementFor("lens", rail.slice(0, 2))).toBe(400);
  });
});

describe("the view", () => {
  it("zooming about a point keeps the millimetre under it", () => {
    const v = { pxPerMm: 1, panPx: 40 };
    const z = zoomAbout(v, 2, 440);
    expect(mmAt(z, 440)).toBeCloseTo(mmAt(v, 440), 9);
    expect(z.pxPerMm).toBe(2);
  });

  it("fit all shows every element inside the margins; an empty rail shows the first metre", () => {
    const v = fitAll([{ id: "a", kind: "screen", positionMm: -200 }, { id: "b", kind: "screen", positionMm: 1800 }], 1000);
    expect(mmAt(v, 80)).toBeCloseTo(-200, 9);
    expect(mmAt(v, 920)).toBeCloseTo(1800, 9);
    const empty = fitAll([], 1000);
    expect(mmAt(empty, 80)).toBeCloseTo(0, 9);
    expect(mmAt(empty, 920)).toBeCloseTo(1000, 9);
  });

  it("pinch: spreading the fingers to twice their distance doubles the scale about their midpoint", () => {
    const start = { pxPerMm: 0.5, panPx: 100 };
    const a = touchPair({ x: 300, y: 100 }, { x: 500, y: 100 });
    expect(a).toEqual({ distancePx: 200, centrePx: 400 });
    const b = touchPair({ x: 200, y: 100 }, { x: 600, y: 100 });
    const v = pinchZoom(start, a.distancePx, a.centrePx, b.distancePx, b.centrePx);
    expect(v.pxPerMm).toBe(1);
    expect(mmAt(v, 400)).toBeCloseTo(mmAt(start, 400), 9);
  });

  it("pinch: moving both fingers pans — the millimetre under the first midpoint follows the fingers", () => {
    const start = { pxPerMm: 2, panPx: 0 };
    const v = pinchZoom(start, 100, 300, 100, 360);
    expect(v.pxPerMm).toBe(2);
    expect(mmAt(v, 360)).toBeCloseTo(150, 9);
  });

  it("pinch: the scale stays within the zoom limits, diagonal fingers count by their true distance", () => {
    const start = { pxPerMm: 1, panPx: 0 };
    expect(pinchZoom(start, 10, 0, 10_000, 0).pxPerMm).toBe(MAX_PX_PER_MM);
    expect(pinchZoom({ pxPerMm: 0.01, panPx: 0 }, 1000, 0, 1, 0).pxPerMm).toBe(MIN_PX_PER_MM);
    expect(touchPair({ x: 0, y: 0 }, { x: 30, y: 40 }).distancePx).toBe(50);
  });

  it("pinch: a zero distance (both fingers at one point) leaves the view alone", () => {
    const start = { pxPerMm: 1, panPx: 0 };
    expect(pinchZoom(start, 0, 0, 100, 0)).toBe(start);
  });
});
