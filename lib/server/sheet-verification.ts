// Verifying a printed build sheet by its content hash: does it belong to a signed-off revision, does that
// sign-off still hold (or has it expired or been replaced), and who signed it when. Lab scope applies.
import "server-only";
import { and, desc, eq } from "drizzle-orm";
import { z } from "zod";
import { safeText } from "@/lib/validation/text";
import type { Database } from "@/db";
import { bench, benchRevision, lab, reviewDecision, type ReviewState } from "@/db/schema";
import { rolesAllow } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { recordAudit } from "./audit";
import type { Actor } from "./authorize";
import { signOffSentence, signOffStatus, type SignOffStatus } from "@/lib/build/rules";
import { inScope } from "./scope";

export type Verdict = "valid" | "expired" | "superseded" | "not-signed-off" | "unknown";

export type VerificationMatch = {
  revisionId: string;
  benchTitle: string;
  labName: string;
  number: number;
  state: ReviewState;
  status: SignOffStatus;
  sentence: string;
  signerName: string | null;
  signerRole: string | null;
  decidedAt: string | null;
  validUntil: string | null;
  conditions: string | null;
};

export type Verification = { hash: string; verdict: Verdict; headline: string; matches: VerificationMatch[] };

/** Accepts the bare hash or the whole verify link a QR code holds. */
export const verifyInput = z.object({
  hash: safeText({ error: "Enter the content hash printed on the sheet" })
    .trim()
    .transform((v) => (v.match(/[?&]hash=([0-9a-fA-F]{64})/)?.[1] ?? v).toLowerCase().replace(/\s+/g, ""))
    .pipe(safeText().regex(/^[0-9a-f]{64}$/, "The content hash is 64 characters, 0–9 and a–f, as printed under the QR code")),
});

const HEADLINE: Record<Verdict, string> = {
  valid: "Valid: this sheet matches a signed-off revision whose sign-off still holds.",
  expired: "Expired: this sheet matches a signed-off revision, but its sign-off has ended. Do not use it.",
  superseded: "Replaced: a newer revision's sign-off has replaced the one this sheet belongs to. Do not use it.",
  "not-signed-off": "Not signed off: this hash belongs to a drawing that was never signed off. Do not use this sheet.",
  unknown: "Unknown: no revision you may see has this hash. The sheet may be altered, or it belongs to a lab you are not a member of.",
};

export async function verifySheetHash(db: Database, actor: Actor, input: z.infer<typeof verifyInput>): Promise<Verification> {
  if (!rolesAllow(actor.roles, { bench: ["read"] }) && !rolesAllow(actor.roles, { audit: ["read"] })) {
    throw new AppError("forbidden", "Your role may not verify build sheets; it needs read access to benches or to the audit trail.");
  }
  const rows = await db
    .select({
      revisionId: benchRevision.id,
      benchId: bench.id,
      benchTitle: bench.title,
      labName: lab.name,
      number: benchRevision.number,
      state: benchRevision.state,
      signerName: reviewDecision.signerName,
      signerRole: reviewDecision.signerRole,
      decidedAt: reviewDecision.decidedAt,
      validUntil: reviewDecision.validUntil,
      conditions: reviewDecision.conditions,
      outcome: reviewDecision.outcome,
    })
    .from(benchRevision)
    .innerJoin(bench, eq(bench.id, benchRevision.benchId))
    .innerJoin(lab, eq(lab.id, bench.labId))
    .leftJoin(reviewDecision, and(eq(reviewDecision.revisionId, benchRevision.id), eq(reviewDecision.outcome, "approved")))
    .where(and(inScope(actor), eq(benchRevision.contentHash, input.hash)))
    .orderBy(desc(benchRevision.updatedAt))
    .limit(20);
  const now = new Date();
  const matches: VerificationMatch[] = rows.map((r) => {
    const decision = r.outcome ? { validUntil: r.validUntil } : null;
    const status = signOffStatus({ state: r.state, decision }, now);
    return {
      revisionId: r.revisionId,
      benchTitle: r.benchTitle,
      labName: r.labName,
      number: r.number,
      state: r.state,
      status,
      sentence: signOffSentence({ number: r.number, decision }, status),
      signerName: r.signerName,
      signerRole: r.signerRole,
      decidedAt: r.decidedAt?.toISOString() ?? null,
      validUntil: r.validUntil?.toISOString() ?? null,
      conditions: r.conditions,
    };
  });
  // The best news any match gives: one valid sign-off is enough for the sheet to be current.
  const rank: Verdict[] = ["valid", "expired", "superseded", "not-signed-off"];
  const verdict: Verdict = matches.length ? (rank.find((v) => matches.some((m) => m.status === v)) ?? "not-signed-off") : "unknown";
  matches.sort((a, b) => rank.indexOf(a.status) - rank.indexOf(b.status));
  await recordAudit(db, actor, {
    action: "sheet-verified",
    benchId: rows[0]?.benchId ?? null,
    revisionId: matches[0]?.revisionId ?? null,
    contentHash: input.hash,
    detail: { verdict, matches: matches.length },
  });
  return { hash: input.hash, verdict, headline: HEADLINE[verdict], matches };
}
