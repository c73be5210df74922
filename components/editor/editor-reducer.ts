// The working bench document as plain state: the reducer with undo/redo history and the selection (no React here,
// so it is tested without a DOM). Continuous gestures (a drag, typing in one field) pass a coalesce key so that
// every change with the same key, one after the other, replaces the last history step instead of stacking.
import type { BenchDocument, BenchElement, ElementKind } from "@/lib/bench/schema";
import { newElement, nextId, roundMm } from "./element-kinds";

export const HISTORY_LIMIT = 200;
/** How far a duplicate lands downstream of its original. */
export const DUPLICATE_OFFSET_MM = 25;

export type EditorState = {
  doc: BenchDocument;
  past: BenchDocument[];
  future: BenchDocument[];
  selection: string[];
  /** The coalesce key of the last change; a change with the same key replaces it instead of stacking. */
  lastCoalesce: string | null;
};

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
  | { type: "replace"; doc: BenchDocument }
  | { type: "reset"; doc: BenchDocument }
  | { type: "select"; ids: string[] }
  | { type: "toggle-select"; id: string }
  | { type: "undo" }
  | { type: "redo" };

export const initialEditorState = (doc: BenchDocument): EditorState => ({ doc, past: [], future: [], selection: [], lastCoalesce: null });

function commit(state: EditorState, doc: BenchDocument, coalesce: string | null = null, selection = state.selection): EditorState {
  const merging = coalesce !== null && coalesce === state.lastCoalesce;
  const past = merging ? state.past : [...state.past, state.doc].slice(-HISTORY_LIMIT);
  return { doc, past, future: [], selection, lastCoalesce: coalesce };
}

const withElements = (doc: BenchDocument, elements: BenchElement[]): BenchDocument => ({ ...doc, elements });

const keepExisting = (selection: string[], doc: BenchDocument) => selection.filter((id) => doc.elements.some((e) => e.id === id));

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
    case "replace":
      return commit(state, action.doc, null, keepExisting(state.selection, action.doc));
    case "reset":
      return initialEditorState(action.doc);
    case "select":
      return { ...state, selection: action.ids, lastCoalesce: null };
    case "toggle-select":
      return {
        ...state,
        selection: state.selection.includes(action.id) ? state.selection.filter((s) => s !== action.id) : [...state.selection, action.id],
        lastCoalesce: null,
      };
    case "undo": {
      const previous = state.past.at(-1);
      if (!previous) return state;
      return { doc: previous, past: state.past.slice(0, -1), future: [state.doc, ...state.future], selection: keepExisting(state.selection, previous), lastCoalesce: null };
    }
    case "redo": {
      const next = state.future[0];
      if (!next) return state;
      return { doc: next, past: [...state.past, state.doc], future: state.future.slice(1), selection: keepExisting(state.selection, next), lastCoalesce: null };
    }
  }
}
