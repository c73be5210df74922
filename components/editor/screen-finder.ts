// The finder on the rail: which stretch to search behind the selected aperture, and which of the finder's answers
// (best first) become ticks and rows. The search itself is the server's (POST /api/analyze/finder).
import { MAX_POSITION_MM, type BenchDocument } from "@/lib/bench/schema";
import type { ScreenCandidate, ScreenSearch } from "@/lib/optics";
import { roundMm } from "./element-kinds";

/** The search starts this far behind the aperture (closer, N is huge and the zones are too thin to set up). */
export const FINDER_START_GAP_MM = 10;
/** With no screen, or a screen close behind the aperture, search at least this far. */
export const FINDER_MIN_SPAN_MM = 500;
/** How many of each (bright, dark) become ticks and rows. */
export const FINDER_SHOWN = 3;

export type FinderRange = { apertureId: string; screenId: string | null; fromMm: number; toMm: number };

/** The next screen downstream of a position (the one the finder would move), or null. */
export function screenAfter(doc: BenchDocument, positionMm: number): { id: string; positionMm: number } | null {
  let best: { id: string; positionMm: number } | null = null;
  for (const e of doc.elements) {
    if (e.kind === "screen" && e.positionMm > positionMm && (best === null || e.positionMm < best.positionMm)) best = { id: e.id, positionMm: e.positionMm };
  }
  return best;
}

/**
 * From 10 mm behind the aperture to twice the screen's rail position (the screen can be pulled back as far again),
 * and never less than FINDER_MIN_SPAN_MM behind the aperture. Null when the element is not an aperture.
 */
export function finderRange(doc: BenchDocument, apertureId: string): FinderRange | null {
  const aperture = doc.elements.find((e) => e.id === apertureId && e.kind === "aperture");
  if (!aperture) return null;
  const screen = screenAfter(doc, aperture.positionMm);
  const fromMm = roundMm(aperture.positionMm + FINDER_START_GAP_MM);
  const far = Math.max(screen ? screen.positionMm * 2 : -Infinity, aperture.positionMm + FINDER_MIN_SPAN_MM);
  const toMm = roundMm(Math.min(MAX_POSITION_MM, far));
  if (!(toMm > fromMm)) return null;
  return { apertureId, screenId: screen?.id ?? null, fromMm, toMm };
}

export type FinderTick = ScreenCandidate & { goal: "bright" | "dark"; rank: number };

/** The best few bright (odd) and dark (even) positions, ranked as the finder ranks them, as one list along the rail. */
export function finderTicks(search: Pick<ScreenSearch, "bright" | "dark"> | undefined, shown = FINDER_SHOWN): FinderTick[] {
  if (!search) return [];
  const ticks = [
    ...search.bright.slice(0, shown).map((c, i) => ({ ...c, goal: "bright" as const, rank: i + 1 })),
    ...search.dark.slice(0, shown).map((c, i) => ({ ...c, goal: "dark" as const, rank: i + 1 })),
  ];
  return ticks.sort((a, b) => a.positionMm - b.positionMm);
}

/** The tick's mark: the predicted centre as a shape (● bright, ○ dark, ◐ between) — never colour alone. */
export const CENTRE_SYMBOL: Record<ScreenCandidate["centre"], string> = { bright: "●", dark: "○", between: "◐" };

/** The position the screen is moved to (kept to the micrometre like every other position). */
export const screenTarget = (tick: Pick<ScreenCandidate, "positionMm">): number => roundMm(tick.positionMm);
