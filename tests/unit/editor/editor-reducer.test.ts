// The editor's working document: undo/redo history where one gesture is one step (a drag, typing in one field),
// nudging, duplicates with fresh ids, and "take the saved version" undone by one undo.
import { describe, expect, it } from "vitest";
import type { BenchDocument } from "@/lib/bench/schema";
import { DUPLICATE_OFFSET_MM, HISTORY_LIMIT, editorReducer, initialEditorState, type EditorAction, type EditorState } from "@/components/editor/editor-reducer";
import { dragPositions, dragStart } from "@/components/editor/drag";
import { snapMm } from "@/components/editor/element-kinds";

const bench: BenchDocument = {
  version: 1,
  title: "HeNe and iris",
  elements: [
    { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 0.8 },
    { id: "iris-1", kind: "aperture", positionMm: 300, diameterMm: 2 },
    { id: "screen-1", kind: "screen", positionMm: 900 },
  ],
};

const run = (actions: EditorAction[], state: EditorState = initialEditorState(bench)) => actions.reduce(editorReducer, state);
const pos = (s: EditorState, id: string) => s.doc.elements.find((e) => e.id === id)?.positionMm;
const field = (s: EditorState, id: string, key: string) => (s.doc.elements.find((e) => e.id === id) as Record<string, unknown> | undefined)?.[key];

describe("undo and redo", () => {
  it("a drag is one step, however many moves it reports", () => {
    const start = dragStart(bench.elements, [], "screen-1");
    const moves = [910, 925.4, 950, 1000.0004].map((mm): EditorAction => ({ type: "set-positions", positions: dragPositions(start, "screen-1", mm), coalesce: "drag-a" }));
    const dragged = run(moves);
    expect(pos(dragged, "screen-1")).toBe(1000);
    expect(dragged.past).toHaveLength(1);
    const undone = editorReducer(dragged, { type: "undo" });
    expect(pos(undone, "screen-1")).toBe(900);
    expect(undone.past).toHaveLength(0);
    expect(pos(editorReducer(undone, { type: "redo" }), "screen-1")).toBe(1000);
  });

  it("two drags are two steps, even of the same element", () => {
    const s = run([
      { type: "set-positions", positions: { "screen-1": 950 }, coalesce: "drag-a" },
      { type: "set-positions", positions: { "screen-1": 1000 }, coalesce: "drag-b" },
    ]);
    expect(s.past).toHaveLength(2);
    expect(pos(editorReducer(s, { type: "undo" }), "screen-1")).toBe(950);
  });

  it("typing in one field (one visit) is one step; a later visit is another", () => {
    const typing = ["1", "1.", "1.5"].map((t): EditorAction => ({ type: "update", id: "iris-1", patch: { diameterMm: Number(t) }, coalesce: "field-iris-1-diameterMm-7" }));
    const typed = run(typing);
    expect(field(typed, "iris-1", "diameterMm")).toBe(1.5);
    expect(typed.past).toHaveLength(1);
    expect(field(editorReducer(typed, { type: "undo" }), "iris-1", "diameterMm")).toBe(2);

    const again = run([{ type: "update", id: "iris-1", patch: { diameterMm: 3 }, coalesce: "field-iris-1-diameterMm-8" }], typed);
    expect(again.past).toHaveLength(2);
    expect(field(editorReducer(again, { type: "undo" }), "iris-1", "diameterMm")).toBe(1.5);
  });

  it("selecting something ends a gesture: the same key afterwards starts a new step", () => {
    const s = run([
      { type: "update", id: "iris-1", patch: { diameterMm: 1 }, coalesce: "k" },
      { type: "select", ids: ["iris-1"] },
      { type: "update", id: "iris-1", patch: { diameterMm: 3 }, coalesce: "k" },
    ]);
    expect(s.past).toHaveLength(2);
  });

  it("a new change after an undo drops the redo branch", () => {
    const s = run([{ type: "nudge", deltaMm: 1 }, { type: "select", ids: ["iris-1"] }, { type: "nudge", deltaMm: 5 }, { type: "undo" }]);
    expect(s.future).toHaveLength(1);
    const changed = editorReducer(s, { type: "nudge", deltaMm: -3 });
    expect(changed.future).toHaveLength(0);
    expect(editorReducer(changed, { type: "redo" })).toBe(changed);
  });

  it("undo and redo with nothing to do change nothing", () => {
    const s = initialEditorState(bench);
    expect(editorReducer(s, { type: "undo" })).toBe(s);
    expect(editorReducer(s, { type: "redo" })).toBe(s);
  });

  it("an empty optional field removes the value (M² back to the default)", () => {
    const s = run([
      { type: "update", id: "laser-1", patch: { m2: 1.3 }, coalesce: "a" },
      { type: "update", id: "laser-1", patch: { m2: undefined }, coalesce: "b" },
    ]);
    expect("m2" in s.doc.elements[0]).toBe(false);
    expect(field(editorReducer(s, { type: "undo" }), "laser-1", "m2")).toBe(1.3);
  });

  it("keeps at most HISTORY_LIMIT steps", () => {
    let s = run([{ type: "select", ids: ["iris-1"] }]);
    for (let i = 0; i < HISTORY_LIMIT + 20; i++) s = editorReducer(s, { type: "nudge", deltaMm: 1 });
    expect(s.past).toHaveLength(HISTORY_LIMIT);
    expect(pos(s, "iris-1")).toBe(300 + HISTORY_LIMIT + 20);
  });

  it("undo after taking the saved version brings my drawing back in one step", () => {
    const mine = run([
      { type: "select", ids: ["screen-1"] },
      { type: "nudge", deltaMm: 10 },
    ]);
    const saved: BenchDocument = { ...bench, elements: bench.elements.map((e) => (e.id === "iris-1" ? { ...e, diameterMm: 1.5 } : e)) };
    const taken = editorReducer(mine, { type: "replace", doc: saved });
    expect(taken.doc).toBe(saved);
    expect(taken.selection).toEqual(["screen-1"]);
    const back = editorReducer(taken, { type: "undo" });
    expect(back.doc).toBe(mine.doc);
    expect(pos(back, "screen-1")).toBe(910);
    expect(field(back, "iris-1", "diameterMm")).toBe(2);
    expect(editorReducer(back, { type: "redo" }).doc).toBe(saved);
  });

  it("a replace drops selected elements that are not in the new document", () => {
    const s = run([{ type: "select", ids: ["iris-1", "screen-1"] }]);
    const without = { ...bench, elements: bench.elements.filter((e) => e.id !== "iris-1") };
    expect(editorReducer(s, { type: "replace", doc: without }).selection).toEqual(["screen-1"]);
  });

  it("reset starts a fresh history", () => {
    const s = run([{ type: "select", ids: ["iris-1"] }, { type: "nudge", deltaMm: 1 }, { type: "reset", doc: bench }]);
    expect(s).toEqual(initialEditorState(bench));
  });
});

describe("nudging", () => {
  it("moves every selected element by the step, each press one step", () => {
    const s = run([
      { type: "select", ids: ["iris-1", "screen-1"] },
      { type: "nudge", deltaMm: 10 },
      { type: "nudge", deltaMm: 1 },
      { type: "nudge", deltaMm: -1 },
    ]);
    expect(pos(s, "iris-1")).toBe(310);
    expect(pos(s, "screen-1")).toBe(910);
    expect(pos(s, "laser-1")).toBe(0);
    expect(s.past).toHaveLength(3);
  });

  it("does nothing without a selection", () => {
    const s = initialEditorState(bench);
    expect(editorReducer(s, { type: "nudge", deltaMm: 1 })).toBe(s);
  });

  it("keeps positions to the micrometre (no float noise after many 0.1 mm steps)", () => {
    let s = run([{ type: "select", ids: ["iris-1"] }]);
    for (let i = 0; i < 30; i++) s = editorReducer(s, { type: "nudge", deltaMm: 0.1 });
    expect(pos(s, "iris-1")).toBe(303);
  });
});

describe("adding and duplicating: ids stay unique", () => {
  it("a new element takes the next free number of its prefix and is selected", () => {
    const s = run([{ type: "add", kind: "aperture", positionMm: 500.0004 }]);
    const added = s.doc.elements.at(-1)!;
    expect(added).toMatchObject({ id: "iris-2", kind: "aperture", positionMm: 500, diameterMm: 2 });
    expect(s.selection).toEqual(["iris-2"]);
  });

  it("numbers past gaps and past ids of other kinds that share the prefix", () => {
    const gappy: BenchDocument = { ...bench, elements: [...bench.elements, { id: "iris-7", kind: "aperture", positionMm: 400, diameterMm: 1 }] };
    const s = run([{ type: "add", kind: "aperture", positionMm: 600 }], initialEditorState(gappy));
    expect(s.doc.elements.at(-1)!.id).toBe("iris-8");
  });

  it("duplicating several elements of one kind gives each copy its own id, 25 mm downstream", () => {
    const two: BenchDocument = { ...bench, elements: [...bench.elements, { id: "iris-2", kind: "aperture", positionMm: 450, diameterMm: 1 }] };
    const s = run([{ type: "select", ids: ["iris-1", "iris-2"] }, { type: "duplicate" }], initialEditorState(two));
    const ids = s.doc.elements.map((e) => e.id);
    expect(new Set(ids).size).toBe(ids.length);
    expect(s.selection).toEqual(["iris-3", "iris-4"]);
    expect(pos(s, "iris-3")).toBe(300 + DUPLICATE_OFFSET_MM);
    expect(pos(s, "iris-4")).toBe(450 + DUPLICATE_OFFSET_MM);
    expect(field(s, "iris-4", "diameterMm")).toBe(1);
    // and again: the copies of copies are fresh too
    const again = editorReducer(s, { type: "duplicate" });
    const all = again.doc.elements.map((e) => e.id);
    expect(new Set(all).size).toBe(all.length);
    expect(again.selection).toEqual(["iris-5", "iris-6"]);
  });

  it("never duplicates the laser (a bench holds exactly one)", () => {
    const s = run([{ type: "select", ids: ["laser-1"] }]);
    expect(editorReducer(s, { type: "duplicate" })).toBe(s);
    const mixed = run([{ type: "select", ids: ["laser-1", "screen-1"] }, { type: "duplicate" }]);
    expect(mixed.doc.elements.filter((e) => e.kind === "laser")).toHaveLength(1);
    expect(mixed.selection).toEqual(["screen-2"]);
  });

  it("an id freed by a delete is not reused while a higher one exists, and a duplicate is one undo step", () => {
    const s = run([{ type: "select", ids: ["iris-1"] }, { type: "duplicate" }, { type: "undo" }]);
    expect(s.doc.elements.map((e) => e.id)).toEqual(["laser-1", "iris-1", "screen-1"]);
  });

  it("delete removes the selection and clears it; undo restores it", () => {
    const s = run([{ type: "select", ids: ["iris-1"] }, { type: "remove" }]);
    expect(s.doc.elements.map((e) => e.id)).toEqual(["laser-1", "screen-1"]);
    expect(s.selection).toEqual([]);
    expect(editorReducer(s, { type: "undo" }).doc).toBe(bench);
  });

  it("toggle-select adds and removes", () => {
    const s = run([{ type: "toggle-select", id: "iris-1" }, { type: "toggle-select", id: "screen-1" }, { type: "toggle-select", id: "iris-1" }]);
    expect(s.selection).toEqual(["screen-1"]);
  });

  it("an empty title is no title", () => {
    expect(run([{ type: "set-title", title: "" }]).doc.title).toBeUndefined();
  });
});

describe("dragging a selection", () => {
  it("moves the whole selection by the dragged element's travel, the others keeping their spacing", () => {
    const start = dragStart(bench.elements, ["iris-1", "screen-1"], "iris-1");
    expect(start).toEqual({ "iris-1": 300, "screen-1": 900 });
    expect(dragPositions(start, "iris-1", snapMm(337.3, 25))).toEqual({ "iris-1": 325, "screen-1": 925 });
  });

  it("dragging an unselected element moves it alone", () => {
    expect(dragStart(bench.elements, ["iris-1"], "screen-1")).toEqual({ "screen-1": 900 });
  });
});
