"use client";
// "Download build sheet": asks for the sheet job, shows its progress while chromium prints it, then offers
// the PDF (a ready sheet for the same content hash comes back at once). Failures are shown in words.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { apiFetch, queryKeys } from "@/lib/api/client";
import type { SheetView } from "@/lib/api/contracts/sheets";

export function SheetDownload({ revisionId, compact = false }: { revisionId: string; compact?: boolean }) {
  const [paper, setPaper] = useState<"A4" | "Letter">("A4");
  const [asked, setAsked] = useState(false);
  const queryClient = useQueryClient();
  const key = queryKeys.sheet(revisionId, paper);
  const status = useQuery({
    queryKey: key,
    queryFn: ({ signal }) => apiFetch<{ sheet: SheetView | null }>(`/api/revisions/${revisionId}/sheet?paper=${paper}`, { signal }).then((r) => r.sheet),
    enabled: asked,
    refetchInterval: (q) => (q.state.data && (q.state.data.state === "queued" || q.state.data.state === "rendering") ? 700 : false),
  });
  const request = useMutation({
    mutationFn: () => apiFetch<{ sheet: SheetView; reused: boolean }>(`/api/revisions/${revisionId}/sheet`, { method: "POST", body: JSON.stringify({ paper }) }),
    onSuccess: (r) => {
      queryClient.setQueryData(key, r.sheet);
      setAsked(true);
    },
  });
  const sheet = asked ? (status.data ?? null) : null;
  const busy = request.isPending || sheet?.state === "queued" || sheet?.state === "rendering";
  return (
    <div className={`flex flex-col gap-2 ${compact ? "" : "rounded-xl border border-line bg-panel p-4"}`} data-testid="sheet-download">
      <div className="flex flex-wrap items-end gap-2">
        <label className="flex flex-col gap-1 text-sm text-muted">
          Paper
          <select value={paper} onChange={(e) => { setPaper(e.target.value as "A4" | "Letter"); setAsked(false); }} className="min-h-11 rounded-md border border-line bg-ink px-2 text-base text-text">
            <option value="A4">A4</option>
            <option value="Letter">Letter</option>
          </select>
        </label>
        <Button type="button" onClick={() => request.mutate()} disabled={busy}>
          {busy ? "Making the build sheet…" : "Download build sheet"}
        </Button>
      </div>
      {request.error ? <p role="alert" className="text-danger">{request.error.message}</p> : null}
      {sheet && busy ? (
        <div className="flex flex-col gap-1" role="status" aria-live="polite">
          <progress className="h-3 w-full" max={100} value={sheet.progressPercent} aria-label="Build sheet progress" />
          <p className="text-sm text-muted">{sheet.state === "queued" ? "Waiting for the printer…" : `Printing the sheet: ${sheet.progressPercent} %`}</p>
        </div>
      ) : null}
      {sheet?.state === "ready" && sheet.downloadUrl ? (
        <a href={sheet.downloadUrl} className="inline-flex min-h-11 items-center gap-2 rounded-md border border-ok px-4 py-2 font-semibold text-ok no-underline" data-testid="sheet-ready-link" download>
          ⬇ Build sheet ready ({paper}, {Math.round((sheet.sizeBytes ?? 0) / 1024)} kB) — save the PDF
        </a>
      ) : null}
      {sheet?.state === "failed" ? <p role="alert" className="text-danger">{sheet.error}</p> : null}
    </div>
  );
}
