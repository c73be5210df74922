// The working table document as plain state: the reducer with undo/redo history and the selection (no React, so it is
// tested without a DOM). As in the rail editor (../editor-reducer.ts), a continuous gesture passes a coalesce key so
// its changes make one undo step. New elements take their values from the one record per kind (lib/bench/element-kinds.ts).
import { ELEMENT_KIND_RECORDS } from "@/lib/bench/element-kinds";
import type { BenchDocument } from "@/lib/bench/schema";
import type { BenchDocumentV2, TableElement, TableElementKind, TableGeometry } from "@/lib/bench/schema-v2";
import { commit, historyReducer, initialHistory, type HistoryAction, type HistoryState } from "../history";
import { normalDeg, railOnTable, roundDeg, roundMm, type PointMm } from "./table-geometry";

export { HISTORY_LIMIT } from "../history";


export type TableEditorState = HistoryState<BenchDocumentV2>;

/** Field values to set on an element; undefined removes an optional field. */
export type TablePatch = Partial<Record<string, number | string | readonly { wavelengthNm: number; powerMw: number }[] | undefined>>;

export type TableAction =
  | { type: "add"; kind: TableElementKind; at: PointMm & { angleDeg: number }; values?: TablePatch }
  | { type: "update"; id: string; patch: TablePatch; coalesce?: string }
  | { type: "place"; places: Record<string, Partial<PointMm & { angleDeg: number }>>; coalesce?: string }
  | { type: "remove" }
  | { type: "set-title"; title: string; coalesce?: string }
  | { type: "set-table"; table: Partial<TableGeometry>; coalesce?: string }
  | HistoryAction<BenchDocumentV2>;

export const initialTableState = (doc: BenchDocumentV2): TableEditorState => initialHistory(doc);

/** The next free id for a kind: its prefix and one more than the highest number in use ("mirror-3"). */
export function nextTableId(kind: TableElementKind, elements: readonly { id: string }[]): string {
  const prefix = ELEMENT_KIND_RECORDS[kind].idPrefix;
  let max = 0;
  for (const e of elements) {
    const m = new RegExp(`^${prefix}-(\\d+)$`).exec(e.id);
    if (m) max = Math.max(max, Number(m[1]));
  }
  return `${prefix}-${max + 1}`;
}

export function newTableElement(kind: TableElementKind, at: PointMm & { angleDeg: number }, elements: readonly { id: string }[]): TableElement {
  return {
    id: nextTableId(kind, elements),
    kind,
    xMm: roundMm(at.xMm),
    yMm: roundMm(at.yMm),
    angleDeg: normalDeg(at.angleDeg),
    ...ELEMENT_KIND_RECORDS[kind].defaults,
  } as TableElement;
}

function applyPatch(element: TableElement, patch: TablePatch): TableElement {
  const next = { ...element } as Record<string, unknown>;
  for (const [k, v] of Object.entries(patch)) {
    if (k === "id" || k === "kind") continue;
    if (v === undefined) delete next[k];
    else if ((k === "xMm" || k === "yMm") && typeof v === "number") next[k] = roundMm(v);
    else if (k === "angleDeg" && typeof v === "number") next[k] = roundDeg(v);
    else next[k] = v;
  }
  return next as TableElement;
}

export function tableReducer(state: TableEditorState, action: TableAction): TableEditorState {
  const { doc } = state;
  switch (action.type) {
    case "add": {
      const created = newTableElement(action.kind, action.at, doc.elements);
      const element = action.values ? applyPatch(created, action.values) : created;
      return commit(state, { ...doc, elements: [...doc.elements, element] }, null, [element.id]);
    }
    case "update": {
      if (!doc.elements.some((e) => e.id === action.id)) return state;
      return commit(state, { ...doc, elements: doc.elements.map((e) => (e.id === action.id ? applyPatch(e, action.patch) : e)) }, action.coalesce ?? null);
    }
    case "place": {
      const ids = Object.keys(action.places).filter((id) => doc.elements.some((e) => e.id === id));
      if (ids.length === 0) return state;
      const elements = doc.elements.map((e) => (e.id in action.places ? applyPatch(e, action.places[e.id] as TablePatch) : e));
      return commit(state, { ...doc, elements }, action.coalesce ?? null);
    }
    case "remove": {
      if (state.selection.length === 0) return state;
      return commit(state, { ...doc, elements: doc.elements.filter((e) => !state.selection.includes(e.id)) }, null, []);
    }
    case "set-title":
      return commit(state, { ...doc, title: action.title === "" ? undefined : action.title }, action.coalesce ?? null);
    case "set-table":
      return commit(state, { ...doc, table: { ...doc.table, ...action.table } }, action.coalesce ?? null);
    default:
      return historyReducer(state, action);
  }
}

/** An empty table to start on. */
export const emptyTable = (title?: string, table: TableGeometry = { widthMm: 900, depthMm: 600, holePitchMm: 25 }): BenchDocumentV2 => ({
  version: 2,
  ...(title ? { title } : {}),
  table,
  elements: [],
});

/**
 * A rail bench moved onto the table: the rail becomes a straight beam along +x on the middle hole row (the bench
 * document contract reads version 1 that way), 100 mm in from the left edge, every element facing +x, values kept.
 */
export function railToTable(doc: BenchDocument): BenchDocumentV2 {
  const { table, xOffsetMm, yMm } = railOnTable(doc.elements);
  const elements = doc.elements.map((e): TableElement => {
    const { positionMm, ...rest } = e;
    return { ...rest, xMm: roundMm(positionMm + xOffsetMm), yMm, angleDeg: 0 } as TableElement;
  });
  return { version: 2, ...(doc.title === undefined ? {} : { title: doc.title }), table, elements };
}
