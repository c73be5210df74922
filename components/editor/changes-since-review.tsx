"use client";
// What the working drawing changes against the revision last sent for review (submitted, approved, returned…),
// as a short list: the researcher sees what the next review will be about. Making a revision is the review
// workflow's (SubmitForReview on the page); this only reads.
import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useEffect, useMemo, useRef } from "react";
import { benchQuery, draftQuery } from "@/lib/api/bench-queries";
import { queryKeys } from "@/lib/api/client";
import type { AnyBenchDocument, BenchDocument } from "@/lib/bench/schema";
import { StateBadge } from "@/components/ui/state-badge";
import { changesSinceRevision } from "./element-diff";
import { lastSentRevision } from "./revision-pick";

const SHOWN = 8;

/** `doc`: the working drawing, a rail or a table; compared with the last revision sent when that is of the same kind. */
type Props = { benchId: string; doc: AnyBenchDocument };

export function ChangesSinceReview({ benchId, doc }: Props) {
  const queryClient = useQueryClient();
  const bench = useQuery(benchQuery(benchId));
  // The cached draft follows saves and the page's refresh after a submission; when its revision or state moves,
  // which revision was last sent may have changed: ask again.
  const draft = useQuery(draftQuery(benchId));
  const revisionNumber = draft.data?.revisionNumber;
  const state = draft.data?.state;
  const seen = useRef<string | null>(null);
  useEffect(() => {
    const now = `${revisionNumber}-${state}`;
    if (seen.current !== null && seen.current !== now) void queryClient.invalidateQueries({ queryKey: queryKeys.bench(benchId), exact: true });
    seen.current = now;
  }, [queryClient, benchId, revisionNumber, state]);

  const sent = bench.data ? lastSentRevision(bench.data.revisions) : null;
  const changes = useMemo(() => (sent && sent.document.version === doc.version ? changesSinceRevision(sent.document as BenchDocument, doc as BenchDocument) : []), [sent, doc]);

  return (
    <section aria-labelledby="since-review-heading" className="rounded-lg border border-line bg-panel p-4" data-testid="changes-since-review">
      <h2 id="since-review-heading" className="mb-2 flex flex-wrap items-center gap-2 text-lg font-semibold">
        {sent ? (
          <>
            Changes since revision {sent.number} <StateBadge state={sent.state} />
          </>
        ) : (
          "Changes since the last revision sent for review"
        )}
      </h2>
      {bench.error ? <p className="text-sm text-danger">✕ {bench.error.message}</p> : null}
      {!bench.data && !bench.error ? <p className="text-sm text-muted">Loading the revisions…</p> : null}
      {bench.data && !sent ? <p className="text-sm text-muted">No revision of this bench has been sent for review yet, so everything on the {doc.version === 2 ? "table" : "rail"} is new to the reviewer.</p> : null}
      {sent && changes.length === 0 ? <p className="text-sm text-muted">Nothing: the drawing is the same as revision {sent.number}.</p> : null}
      {changes.length > 0 ? (
        <>
          <ul className="flex flex-col gap-1 text-sm" aria-label={`Changes since revision ${sent?.number}`}>
            {changes.slice(0, SHOWN).map((c) => (
              <li key={`${c.mark}-${c.id}`} className="flex gap-2">
                <span className="w-4 shrink-0 text-center font-mono font-bold" aria-hidden="true">
                  {c.mark}
                </span>
                <span>
                  <span className="sr-only">{c.mark === "+" ? "Added: " : c.mark === "−" ? "Removed: " : "Changed: "}</span>
                  {c.sentence}
                </span>
              </li>
            ))}
          </ul>
          {changes.length > SHOWN ? <p className="mt-1 text-xs text-muted">…and {changes.length - SHOWN} more.</p> : null}
          <p className="mt-2 text-xs text-muted">+ added · − removed · ~ changed</p>
        </>
      ) : null}
    </section>
  );
}
