import { whereWords, type BenchDiff } from "@/lib/bench/diff";
import { KIND_WORDS } from "./format";

function show(value: unknown): string {
  return value === undefined ? "(not set)" : typeof value === "string" ? value : JSON.stringify(value);
}

// What changed since the last signed-off revision, element by element, with words and marks (not colour alone).
export function RevisionDiff({ diff, againstNumber }: { diff: BenchDiff; againstNumber: number }) {
  if (diff.identical) return <p className="text-muted">Nothing changed since revision {againstNumber}: the drawing is the same.</p>;
  const changed = diff.elements.filter((e) => e.change !== "same");
  const same = diff.elements.length - changed.length;
  return (
    <div className="flex flex-col gap-2" data-testid="revision-diff">
      <ul className="flex flex-col gap-2">
        {diff.titleChange ? (
          <li className="rounded-md border border-line px-3 py-2">
            <span className="font-medium">~ Title</span>: {show(diff.titleChange.before)} → {show(diff.titleChange.after)}
          </li>
        ) : null}
        {diff.tableChange ? (
          <li className="rounded-md border border-line px-3 py-2">
            <span className="font-medium">~ Table</span>: {show(diff.tableChange.before ?? "a straight rail")} → {show(diff.tableChange.after ?? "a straight rail")}
          </li>
        ) : null}
        {changed.map((e) => (
          <li key={`${e.change}-${e.id}`} className={`rounded-md border px-3 py-2 ${e.change === "added" ? "border-ok/70" : e.change === "removed" ? "border-danger/70" : "border-warn/70"}`}>
            <span className="font-medium">
              {e.change === "added" ? "+ Added" : e.change === "removed" ? "− Removed" : "~ Changed"} {KIND_WORDS[e.kind] ?? e.kind} {e.id}
            </span>
            {e.change === "changed" ? (
              <ul className="mt-1 text-sm">
                {e.fields.map((f) => (
                  <li key={f.field} className="font-mono">
                    {f.field}: <span className="line-through decoration-danger">{show(f.before)}</span> → <span className="text-ok">{show(f.after)}</span>
                  </li>
                ))}
              </ul>
            ) : e.change === "added" ? (
              <p className="font-mono text-sm text-muted">{show({ ...e.after, id: undefined, kind: undefined })}</p>
            ) : (
              <p className="font-mono text-sm text-muted">was {whereWords(e.before)}</p>
            )}
          </li>
        ))}
      </ul>
      {same ? <p className="text-sm text-muted">{same} other element{same === 1 ? "" : "s"} unchanged.</p> : null}
    </div>
  );
}
