"use client";
// The working bench document as React state: the reducer (editor-reducer.ts, plain and tested) with the selected elements.
import { useMemo, useReducer } from "react";
import type { BenchDocument } from "@/lib/bench/schema";
import { editorReducer, initialEditorState } from "./editor-reducer";

export type { EditorAction, EditorState } from "./editor-reducer";

export function useEditorState(initial: BenchDocument) {
  const [state, dispatch] = useReducer(editorReducer, initial, initialEditorState);
  const selected = useMemo(() => state.doc.elements.filter((e) => state.selection.includes(e.id)), [state.doc, state.selection]);
  return { state, dispatch, selected, canUndo: state.past.length > 0, canRedo: state.future.length > 0 };
}
