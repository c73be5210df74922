"use client";
import type { AnyBenchDocument } from "@/lib/bench/schema";
import { ConflictDialog } from "./conflict-dialog";
import type { useAutosave } from "./use-autosave";

// What both editors (the rail's and the table's) say above the drawing: that it is read only and why, that the revision
// shown is no longer a draft so the first change starts a new one, and the conflict dialog when someone else saved.

type Props<D extends AnyBenchDocument> = {
  doc: D;
  save: ReturnType<typeof useAutosave>;
  canEdit: boolean;
  labName: string;
  /** "the drawing" or "the table": what the read-only person may look at. */
  what: string;
  /** Load the other person's document when it is of this editor's kind (a rail for the rail editor, a table for the table's). */
  onTakeTheirs: (theirs: AnyBenchDocument) => void;
};

export function EditorNotices<D extends AnyBenchDocument>({ doc, save, canEdit, labName, what, onTakeTheirs }: Props<D>) {
  const baseState = save.base.state;
  return (
    <>
      {!canEdit ? (
        <p className="rounded-md border border-line bg-panel px-3 py-2 text-sm" data-testid="read-only-note">
          <span aria-hidden="true">◇ </span>Read only: you can look at {what} and the predictions, but only researchers of {labName} can change this bench.
        </p>
      ) : baseState !== "draft" ? (
        <p className="rounded-md border border-warn/60 bg-panel px-3 py-2 text-sm">
          Revision {save.base.revisionNumber} is no longer a draft, so it stays exactly as it is: your first change starts revision {save.base.revisionNumber + 1} as a new draft.
        </p>
      ) : null}

      {save.state.kind === "conflict" ? (
        <ConflictDialog
          mine={doc}
          current={save.state.current}
          message={save.state.message}
          onKeepMine={save.keepMine}
          onTakeTheirs={() => {
            const theirs = save.takeTheirs();
            if (theirs && theirs.version === doc.version) onTakeTheirs(theirs);
          }}
        />
      ) : null}
    </>
  );
}
