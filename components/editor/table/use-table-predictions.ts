"use client";
// Predictions for the table editor from two sources. The server (POST /api/analyze) answers for the drawing once it has
// rested, as in the rail editor, and its answer stands. While the drawing moves (a drag, a turn) the same engine runs in
// a worker in this browser on the newest state, one run at a time (a run asked for while one is busy waits, and only the
// newest waiting state is kept), so the figures follow the drag without holding up its frames.
import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { useEffect, useMemo, useRef, useState } from "react";
import { apiFetch, queryKeys } from "@/lib/api/client";
import type { TableAnalyzeResponse } from "@/lib/api/bench-queries";
import { benchDocumentV2Schema, type BenchDocumentV2 } from "@/lib/bench/schema-v2";
import { describeIssues } from "@/lib/bench/schema";
import { documentKey, shortHash } from "../document-key";
import { useDebounced } from "../use-debounced";
import { ANALYSIS_DELAY_MS } from "../use-analysis";
import { predictTable, type TablePredictions } from "./table-engine";

export type TablePredictionView = {
  /** The predictions shown, or undefined before the first answer. */
  data: TablePredictions | undefined;
  /** Where the shown predictions come from. */
  source: "server" | "browser" | null;
  /** True when the shown predictions are for another drawing than the one on screen. */
  stale: boolean;
  blockedBy: string | null;
  error: string | null;
  fetching: boolean;
  /** How many answers the browser's engine has given (the drag benchmark counts them). */
  liveRuns: number;
};

/** POST /api/analyze for the table, tagged with the document key it answers (so the editor tells current from stale). */
const serverPredictions = (document: BenchDocumentV2, documentKey: string, hash: string) =>
  queryOptions({
    queryKey: [...queryKeys.analysis(hash), "table-editor"] as const,
    queryFn: ({ signal }) =>
      apiFetch<TableAnalyzeResponse>("/api/analyze", { method: "POST", body: JSON.stringify(document), signal }).then((r) => ({ ...r, documentKey })),
    staleTime: Infinity,
    gcTime: 60_000,
    retry: false,
  });

type Local = { key: string; predictions?: TablePredictions; error?: string };

/** One worker per editor; a browser without workers computes on the main thread after the current frame. */
function useEngineWorker(onAnswer: (answer: Local) => void) {
  const worker = useRef<Worker | null>(null);
  const submit = useRef<(job: { key: string; doc: BenchDocumentV2 }) => void>(() => undefined);
  const busy = useRef(false);
  const waiting = useRef<{ key: string; doc: BenchDocumentV2 } | null>(null);
  const answer = useRef(onAnswer);
  useEffect(() => {
    answer.current = onAnswer;
  });
  useEffect(() => {
    let w: Worker | null = null;
    try {
      w = new Worker(new URL("./table-engine.worker.ts", import.meta.url));
    } catch {
      w = null;
    }
    worker.current = w;
    const next = () => {
      busy.current = false;
      const job = waiting.current;
      if (job) {
        waiting.current = null;
        run(job);
      }
    };
    const run = (job: { key: string; doc: BenchDocumentV2 }) => {
      busy.current = true;
      if (w) w.postMessage(job);
      else
        setTimeout(() => {
          try {
            answer.current({ key: job.key, predictions: predictTable(job.doc) });
          } catch (error) {
            answer.current({ key: job.key, error: error instanceof Error ? error.message : String(error) });
          }
          next();
        }, 0);
    };
    if (w)
      w.onmessage = (event: MessageEvent<Local>) => {
        answer.current(event.data);
        next();
      };
    submit.current = (job) => {
      if (busy.current) waiting.current = job;
      else run(job);
    };
    return () => {
      w?.terminate();
      submit.current = () => undefined;
    };
  }, []);
  return submit;
}

/**
 * doc: the committed drawing (what is saved and sent to the server); live: what is on screen right now (the drag's
 * preview, or doc itself).
 */
export function useTablePredictions(doc: BenchDocumentV2, live: BenchDocumentV2): TablePredictionView {
  const key = useMemo(() => documentKey(doc), [doc]);
  const liveKey = useMemo(() => (live === doc ? key : documentKey(live)), [live, doc, key]);
  const validity = useMemo(() => benchDocumentV2Schema.safeParse(doc), [doc]);
  const settledKey = useDebounced(key, ANALYSIS_DELAY_MS);
  const settled = settledKey === key && validity.success ? { doc: validity.data, key, hash: shortHash(key) } : null;

  const server = useQuery({
    ...serverPredictions(settled?.doc ?? doc, settled?.key ?? key, settled?.hash ?? "pending"),
    enabled: settled !== null,
    placeholderData: keepPreviousData,
  });
  const serverData: (TablePredictions & { documentKey: string }) | undefined = server.data;

  const [local, setLocal] = useState<{ answer: Local; runs: number } | null>(null);
  const submit = useEngineWorker((answer) => setLocal((l) => ({ answer, runs: (l?.runs ?? 0) + 1 })));
  const serverHasLive = serverData?.documentKey === liveKey;
  useEffect(() => {
    if (serverHasLive) return;
    if (!live.elements.some((e) => e.kind === "laser")) return;
    submit.current({ key: liveKey, doc: live });
  }, [liveKey, live, serverHasLive, submit]);

  const localAnswer = local?.answer ?? null;
  let data: TablePredictions | undefined;
  let source: TablePredictionView["source"] = null;
  let stale = true;
  if (serverData && serverData.documentKey === liveKey) {
    data = serverData;
    source = "server";
    stale = false;
  } else if (localAnswer?.predictions && localAnswer.key === liveKey) {
    data = localAnswer.predictions;
    source = "browser";
    stale = false;
  } else if (localAnswer?.predictions && (!serverData || liveKey !== key)) {
    data = localAnswer.predictions;
    source = "browser";
  } else if (serverData) {
    data = serverData;
    source = "server";
  }
  const blockedBy = validity.success ? null : (describeIssues(validity.error)[0]?.message ?? "The table is not complete.");
  return {
    data,
    source,
    stale,
    blockedBy,
    error: server.error ? server.error.message : localAnswer?.key === liveKey && localAnswer.error ? localAnswer.error : null,
    fetching: server.isFetching || (validity.success && settledKey !== key),
    liveRuns: local?.runs ?? 0,
  };
}
