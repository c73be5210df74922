// Query options and mutations of the as-built record, shared by the server prefetch (same keys) and the
// browser. Every mutation answers with the whole build, which replaces the cached one.
import { queryOptions, useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch, queryKeys } from "@/lib/api/client";
import type { BuildView, ObservationView, PhotoReadingView } from "@/lib/api/contracts/builds";

export type { BuildView, ObservationView };

export const buildQuery = (buildId: string) =>
  queryOptions({
    queryKey: queryKeys.build(buildId),
    queryFn: ({ signal }) => apiFetch<{ build: BuildView }>(`/api/builds/${buildId}`, { signal }).then((r) => r.build),
    staleTime: 10_000,
  });

function useBuildMutation<I, R extends { build: BuildView }>(buildId: string, send: (input: I) => Promise<R>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: send,
    onSuccess: (result) => queryClient.setQueryData(queryKeys.build(buildId), result.build),
  });
}

export type CheckPatch = { itemKey: string; done?: boolean; measuredPositionMm?: number | null; note?: string | null };
export function useCheck(buildId: string) {
  return useBuildMutation(buildId, (input: CheckPatch) => apiFetch<{ build: BuildView }>(`/api/builds/${buildId}/checks`, { method: "PATCH", body: JSON.stringify(input) }));
}

export type ObservationInput = { apertureId: string | null; centreSeen: "bright" | "dark" | "between" | null; spotDiameterMm: number | null; screenPowerMw: number | null; note: string | null };
export function useObservation(buildId: string) {
  return useBuildMutation(buildId, (input: ObservationInput) =>
    apiFetch<{ build: BuildView; observation: ObservationView }>(`/api/builds/${buildId}/observations`, { method: "POST", body: JSON.stringify(input) }),
  );
}

export function useSignOff(buildId: string) {
  return useBuildMutation(buildId, () => apiFetch<{ build: BuildView }>(`/api/builds/${buildId}/sign-off`, { method: "POST", body: "{}" }));
}

/** Multipart: apiFetch sends a FormData body as it is. */
export function useUpload(buildId: string) {
  return useBuildMutation(buildId, (input: { file: File; kind: string }) => {
    const form = new FormData();
    form.set("file", input.file);
    form.set("kind", input.kind);
    return apiFetch<{ build: BuildView }>(`/api/builds/${buildId}/uploads`, { method: "POST", body: form });
  });
}

/** Reads an uploaded screen photo against the prediction behind one aperture. */
export function usePhotoReading(buildId: string) {
  return useBuildMutation(buildId, (input: { uploadId: string; apertureId: string; screenId?: string }) =>
    apiFetch<{ build: BuildView; reading: PhotoReadingView; created: boolean }>(`/api/builds/${buildId}/photo-reading`, { method: "POST", body: JSON.stringify(input) }),
  );
}
