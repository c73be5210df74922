// Where a new element lands when it is added without pointing (palette click or Enter): a sensible place on the rail.
import type { ElementKind } from "@/lib/bench/schema";

/** Where a clicked palette item goes: optics between the last optic and the first stop after it; stops after everything. */
export function placementFor(kind: ElementKind, positions: { kind: string; positionMm: number }[]): number {
  if (positions.length === 0) return 0;
  const sorted = [...positions].sort((a, b) => a.positionMm - b.positionMm);
  const first = sorted[0].positionMm;
  const last = sorted[sorted.length - 1].positionMm;
  if (kind === "laser") return first - 100;
  if (kind === "screen" || kind === "beam-block") return last + 200;
  const stopIndex = sorted.findIndex((e) => e.kind === "screen" || e.kind === "beam-block");
  if (stopIndex <= 0) return last + 100;
  const before = sorted[stopIndex - 1].positionMm;
  return Math.round((before + sorted[stopIndex].positionMm) / 2);
}
