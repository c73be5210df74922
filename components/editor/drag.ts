// Moving elements by dragging: the dragged element follows the pointer (already snapped by the drawing) and the
// rest of the selection keeps its distance to it, so a group keeps its spacing whatever the snap step.
import { roundMm } from "./element-kinds";

/** Start positions of the elements that move: the selection if the dragged element is in it, else that element alone. */
export function dragStart(elements: readonly { id: string; positionMm: number }[], selection: readonly string[], draggedId: string): Record<string, number> {
  const moving = selection.includes(draggedId) ? selection : [draggedId];
  const start: Record<string, number> = {};
  for (const e of elements) if (moving.includes(e.id)) start[e.id] = e.positionMm;
  return start;
}

/** Positions of every moving element once the dragged one stands at draggedMm. */
export function dragPositions(start: Record<string, number>, draggedId: string, draggedMm: number): Record<string, number> {
  const deltaMm = draggedMm - start[draggedId];
  const positions: Record<string, number> = {};
  for (const [id, mm] of Object.entries(start)) positions[id] = roundMm(id === draggedId ? draggedMm : mm + deltaMm);
  return positions;
}
