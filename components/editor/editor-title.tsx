"use client";
import type { ReviewState } from "@/db/schema";
import { StateBadge } from "@/components/ui/state-badge";

// The top left of both editors: lab, author, revision and its state (and what the bench is drawn on), then the title —
// a field for those who may edit, a heading for everyone else.
type Props = {
  labName: string;
  authorName: string;
  revisionNumber: number;
  state: ReviewState;
  /** Words after the state, e.g. "on an optical table". */
  onWhat?: string;
  title: string | undefined;
  canEdit: boolean;
  onTitle: (title: string) => void;
};

export function EditorTitle({ labName, authorName, revisionNumber, state, onWhat, title, canEdit, onTitle }: Props) {
  return (
    <div className="min-w-0 flex-1">
      <p className="text-sm text-muted">
        {labName} · by {authorName} · revision {revisionNumber} <StateBadge state={state} />
        {onWhat ? ` · ${onWhat}` : null}
      </p>
      {canEdit ? (
        <label className="mt-1 block">
          <span className="sr-only">Bench title</span>
          <input
            value={title ?? ""}
            onChange={(e) => onTitle(e.target.value)}
            placeholder="Untitled bench"
            maxLength={200}
            className="w-full rounded-md border border-transparent bg-transparent px-1 text-2xl font-semibold hover:border-line focus:border-line"
          />
        </label>
      ) : (
        <h1 className="text-2xl font-semibold">{title ?? "Untitled bench"}</h1>
      )}
    </div>
  );
}
