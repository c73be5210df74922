"use client";
// Revisions from the editor: "Make a revision" freezes the working draft as it is (it keeps its number and content
// hash and takes no more changes) and goes on in the next revision; "Compare revisions" opens the visual difference
// between any two revisions of the bench (app/(app)/benches/[benchId]/compare).
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useQuery } from "@tanstack/react-query";
import { useMemo, useState } from "react";
import { benchQuery, useMakeRevision, type DraftView, type FrozenRevision } from "@/lib/api/bench-queries";
import type { AnyBenchDocument } from "@/lib/bench/schema";
import { anyBenchDocumentSchema } from "@/lib/bench/schema-v2";
import type { ReviewState } from "@/db/schema";
import { StateBadge } from "@/components/ui/state-badge";
import type { SaveState } from "./use-autosave";

type Props = {
  benchId: string;
  canEdit: boolean;
  /** The working drawing, a rail or a table. */
  doc: AnyBenchDocument;
  base: { revisionNumber: number; version: number; state: ReviewState };
  saveState: SaveState;
  /** The editor continues on the new working draft. */
  onMade: (draft: DraftView) => void;
};

const BUTTON = "inline-flex min-h-10 items-center justify-center gap-1.5 rounded-md border px-3 text-sm disabled:cursor-not-allowed disabled:opacity-50";

const STATE_WORDS: Record<ReviewState, string> = {
  draft: "draft",
  submitted: "waiting for review",
  approved: "signed off",
  "changes-requested": "changes asked",
  rejected: "turned down",
  withdrawn: "withdrawn",
  expired: "sign-off expired",
  superseded: "replaced",
};

export const compareHref = (benchId: string, from: number, to: number) => `/benches/${benchId}/compare?from=${from}&to=${to}`;

export function RevisionsPanel({ benchId, canEdit, doc, base, saveState, onMade }: Props) {
  const router = useRouter();
  const make = useMakeRevision(benchId);
  const [done, setDone] = useState<{ frozen: FrozenRevision; next: number } | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const complete = useMemo(() => anyBenchDocumentSchema.safeParse(doc).success, [doc]);

  const why =
    base.state !== "draft"
      ? `Revision ${base.revisionNumber} is already fixed; your next change starts revision ${base.revisionNumber + 1}.`
      : !complete
        ? "The drawing needs a laser and valid values before it can become a revision."
        : saveState.kind !== "saved"
          ? "Waiting until your changes are saved…"
          : null;

  const makeRevision = () => {
    setProblem(null);
    setDone(null);
    make.mutate(
      { baseRevision: base.revisionNumber, baseVersion: base.version },
      {
        onSuccess: (outcome) => {
          if (outcome.kind === "conflict") {
            setProblem(`${outcome.message} Reload the page to see the bench as it is now.`);
            return;
          }
          onMade(outcome.draft);
          setDone({ frozen: outcome.frozen, next: outcome.draft.revisionNumber });
          // The page's revision list and review box are drawn on the server.
          router.refresh();
        },
        onError: (error) => setProblem(error.message),
      },
    );
  };

  return (
    <section aria-labelledby="revisions-heading-editor" className="rounded-lg border border-line bg-panel p-4" data-testid="revisions-panel">
      <h2 id="revisions-heading-editor" className="mb-2 flex flex-wrap items-center gap-2 text-lg font-semibold">
        Revision {base.revisionNumber} <StateBadge state={base.state} />
      </h2>
      {canEdit ? (
        <div className="flex flex-col gap-2">
          <p className="text-sm text-muted">
            Making a revision keeps revision {base.revisionNumber} exactly as it is now (with its content hash) and you go on drawing in revision {base.revisionNumber + 1}.
          </p>
          <div className="flex flex-wrap items-center gap-2">
            <button
              type="button"
              onClick={makeRevision}
              disabled={why !== null || make.isPending}
              className={`${BUTTON} border-accent font-semibold text-accent hover:bg-raised`}
              data-testid="make-revision"
              aria-describedby={why ? "make-revision-why" : undefined}
            >
              <span aria-hidden="true">▣</span>
              {make.isPending ? "Making the revision…" : "Make a revision"}
            </button>
            {why ? (
              <span id="make-revision-why" className="text-xs text-muted">
                {why}
              </span>
            ) : null}
          </div>
          <div aria-live="polite">
            {done ? (
              <p className="text-sm text-ok" data-testid="revision-made">
                <span aria-hidden="true">✓ </span>Revision {done.frozen.number} is kept as it is (hash <span className="font-mono">{done.frozen.contentHash.slice(0, 12)}…</span>). You are now editing revision {done.next}.
              </p>
            ) : null}
            {problem ? (
              <p className="text-sm text-danger" role="alert">
                <span aria-hidden="true">✕ </span>
                {problem}
              </p>
            ) : null}
          </div>
        </div>
      ) : null}
      <CompareRevisions benchId={benchId} latestNumber={base.revisionNumber} />
    </section>
  );
}

function CompareRevisions({ benchId, latestNumber }: { benchId: string; latestNumber: number }) {
  const bench = useQuery(benchQuery(benchId));
  const revisions = useMemo(() => [...(bench.data?.revisions ?? [])].sort((a, b) => a.number - b.number), [bench.data]);
  const [picked, setPicked] = useState<{ from: number | null; to: number | null }>({ from: null, to: null });
  const newest = Math.max(latestNumber, revisions.at(-1)?.number ?? 0);
  const to = picked.to ?? newest;
  const from = picked.from ?? revisions.filter((r) => r.number < to).at(-1)?.number ?? revisions[0]?.number ?? 1;

  return (
    <div className="mt-3 border-t border-line pt-3" data-testid="compare-revisions">
      <h3 className="mb-1 text-sm font-semibold">Compare revisions</h3>
      {bench.error ? <p className="text-sm text-danger">✕ {bench.error.message}</p> : null}
      {!bench.data && !bench.error ? <p className="text-sm text-muted">Loading the revisions…</p> : null}
      {bench.data && revisions.length < 2 ? <p className="text-sm text-muted">There is only one revision so far; make a revision to have two to compare.</p> : null}
      {revisions.length >= 2 ? (
        <div className="flex flex-wrap items-end gap-2 text-sm">
          <label className="flex flex-col gap-0.5">
            <span className="text-muted">From</span>
            <select value={from} onChange={(e) => setPicked({ from: Number(e.target.value), to })} className="min-h-10 rounded-md border border-line bg-ink px-2" data-testid="compare-from">
              {revisions.map((r) => (
                <option key={r.id} value={r.number}>
                  Revision {r.number} ({STATE_WORDS[r.state]})
                </option>
              ))}
            </select>
          </label>
          <label className="flex flex-col gap-0.5">
            <span className="text-muted">To</span>
            <select value={to} onChange={(e) => setPicked({ from, to: Number(e.target.value) })} className="min-h-10 rounded-md border border-line bg-ink px-2" data-testid="compare-to">
              {revisions.map((r) => (
                <option key={r.id} value={r.number}>
                  Revision {r.number} ({STATE_WORDS[r.state]})
                </option>
              ))}
            </select>
          </label>
          <Link href={compareHref(benchId, from, to)} className={`${BUTTON} border-line text-text no-underline hover:bg-raised`} data-testid="compare-link">
            Compare revisions {from} → {to}
          </Link>
        </div>
      ) : null}
    </div>
  );
}
