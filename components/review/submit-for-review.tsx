"use client";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { Button } from "@/components/ui/button";
import { StateBadge } from "@/components/ui/state-badge";
import { apiFetch, ApiError, queryKeys } from "@/lib/api/client";
import type { ReviewDetail } from "@/lib/api/contracts/reviews";

// TODO(lead): move this key into queryKeys in lib/api/client.ts (revision: (id) => ["revisions", id]).
const revisionQueryKey = queryKeys.revision;

/**
 * The revision's review state, with "Send for review" for its author while it is a draft (or withdrawn)
 * and "Withdraw" while it waits. Drop it on any page that knows the revision id.
 */
export function SubmitForReview({
  revisionId,
  initial,
  contentHash,
  waitingFor = null,
  onChanged,
}: {
  revisionId: string;
  initial?: ReviewDetail;
  /** The content hash of the revision as the sender sees it (the editor's last save); null while a save is pending. */
  contentHash?: string | null;
  /** Why sending has to wait (e.g. a save still pending), or null. */
  waitingFor?: string | null;
  /** After a submit or withdraw: the editor reloads its draft so its state and version are the server's. */
  onChanged?: () => Promise<void> | void;
}) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const review = useQuery({
    queryKey: revisionQueryKey(revisionId),
    queryFn: () => apiFetch<ReviewDetail>(`/api/revisions/${revisionId}`),
    initialData: initial,
  });
  const act = useMutation({
    mutationFn: (action: "submit" | "withdraw") =>
      apiFetch(`/api/revisions/${revisionId}/${action}`, {
        method: "POST",
        body: JSON.stringify(action === "submit" ? { contentHash: contentHash ?? review.data?.revision.contentHash } : {}),
      }),
    onSettled: async () => {
      if (onChanged) await onChanged();
      await queryClient.invalidateQueries({ queryKey: revisionQueryKey(revisionId) });
      // The editor reads the bench (its revisions) and the draft under the "benches" keys.
      await queryClient.invalidateQueries({ queryKey: queryKeys.benches() });
      await queryClient.invalidateQueries({ queryKey: queryKeys.inbox() });
      router.refresh();
    },
  });

  if (review.isPending) return <p className="text-muted">Loading the review state…</p>;
  if (review.isError) return <p role="alert" className="text-danger">{review.error.message}</p>;
  const { revision, may, decision } = review.data;
  return (
    <div className="flex flex-col gap-2 rounded-xl border border-line bg-panel p-4" data-testid="submit-for-review">
      <div className="flex flex-wrap items-center gap-3">
        <span className="font-semibold">Revision {revision.number}</span>
        <StateBadge state={revision.state} />
      </div>
      {revision.state === "submitted" ? <p className="text-sm text-muted">A laser safety officer has been asked to review it. Keep the laser off until it is signed off.</p> : null}
      {revision.state === "draft" && may.submit ? <p className="text-sm text-muted">When the drawing is ready, send it to the laser safety officers. It cannot be edited while it waits; further edits make a new revision.</p> : null}
      {decision?.conditions && revision.state === "approved" ? <p className="text-sm">Conditions: {decision.conditions}</p> : null}
      <div className="flex flex-wrap gap-2">
        {may.submit ? (
          <Button type="button" onClick={() => act.mutate("submit")} disabled={act.isPending || waitingFor !== null || contentHash === null}>
            Send for review
          </Button>
        ) : null}
        {may.submit && waitingFor ? <span className="self-center text-sm text-muted">{waitingFor}</span> : null}
        {may.withdraw ? (
          <Button type="button" variant="quiet" onClick={() => act.mutate("withdraw")} disabled={act.isPending}>
            Withdraw from review
          </Button>
        ) : null}
      </div>
      {act.error instanceof ApiError ? (
        <p role="alert" className="text-sm text-danger">
          {act.error.message}
        </p>
      ) : null}
    </div>
  );
}
