import { formatDate, formatDateTime } from "@/lib/format";
import { getDb } from "@/db";
import { Refused } from "@/components/shell/refused";
import { rolesAllow } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { parseWith } from "@/lib/server/api";
import { pageActor } from "@/lib/server/page-guard";
import { verifyInput, verifySheetHash, type Verification } from "@/lib/server/sheet-verification";

export const metadata = { title: "Check a sheet" };

const LOOK: Record<Verification["verdict"], { shape: string; className: string }> = {
  valid: { shape: "✓", className: "border-ok text-ok" },
  expired: { shape: "⊘", className: "border-danger text-danger" },
  superseded: { shape: "⇢", className: "border-danger text-danger" },
  "not-signed-off": { shape: "✕", className: "border-danger text-danger" },
  unknown: { shape: "?", className: "border-warn text-warn" },
};

// Enter the hash printed on a sheet, or open the QR code's link (?hash=…): the verdict in big plain words.
export default async function VerifyPage({ searchParams }: { searchParams: Promise<{ hash?: string }> }) {
  const actor = await pageActor();
  if (!rolesAllow(actor.roles, { bench: ["read"] }) && !rolesAllow(actor.roles, { audit: ["read"] })) {
    return <Refused reason="Your role may not verify build sheets; it needs read access to benches or to the audit trail." />;
  }
  const { hash } = await searchParams;
  let result: Verification | null = null;
  let problem: string | null = null;
  if (hash !== undefined) {
    try {
      result = await verifySheetHash(getDb(), actor, parseWith(verifyInput, { hash }, "The hash"));
    } catch (error) {
      if (!(error instanceof AppError)) throw error;
      problem = error.fields[0]?.message ?? error.message;
    }
  }
  return (
    <div className="flex max-w-3xl flex-col gap-6">
      <h1 className="text-2xl font-semibold">Check a sheet</h1>
      <form method="get" className="flex flex-col gap-2">
        <label htmlFor="hash" className="font-medium">
          Content hash printed on the sheet (or the link from its QR code)
        </label>
        <div className="flex flex-wrap gap-2">
          <input id="hash" name="hash" defaultValue={hash ?? ""} autoComplete="off" spellCheck={false} className="min-h-11 flex-1 rounded-md border border-line bg-ink px-3 font-mono text-base text-text" aria-describedby={problem ? "hash-error" : undefined} />
          <button type="submit" className="inline-flex min-h-11 items-center rounded-md bg-accent px-4 py-2 font-semibold text-ink">
            Check
          </button>
        </div>
        {problem ? (
          <p id="hash-error" role="alert" className="text-danger">
            {problem}
          </p>
        ) : null}
      </form>
      {result ? (
        <section className={`flex flex-col gap-4 rounded-xl border-2 bg-panel p-6 ${LOOK[result.verdict].className}`} data-testid="verdict" aria-live="polite">
          <p className="text-4xl font-bold">
            <span aria-hidden="true">{LOOK[result.verdict].shape} </span>
            {result.headline.split(":")[0]}
          </p>
          <p className="text-xl text-text">{result.headline.split(":").slice(1).join(":").trim()}</p>
          {result.matches.map((m) => (
            <div key={m.revisionId} className="rounded-lg border border-line p-4 text-text">
              <p className="text-lg font-semibold">
                {m.benchTitle}, revision {m.number} <span className="text-muted">· {m.labName}</span>
              </p>
              <p>{m.sentence}</p>
              {m.signerName ? (
                <p>
                  Approved by <strong>{m.signerName}</strong> ({m.signerRole}) on <strong>{formatDateTime(m.decidedAt)}</strong>
                  {m.validUntil ? `, valid until ${formatDate(m.validUntil)}` : ""}.
                </p>
              ) : null}
              {m.conditions ? <p>Conditions: {m.conditions}</p> : null}
              <a href={`/reviews/${m.revisionId}`}>Open the online record</a>
            </div>
          ))}
          <p className="break-all font-mono text-sm text-muted">{result.hash}</p>
        </section>
      ) : null}
    </div>
  );
}
