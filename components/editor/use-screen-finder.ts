"use client";
// The finder for the selected aperture: asked for the settled (debounced, valid) drawing only, under the same
// document hash as the analysis, so a newer drawing supersedes and cancels it; older answers show as stale.
import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { useMemo } from "react";
import { screenFinderQuery } from "@/lib/api/bench-queries";
import type { AnalysisView } from "./use-analysis";
import { finderRange, finderTicks, type FinderRange } from "./screen-finder";

const NO_RANGE: FinderRange = { apertureId: "", screenId: null, fromMm: 0, toMm: 1 };

export function useScreenFinder(settled: AnalysisView["settled"], apertureId: string | null) {
  const range = useMemo(() => (settled && apertureId ? finderRange(settled.doc, apertureId) : null), [settled, apertureId]);
  const r = range ?? NO_RANGE;
  const query = useQuery({
    ...screenFinderQuery(settled?.doc ?? { version: 1, elements: [] }, settled?.hash ?? "pending", { apertureId: r.apertureId, fromMm: r.fromMm, toMm: r.toMm }),
    enabled: settled !== null && range !== null,
    placeholderData: keepPreviousData,
  });
  // An answer for another aperture is never shown, not even greyed.
  const data = apertureId !== null && query.data?.apertureId === apertureId ? query.data : undefined;
  const ticks = useMemo(() => finderTicks(data), [data]);
  return {
    data,
    ticks,
    range,
    stale: data !== undefined && (query.isPlaceholderData || settled === null),
    loading: query.isFetching,
    error: query.error ? query.error.message : null,
  };
}
