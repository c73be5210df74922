// Lab scope: which labs a caller may see, as one SQL condition every list query takes and one check for a
// single row. Officers and auditors see every lab; everyone else the labs they belong to. No 'server-only'
// so the desk's queries, timed by scripts/bench-desk.ts, use the same condition.
import { inArray, sql, type SQL } from "drizzle-orm";
import type { AnyPgColumn } from "drizzle-orm/pg-core";
import { bench } from "@/db/schema";
import { AppError, notFound } from "@/lib/errors";

/** Which labs the caller may see: everything (officers, auditors) or the listed labs. An Actor is one. */
export type LabScope = { allLabs: boolean; labIds: string[] };

/** The WHERE condition that keeps rows of the scope's labs; `labColumn` is the row's lab (a bench's by default). */
export function inScope(scope: LabScope, labColumn: AnyPgColumn = bench.labId): SQL | undefined {
  if (scope.allLabs) return undefined;
  if (scope.labIds.length === 0) return sql`false`;
  return inArray(labColumn, scope.labIds);
}

/** Whether one row's lab lies in the scope (outside it, the row answers 404 like a missing one). */
export function scopeHolds(scope: LabScope, labId: string): boolean {
  return scope.allLabs || scope.labIds.includes(labId);
}

/** The row when it exists and lies in the scope; otherwise "not found" — the same answer for both, so ids outside the caller's labs reveal nothing. */
export function visibleOr404<T extends { labId: string }>(scope: LabScope, row: T | undefined, what: string): T {
  if (!row || !scopeHolds(scope, row.labId)) throw notFound(what);
  return row;
}

/**
 * Loads something through another loader and answers "not found" under this thing's name when that
 * loader found nothing or refused. Any other failure (a database error) is passed on, never turned into a 404.
 */
export async function notFoundAs<T>(what: string, load: Promise<T>): Promise<T> {
  try {
    return await load;
  } catch (error) {
    if (error instanceof AppError && (error.code === "not-found" || error.code === "forbidden")) throw notFound(what);
    throw error;
  }
}
