import Link from "next/link";
import { BUILD_DONE, formatDate } from "@/lib/format";
import { getDb } from "@/db";
import { StartBuildButton } from "@/components/builds/start-build-button";
import { SheetDownload } from "@/components/sheets/sheet-download";
import { Refused } from "@/components/shell/refused";
import { StateBadge } from "@/components/ui/state-badge";
import { rolesAllow } from "@/lib/auth/permissions";
import { listBuildable } from "@/lib/server/builds";
import { pageActor, refusal } from "@/lib/server/page-guard";

export const metadata = { title: "Builds" };

// The technician's list: signed-off revisions of their labs, valid ones first; an expired or replaced
// sign-off is marked in words and cannot be started.
export default async function BuildsPage() {
  const actor = await pageActor();
  const refused = refusal(actor, { build: ["read"] });
  if (refused) return <Refused reason={refused} />;
  const rows = await listBuildable(getDb(), actor);
  const mayRecord = rolesAllow(actor.roles, { build: ["record"] });
  return (
    <div className="flex flex-col gap-6">
      <header>
        <h1 className="text-2xl font-semibold">Benches to build</h1>
        <p className="text-muted">Signed-off revisions of your labs. Build only from a sheet whose sign-off still holds.</p>
      </header>
      {rows.length === 0 ? <p className="rounded-lg border border-dashed border-line p-4 text-muted">No signed-off bench in your labs yet.</p> : null}
      <ul className="flex flex-col gap-4" data-testid="buildable-list">
        {rows.map((r) => {
          const mine = r.builds.find((b) => b.state === "in-progress");
          return (
            <li key={r.revisionId} className={`flex flex-col gap-3 rounded-xl border bg-panel p-4 ${r.status === "valid" ? "border-line" : "border-danger/60"}`} data-testid={`buildable-${r.revisionId}`} id={`revision-${r.revisionId}`}>
              <div className="flex flex-wrap items-center gap-3">
                <h2 className="text-lg font-semibold">{r.title}</h2>
                <span className="text-muted">revision {r.number}</span>
                <StateBadge state={r.status === "expired" ? "expired" : r.state} />
                <span className="text-sm text-muted">{r.labName} · drawn by {r.authorName}</span>
              </div>
              <p className={r.status === "valid" ? "" : "text-lg font-semibold text-danger"}>
                {r.status === "valid" ? `Signed off by ${r.signerName} on ${formatDate(r.decidedAt)}. ${r.statusSentence}` : `✕ ${r.statusSentence}`}
              </p>
              <p className="break-all font-mono text-xs text-muted">Content hash {r.contentHash}</p>
              {r.status === "valid" ? (
                <div className="flex flex-wrap items-start gap-4">
                  {mayRecord ? mine ? (
                    <Link href={`/builds/${mine.id}`} className="inline-flex min-h-11 items-center rounded-md bg-accent px-4 py-2 font-semibold text-ink no-underline">
                      Continue the build
                    </Link>
                  ) : (
                    <StartBuildButton revisionId={r.revisionId} />
                  ) : null}
                  <SheetDownload revisionId={r.revisionId} compact />
                </div>
              ) : (
                <p className="text-sm text-muted">This revision cannot be started.</p>
              )}
              {r.builds.length ? (
                <ul className="text-sm">
                  {r.builds.map((b) => (
                    <li key={b.id}>
                      <Link href={`/builds/${b.id}`}>
                        Build by {b.technicianName}, started {formatDate(b.startedAt)} — {b.state === "completed" ? `${BUILD_DONE.past} ${formatDate(b.signedOffAt)}` : "in progress"}
                      </Link>
                    </li>
                  ))}
                </ul>
              ) : null}
            </li>
          );
        })}
      </ul>
    </div>
  );
}
