// Element-by-element difference between two bench documents, matched by element id: what the
// reviewer needs to see against the last signed-off revision. Pure; no published formula involved.
// Either version: a rail (version 1) lists elements along the beam; a table (version 2) from the front left corner.
import type { AnyBenchDocument, BenchElement, TableElement } from "./schema";

export type FieldChange = { field: string; before: unknown; after: unknown };

/** An element of either version of the document. */
export type AnyElement = BenchElement | TableElement;

export type ElementDiff =
  | { change: "added"; id: string; kind: string; after: AnyElement }
  | { change: "removed"; id: string; kind: string; before: AnyElement }
  | { change: "changed"; id: string; kind: string; fields: FieldChange[] }
  | { change: "same"; id: string; kind: string };

export type BenchDiff = {
  elements: ElementDiff[];
  titleChange: FieldChange | null;
  /** The table's size or hole pitch changed, or one side is a rail and the other a table. */
  tableChange: FieldChange | null;
  /** True when nothing differs (the same content hash would say the same). */
  identical: boolean;
};

function fieldsOf(element: AnyElement): Record<string, unknown> {
  return element as unknown as Record<string, unknown>;
}

/** Rail elements in beam order; table elements by y (front first), then x. */
function inReadingOrder(elements: readonly AnyElement[]): AnyElement[] {
  const key = (e: AnyElement) => ("positionMm" in e ? [e.positionMm, 0] : [e.yMm, e.xMm]);
  return [...elements].sort((a, b) => {
    const [a1, a2] = key(a);
    const [b1, b2] = key(b);
    return a1 - b1 || a2 - b2;
  });
}

/** Where an element stood, in words: "at 120 mm" on a rail, "at (100, 250) mm" on a table. */
export function whereWords(element: AnyElement): string {
  const n = (v: number) => String(Number(v.toPrecision(6)));
  return "positionMm" in element ? `at ${n(element.positionMm)} mm` : `at (${n(element.xMm)}, ${n(element.yMm)}) mm, ${n(element.angleDeg)}°`;
}

export function diffBenches(before: AnyBenchDocument, after: AnyBenchDocument): BenchDiff {
  const beforeElements: readonly AnyElement[] = before.elements;
  const afterElements: readonly AnyElement[] = after.elements;
  const beforeById = new Map(beforeElements.map((e) => [e.id, e]));
  const afterById = new Map(afterElements.map((e) => [e.id, e]));
  const elements: ElementDiff[] = [];

  for (const a of inReadingOrder(afterElements)) {
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
  for (const b of beforeElements) {
    if (!afterById.has(b.id)) elements.push({ change: "removed", id: b.id, kind: b.kind, before: b });
  }

  const titleChange = (before.title ?? "") !== (after.title ?? "") ? { field: "title", before: before.title, after: after.title } : null;
  const tableBefore = before.version === 2 ? before.table : null;
  const tableAfter = after.version === 2 ? after.table : null;
  const tableChange = JSON.stringify(tableBefore) !== JSON.stringify(tableAfter) ? { field: "table", before: tableBefore, after: tableAfter } : null;
  return { elements, titleChange, tableChange, identical: !titleChange && !tableChange && elements.every((e) => e.change === "same") };
}
