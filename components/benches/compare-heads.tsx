import type { BenchDetail } from "@/lib/server/benches";
import { StateBadge } from "@/components/ui/state-badge";

type Revision = BenchDetail["revisions"][number];

/** The two revisions being compared, side by side: number, state and content hash (a rail's comparison and a table's). */
export function CompareHeads({ from, to }: { from: Revision; to: Revision }) {
  return (
    <div className="grid gap-2 sm:grid-cols-2">
      {[from, to].map((r, i) => (
        <div key={r.id} className="rounded-lg border border-line bg-panel px-3 py-2 text-sm">
          <div className="flex flex-wrap items-center gap-2">
            <span className="font-semibold">
              {i === 0 ? "From" : "To"}: revision {r.number}
            </span>
            <StateBadge state={r.state} />
          </div>
          <p className="mt-1 break-all font-mono text-xs text-muted" title="Content hash (SHA-256 of the canonical bench document)">
            {r.contentHash}
          </p>
        </div>
      ))}
    </div>
  );
}
