"use client";
// Autosave of the working draft with optimistic concurrency. The edit remembers which revision and version it is
// based on (its provenance, set at load and after each save); a save on an older base comes back as a conflict
// with the server's draft, and nothing is saved until the user chooses. Leaving the page (reload, close, another
// page) sends the pending change at once with keepalive, and a copy stays in this browser until the server has it.
import { useCallback, useEffect, useLayoutEffect, useMemo, useRef, useState } from "react";
import { useQueryClient } from "@tanstack/react-query";
import { putDraft, useSaveDraft, type DraftView, type SaveDraftOutcome } from "@/lib/api/bench-queries";
import { ApiError, queryKeys } from "@/lib/api/client";
import { describeIssues } from "@/lib/bench/schema";
import { anyBenchDocumentSchema, type AnyBenchDocument } from "@/lib/bench/schema-v2";
import { documentKey } from "./document-key";
import { forgetUnsaved, keepUnsaved } from "./unsaved-copy";

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

type Base = Pick<DraftView, "revisionId" | "revisionNumber" | "version" | "state" | "updatedAt" | "contentHash"> & { key: string };

const baseOf = (draft: DraftView): Base => ({
  revisionId: draft.revisionId,
  contentHash: draft.contentHash,
  revisionNumber: draft.revisionNumber,
  version: draft.version,
  state: draft.state,
  updatedAt: draft.updatedAt,
  key: documentKey(draft.document),
});

/** doc: the working document, a rail (version 1) or a table (version 2); either is saved the same way. */
export function useAutosave(benchId: string, initial: DraftView, doc: AnyBenchDocument, canEdit: boolean) {
  const queryClient = useQueryClient();
  const save = useSaveDraft(benchId);
  const [base, setBase] = useState<Base>(() => baseOf(initial));
  const [conflict, setConflict] = useState<{ current: DraftView; message: string } | null>(null);
  const [failure, setFailure] = useState<{ offline: boolean; message: string } | null>(null);
  const [retryTick, setRetryTick] = useState(0);

  const key = useMemo(() => documentKey(doc), [doc]);
  const validity = useMemo(() => anyBenchDocumentSchema.safeParse(doc), [doc]);
  const dirty = key !== base.key;

  // What the leave handlers need, current at the moment the page is left.
  const latest = useRef({ canEdit, dirty, key, base, conflict, document: validity.success ? validity.data : null });
  useLayoutEffect(() => {
    latest.current = { canEdit, dirty, key, base, conflict, document: validity.success ? validity.data : null };
  });
  const sentOnLeave = useRef<string | null>(null);

  /** A save's answer: saved → the new base; a 409 whose server document is the one here (a save on leaving got there first) is no conflict. */
  const settle = useCallback(
    (outcome: SaveDraftOutcome, sentKey: string) => {
      setFailure(null);
      if (outcome.kind === "saved") {
        setBase({ ...baseOf(outcome.draft), key: sentKey });
        return;
      }
      const theirs = documentKey(outcome.current.document);
      if (theirs === sentKey || theirs === latest.current.key) {
        queryClient.setQueryData(queryKeys.draft(benchId), outcome.current);
        setBase(baseOf(outcome.current));
      } else setConflict({ current: outcome.current, message: outcome.message });
    },
    [queryClient, benchId],
  );

  const saveNow = useCallback(() => {
    if (!validity.success) return;
    const sentKey = key;
    save.mutate(
      { document: validity.data, baseRevision: base.revisionNumber, baseVersion: base.version },
      {
        onSuccess: (outcome) => settle(outcome, sentKey),
        onError: (error) => {
          const offline = error instanceof ApiError && error.status === 0;
          setFailure({ offline, message: error.message });
        },
      },
    );
  }, [validity, key, base, save, settle]);

  // A copy of an unsaved drawing stays in this browser until the server has it (unsaved-copy.ts). The copy is
  // forgotten only once this page has held a change and the server has it, and never while the page is being left:
  // - on opening the page the copy still waits to be restored (the editor reads it after this effect has run);
  // - a save that lands while a reload is under way may land after the new page has read the draft, so that page
  //   must still find the copy (based on the version it read) to put the change back. A copy the server already
  //   holds is harmless: its base version is older than the draft's, and the editor then drops it.
  const heldChange = useRef(false);
  const leaving = useRef(false);
  useEffect(() => {
    if (!canEdit) return;
    if (dirty) {
      heldChange.current = true;
      keepUnsaved(benchId, { document: doc, baseRevision: base.revisionNumber, baseVersion: base.version, key, savedAtMs: Date.now() });
    } else if (heldChange.current && !leaving.current) forgetUnsaved(benchId);
  }, [canEdit, dirty, doc, key, base.revisionNumber, base.version, benchId]);

  // Leaving the page: send what is pending at once (keepalive outlives the page). Returns false when it cannot be
  // sent (an incomplete drawing, an open conflict), so the browser asks before the page goes.
  const flushOnLeave = useCallback((): boolean => {
    leaving.current = true;
    const l = latest.current;
    if (!l.canEdit || !l.dirty) return true;
    // The browser's copy first, synchronously: whatever happens to the request below, the change is kept here.
    if (l.document) keepUnsaved(benchId, { document: l.document, baseRevision: l.base.revisionNumber, baseVersion: l.base.version, key: l.key, savedAtMs: Date.now() });
    if (!l.document || l.conflict) return false;
    if (sentOnLeave.current === l.key) return true;
    sentOnLeave.current = l.key;
    const sentKey = l.key;
    putDraft(benchId, { document: l.document, baseRevision: l.base.revisionNumber, baseVersion: l.base.version }, { keepalive: true })
      .then((outcome) => {
        if (outcome.kind === "saved") queryClient.setQueryData(queryKeys.draft(benchId), outcome.draft);
        settle(outcome, sentKey);
      })
      .catch(() => {
        sentOnLeave.current = null;
      });
    return true;
  }, [benchId, queryClient, settle]);

  useEffect(() => {
    const onHidden = () => {
      if (document.visibilityState === "hidden") flushOnLeave();
      else leaving.current = false; // back on this page (another tab was shown, or a leave was cancelled)
    };
    const onPageShow = () => {
      leaving.current = false;
    };
    const onPageHide = () => flushOnLeave();
    const onBeforeUnload = (event: BeforeUnloadEvent) => {
      if (!flushOnLeave()) {
        event.preventDefault();
        event.returnValue = "";
      }
    };
    document.addEventListener("visibilitychange", onHidden);
    window.addEventListener("pagehide", onPageHide);
    window.addEventListener("pageshow", onPageShow);
    window.addEventListener("beforeunload", onBeforeUnload);
    return () => {
      document.removeEventListener("visibilitychange", onHidden);
      window.removeEventListener("pagehide", onPageHide);
      window.removeEventListener("pageshow", onPageShow);
      window.removeEventListener("beforeunload", onBeforeUnload);
    };
  }, [flushOnLeave]);

  // Leaving the editor inside the app (a link to another page) unmounts it: send what is pending then too.
  const flushRef = useRef(flushOnLeave);
  useLayoutEffect(() => {
    flushRef.current = flushOnLeave;
  });
  useEffect(() => () => void flushRef.current(), []);

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
  const takeTheirs = useCallback((): AnyBenchDocument | null => {
    if (!conflict) return null;
    queryClient.setQueryData(queryKeys.draft(benchId), conflict.current);
    setBase(baseOf(conflict.current));
    setConflict(null);
    // A draft of the other version (a table saved over a rail, or the reverse) is not taken by this editor: the draft in
    // the cache is now that document, and BenchEditor opens the editor that holds it.
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
