// Element-by-element difference between two bench documents, matched by element id: what the
// reviewer needs to see against the last signed-off revision. Pure; no published formula involved.
import type { BenchDocument, BenchElement } from "./schema";

export type FieldChange = { field: string; before: unknown; after: unknown };

export type ElementDiff =
  | { change: "added"; id: string; kind: string; after: BenchElement }
  | { change: "removed"; id: string; kind: string; before: BenchElement }
  | { change: "changed"; id: string; kind: string; fields: FieldChange[] }
  | { change: "same"; id: string; kind: string };

export type BenchDiff = {
  elements: ElementDiff[];
  titleChange: FieldChange | null;
  /** True when nothing differs (the same content hash would say the same). */
  identical: boolean;
};

function fieldsOf(element: BenchElement): Record<string, unknown> {
  return element as unknown as Record<string, unknown>;
}

export function diffBenches(before: BenchDocument, after: BenchDocument): BenchDiff {
  const beforeById = new Map(before.elements.map((e) => [e.id, e]));
  const afterById = new Map(after.elements.map((e) => [e.id, e]));
  const elements: ElementDiff[] = [];

  for (const a of [...after.elements].sort((x, y) => x.positionMm - y.positionMm)) {
    const b = beforeById.get(a.id);
    if (!b) {
      elements.push({ change: "added", id: a.id, kind: a.kind, after: a });
      continue;
    }
    const fb = fieldsOf(b);
    const fa = fieldsOf(a);
    const names = [...new Set([...Object.keys(fb), ...Object.keys(fa)])].filter((n) => n !== "id");
    const fields = names
      .filter((n) => JSON.stringify(fb[n]) !== JSON.stringify(fa[n]))
      .map((n) => ({ field: n, before: fb[n], after: fa[n] }));
    elements.push(fields.length ? { change: "changed", id: a.id, kind: a.kind, fields } : { change: "same", id: a.id, kind: a.kind });
  }
  for (const b of before.elements) {
    if (!afterById.has(b.id)) elements.push({ change: "removed", id: b.id, kind: b.kind, before: b });
  }

  const titleChange = (before.title ?? "") !== (after.title ?? "") ? { field: "title", before: before.title, after: after.title } : null;
  return { elements, titleChange, identical: !titleChange && elements.every((e) => e.change === "same") };
}
