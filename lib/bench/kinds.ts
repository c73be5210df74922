// The names of the element kinds, said once: the heading form for lists, sheets and checklists and the
// lower-case noun for sentences. Our own wording (trade terms kept); adding a kind to the schema makes tsc ask for it here.
import type { ElementKind } from "./schema";

export const KIND_NAMES: Record<ElementKind, { title: string; noun: string }> = {
  laser: { title: "Laser", noun: "laser" },
  lens: { title: "Lens", noun: "lens" },
  aperture: { title: "Aperture (iris)", noun: "aperture" },
  filter: { title: "Filter", noun: "filter" },
  "beam-block": { title: "Beam block", noun: "beam block" },
  screen: { title: "Screen", noun: "screen" },
};

/** "Aperture (iris)" for a known kind; the kind itself for one this code does not know yet (a newer document). */
export function kindTitle(kind: string): string {
  return (KIND_NAMES as Record<string, { title: string } | undefined>)[kind]?.title ?? kind;
}

/** "aperture" for sentences. */
export function kindNoun(kind: string): string {
  return (KIND_NAMES as Record<string, { noun: string } | undefined>)[kind]?.noun ?? kind;
}
