// A copy of the drawing kept in this browser while a change is not yet saved, so nothing typed is lost when the page
// is reloaded, closed or left before the save reached the server (the save on leaving usually gets there first).
import type { AnyBenchDocument } from "@/lib/bench/schema-v2";

export type UnsavedCopy = { document: AnyBenchDocument; baseRevision: number; baseVersion: number; key: string; savedAtMs: number };

const storageKey = (benchId: string) => `benchwarden:unsaved:${benchId}`;

export function keepUnsaved(benchId: string, copy: UnsavedCopy): void {
  try {
    window.localStorage.setItem(storageKey(benchId), JSON.stringify(copy));
  } catch {
    // storage full or refused: the save on leaving still runs
  }
}

export function forgetUnsaved(benchId: string): void {
  try {
    window.localStorage.removeItem(storageKey(benchId));
  } catch {
    // nothing to forget
  }
}

/** The stored copy as text (a stable value to subscribe to), or null. */
export function unsavedText(benchId: string): string | null {
  try {
    return window.localStorage.getItem(storageKey(benchId));
  } catch {
    return null;
  }
}

export function readUnsaved(benchId: string): UnsavedCopy | null {
  try {
    const raw = window.localStorage.getItem(storageKey(benchId));
    if (!raw) return null;
    const copy = JSON.parse(raw) as UnsavedCopy;
    return copy && typeof copy.baseVersion === "number" && typeof copy.baseRevision === "number" && copy.document ? copy : null;
  } catch {
    return null;
  }
}
