// Differences between two bench documents, element by element (matched by id): one structured diff, told as
// short sentences two ways — the conflict dialog (yours vs the saved version) and the revisions panel (what
// changed since the revision last sent for review).
import type { BenchDocument, BenchElement } from "@/lib/bench/schema";
import { kindLabel } from "@/lib/bench/element-kinds";
import { shortLabel } from "./element-kinds";

export type ElementDifference = { id: string; sentence: string };

export type FieldChange = { key: string; before: unknown; after: unknown };
export type ElementChange =
  | { id: string; change: "added"; element: BenchElement }
  | { id: string; change: "removed"; element: BenchElement }
  | { id: string; change: "changed"; before: BenchElement; after: BenchElement; fields: FieldChange[] };
export type DocumentChanges = { title: { before: string; after: string } | null; elements: ElementChange[] };

/** Field names in words, with their unit ("" when the quantity has none). */
const FIELD_WORDS: Record<string, { label: string; unit: string }> = {
  positionMm: { label: "position", unit: "mm" },
  xMm: { label: "x", unit: "mm" },
  yMm: { label: "y", unit: "mm" },
  angleDeg: { label: "angle", unit: "°" },
  reflectance: { label: "reflectance", unit: "" },
  reflectancePerSurface: { label: "reflectance per surface", unit: "" },
  clearApertureMm: { label: "clear aperture", unit: "mm" },
  wavelengthNm: { label: "wavelength", unit: "nm" },
  powerMw: { label: "power", unit: "mW" },
  beamDiameterMm: { label: "beam diameter", unit: "mm" },
  m2: { label: "M²", unit: "" },
  focalLengthMm: { label: "focal length", unit: "mm" },
  diameterMm: { label: "diameter", unit: "mm" },
  opticalDensity: { label: "optical density", unit: "" },
  kind: { label: "kind", unit: "" },
  registerId: { label: "register entry", unit: "" },
};

const words = (key: string) => FIELD_WORDS[key] ?? { label: key, unit: "" };
// A table element (bench document version 2) has x and y instead of a rail position; the same sentences serve both.
const describe = (e: BenchElement) => {
  const placed = e as unknown as { positionMm?: number; xMm?: number; yMm?: number };
  const at = placed.positionMm !== undefined ? `${placed.positionMm} mm` : `(${placed.xMm}, ${placed.yMm}) mm`;
  return `${kindLabel(e.kind).toLowerCase()} at ${at}`;
};
const shown = (v: unknown) => (v === undefined || v === null ? "—" : String(v));

/** What changed going from `before` to `after`: elements of `after` in their order (added or changed), then those only in `before`. */
export function elementChanges(before: BenchDocument, after: BenchDocument): DocumentChanges {
  const beforeById = new Map(before.elements.map((e) => [e.id, e]));
  const afterIds = new Set(after.elements.map((e) => e.id));
  const elements: ElementChange[] = [];
  for (const e of after.elements) {
    const old = beforeById.get(e.id);
    if (!old) {
      elements.push({ id: e.id, change: "added", element: e });
      continue;
    }
    const a = old as Record<string, unknown>;
    const b = e as Record<string, unknown>;
    const fields = [...new Set([...Object.keys(b), ...Object.keys(a)])]
      .filter((k) => k !== "id" && a[k] !== b[k] && !(a[k] === undefined && b[k] === undefined))
      .map((key) => ({ key, before: a[key], after: b[key] }));
    if (fields.length > 0) elements.push({ id: e.id, change: "changed", before: old, after: e, fields });
  }
  for (const e of before.elements) if (!afterIds.has(e.id)) elements.push({ id: e.id, change: "removed", element: e });
  const title = (before.title ?? "") !== (after.title ?? "") ? { before: before.title ?? "", after: after.title ?? "" } : null;
  return { title, elements };
}

/** For the conflict dialog: my drawing against the version saved elsewhere. */
export function documentDifferences(mine: BenchDocument, theirs: BenchDocument): ElementDifference[] {
  const changes = elementChanges(theirs, mine);
  const out: ElementDifference[] = [];
  if (changes.title) out.push({ id: "(title)", sentence: `Title: yours “${changes.title.after}”, saved “${changes.title.before}”.` });
  for (const c of changes.elements) {
    if (c.change === "added") out.push({ id: c.id, sentence: `${c.id}: only in yours (${describe(c.element)}).` });
    else if (c.change === "removed") out.push({ id: c.id, sentence: `${c.id}: only in the saved version (${describe(c.element)}).` });
    else {
      const parts = c.fields.map((f) => {
        const w = words(f.key);
        return `${w.label}${w.unit ? ` (${w.unit})` : ""} ${shown(f.after)} in yours, ${shown(f.before)} saved`;
      });
      out.push({ id: c.id, sentence: `${c.id}: ${parts.join("; ")}.` });
    }
  }
  return out;
}

const signedMm = (mm: number) => `${mm > 0 ? "+" : mm < 0 ? "−" : "±"}${Number(Math.abs(mm).toFixed(3))} mm`;

export type RevisionChange = ElementDifference & { mark: "+" | "−" | "~" };

/** For the revisions panel: what the current drawing changes against the revision last sent for review. */
export function changesSinceRevision(sent: BenchDocument, current: BenchDocument): RevisionChange[] {
  const changes = elementChanges(sent, current);
  const out: RevisionChange[] = [];
  if (changes.title) out.push({ id: "(title)", mark: "~", sentence: `Title “${changes.title.before}” → “${changes.title.after}”` });
  for (const c of changes.elements) {
    if (c.change === "added") {
      const label = shortLabel(c.element);
      out.push({ id: c.id, mark: "+", sentence: `${c.id} added: ${describe(c.element)}${label ? ` (${label})` : ""}` });
    } else if (c.change === "removed") {
      out.push({ id: c.id, mark: "−", sentence: `${c.id} removed (was the ${describe(c.element)})` });
    } else {
      const parts = c.fields.map((f) => {
        if (f.key === "positionMm" && typeof f.before === "number" && typeof f.after === "number") {
          return `moved ${f.before} → ${f.after} mm (${signedMm(f.after - f.before)})`;
        }
        const w = words(f.key);
        return `${w.label} ${shown(f.before)} → ${shown(f.after)}${w.unit ? ` ${w.unit}` : ""}`;
      });
      out.push({ id: c.id, mark: "~", sentence: `${c.id}: ${parts.join("; ")}` });
    }
  }
  return out;
}
