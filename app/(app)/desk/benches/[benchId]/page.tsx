import Link from "next/link";
import { notFound } from "next/navigation";
import { getDb } from "@/db";
import { TrailTimeline } from "@/components/desk/trail-timeline";
import { Refused } from "@/components/shell/refused";
import { StateBadge } from "@/components/ui/state-badge";
import { rolesAllow } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { formatDate, formatDateTime } from "@/lib/format";
import { getBenchTrail } from "@/lib/server/desk";
import { pageActor, refusal } from "@/lib/server/page-guard";

export const metadata = { title: "Bench trail" };

export default async function BenchTrailPage({ params }: { params: Promise<{ benchId: string }> }) {
  const actor = await pageActor();
  const refused = refusal(actor, { audit: ["read"] });
  if (refused) return <Refused reason={refused} />;
  const { benchId } = await params;
  let trail;
  try {
    trail = await getBenchTrail(getDb(), actor, benchId);
  } catch (error) {
    if (error instanceof AppError && error.status === 404) notFound();
    if (error instanceof AppError) return <Refused reason={error.message} />;
    throw error;
  }
  const mayExport = rolesAllow(actor.roles, { audit: ["export"] });
  return (
    <div className="flex flex-col gap-6">
      <p>
        <Link href="/desk">← Sign-off desk</Link>
      </p>
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-2xl font-semibold">{trail.bench.title}</h1>
          <p className="text-muted">
            {trail.bench.labName} · drawn by {trail.bench.authorName} · started {formatDate(trail.bench.createdAt)}
          </p>
        </div>
        {mayExport ? (
          <a href={`/api/desk/benches/${trail.bench.id}/trail/export`} download className="inline-flex min-h-11 items-center rounded-md bg-accent px-4 py-2 font-semibold text-ink no-underline hover:bg-accent-strong" data-testid="export-trail">
            Export this trail (CSV)
          </a>
        ) : null}
      </div>
      <section aria-labelledby="revisions-heading">
        <h2 id="revisions-heading" className="mb-2 text-lg font-semibold">
          Revisions
        </h2>
        <div tabIndex={0} role="region" aria-label="Table; scrolls sideways on a narrow screen" className="overflow-x-auto rounded-lg border border-line">
          <table className="w-full text-left">
            <thead className="bg-raised text-sm text-muted">
              <tr>
                <th className="px-3 py-2 font-medium">Revision</th>
                <th className="px-3 py-2 font-medium">Content hash (SHA-256 of the drawing)</th>
                <th className="px-3 py-2 font-medium">State now</th>
                <th className="px-3 py-2 font-medium">Created</th>
              </tr>
            </thead>
            <tbody>
              {trail.revisions.map((r) => (
                <tr key={r.id} className="border-t border-line">
                  <td className="px-3 py-2">
                    <Link href={`/reviews/${r.id}`}>#{r.number}</Link>
                  </td>
                  <td className="break-all px-3 py-2 font-mono text-sm">{r.contentHash}</td>
                  <td className="px-3 py-2">
                    <StateBadge state={r.state} />
                  </td>
                  <td className="px-3 py-2 text-sm text-muted">{formatDateTime(r.createdAt)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>
      <section aria-labelledby="trail-heading">
        <h2 id="trail-heading" className="mb-3 text-lg font-semibold">
          Trail, oldest first
        </h2>
        <TrailTimeline entries={trail.entries} />
      </section>
    </div>
  );
}
