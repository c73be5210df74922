import Link from "next/link";
import { notFound } from "next/navigation";
import { getDb } from "@/db";
import { CoverageList } from "@/components/eyewear/coverage-list";
import { BenchDrawing } from "@/components/review/bench-drawing";
import { CommentThreads } from "@/components/review/comment-threads";
import { DecisionPanel } from "@/components/review/decision-panel";
import { DecisionRecord } from "@/components/review/decision-record";
import { KIND_WORDS, utc } from "@/components/review/format";
import { HazardPanel } from "@/components/review/hazard-panel";
import { PredictionsTable } from "@/components/review/predictions-table";
import { RevisionDiff } from "@/components/review/revision-diff";
import { SubmitForReview } from "@/components/review/submit-for-review";
import { Refused } from "@/components/shell/refused";
import { StateBadge } from "@/components/ui/state-badge";
import { rolesAllow } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { pageActor, refusal } from "@/lib/server/page-guard";
import { revisionEyewear } from "@/lib/server/eyewear";
import { labStandard } from "@/lib/server/lab-standard";
import { assessRevision, assessTableRevision } from "@/lib/review/hazard";
import { TableReview } from "@/components/review/table-review";
import { whereWords } from "@/lib/bench/diff";
import type { LaserElement } from "@/lib/bench/schema";
import { SIGN_OFF_MEANING } from "@/lib/review/transitions";
import { getReview } from "@/lib/server/review-screen";

export const metadata = { title: "Review" };

const TRAIL_WORDS: Record<string, string> = {
  "review-submitted": "sent it for review",
  "review-withdrawn": "withdrew it from review",
  "review-approved": "signed it off",
  "review-changes-requested": "asked for changes",
  "review-rejected": "turned it down",
  "review-comment": "commented",
  "review-superseded": "— its sign-off was replaced by a newer revision's",
  "review-expired": "— its sign-off expired",
};

function Section({ title, children, id }: { title: string; children: React.ReactNode; id: string }) {
  return (
    <section aria-labelledby={id} className="flex flex-col gap-3">
      <h2 id={id} className="text-xl font-semibold">
        {title}
      </h2>
      {children}
    </section>
  );
}

export default async function ReviewPage({ params }: { params: Promise<{ revisionId: string }> }) {
  const actor = await pageActor();
  const refused = refusal(actor, { bench: ["read"] });
  if (refused) return <Refused reason={refused} />;
  const { revisionId } = await params;
  const review = await getReview(getDb(), actor, revisionId).catch((error: unknown) => {
    if (error instanceof AppError && error.status === 404) notFound();
    throw error;
  });
  const { revision, bench, decision, lastApproved, may } = review;
  const doc = revision.document;
  const eyewear = rolesAllow(actor.roles, { eyewear: ["read"] }) ? await revisionEyewear(getDb(), actor, revision.id) : null;
  // every hazard figure follows the standard the bench's lab chose, whether or not the reader may see its eyewear
  const options = { standard: eyewear?.standard ?? (await labStandard(getDb(), bench.labId)) };
  const officer = rolesAllow(actor.roles, { review: ["decide"] });
  const mayReadReview = rolesAllow(actor.roles, { review: ["read"] });
  const elementOptions =
    doc.version === 1
      ? [...doc.elements].sort((a, b) => a.positionMm - b.positionMm).map((e) => ({ id: e.id, label: `${KIND_WORDS[e.kind] ?? e.kind} ${e.id} (${e.positionMm} mm)` }))
      : [...doc.elements].sort((a, b) => a.id.localeCompare(b.id, undefined, { numeric: true })).map((e) => ({ id: e.id, label: `${KIND_WORDS[e.kind] ?? e.kind} ${e.id} (${whereWords(e)})` }));
  const assessed = doc.version === 1 ? assessRevision(doc, options) : null;
  const table = doc.version === 2 ? assessTableRevision(doc, options) : null;
  const afterNote =
    revision.state === "expired"
      ? "This sign-off has expired: the laser must not be used on this setup until a revision is signed off again."
      : revision.state === "superseded"
        ? "A newer revision's sign-off has replaced this one."
        : null;

  return (
    <div className="flex flex-col gap-6">
      {mayReadReview ? (
        <Link href="/reviews" className="text-sm">
          ← All reviews
        </Link>
      ) : null}
      <header className="flex flex-col gap-2">
        <p className="text-sm text-muted">{bench.labName}</p>
        <h1 className="text-2xl font-semibold">{bench.title}</h1>
        <div className="flex flex-wrap items-center gap-3">
          <span className="font-semibold">Revision {revision.number}</span>
          <StateBadge state={revision.state} />
          <span className="text-muted">drawn by {bench.authorName}</span>
          <span className="text-sm text-muted">last change {utc(revision.updatedAt)}</span>
        </div>
        <p className="break-all font-mono text-sm text-muted" title="SHA-256 of the canonical bench document: the exact version a decision belongs to">
          Content hash {revision.contentHash}
        </p>
      </header>

      <div className="grid gap-8 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="flex min-w-0 flex-col gap-8">
          {doc.version === 1 ? (
            <Section id="drawing-heading" title="The bench">
              <BenchDrawing doc={doc} />
            </Section>
          ) : null}

          {table ? (
            table.ok ? (
              <TableReview assessed={table} eyewear={eyewear ? <CoverageList data={eyewear} safety={table.safety} /> : null} />
            ) : (
              <p role="alert" className="rounded-lg border border-warn p-4">
                <span aria-hidden="true" className="text-warn">▲ </span>
                The hazard and beam figures cannot be computed for this table: {table.problem}
              </p>
            )
          ) : !assessed ? null : assessed.ok ? (
            <>
              <Section id="hazard-heading" title="Laser hazard">
                <HazardPanel safety={assessed.safety} laser={doc.version === 1 ? doc.elements.find((e): e is LaserElement => e.kind === "laser") : undefined} />
              </Section>
              {eyewear ? (
                <Section id="eyewear-heading" title="Eyewear for each line">
                  <CoverageList data={eyewear} safety={assessed.safety} />
                </Section>
              ) : null}
              <Section id="predictions-heading" title="What the light will do">
                <PredictionsTable analysis={assessed.analysis} safety={assessed.safety} />
              </Section>
            </>
          ) : (
            <p role="alert" className="rounded-lg border border-warn p-4">
              <span aria-hidden="true" className="text-warn">▲ </span>
              The hazard and beam figures cannot be computed for this drawing: {assessed.problem}
            </p>
          )}

          <Section id="diff-heading" title={lastApproved ? `Changes since revision ${lastApproved.number}, the last one signed off` : "Changes since the last revision signed off"}>
            {lastApproved ? <RevisionDiff diff={lastApproved.diff} againstNumber={lastApproved.number} /> : <p className="text-muted">No earlier revision of this bench was signed off, so the whole drawing is new to review.</p>}
          </Section>

          {mayReadReview ? (
            <Section id="comments-heading" title="Comments">
              <CommentThreads revisionId={revision.id} threads={review.threads} elements={elementOptions} mayComment={may.comment} />
            </Section>
          ) : null}

          <Section id="history-heading" title="History of this revision">
            {review.trail.length === 0 ? (
              <p className="text-muted">Nothing has happened to this revision yet.</p>
            ) : (
              <ol className="flex flex-col gap-1 border-l-2 border-line pl-4 text-sm">
                {review.trail.map((t, i) => (
                  <li key={`${t.at}-${i}`}>
                    <span className="text-muted">{utc(t.at)}</span> — {t.actorName ?? "Benchwarden"} {TRAIL_WORDS[t.action] ?? t.action}
                  </li>
                ))}
              </ol>
            )}
          </Section>
        </div>

        <aside className="flex flex-col gap-4 lg:sticky lg:top-4 lg:self-start" aria-label="Decision">
          {may.submit || may.withdraw ? <SubmitForReview revisionId={revision.id} initial={review} /> : null}
          {decision ? <DecisionRecord decision={decision} expiredOrReplaced={afterNote} /> : null}
          {may.decide ? (
            <DecisionPanel revisionId={revision.id} revisionNumber={revision.number} contentHash={revision.contentHash} meaning={SIGN_OFF_MEANING} />
          ) : officer && !decision && may.whyNotDecide ? (
            <p className="rounded-xl border border-line bg-panel p-4 text-muted">{may.whyNotDecide}</p>
          ) : null}
          {!decision && revision.state === "submitted" && !may.decide && !may.withdraw && !officer ? (
            <p className="rounded-xl border border-line bg-panel p-4 text-muted">Waiting for a laser safety officer.</p>
          ) : null}
        </aside>
      </div>
    </div>
  );
}
