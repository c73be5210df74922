import Link from "next/link";
import { notFound } from "next/navigation";
import { getDb } from "@/db";
import { RevisionCompare, RevisionPicker } from "@/components/benches/revision-compare";
import { Refused } from "@/components/shell/refused";
import { AppError } from "@/lib/errors";
import { getBench } from "@/lib/server/benches";
import { labStandard } from "@/lib/server/lab-standard";
import { pageActor, refusal } from "@/lib/server/page-guard";

export const metadata = { title: "Compare revisions" };

const revisionNumber = (value: string | string[] | undefined): number | null => {
  const text = Array.isArray(value) ? value[0] : value;
  return text !== undefined && /^\d{1,6}$/.test(text) ? Number(text) : null;
};

export default async function CompareRevisionsPage({ params, searchParams }: { params: Promise<{ benchId: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const actor = await pageActor();
  const refused = refusal(actor, { bench: ["read"] });
  if (refused) return <Refused reason={refused} />;
  const { benchId } = await params;
  const query = await searchParams;
  const bench = await getBench(getDb(), actor, benchId).catch((error: unknown) => {
    if (error instanceof AppError && error.status === 404) notFound();
    throw error;
  });
  // a table's open beams are counted above the MPE of the lab's chosen standard, as on its review screen
  const standard = await labStandard(getDb(), bench.labId);
  const newest = bench.revisions[0]?.number ?? 1;
  const to = revisionNumber(query.to) ?? newest;
  const from = revisionNumber(query.from) ?? Math.max(1, to - 1);
  const fromRevision = bench.revisions.find((r) => r.number === from);
  const toRevision = bench.revisions.find((r) => r.number === to);
  const missing = [fromRevision ? null : from, toRevision ? null : to].filter((n): n is number => n !== null);

  return (
    <div className="flex flex-col gap-5">
      <Link href={`/benches/${benchId}`} className="text-sm">
        ← Back to the bench
      </Link>
      <header>
        <p className="text-sm text-muted">
          {bench.labName} · by {bench.authorName}
        </p>
        <h1 className="text-2xl font-semibold">Compare revisions of “{bench.title}”</h1>
      </header>
      <RevisionPicker benchId={benchId} revisions={bench.revisions} from={fromRevision ? from : Math.max(1, newest - 1)} to={toRevision ? to : newest} />
      {missing.length > 0 ? (
        <p role="alert" className="rounded-lg border border-warn p-3">
          <span aria-hidden="true">⚠ </span>
          {missing.map((n) => `Revision ${n}`).join(" and ")} {missing.length === 1 ? "does" : "do"} not exist; this bench has revisions 1 to {newest}. Pick two above.
        </p>
      ) : fromRevision && toRevision ? (
        <RevisionCompare from={fromRevision} to={toRevision} standard={standard} />
      ) : null}
    </div>
  );
}
