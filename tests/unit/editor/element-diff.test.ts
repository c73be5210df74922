// The element diff behind the conflict dialog (yours vs saved) and the revisions panel (since the last review).
import { describe, expect, it } from "vitest";
import type { BenchDocument } from "@/lib/bench/schema";
import { changesSinceRevision, documentDifferences, elementChanges } from "@/components/editor/element-diff";
import { lastSentRevision } from "@/components/editor/revision-pick";

const saved: BenchDocument = {
  version: 1,
  title: "Iris bench",
  elements: [
    { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 0.8 },
    { id: "iris-1", kind: "aperture", positionMm: 300, diameterMm: 1.5 },
    { id: "block-1", kind: "beam-block", positionMm: 1200 },
    { id: "screen-1", kind: "screen", positionMm: 900 },
  ],
};

const mine: BenchDocument = {
  version: 1,
  title: "Iris bench, tuned",
  elements: [
    { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 0.8, m2: 1.1 },
    { id: "iris-1", kind: "aperture", positionMm: 300, diameterMm: 1 },
    { id: "screen-1", kind: "screen", positionMm: 910 },
    { id: "lens-1", kind: "lens", positionMm: 100, focalLengthMm: -50 },
  ],
};

describe("elementChanges", () => {
  it("matches elements by id: added and changed in the newer order, then removed", () => {
    const c = elementChanges(saved, mine);
    expect(c.title).toEqual({ before: "Iris bench", after: "Iris bench, tuned" });
    expect(c.elements.map((e) => [e.id, e.change])).toEqual([
      ["laser-1", "changed"],
      ["iris-1", "changed"],
      ["screen-1", "changed"],
      ["lens-1", "added"],
      ["block-1", "removed"],
    ]);
    const laser = c.elements[0];
    expect(laser.change === "changed" && laser.fields).toEqual([{ key: "m2", before: undefined, after: 1.1 }]);
  });

  it("the same document, or the same values in another key order, has no changes", () => {
    expect(elementChanges(saved, saved)).toEqual({ title: null, elements: [] });
    const reordered: BenchDocument = { elements: saved.elements.map((e) => Object.fromEntries(Object.entries(e).reverse()) as typeof e), title: "Iris bench", version: 1 };
    expect(elementChanges(saved, reordered).elements).toEqual([]);
  });

  it("a missing title and an empty one are the same", () => {
    expect(elementChanges({ version: 1, elements: [] }, { version: 1, title: "", elements: [] }).title).toBeNull();
  });
});

describe("conflict dialog sentences (yours vs saved)", () => {
  it("says per element what differs, with units", () => {
    expect(documentDifferences(mine, saved).map((d) => d.sentence)).toEqual([
      "Title: yours “Iris bench, tuned”, saved “Iris bench”.",
      "laser-1: M² 1.1 in yours, — saved.",
      "iris-1: diameter (mm) 1 in yours, 1.5 saved.",
      "screen-1: position (mm) 910 in yours, 900 saved.",
      "lens-1: only in yours (lens at 100 mm).",
      "block-1: only in the saved version (beam block at 1200 mm).",
    ]);
  });

  it("is empty for the same drawing", () => expect(documentDifferences(saved, structuredClone(saved))).toEqual([]));
});

describe("changes since the revision sent for review", () => {
  it("reads as a short list with a mark per line", () => {
    expect(changesSinceRevision(saved, mine)).toEqual([
      { id: "(title)", mark: "~", sentence: "Title “Iris bench” → “Iris bench, tuned”" },
      { id: "laser-1", mark: "~", sentence: "laser-1: M² — → 1.1" },
      { id: "iris-1", mark: "~", sentence: "iris-1: diameter 1.5 → 1 mm" },
      { id: "screen-1", mark: "~", sentence: "screen-1: moved 900 → 910 mm (+10 mm)" },
      { id: "lens-1", mark: "+", sentence: "lens-1 added: lens at 100 mm (f −50 mm)" },
      { id: "block-1", mark: "−", sentence: "block-1 removed (was the beam block at 1200 mm)" },
    ]);
  });

  it("a move upstream has a minus sign, and a move and a value change share one line", () => {
    const moved: BenchDocument = { ...saved, elements: saved.elements.map((e) => (e.id === "iris-1" ? { ...e, positionMm: 287.5, diameterMm: 2 } : e)) };
    expect(changesSinceRevision(saved, moved)).toEqual([{ id: "iris-1", mark: "~", sentence: "iris-1: moved 300 → 287.5 mm (−12.5 mm); diameter 1.5 → 2 mm" }]);
  });

  it("compares with the newest revision that left the draft state", () => {
    const revs = [
      { number: 4, state: "draft" },
      { number: 3, state: "changes-requested" },
      { number: 2, state: "superseded" },
      { number: 1, state: "approved" },
    ];
    expect(lastSentRevision(revs)?.number).toBe(3);
    expect(lastSentRevision([{ number: 1, state: "draft" }])).toBeNull();
    expect(lastSentRevision([{ number: 1, state: "approved" }, { number: 2, state: "withdrawn" }])?.number).toBe(2);
  });
});
