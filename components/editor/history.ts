// The editing history both editors share (the rail's editor-reducer.ts and the table's table/table-reducer.ts): the
// working document with undo/redo stacks and the selection, as plain state (no React). A continuous gesture (a drag,
// typing in one field) passes a coalesce key: every change with the same key, one after the other, replaces the last
// history step instead of stacking, so the gesture is undone in one step.

export const HISTORY_LIMIT = 200;

export type HistoryState<D> = {
  doc: D;
  past: D[];
  future: D[];
  selection: string[];
  /** The coalesce key of the last change; a change with the same key replaces it instead of stacking. */
  lastCoalesce: string | null;
};

/** The actions that touch only the history and the selection, the same in both editors. */
export type HistoryAction<D> =
  | { type: "replace"; doc: D }
  | { type: "select"; ids: string[] }
  | { type: "toggle-select"; id: string }
  | { type: "undo" }
  | { type: "redo" };

type WithElements = { elements: readonly { id: string }[] };

export const initialHistory = <D>(doc: D): HistoryState<D> => ({ doc, past: [], future: [], selection: [], lastCoalesce: null });

/** A new document as one history step (or merged into the last one when the coalesce key repeats); redo is cleared. */
export function commit<D>(state: HistoryState<D>, doc: D, coalesce: string | null = null, selection = state.selection): HistoryState<D> {
  const merging = coalesce !== null && coalesce === state.lastCoalesce;
  const past = merging ? state.past : [...state.past, state.doc].slice(-HISTORY_LIMIT);
  return { doc, past, future: [], selection, lastCoalesce: coalesce };
}

/** The selected ids that still name an element of the document. */
export const keepExisting = (selection: string[], doc: WithElements): string[] => selection.filter((id) => doc.elements.some((e) => e.id === id));

export function historyReducer<D extends WithElements>(state: HistoryState<D>, action: HistoryAction<D>): HistoryState<D> {
  switch (action.type) {
    case "replace":
      return commit(state, action.doc, null, keepExisting(state.selection, action.doc));
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
