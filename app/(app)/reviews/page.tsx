import Link from "next/link";
import { getDb } from "@/db";
import { Refused } from "@/components/shell/refused";
import { StateBadge } from "@/components/ui/state-badge";
import { utc, day } from "@/components/review/format";
import { reviewQueue } from "@/lib/server/review-screen";
import { pageActor, refusal } from "@/lib/server/page-guard";

export const metadata = { title: "Reviews" };

export default async function ReviewQueuePage() {
  const actor = await pageActor();
  const refused = refusal(actor, { review: ["read"] });
  if (refused) return <Refused reason={refused} />;
  const { waiting, decided } = await reviewQueue(getDb(), actor);
  return (
    <div className="flex flex-col gap-10">
      <section aria-labelledby="waiting-heading" data-testid="review-queue">
        <h1 id="waiting-heading" className="mb-1 text-2xl font-semibold">
          Waiting for review <span className="text-muted">({waiting.length})</span>
        </h1>
        <p className="mb-4 text-muted">Oldest first. The laser stays off on each of these setups until it is signed off.</p>
        {waiting.length === 0 ? (
          <p className="rounded-lg border border-dashed border-line p-4 text-muted">Nothing is waiting for review.</p>
        ) : (
          <div tabIndex={0} role="region" aria-label="Table; scrolls sideways on a narrow screen" className="overflow-x-auto rounded-lg border border-line">
            <table className="w-full text-left">
              <caption className="sr-only">Revisions waiting for review</caption>
              <thead className="bg-raised text-sm text-muted">
                <tr>
                  <th className="px-3 py-2 font-medium">Bench</th>
                  <th className="px-3 py-2 font-medium">Lab</th>
                  <th className="px-3 py-2 font-medium">Drawn by</th>
                  <th className="px-3 py-2 font-medium">Revision</th>
                  <th className="px-3 py-2 font-medium">Sent</th>
                </tr>
              </thead>
              <tbody>
                {waiting.map((w) => (
                  <tr key={w.revisionId} className="border-t border-line">
                    <td className="px-3 py-3">
                      <Link href={`/reviews/${w.revisionId}`} className="font-medium">
                        {w.title}
                      </Link>
                      {w.mine ? <span className="ml-2 text-sm text-muted">(yours — another officer reviews it)</span> : null}
                    </td>
                    <td className="px-3 py-3">{w.labName}</td>
                    <td className="px-3 py-3">{w.authorName}</td>
                    <td className="px-3 py-3 font-mono text-sm" title={`Content hash ${w.contentHash}`}>
                      #{w.number} · {w.contentHash.slice(0, 10)}
                    </td>
                    <td className="px-3 py-3 text-sm text-muted">{utc(w.submittedAt)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>

      <section aria-labelledby="decided-heading">
        <h2 id="decided-heading" className="mb-3 text-xl font-semibold">
          Recently decided
        </h2>
        {decided.length === 0 ? (
          <p className="rounded-lg border border-dashed border-line p-4 text-muted">No decisions yet.</p>
        ) : (
          <div tabIndex={0} role="region" aria-label="Table; scrolls sideways on a narrow screen" className="overflow-x-auto rounded-lg border border-line">
            <table className="w-full text-left">
              <caption className="sr-only">Recent decisions</caption>
              <thead className="bg-raised text-sm text-muted">
                <tr>
                  <th className="px-3 py-2 font-medium">Bench</th>
                  <th className="px-3 py-2 font-medium">Lab</th>
                  <th className="px-3 py-2 font-medium">Revision</th>
                  <th className="px-3 py-2 font-medium">Now</th>
                  <th className="px-3 py-2 font-medium">Decided by</th>
                  <th className="px-3 py-2 font-medium">Valid until</th>
                </tr>
              </thead>
              <tbody>
                {decided.map((d) => (
                  <tr key={d.revisionId} className="border-t border-line">
                    <td className="px-3 py-3">
                      <Link href={`/reviews/${d.revisionId}`} className="font-medium">
                        {d.title}
                      </Link>
                    </td>
                    <td className="px-3 py-3">{d.labName}</td>
                    <td className="px-3 py-3 font-mono text-sm">#{d.number}</td>
                    <td className="px-3 py-3">
                      <StateBadge state={d.state} />
                    </td>
                    <td className="px-3 py-3 text-sm">
                      {d.signerName}
                      <span className="block text-muted">{utc(d.decidedAt)}</span>
                    </td>
                    <td className="px-3 py-3 text-sm">{d.validUntil ? day(d.validUntil) : "—"}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>
    </div>
  );
}
