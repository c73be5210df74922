// What happened to each element between two revisions, for marking the two drawings of the compare page: moved (with
// the distance), changed (other values), added, removed. Built on the one element diff (lib/bench/diff.ts). Pure.
import { diffBenches, type BenchDiff } from "@/lib/bench/diff";
import type { BenchDocument, BenchElement } from "@/lib/bench/schema";

export type Mark = "moved" | "changed" | "added" | "removed";

export type ElementMarks = {
  id: string;
  kind: string;
  marks: Mark[];
  /** Where the element stood in the "from" revision and stands in the "to" one (null where it does not exist). */
  fromMm: number | null;
  toMm: number | null;
  /** The other fields that changed (not the position), by name. */
  changedFields: string[];
};

export type RevisionMarks = {
  diff: BenchDiff;
  byId: Map<string, ElementMarks>;
  counts: Record<Mark, number>;
  /** The rail range both drawings share, so that a moved element visibly moves. */
  rangeMm: { min: number; max: number };
};

export function revisionMarks(from: BenchDocument, to: BenchDocument): RevisionMarks {
  const diff = diffBenches(from, to);
  const fromById = new Map(from.elements.map((e) => [e.id, e]));
  const toById = new Map(to.elements.map((e) => [e.id, e]));
  const byId = new Map<string, ElementMarks>();
  const counts: Record<Mark, number> = { moved: 0, changed: 0, added: 0, removed: 0 };
  for (const d of diff.elements) {
    const marks: Mark[] = [];
    let changedFields: string[] = [];
    if (d.change === "added") marks.push("added");
    else if (d.change === "removed") marks.push("removed");
    else if (d.change === "changed") {
      if (d.fields.some((f) => f.field === "positionMm")) marks.push("moved");
      changedFields = d.fields.map((f) => f.field).filter((f) => f !== "positionMm");
      if (changedFields.length > 0) marks.push("changed");
    }
    for (const m of marks) counts[m] += 1;
    byId.set(d.id, { id: d.id, kind: d.kind, marks, fromMm: fromById.get(d.id)?.positionMm ?? null, toMm: toById.get(d.id)?.positionMm ?? null, changedFields });
  }
  const all: BenchElement[] = [...from.elements, ...to.elements];
  const positions = all.map((e) => e.positionMm);
  const min = positions.length ? Math.min(...positions) : 0;
  const max = positions.length ? Math.max(...positions) : 1;
  return { diff, byId, counts, rangeMm: { min, max: Math.max(max, min + 1) } };
}

const signed = (mm: number) => `${mm > 0 ? "+" : mm < 0 ? "−" : "±"}${Number(Math.abs(mm).toFixed(3))} mm`;

/** The short tag drawn beside an element: a shape and a word (never colour alone). */
export function markTag(m: ElementMarks, side: "from" | "to"): string | null {
  const parts: string[] = [];
  if (m.marks.includes("added")) parts.push("+ added");
  if (m.marks.includes("removed")) parts.push("− removed");
  if (m.marks.includes("moved") && m.fromMm !== null && m.toMm !== null) parts.push(side === "to" ? `↔ moved ${signed(m.toMm - m.fromMm)}` : "↔ moved");
  if (m.marks.includes("changed")) parts.push("~ changed");
  return parts.length ? parts.join(" · ") : null;
}
