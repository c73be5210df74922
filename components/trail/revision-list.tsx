import { formatDateTime } from "@/lib/format";
import Link from "next/link";
import { StateBadge } from "@/components/ui/state-badge";
import type { BenchTrail } from "@/lib/server/trail";

/** The bench's revisions with their content hashes and where each stands now; drafts have no review page. */
export function RevisionList({ revisions }: { revisions: BenchTrail["revisions"] }) {
  return (
    <div tabIndex={0} role="region" aria-label="Table; scrolls sideways on a narrow screen" className="overflow-x-auto rounded-lg border border-line">
      <table className="w-full text-left">
        <caption className="sr-only">Revisions of this bench</caption>
        <thead className="bg-raised text-sm text-muted">
          <tr>
            <th scope="col" className="px-3 py-2 font-medium">Revision</th>
            <th scope="col" className="px-3 py-2 font-medium">Content hash (SHA-256 of the drawing)</th>
            <th scope="col" className="px-3 py-2 font-medium">State now</th>
            <th scope="col" className="px-3 py-2 font-medium">Created</th>
          </tr>
        </thead>
        <tbody>
          {revisions.map((r) => (
            <tr key={r.id} className="border-t border-line">
              <td className="px-3 py-2">{r.state === "draft" ? `#${r.number}` : <Link href={`/reviews/${r.id}`}>#{r.number}</Link>}</td>
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
  );
}
