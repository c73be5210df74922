// A bench's trail for everyone who may read it: who did what to which revision (and hash), oldest first.
// The timeline itself is the auditor's desk's (components/desk/trail-timeline.tsx), so both read alike.
import { formatDate } from "@/lib/format";
import Link from "next/link";
import { TrailTimeline } from "@/components/desk/trail-timeline";
import type { ReaderTrail } from "@/lib/server/trail";
import { RevisionList } from "./revision-list";

export function BenchTrailView({ trail, exportHref }: { trail: ReaderTrail; exportHref?: string }) {
  const { bench } = trail;
  return (
    <div className="flex flex-col gap-6" data-testid="bench-trail">
      <p>
        <Link href={`/benches/${bench.id}`}>← {bench.title}</Link>
      </p>
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-2xl font-semibold">Trail of {bench.title}</h1>
          <p className="text-muted">
            {bench.labName} · drawn by {bench.authorName} · started {formatDate(bench.createdAt)} · {trail.entries.length} {trail.entries.length === 1 ? "entry" : "entries"}
          </p>
        </div>
        {exportHref ? (
          <a href={exportHref} download className="inline-flex min-h-11 items-center rounded-md bg-accent px-4 py-2 font-semibold text-ink no-underline hover:bg-accent-strong">
            Export this trail (CSV)
          </a>
        ) : null}
      </div>
      <p className="max-w-3xl text-muted">
        Every change of state, decision, comment, build sheet and rebuild of this bench, as the audit trail keeps it: nothing in it can be changed or removed. Times are
        the lab&apos;s local time.
      </p>
      <section aria-labelledby="trail-revisions-heading">
        <h2 id="trail-revisions-heading" className="mb-2 text-lg font-semibold">
          Revisions
        </h2>
        <RevisionList revisions={trail.revisions} />
      </section>
      <section aria-labelledby="trail-heading">
        <h2 id="trail-heading" className="mb-3 text-lg font-semibold">
          What happened, oldest first
        </h2>
        {trail.commentsHidden ? (
          <p className="mb-3 text-sm text-muted" data-testid="trail-comments-hidden">
            Review comments are shown to researchers, safety officers and auditors; here you see that a comment was written, not what it says.
          </p>
        ) : null}
        <TrailTimeline entries={trail.entries} />
      </section>
    </div>
  );
}
