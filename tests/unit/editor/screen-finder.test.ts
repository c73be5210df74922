// The finder on the rail: the searched stretch behind the selected aperture and the ticks from the answer
// (odd zone counts bright, even dark: Born & Wolf §8.2, Hecht §10.3).
import { describe, expect, it } from "vitest";
import type { BenchDocument } from "@/lib/bench/schema";
import { findScreenPositions, analyzeBench } from "@/lib/optics";
import { CENTRE_SYMBOL, FINDER_MIN_SPAN_MM, finderRange, finderTicks, screenAfter, screenTarget } from "@/components/editor/screen-finder";

const bench: BenchDocument = {
  version: 1,
  elements: [
    { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 5 },
    { id: "iris-1", kind: "aperture", positionMm: 300, diameterMm: 1 },
    { id: "screen-1", kind: "screen", positionMm: 900 },
  ],
};

describe("the searched stretch", () => {
  it("runs from 10 mm behind the aperture to twice the screen's position", () => {
    expect(finderRange(bench, "iris-1")).toEqual({ apertureId: "iris-1", screenId: "screen-1", fromMm: 310, toMm: 1800 });
  });

  it("searches at least FINDER_MIN_SPAN_MM behind the aperture when the screen is close", () => {
    const close: BenchDocument = { ...bench, elements: [bench.elements[0], { id: "iris-1", kind: "aperture", positionMm: 300, diameterMm: 1 }, { id: "screen-1", kind: "screen", positionMm: 320 }] };
    expect(finderRange(close, "iris-1")?.toMm).toBe(300 + FINDER_MIN_SPAN_MM);
  });

  it("without a screen it still searches, and there is no screen to move", () => {
    const none: BenchDocument = { ...bench, elements: bench.elements.slice(0, 2) };
    expect(finderRange(none, "iris-1")).toEqual({ apertureId: "iris-1", screenId: null, fromMm: 310, toMm: 800 });
  });

  it("is null for anything but an aperture", () => {
    expect(finderRange(bench, "screen-1")).toBeNull();
    expect(finderRange(bench, "nope")).toBeNull();
  });

  it("the screen moved is the first one downstream of the aperture", () => {
    const two: BenchDocument = { ...bench, elements: [...bench.elements, { id: "screen-2", kind: "screen", positionMm: 700 }, { id: "screen-0", kind: "screen", positionMm: 100 }] };
    expect(screenAfter(two, 300)?.id).toBe("screen-2");
  });
});

describe("ticks", () => {
  const search = {
    bright: [1, 3, 5, 7].map((k, i) => ({ positionMm: 2000 - i * 300, zoneCount: k })),
    dark: [2, 4, 6, 8].map((k, i) => ({ positionMm: 1850 - i * 300, zoneCount: k })),
  };
  const full = (c: { positionMm: number; zoneCount: number }) => ({
    ...c,
    observationDistanceMm: c.positionMm - 300,
    fresnelNumber: c.zoneCount,
    centreIntensityRatio: c.zoneCount % 2 ? 3.8 : 0.01,
    centre: (c.zoneCount % 2 ? "bright" : "dark") as "bright" | "dark",
    onAxisIrradianceWPerCm2: 1,
    toleranceMm: 10,
  });

  it("the best three of each goal, ranked as the finder ranks them, in rail order", () => {
    const ticks = finderTicks({ bright: search.bright.map(full), dark: search.dark.map(full) });
    expect(ticks.map((t) => [t.goal, t.rank, t.zoneCount])).toEqual([
      ["dark", 3, 6],
      ["bright", 3, 5],
      ["dark", 2, 4],
      ["bright", 2, 3],
      ["dark", 1, 2],
      ["bright", 1, 1],
    ]);
    expect(finderTicks(undefined)).toEqual([]);
  });

  it("marks the centre by shape: ● bright, ○ dark, ◐ in between", () => {
    expect(CENTRE_SYMBOL).toEqual({ bright: "●", dark: "○", between: "◐" });
  });

  it("moving the screen to a tick gives the centre the finder predicted", () => {
    const range = finderRange(bench, "iris-1")!;
    const found = findScreenPositions(bench, "iris-1", { fromMm: range.fromMm, toMm: range.toMm });
    const ticks = finderTicks(found);
    expect(ticks.some((t) => t.goal === "bright") && ticks.some((t) => t.goal === "dark")).toBe(true);
    for (const t of ticks) {
      const moved: BenchDocument = { ...bench, elements: bench.elements.map((e) => (e.id === "screen-1" ? { ...e, positionMm: screenTarget(t) } : e)) };
      const a = analyzeBench(moved).apertures.find((x) => x.id === "iris-1")!;
      expect(a.centre).toBe(t.centre);
      expect(t.centre).toBe(t.goal);
      expect(Math.round(a.zonesExposed)).toBe(t.zoneCount);
    }
  });
});
