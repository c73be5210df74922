// The laser safety standard each lab chose (ANSI Z136.1-2014 or IEC 60825-1:2014), read where hazard figures are computed
// for a lab's bench (review screen, sign-off summary, eyewear coverage). A lab's choice is not secret: no authorization here.
import "server-only";
import { eq } from "drizzle-orm";
import { z } from "zod";
import type { DbOrTx } from "@/db";
import { lab, type SafetyStandard } from "@/db/schema";

export const DEFAULT_STANDARD: SafetyStandard = "ANSI Z136.1-2014";

/** The standard a lab chose; null when there is no such lab. */
export async function findLabStandard(db: DbOrTx, labId: string): Promise<SafetyStandard | null> {
  if (!z.uuid().safeParse(labId).success) return null;
  const [row] = await db.select({ standard: lab.safetyStandard }).from(lab).where(eq(lab.id, labId));
  return row?.standard ?? null;
}

/** The standard a lab chose; the default when the lab is unknown. */
export async function labStandard(db: DbOrTx, labId: string): Promise<SafetyStandard> {
  return (await findLabStandard(db, labId)) ?? DEFAULT_STANDARD;
}
