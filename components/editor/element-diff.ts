// Differences between two bench documents, element by element, as short sentences for the conflict dialog.
import type { BenchDocument, BenchElement } from "@/lib/bench/schema";
import { KIND_INFO } from "./element-kinds";

export type ElementDifference = { id: string; sentence: string };

const FIELD_WORDS: Record<string, string> = {
  positionMm: "position (mm)",
  wavelengthNm: "wavelength (nm)",
  powerMw: "power (mW)",
  beamDiameterMm: "beam diameter (mm)",
  m2: "M²",
  focalLengthMm: "focal length (mm)",
  diameterMm: "diameter (mm)",
  opticalDensity: "optical density",
  kind: "kind",
  registerId: "register entry",
};

const describe = (e: BenchElement) => `${KIND_INFO[e.kind].label.toLowerCase()} at ${e.positionMm} mm`;

export function documentDifferences(mine: BenchDocument, theirs: BenchDocument): ElementDifference[] {
  const out: ElementDifference[] = [];
  if ((mine.title ?? "") !== (theirs.title ?? "")) out.push({ id: "(title)", sentence: `Title: yours “${mine.title ?? ""}”, saved “${theirs.title ?? ""}”.` });
  const theirsById = new Map(theirs.elements.map((e) => [e.id, e]));
  const mineById = new Map(mine.elements.map((e) => [e.id, e]));
  for (const e of mine.elements) {
    const other = theirsById.get(e.id);
    if (!other) {
      out.push({ id: e.id, sentence: `${e.id}: only in yours (${describe(e)}).` });
      continue;
    }
    const a = e as Record<string, unknown>;
    const b = other as Record<string, unknown>;
    const keys = [...new Set([...Object.keys(a), ...Object.keys(b)])].filter((k) => k !== "id" && a[k] !== b[k]);
    if (keys.length > 0) {
      const parts = keys.map((k) => `${FIELD_WORDS[k] ?? k} ${a[k] ?? "—"} in yours, ${b[k] ?? "—"} saved`);
      out.push({ id: e.id, sentence: `${e.id}: ${parts.join("; ")}.` });
    }
  }
  for (const e of theirs.elements) {
    if (!mineById.has(e.id)) out.push({ id: e.id, sentence: `${e.id}: only in the saved version (${describe(e)}).` });
  }
  return out;
}
