import Link from "next/link";
import { getDb } from "@/db";
import { BenchTable } from "@/components/benches/bench-table";
import { Refused } from "@/components/shell/refused";
import { listBenches } from "@/lib/server/benches";
import { pageActor, refusal } from "@/lib/server/page-guard";
import { rolesAllow } from "@/lib/auth/permissions";

export const metadata = { title: "Benches" };

export default async function BenchesPage() {
  const actor = await pageActor();
  const refused = refusal(actor, { bench: ["read"] });
  if (refused) return <Refused reason={refused} />;
  const benches = await listBenches(getDb(), actor);
  return (
    <div>
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h1 className="mb-1 text-2xl font-semibold">Benches</h1>
        {rolesAllow(actor.roles, { bench: ["create"] }) ? (
          <Link href="/benches/new" className="inline-flex min-h-11 items-center rounded-md bg-accent px-4 py-2 font-semibold text-ink no-underline hover:bg-accent-strong">
            New bench
          </Link>
        ) : null}
      </div>
      <p className="mb-6 text-muted">{actor.allLabs ? "Every lab's benches." : "The benches of your labs."}</p>
      <BenchTable
        caption="Benches"
        empty="No benches yet."
        rows={benches.map((b) => ({ benchId: b.id, title: b.title, labName: b.labName, authorName: b.authorName, number: b.latestRevision, state: b.latestState, contentHash: b.latestHash, updatedAt: b.updatedAt }))}
      />
    </div>
  );
}
