// Canonical JSON of a bench document and its SHA-256 content hash: the identity an approval signs.
// Keys sorted, elements in beam order (position, then id) — on a table (version 2) by id —, numbers as JavaScript prints them.
import { createHash } from "node:crypto";
import type { AnyBenchDocument } from "./schema";

function canonicalValue(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(canonicalValue);
  if (value && typeof value === "object") {
    return Object.fromEntries(
      Object.keys(value as Record<string, unknown>)
        .filter((k) => (value as Record<string, unknown>)[k] !== undefined)
        .sort()
        .map((k) => [k, canonicalValue((value as Record<string, unknown>)[k])]),
    );
  }
  return value;
}

const byId = (a: { id: string }, b: { id: string }) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);

export function canonicalJson(doc: AnyBenchDocument): string {
  if (doc.version === 2) return JSON.stringify(canonicalValue({ ...doc, elements: [...doc.elements].sort(byId) }));
  const elements = [...doc.elements].sort((a, b) => a.positionMm - b.positionMm || byId(a, b));
  return JSON.stringify(canonicalValue({ ...doc, elements }));
}

export function contentHash(doc: AnyBenchDocument): string {
  return createHash("sha256").update(canonicalJson(doc)).digest("hex");
}
