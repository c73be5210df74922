// Limits on guessing a secret (sign-in, the signing step-up), per account and per client address,
// counted in PostgreSQL (auth_attempt) so every app server enforces the same numbers. Common practice
// (OWASP Authentication Cheat Sheet: throttle per account and per source), numbers our own.
import "server-only";
import { and, eq, gt, inArray, lt, sql } from "drizzle-orm";
import type { DbOrTx } from "@/db";
import { authAttempt } from "@/db/schema";
import { AppError } from "@/lib/errors";

export type AttemptScope = "sign-in" | "step-up";
type Limit = { max: number; windowMinutes: number };

/** Failed attempts allowed in the sliding window before further attempts are refused. */
export const ATTEMPT_LIMITS: Record<AttemptScope, { account: Limit; address: Limit }> = {
  "sign-in": { account: { max: 10, windowMinutes: 15 }, address: { max: 30, windowMinutes: 15 } },
  "step-up": { account: { max: 8, windowMinutes: 15 }, address: { max: 30, windowMinutes: 15 } },
};

export type Attempt = {
  allowed: boolean;
  /** The sentence for a refused attempt. */
  refusal: string | null;
  /** Forget this attempt (the secret was right, or it was refused before it was tried). */
  release: () => Promise<void>;
};

const WHAT: Record<AttemptScope, string> = { "sign-in": "sign-in", "step-up": "signing password" };

/**
 * Counts an attempt before the secret is checked: the row is written first, then the window counted,
 * so a burst of parallel guesses cannot all pass a count taken before any of them was recorded.
 * A refused attempt is released at once (it tried nothing); a right secret releases its row too.
 */
export async function reserveAttempt(db: DbOrTx, scope: AttemptScope, who: { account: string | null; address: string | null }): Promise<Attempt> {
  const subjects: { subject: string; limit: Limit }[] = [];
  if (who.account) subjects.push({ subject: `account:${who.account.trim().toLowerCase().slice(0, 320)}`, limit: ATTEMPT_LIMITS[scope].account });
  if (who.address) subjects.push({ subject: `address:${who.address}`, limit: ATTEMPT_LIMITS[scope].address });
  if (subjects.length === 0) return { allowed: true, refusal: null, release: async () => undefined };

  const rows = await db
    .insert(authAttempt)
    .values(subjects.map((s) => ({ scope, subject: s.subject })))
    .returning({ id: authAttempt.id });
  const ids = rows.map((r) => r.id);
  const release = async () => {
    await db.delete(authAttempt).where(inArray(authAttempt.id, ids));
  };

  for (const s of subjects) {
    const [{ count }] = await db
      .select({ count: sql<number>`count(*)::int` })
      .from(authAttempt)
      .where(and(eq(authAttempt.scope, scope), eq(authAttempt.subject, s.subject), gt(authAttempt.attemptedAt, sql`now() - make_interval(mins => ${s.limit.windowMinutes})`)));
    if (count > s.limit.max) {
      await release();
      const per = s.subject.startsWith("account:") ? "for this account" : "from your network address";
      return {
        allowed: false,
        refusal: `Too many wrong ${WHAT[scope]} attempts ${per}; wait ${s.limit.windowMinutes} minutes, then try again.`,
        release: async () => undefined,
      };
    }
  }
  // Old rows are of no use to any window; a cheap sweep keeps the table small.
  if (Math.random() < 0.02) await db.delete(authAttempt).where(lt(authAttempt.attemptedAt, sql`now() - interval '1 day'`));
  return { allowed: true, refusal: null, release };
}

export function rateLimited(message: string): AppError {
  return new AppError("rate-limited", message);
}
