import { formatDateTime } from "@/lib/format";
import Link from "next/link";
import type { ReviewState } from "@/db/schema";
import { StateBadge } from "@/components/ui/state-badge";

export type BenchRow = { href?: string; benchId: string; title: string; labName: string; authorName: string; number: number; state?: ReviewState; contentHash: string; updatedAt: string };

export function BenchTable({ rows, empty, caption }: { rows: BenchRow[]; empty: string; caption: string }) {
  if (rows.length === 0) return <p className="rounded-lg border border-dashed border-line p-4 text-muted">{empty}</p>;
  return (
    <div tabIndex={0} role="region" aria-label="Table; scrolls sideways on a narrow screen" className="overflow-x-auto rounded-lg border border-line">
      <table className="w-full text-left">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-raised text-sm text-muted">
          <tr>
            <th className="px-3 py-2 font-medium">Bench</th>
            <th className="px-3 py-2 font-medium">Lab</th>
            <th className="px-3 py-2 font-medium">Author</th>
            <th className="px-3 py-2 font-medium">Revision</th>
            <th className="px-3 py-2 font-medium">State</th>
            <th className="px-3 py-2 font-medium">Updated</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={`${r.benchId}-${r.number}`} className="border-t border-line">
              <td className="px-3 py-3">
                <Link href={r.href ?? `/benches/${r.benchId}`} className="font-medium">
                  {r.title}
                </Link>
              </td>
              <td className="px-3 py-3">{r.labName}</td>
              <td className="px-3 py-3">{r.authorName}</td>
              <td className="px-3 py-3 font-mono text-sm" title={`Content hash ${r.contentHash}`}>
                #{r.number} · {r.contentHash.slice(0, 10)}
              </td>
              <td className="px-3 py-3">{r.state ? <StateBadge state={r.state} /> : null}</td>
              <td className="px-3 py-3 text-sm text-muted">{formatDateTime(r.updatedAt)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
