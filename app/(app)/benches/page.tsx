import { getDb } from "@/db";
import { BenchTable } from "@/components/benches/bench-table";
import { Refused } from "@/components/shell/refused";
import { listBenches } from "@/lib/server/benches";
import { pageActor, refusal } from "@/lib/server/page-guard";

export const metadata = { title: "Benches" };

export default async function BenchesPage() {
  const actor = await pageActor();
  const refused = refusal(actor, { bench: ["read"] });
  if (refused) return <Refused reason={refused} />;
  const benches = await listBenches(getDb(), actor);
  return (
    <div>
      <h1 className="mb-1 text-2xl font-semibold">Benches</h1>
      <p className="mb-6 text-muted">{actor.allLabs ? "Every lab's benches." : "The benches of your labs."}</p>
      <BenchTable
        caption="Benches"
        empty="No benches yet."
        rows={benches.map((b) => ({ benchId: b.id, title: b.title, labName: b.labName, authorName: b.authorName, number: b.latestRevision, state: b.latestState, contentHash: b.latestHash, updatedAt: b.updatedAt }))}
      />
    </div>
  );
}
