// A stable text key for a bench document (sorted keys, elements in their order) and a short hash of it:
// the key tells whether two documents are the same (the database reorders JSON keys), the hash names queries.
import type { AnyBenchDocument } from "@/lib/bench/schema";

function sortValue(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(sortValue);
  if (value && typeof value === "object") {
    const record = value as Record<string, unknown>;
    return Object.fromEntries(
      Object.keys(record)
        .filter((k) => record[k] !== undefined)
        .sort()
        .map((k) => [k, sortValue(record[k])]),
    );
  }
  return value;
}

export const documentKey = (doc: AnyBenchDocument): string => JSON.stringify(sortValue(doc));

/** FNV-1a (two 32-bit lanes) of the key: a cache name, not a security hash. */
export function shortHash(text: string): string {
  let h1 = 0x811c9dc5;
  let h2 = 0x01000193 ^ text.length;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    h1 = Math.imul(h1 ^ c, 0x01000193);
    h2 = Math.imul(h2 ^ c, 0x5bd1e995);
  }
  return (h1 >>> 0).toString(16).padStart(8, "0") + (h2 >>> 0).toString(16).padStart(8, "0");
}
