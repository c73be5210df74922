import type { BenchDetail } from "@/lib/server/benches";
import type { SafetyStandard } from "@/db/schema";
import { diffBenches, whereWords } from "@/lib/bench/diff";
import { assessTableRevision, EMPTY_TABLE_ANALYSIS } from "@/lib/review/hazard";
import { RevisionDiff } from "@/components/review/revision-diff";
import { CompareHeads } from "./compare-heads";
import { TablePlan } from "@/components/table/table-plan";

// Two revisions where at least one is an optical table (bench document version 2): both plans one above the other at
// the same scale, with the paths and open beams each one gives, what moved or turned, and the field-by-field list.
type Revision = BenchDetail["revisions"][number];

const n = (v: number) => String(Number(v.toPrecision(4)));

function Side({ revision, label, standard }: { revision: Revision; label: string; standard: SafetyStandard }) {
  const doc = revision.document;
  if (doc.version !== 2) {
    return (
      <p className="rounded-lg border border-line bg-panel p-3 text-sm">
        {label}: revision {revision.number} is a straight rail (version 1) with {doc.elements.length} element{doc.elements.length === 1 ? "" : "s"}; it has no table plan.
      </p>
    );
  }
  const assessed = assessTableRevision(doc, { standard });
  const open = assessed.ok ? assessed.safety.openBeams : [];
  return (
    <section className="rounded-lg border border-line bg-panel p-3" aria-label={`${label}: revision ${revision.number}`} data-testid={`table-compare-${label.toLowerCase()}`}>
      <h2 className="mb-2 text-base font-semibold">
        {label}: revision {revision.number} — {assessed.ok ? `${assessed.analysis.paths.length} beam paths, ${open.length} leaving the table${open.some((o) => o.exceedsMpe) ? ` (${open.filter((o) => o.exceedsMpe).length} above the MPE)` : ""}` : `not assessed: ${assessed.problem}`}
      </h2>
      <TablePlan doc={doc} analysis={assessed.ok ? assessed.analysis : EMPTY_TABLE_ANALYSIS} safety={assessed.ok ? assessed.safety : null} idPrefix={`compare-${label.toLowerCase()}`} />
    </section>
  );
}

export function TableCompare({ from, to, standard }: { from: Revision; to: Revision; standard: SafetyStandard }) {
  const diff = diffBenches(from.document, to.document);
  const moved = diff.elements.flatMap((e) => {
    if (e.change !== "changed") return [];
    const placement = e.fields.filter((f) => f.field === "xMm" || f.field === "yMm" || f.field === "angleDeg");
    if (placement.length === 0) return [];
    const before = (from.document.elements as { id: string }[]).find((x) => x.id === e.id);
    const after = (to.document.elements as { id: string }[]).find((x) => x.id === e.id);
    if (!before || !after) return [];
    const turn = placement.find((f) => f.field === "angleDeg");
    const turned = turn ? ` (turned ${n(Number(turn.after) - Number(turn.before))}°)` : "";
    return [`${e.id}: ${whereWords(before as never)} → ${whereWords(after as never)}${turned}`];
  });
  return (
    <div className="flex flex-col gap-4" data-testid="revision-compare" data-from={from.number} data-to={to.number}>
      <CompareHeads from={from} to={to} />
      <p className="text-base" data-testid="compare-summary">
        {diff.identical
          ? from.contentHash === to.contentHash
            ? "The two revisions hold the same drawing (the same content hash)."
            : "Nothing on the table differs."
          : `${diff.elements.filter((e) => e.change !== "same").length} element${diff.elements.filter((e) => e.change !== "same").length === 1 ? "" : "s"} differ${diff.tableChange ? "; the table itself changed" : ""}.`}
      </p>
      <Side revision={from} label="From" standard={standard} />
      <Side revision={to} label="To" standard={standard} />
      {moved.length ? (
        <section aria-labelledby="moved-heading">
          <h2 id="moved-heading" className="text-lg font-semibold">
            Moved or turned
          </h2>
          <ul className="list-disc pl-5 font-mono text-sm">
            {moved.map((m) => (
              <li key={m}>↔ {m}</li>
            ))}
          </ul>
        </section>
      ) : null}
      <section aria-labelledby="field-changes-heading" className="flex flex-col gap-2">
        <h2 id="field-changes-heading" className="text-lg font-semibold">
          Field by field
        </h2>
        <RevisionDiff diff={diff} againstNumber={from.number} />
      </section>
    </div>
  );
}
