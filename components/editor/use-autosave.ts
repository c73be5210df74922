"use client";
// Autosave of the working draft with optimistic concurrency. The edit remembers which revision and version it is
// based on (its provenance, set at load and after each save); a save on an older base comes back as a conflict
// with the server's draft, and nothing is saved until the user chooses.
import { useCallback, useEffect, useMemo, useState } from "react";
import { useQueryClient } from "@tanstack/react-query";
import { useSaveDraft, type DraftView } from "@/lib/api/bench-queries";
import { ApiError, queryKeys } from "@/lib/api/client";
import { benchDocumentSchema, describeIssues, type BenchDocument } from "@/lib/bench/schema";
import { documentKey } from "./document-key";

export const AUTOSAVE_DELAY_MS = 800;
const OFFLINE_RETRY_MS = 5_000;

export type SaveState =
  | { kind: "saved"; at: string }
  | { kind: "pending" }
  | { kind: "saving" }
  | { kind: "offline"; message: string }
  | { kind: "conflict"; current: DraftView; message: string }
  | { kind: "invalid"; message: string }
  | { kind: "error"; message: string }
  | { kind: "read-only" };

type Base = Pick<DraftView, "revisionNumber" | "version" | "state" | "updatedAt"> & { key: string };

const baseOf = (draft: DraftView): Base => ({
  revisionNumber: draft.revisionNumber,
  version: draft.version,
  state: draft.state,
  updatedAt: draft.updatedAt,
  key: documentKey(draft.document),
});

export function useAutosave(benchId: string, initial: DraftView, doc: BenchDocument, canEdit: boolean) {
  const queryClient = useQueryClient();
  const save = useSaveDraft(benchId);
  const [base, setBase] = useState<Base>(() => baseOf(initial));
  const [conflict, setConflict] = useState<{ current: DraftView; message: string } | null>(null);
  const [failure, setFailure] = useState<{ offline: boolean; message: string } | null>(null);
  const [retryTick, setRetryTick] = useState(0);

  const key = useMemo(() => documentKey(doc), [doc]);
  const validity = useMemo(() => benchDocumentSchema.safeParse(doc), [doc]);
  const dirty = key !== base.key;

  const saveNow = useCallback(() => {
    if (!validity.success) return;
    const sentKey = key;
    save.mutate(
      { document: validity.data, baseRevision: base.revisionNumber, baseVersion: base.version },
      {
        onSuccess: (outcome) => {
          setFailure(null);
          if (outcome.kind === "saved") setBase({ ...baseOf(outcome.draft), key: sentKey });
          else setConflict({ current: outcome.current, message: outcome.message });
        },
        onError: (error) => {
          const offline = error instanceof ApiError && error.status === 0;
          setFailure({ offline, message: error.message });
        },
      },
    );
  }, [validity, key, base, save]);

  // Debounced autosave: a quiet period after the last change, never while a save or a conflict is open.
  useEffect(() => {
    if (!canEdit || !dirty || !validity.success || conflict || save.isPending) return;
    const delay = failure ? OFFLINE_RETRY_MS : AUTOSAVE_DELAY_MS;
    const timer = setTimeout(saveNow, delay);
    return () => clearTimeout(timer);
  }, [canEdit, dirty, validity.success, conflict, save.isPending, failure, saveNow, retryTick]);

  useEffect(() => {
    const again = () => setRetryTick((t) => t + 1);
    window.addEventListener("online", again);
    return () => window.removeEventListener("online", again);
  }, []);

  /** Keep my drawing: rebase it on the server's version and save it on top. */
  const keepMine = useCallback(() => {
    if (!conflict) return;
    queryClient.setQueryData(queryKeys.draft(benchId), conflict.current);
    setBase(baseOf(conflict.current));
    setConflict(null);
  }, [conflict, queryClient, benchId]);

  /** Take theirs: the server's document becomes the drawing (one undo step brings mine back). */
  const takeTheirs = useCallback((): BenchDocument | null => {
    if (!conflict) return null;
    queryClient.setQueryData(queryKeys.draft(benchId), conflict.current);
    setBase(baseOf(conflict.current));
    setConflict(null);
    return conflict.current.document;
  }, [conflict, queryClient, benchId]);

  /** A new working draft made elsewhere in the editor (e.g. "make a revision"): the edit is based on it from now on. */
  const adopt = useCallback(
    (draft: DraftView) => {
      queryClient.setQueryData(queryKeys.draft(benchId), draft);
      setBase(baseOf(draft));
      setConflict(null);
    },
    [queryClient, benchId],
  );

  let state: SaveState;
  if (!canEdit) state = { kind: "read-only" };
  else if (conflict) state = { kind: "conflict", ...conflict };
  else if (save.isPending) state = { kind: "saving" };
  else if (dirty && !validity.success) state = { kind: "invalid", message: describeIssues(validity.error)[0]?.message ?? "The drawing is not complete." };
  else if (dirty && failure) state = failure.offline ? { kind: "offline", message: failure.message } : { kind: "error", message: failure.message };
  else if (dirty) state = { kind: "pending" };
  else state = { kind: "saved", at: base.updatedAt };

  return { state, base, keepMine, takeTheirs, saveNow, adopt };
}
