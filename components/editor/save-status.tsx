"use client";
// The save state, always visible, as a shape and a word: saved / unsaved / saving / offline / conflict / not saved.
import type { SaveState } from "./use-autosave";

const LOOK: Record<SaveState["kind"], { shape: string; word: string; className: string }> = {
  saved: { shape: "✓", word: "Saved", className: "border-ok text-ok" },
  pending: { shape: "●", word: "Unsaved changes", className: "border-line text-muted" },
  saving: { shape: "◌", word: "Saving…", className: "border-accent text-accent" },
  offline: { shape: "⚠", word: "Offline — kept here, will save", className: "border-warn text-warn" },
  conflict: { shape: "✕", word: "Conflict — choose below", className: "border-danger text-danger" },
  invalid: { shape: "⚠", word: "Not saved", className: "border-warn text-warn" },
  error: { shape: "✕", word: "Not saved", className: "border-danger text-danger" },
  "read-only": { shape: "◇", word: "Read only", className: "border-line text-muted" },
};

export function SaveStatus({ state }: { state: SaveState }) {
  const look = LOOK[state.kind];
  const detail = state.kind === "invalid" || state.kind === "error" || state.kind === "offline" ? state.message : null;
  return (
    <div role="status" aria-live="polite" data-testid="save-status" data-state={state.kind} className="flex flex-col items-end gap-0.5">
      <span className={`inline-flex items-center gap-1.5 rounded-full border px-3 py-1 text-sm font-medium ${look.className}`}>
        <span aria-hidden="true">{look.shape}</span>
        {look.word}
      </span>
      {detail ? <span className="max-w-xs text-right text-xs text-muted">{detail}</span> : null}
    </div>
  );
}
