// The working bench document as plain state: the reducer with undo/redo history and the selection (no React here,
// so it is tested without a DOM). Continuous gestures (a drag, typing in one field) pass a coalesce key so that
// every change with the same key, one after the other, replaces the last history step instead of stacking.
import type { BenchDocument, BenchElement, ElementKind } from "@/lib/bench/schema";
import { newElement, nextId, roundMm } from "./element-kinds";
import { commit, historyReducer, initialHistory, type HistoryAction, type HistoryState } from "./history";

export { HISTORY_LIMIT } from "./history";
/** How far a duplicate lands downstream of its original. */
export const DUPLICATE_OFFSET_MM = 25;


export type EditorState = HistoryState<BenchDocument>;

/** Field values to set on an element; undefined removes an optional field (e.g. registerId for an ad hoc laser). */
export type ElementPatch = Partial<Record<string, number | string | readonly { wavelengthNm: number; powerMw: number }[] | undefined>>;

function applyPatch(element: BenchElement, patch: ElementPatch): BenchElement {
  const next = { ...element } as Record<string, unknown>;
  for (const [k, v] of Object.entries(patch)) {
    if (k === "id" || k === "kind") continue;
    if (v === undefined) delete next[k];
    else next[k] = k === "positionMm" && typeof v === "number" ? roundMm(v) : v;
  }
  return next as BenchElement;
}

export type EditorAction =
  | { type: "add"; kind: ElementKind; positionMm: number; values?: ElementPatch }
  | { type: "update"; id: string; patch: ElementPatch; coalesce?: string }
  | { type: "set-positions"; positions: Record<string, number>; coalesce?: string }
  | { type: "nudge"; deltaMm: number }
  | { type: "remove" }
  | { type: "duplicate" }
  | { type: "set-title"; title: string; coalesce?: string }
  | { type: "reset"; doc: BenchDocument }
  | HistoryAction<BenchDocument>;

export const initialEditorState = (doc: BenchDocument): EditorState => initialHistory(doc);

const withElements = (doc: BenchDocument, elements: BenchElement[]): BenchDocument => ({ ...doc, elements });

export function editorReducer(state: EditorState, action: EditorAction): EditorState {
  const { doc } = state;
  switch (action.type) {
    case "add": {
      const created = newElement(action.kind, action.positionMm, doc.elements);
      const element = action.values ? applyPatch(created, action.values) : created;
      return commit(state, withElements(doc, [...doc.elements, element]), null, [element.id]);
    }
    case "update": {
      if (!doc.elements.some((e) => e.id === action.id)) return state;
      const elements = doc.elements.map((e) => (e.id === action.id ? applyPatch(e, action.patch) : e));
      return commit(state, withElements(doc, elements), action.coalesce ?? null);
    }
    case "set-positions": {
      const elements = doc.elements.map((e) => (e.id in action.positions ? ({ ...e, positionMm: roundMm(action.positions[e.id]) } as BenchElement) : e));
      return commit(state, withElements(doc, elements), action.coalesce ?? null);
    }
    case "nudge": {
      if (state.selection.length === 0) return state;
      const elements = doc.elements.map((e) => (state.selection.includes(e.id) ? ({ ...e, positionMm: roundMm(e.positionMm + action.deltaMm) } as BenchElement) : e));
      return commit(state, withElements(doc, elements));
    }
    case "remove": {
      if (state.selection.length === 0) return state;
      return commit(state, withElements(doc, doc.elements.filter((e) => !state.selection.includes(e.id))), null, []);
    }
    case "duplicate": {
      if (state.selection.length === 0) return state;
      const copies: BenchElement[] = [];
      const all = [...doc.elements];
      for (const e of doc.elements) {
        if (!state.selection.includes(e.id) || e.kind === "laser") continue; // a bench holds exactly one laser
        const copy = { ...e, id: nextId(e.kind, all), positionMm: roundMm(e.positionMm + DUPLICATE_OFFSET_MM) } as BenchElement;
        all.push(copy);
        copies.push(copy);
      }
      if (copies.length === 0) return state;
      return commit(state, withElements(doc, all), null, copies.map((c) => c.id));
    }
    case "set-title":
      return commit(state, { ...doc, title: action.title === "" ? undefined : action.title }, action.coalesce ?? null);
    case "reset":
      return initialEditorState(action.doc);
    default:
      return historyReducer(state, action);
  }
}
