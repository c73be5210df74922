import { dehydrate, HydrationBoundary, QueryClient } from "@tanstack/react-query";
import { notFound } from "next/navigation";
import { getDb } from "@/db";
import { BenchEditor } from "@/components/editor/bench-editor";
import { Refused } from "@/components/shell/refused";
import { StateBadge } from "@/components/ui/state-badge";
import { draftQuery } from "@/lib/api/bench-queries";
import { rolesAllow } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { getBench } from "@/lib/server/benches";
import { getDraft } from "@/lib/server/drafts";
import { labShelf } from "@/lib/server/eyewear";
import { pageActor, refusal } from "@/lib/server/page-guard";

export const metadata = { title: "Bench" };

export default async function BenchPage({ params }: { params: Promise<{ benchId: string }> }) {
  const actor = await pageActor();
  const refused = refusal(actor, { bench: ["read"] });
  if (refused) return <Refused reason={refused} />;
  const { benchId } = await params;
  const db = getDb();
  const queryClient = new QueryClient();
  const detail = await getBench(db, actor, benchId).catch((error: unknown) => {
    if (error instanceof AppError && error.status === 404) notFound();
    throw error;
  });
  // The same query (key) the editor uses in the browser, filled from the data layer directly.
  await queryClient.fetchQuery({ ...draftQuery(benchId), queryFn: () => getDraft(db, actor, benchId) });
  const shelf = rolesAllow(actor.roles, { eyewear: ["read"] }) ? await labShelf(db, actor, detail.labId) : null;
  return (
    <div className="flex flex-col gap-8">
      <HydrationBoundary state={dehydrate(queryClient)}>
        <BenchEditor benchId={benchId} labId={detail.labId} labName={detail.labName} authorName={detail.authorName} shelf={shelf} />
      </HydrationBoundary>
      <section aria-labelledby="revisions-heading">
        <div className="mb-2 flex flex-wrap items-baseline gap-4">
          <h2 id="revisions-heading" className="text-lg font-semibold">Revisions</h2>
          <a href={`/benches/${benchId}/trail`}>Full trail of this bench</a>
          {detail.revisions.length > 1 ? (
            <a href={`/benches/${benchId}/compare?from=${detail.revisions[1].number}&to=${detail.revisions[0].number}`}>
              Compare the last two revisions
            </a>
          ) : null}
        </div>
        <ul className="flex flex-col gap-2">
          {detail.revisions.map((r) => (
            <li key={r.id} className="flex flex-wrap items-center gap-3 rounded-lg border border-line bg-panel px-4 py-2">
              {r.state === "draft" ? (
                <span className="font-semibold">Revision {r.number}</span>
              ) : (
                <a href={`/reviews/${r.id}`} className="font-semibold">
                  Revision {r.number}
                </a>
              )}
              <StateBadge state={r.state} />
              {r.state === "draft" && r.id !== detail.revisions[0].id ? <span className="text-sm text-muted">kept as it was; not the working draft</span> : null}
              <span className="font-mono text-xs text-muted" title="Content hash (SHA-256 of the canonical bench document)">
                {r.contentHash}
              </span>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
