// The names of the element kinds, said once: the heading form for lists, sheets and checklists and the
// lower-case noun for sentences. Our own wording (trade terms kept); they come from the one record per kind in ./element-kinds.ts.
import { ELEMENT_KIND_RECORDS } from "./element-kinds";
import type { TableElementKind } from "./schema-v2";

export const KIND_NAMES: Record<TableElementKind, { title: string; noun: string }> = Object.fromEntries(
  Object.values(ELEMENT_KIND_RECORDS).map((r) => [r.kind, { title: r.label, noun: r.noun }]),
) as Record<TableElementKind, { title: string; noun: string }>;

/** "Aperture (iris)" for a known kind; the kind itself for one this code does not know yet (a newer document). */
export function kindTitle(kind: string): string {
  return (KIND_NAMES as Record<string, { title: string } | undefined>)[kind]?.title ?? kind;
}

/** "aperture" for sentences. */
export function kindNoun(kind: string): string {
  return (KIND_NAMES as Record<string, { noun: string } | undefined>)[kind]?.noun ?? kind;
}
