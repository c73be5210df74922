import type { BenchDetail } from "@/lib/server/benches";
import type { SafetyStandard } from "@/db/schema";
import { RevisionDiff } from "@/components/review/revision-diff";
import { CompareHeads } from "./compare-heads";
import { CompareDrawing } from "./compare-drawing";
import { TableCompare } from "./table-compare";
import { revisionMarks, type Mark } from "./revision-marks";

// The visual difference between two revisions of a bench: a form to pick them (works without script), the two
// drawings one above the other on a shared rail with what moved, changed, was added or removed marked, and the
// field-by-field list of the review screen.
type Revision = BenchDetail["revisions"][number];

const LEGEND: { mark: Mark; shape: string; words: string; className: string }[] = [
  { mark: "moved", shape: "↔", words: "moved (the arrow runs from where it stood)", className: "border-warn" },
  { mark: "changed", shape: "~", words: "changed values", className: "border-accent" },
  { mark: "added", shape: "+", words: "added", className: "border-ok" },
  { mark: "removed", shape: "−", words: "removed (crossed outline where it stood)", className: "border-danger" },
];

const plural = (n: number, one: string) => `${n} ${one}`;

export function RevisionPicker({ benchId, revisions, from, to }: { benchId: string; revisions: Revision[]; from: number | null; to: number | null }) {
  const ordered = [...revisions].sort((a, b) => a.number - b.number);
  return (
    <form method="get" action={`/benches/${benchId}/compare`} className="flex flex-wrap items-end gap-3 rounded-lg border border-line bg-panel p-3" data-testid="compare-form">
      {(["from", "to"] as const).map((name) => (
        <label key={name} className="flex flex-col gap-0.5 text-sm">
          <span className="text-muted">{name === "from" ? "From revision" : "To revision"}</span>
          <select name={name} defaultValue={String((name === "from" ? from : to) ?? "")} className="min-h-10 rounded-md border border-line bg-ink px-2">
            {ordered.map((r) => (
              <option key={r.id} value={r.number}>
                Revision {r.number}
              </option>
            ))}
          </select>
        </label>
      ))}
      <button type="submit" className="inline-flex min-h-10 items-center rounded-md border border-line px-3 text-sm hover:bg-raised">
        Compare
      </button>
    </form>
  );
}

export function RevisionCompare({ from, to, standard }: { from: Revision; to: Revision; standard: SafetyStandard }) {
  if (from.document.version !== 1 || to.document.version !== 1) return <TableCompare from={from} to={to} standard={standard} />;
  return <RailCompare from={{ ...from, document: from.document }} to={{ ...to, document: to.document }} />;
}

type RailRevision = Revision & { document: Extract<Revision["document"], { version: 1 }> };

function RailCompare({ from, to }: { from: RailRevision; to: RailRevision }) {
  const marks = revisionMarks(from.document, to.document);
  const { counts } = marks;
  const summary = marks.diff.identical
    ? from.contentHash === to.contentHash
      ? "The two revisions hold the same drawing (the same content hash)."
      : "Nothing on the rail differs."
    : [
        counts.moved ? plural(counts.moved, "moved") : null,
        counts.changed ? plural(counts.changed, "changed") : null,
        counts.added ? plural(counts.added, "added") : null,
        counts.removed ? plural(counts.removed, "removed") : null,
        marks.diff.titleChange ? "title changed" : null,
      ]
        .filter(Boolean)
        .join(", ") + ".";
  return (
    <div className="flex flex-col gap-4" data-testid="revision-compare" data-from={from.number} data-to={to.number}>
      <CompareHeads from={from} to={to} />
      <p className="text-base" data-testid="compare-summary">
        {summary}
      </p>
      <ul className="flex flex-wrap gap-2 text-sm" aria-label="What the marks mean">
        {LEGEND.map((l) => (
          <li key={l.mark} className={`rounded-full border px-2.5 py-0.5 ${l.className}`}>
            <span className="font-bold" aria-hidden="true">
              {l.shape}{" "}
            </span>
            {l.words}
          </li>
        ))}
      </ul>
      <CompareDrawing doc={from.document} side="from" number={from.number} marks={marks} other={to.document} />
      <CompareDrawing doc={to.document} side="to" number={to.number} marks={marks} other={from.document} />
      <p className="text-sm text-muted">Side views, to scale along the rail only; both drawings share the same stretch of rail.</p>
      <section aria-labelledby="field-changes-heading" className="flex flex-col gap-2">
        <h2 id="field-changes-heading" className="text-lg font-semibold">
          Field by field
        </h2>
        <RevisionDiff diff={marks.diff} againstNumber={from.number} />
      </section>
    </div>
  );
}
