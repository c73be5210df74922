"use client";
// Live predictions: the working document, once it has rested for ANALYSIS_DELAY_MS and passes the shared schema,
// goes to POST /api/analyze. A superseded request is cancelled (react-query aborts the signal when its query loses
// its observer); the last answer stays on screen, marked stale until the answer for the current drawing arrives.
import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { useMemo } from "react";
import { analysisQuery, profileQuery, type KeyedAnalysis } from "@/lib/api/bench-queries";
import { benchDocumentSchema, describeIssues, type BenchDocument } from "@/lib/bench/schema";
import { documentKey, shortHash } from "./document-key";
import { useDebounced } from "./use-debounced";

export const ANALYSIS_DELAY_MS = 250;

export type AnalysisView = {
  data: KeyedAnalysis | undefined;
  /** True when the shown analysis was computed for another drawing than the current one. */
  stale: boolean;
  /** Why there is no analysis for the current drawing (schema problems), if that is the reason. */
  blockedBy: string | null;
  error: string | null;
  fetching: boolean;
  /** The settled document the predictions are for, and its hash (for the profile query). */
  settled: { doc: BenchDocument; hash: string } | null;
};

/** `labId`: the bench's lab, whose chosen safety standard the hazard figures follow. */
export function useAnalysis(doc: BenchDocument, labId?: string): AnalysisView {
  const key = useMemo(() => documentKey(doc), [doc]);
  const validity = useMemo(() => benchDocumentSchema.safeParse(doc), [doc]);
  const settledKey = useDebounced(key, ANALYSIS_DELAY_MS);
  const settled = useMemo(() => {
    if (settledKey !== key || !validity.success) return null;
    return { doc: validity.data, hash: shortHash(key), key };
  }, [settledKey, key, validity]);

  const query = useQuery({
    ...analysisQuery(settled?.doc ?? doc, settled?.key ?? key, settled?.hash ?? "pending", labId),
    enabled: settled !== null,
    placeholderData: keepPreviousData,
  });

  return {
    data: query.data,
    stale: query.data !== undefined && query.data.documentKey !== key,
    blockedBy: validity.success ? null : describeIssues(validity.error)[0]?.message ?? "The drawing is not complete.",
    error: query.error ? query.error.message : null,
    fetching: query.isFetching || (validity.success && settledKey !== key),
    settled: settled ? { doc: settled.doc, hash: settled.hash } : null,
  };
}

export function useProfile(settled: AnalysisView["settled"], apertureId: string | null, hasScreen: boolean) {
  return useQuery({
    ...profileQuery(settled?.doc ?? { version: 1, elements: [] }, settled?.hash ?? "pending", apertureId ?? ""),
    enabled: settled !== null && apertureId !== null && hasScreen,
    placeholderData: keepPreviousData,
  });
}
