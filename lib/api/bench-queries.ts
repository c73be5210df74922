// Query options and mutations for benches, their working drafts and the analysis, shared by the server
// prefetch (same keys, a direct queryFn) and the browser. Keys come from queryKeys in ./client.
import { queryOptions, useMutation, useQueryClient } from "@tanstack/react-query";
import type { AnyBenchDocument, BenchDocument, BenchDocumentV2 } from "@/lib/bench/schema";
import type { BenchAnalysis, ScreenSearch } from "@/lib/optics";
import type { BenchSafetyAssessment, TableSafetyAssessment } from "@/lib/safety";
import type { TableAnalysis } from "@/lib/optics/table";
import type { BenchDetail } from "@/lib/server/benches";
import { createBenchInput, type DraftView, type FrozenRevision, type RailDraftView } from "@/lib/api/contracts/benches";
import type { LaserView } from "@/lib/api/contracts/register";
import { apiFetch, checkBeforeSending, conflictCurrent, queryKeys, type ApiError } from "./client";

export type { BenchDetail, DraftView, FrozenRevision, LaserView, RailDraftView };

export type AnalyzeResponse = { analysis: BenchAnalysis; safety?: BenchSafetyAssessment };
/** POST /api/analyze for a table (version 2): paths with their ends, open beams, one entry per laser; the fixed limitations left out. */
export type TableAnalyzeResponse = { analysis: TableAnalysis; safety?: Omit<TableSafetyAssessment, "limitations"> };
/** An analysis tagged with the document key it was computed for, so the editor can tell current from stale. */
export type KeyedAnalysis = AnalyzeResponse & { documentKey: string };
export type ProfileResponse = { radiusMm: number[]; relativeIntensity: number[]; method?: string; shadowRadiusMm?: number };

const json = (body: unknown) => JSON.stringify(body);

export const draftQuery = (benchId: string) =>
  queryOptions({
    queryKey: queryKeys.draft(benchId),
    queryFn: ({ signal }) => apiFetch<{ draft: DraftView }>(`/api/benches/${benchId}/draft`, { signal }).then((r) => r.draft),
    // The editor owns the working copy; a background refetch must never move the version it is based on.
    staleTime: Infinity,
    refetchOnWindowFocus: false,
  });

/** The analysis of a table (version 2), cached under the same key factory as the rail's; with `labId`, as analysisQuery. */
export const tableAnalysisQuery = (document: BenchDocumentV2, hash: string, labId?: string) =>
  queryOptions({
    queryKey: labId ? [...queryKeys.analysis(hash), "lab", labId] : queryKeys.analysis(hash),
    queryFn: ({ signal }) =>
      apiFetch<TableAnalyzeResponse>(labId ? `/api/analyze?labId=${encodeURIComponent(labId)}` : "/api/analyze", { method: "POST", body: json(document), signal }),
    staleTime: Infinity,
    gcTime: 60_000,
    retry: false,
  });

/** With `labId`, the hazard figures follow that lab's chosen safety standard (the server reads it). */
export const analysisQuery = (document: BenchDocument, documentKey: string, hash: string, labId?: string) =>
  queryOptions({
    queryKey: labId ? [...queryKeys.analysis(hash), "lab", labId] : queryKeys.analysis(hash),
    queryFn: ({ signal }) =>
      apiFetch<AnalyzeResponse>(labId ? `/api/analyze?labId=${encodeURIComponent(labId)}` : "/api/analyze", { method: "POST", body: json(document), signal }).then(
        (r): KeyedAnalysis => ({ ...r, documentKey }),
      ),
    staleTime: Infinity,
    gcTime: 60_000,
    retry: false,
  });

export const profileQuery = (document: BenchDocument, hash: string, apertureId: string) =>
  queryOptions({
    queryKey: queryKeys.profile(hash, apertureId),
    queryFn: ({ signal }) =>
      apiFetch<ProfileResponse>("/api/analyze/profile", { method: "POST", body: json({ document, apertureId, points: 240 }), signal }),
    staleTime: Infinity,
    gcTime: 60_000,
    retry: false,
  });

/** The bench with every revision (state, hash, document), e.g. to compare the drawing with the last one sent for review. */
export const benchQuery = (benchId: string) =>
  queryOptions({
    queryKey: queryKeys.bench(benchId),
    queryFn: ({ signal }) => apiFetch<BenchDetail>(`/api/benches/${benchId}`, { signal }),
    staleTime: 30_000,
  });

/** A finder answer tagged with the aperture it is for. */
export type KeyedScreenSearch = ScreenSearch & { apertureId: string };

export type FinderScreenRequest = { apertureId: string; fromMm: number; toMm: number; maxResults?: number };

/**
 * Screen positions behind an aperture giving a bright or a dark centre (POST /api/analyze/finder). Keyed under the
 * analysis of the same document (its hash), so it is cached, superseded and cancelled the same way.
 */
export const screenFinderQuery = (document: BenchDocument, hash: string, request: FinderScreenRequest) =>
  queryOptions({
    queryKey: [...queryKeys.analysis(hash), "finder", request.apertureId, request.fromMm, request.toMm, request.maxResults ?? null] as const,
    queryFn: ({ signal }) =>
      apiFetch<ScreenSearch>("/api/analyze/finder", { method: "POST", body: json({ goal: "screen-positions", document, ...request }), signal }).then(
        (r): KeyedScreenSearch => ({ ...r, apertureId: request.apertureId }),
      ),
    staleTime: Infinity,
    gcTime: 60_000,
    retry: false,
  });

export type SaveDraftRequest = { document: AnyBenchDocument; baseRevision: number; baseVersion: number };
export type SaveDraftOutcome = { kind: "saved"; draft: DraftView; createdRevision: boolean } | { kind: "conflict"; current: DraftView; message: string };

/** PUT the draft. A 409 is an answer (the server's draft), not an error; other failures throw ApiError (status 0 = offline). */
/** A save that has not answered after this long is taken as not arrived: the change stays here and is sent again. */
export const SAVE_TIMEOUT_MS = 20_000;

export async function putDraft(benchId: string, request: SaveDraftRequest, options: { keepalive?: boolean } = {}): Promise<SaveDraftOutcome> {
  try {
    const body = await apiFetch<{ draft: DraftView; createdRevision?: boolean }>(`/api/benches/${benchId}/draft`, {
      method: "PUT",
      body: json(request),
      // keepalive: a save sent while the page is being left still reaches the server
      keepalive: options.keepalive,
      timeoutMs: SAVE_TIMEOUT_MS,
      offlineMessage: "The server cannot be reached. Your changes are kept here and saved when it answers.",
    });
    return { kind: "saved", draft: body.draft, createdRevision: Boolean(body.createdRevision) };
  } catch (error) {
    const current = conflictCurrent<DraftView>(error);
    if (current) return { kind: "conflict", current, message: (error as ApiError).message };
    throw error;
  }
}

export function useSaveDraft(benchId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: ["save-draft", benchId],
    mutationFn: (request: SaveDraftRequest) => putDraft(benchId, request),
    onSuccess: (outcome) => {
      if (outcome.kind === "saved") {
        queryClient.setQueryData(queryKeys.draft(benchId), outcome.draft);
        void queryClient.invalidateQueries({ queryKey: queryKeys.benches(), exact: true });
      }
    },
    retry: false,
  });
}

export function useCreateBench() {
  const queryClient = useQueryClient();
  return useMutation({
    // checked against the route's own schema first: a missing title or lab is named at once, without a round trip
    mutationFn: async (input: { labId: string; title: string; table?: BenchDocumentV2["table"] }) =>
      apiFetch<{ id: string }>("/api/benches", { method: "POST", body: json(checkBeforeSending(createBenchInput, input)) }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: queryKeys.benches() }),
  });
}

export type MakeRevisionRequest = { baseRevision: number; baseVersion: number };
export type MakeRevisionOutcome = { kind: "made"; draft: DraftView; frozen: FrozenRevision } | { kind: "conflict"; current: DraftView; message: string };

/** POST a "make a revision". A 409 with the server's draft is an answer (stale base); other failures throw ApiError. */
export async function postRevision(benchId: string, request: MakeRevisionRequest): Promise<MakeRevisionOutcome> {
  try {
    const body = await apiFetch<{ draft: DraftView; frozen: FrozenRevision }>(`/api/benches/${benchId}/revisions`, {
      method: "POST",
      body: json(request),
      offlineMessage: "The server cannot be reached; no revision was made. Try again when it answers.",
    });
    return { kind: "made", draft: body.draft, frozen: body.frozen };
  } catch (error) {
    const current = conflictCurrent<DraftView>(error);
    if (current) return { kind: "conflict", current, message: (error as ApiError).message };
    throw error;
  }
}

export function useMakeRevision(benchId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: ["make-revision", benchId],
    mutationFn: (request: MakeRevisionRequest) => postRevision(benchId, request),
    onSuccess: (outcome) => {
      if (outcome.kind === "made") queryClient.setQueryData(queryKeys.draft(benchId), outcome.draft);
      void queryClient.invalidateQueries({ queryKey: queryKeys.bench(benchId), exact: true });
      void queryClient.invalidateQueries({ queryKey: queryKeys.benches(), exact: true });
    },
    retry: false,
  });
}

// TODO(lead): move these keys into queryKeys in lib/api/client.ts (lasers: (labId, status) => ["lasers", labId, status]).
const laserKeys = {
  inService: (labId: string) => ["lasers", labId, "in-service"] as const,
  one: (laserId: string) => ["lasers", "entry", laserId] as const,
};

/** The lab's in-service lasers from the register, for the editor's laser picker. */
export const inServiceLasersQuery = (labId: string) =>
  queryOptions({
    queryKey: laserKeys.inService(labId),
    queryFn: ({ signal }) => apiFetch<{ lasers: LaserView[] }>(`/api/lasers?labId=${encodeURIComponent(labId)}&status=in-service`, { signal }).then((r) => r.lasers),
    staleTime: 60_000,
  });

/** One register entry (any status), for the properties of a laser that refers to it. */
export const laserEntryQuery = (laserId: string) =>
  queryOptions({
    queryKey: laserKeys.one(laserId),
    queryFn: ({ signal }) => apiFetch<LaserView>(`/api/lasers/${encodeURIComponent(laserId)}`, { signal }),
    staleTime: 60_000,
    retry: false,
  });
