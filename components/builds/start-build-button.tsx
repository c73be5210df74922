"use client";
import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { Button } from "@/components/ui/button";
import { apiFetch } from "@/lib/api/client";
import type { BuildView } from "@/lib/api/contracts/builds";

/** Starts (or reopens) the technician's build of a signed-off revision and goes to it. */
export function StartBuildButton({ revisionId, label = "Start the build" }: { revisionId: string; label?: string }) {
  const router = useRouter();
  const start = useMutation({
    mutationFn: () => apiFetch<{ build: BuildView }>("/api/builds", { method: "POST", body: JSON.stringify({ revisionId }) }),
    onSuccess: (r) => router.push(`/builds/${r.build.id}`),
  });
  return (
    <div className="flex flex-col gap-1">
      <Button type="button" onClick={() => start.mutate()} disabled={start.isPending || start.isSuccess}>
        {start.isPending ? "Starting…" : label}
      </Button>
      {start.error ? <p role="alert" className="text-sm text-danger">{start.error.message}</p> : null}
    </div>
  );
}
