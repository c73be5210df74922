import type { DecisionView } from "@/lib/api/contracts/reviews";
import { FinalSay } from "@/components/ui/hazard-notes";
import { eyewearWords, nohdWords } from "@/lib/format";
import { day, fmt, utc } from "./format";

const TITLES = { approved: "● Signed off", "changes-requested": "◑ Changes asked", rejected: "✕ Turned down" } as const;

/** The signature as recorded: who, in which role, when, what it means, for which content hash, and the hazard picture then. */
export function DecisionRecord({ decision, expiredOrReplaced }: { decision: DecisionView; expiredOrReplaced?: string | null }) {
  const h = decision.hazardSummary as
    | {
        hazardClass?: { value: string };
        governingOd?: { value: number; elementId: string } | null;
        nohd?: { value: number };
        mpe?: { value: number; unit: string };
        problem?: string;
        /** A table's summary (version 2): every laser, the paths, the open beams. */
        version?: number;
        lasers?: unknown[];
        paths?: unknown[];
        openBeams?: { exceedsMpe: boolean }[];
      }
    | null;
  const tone = decision.outcome === "approved" ? "border-ok" : decision.outcome === "rejected" ? "border-danger" : "border-warn";
  return (
    <section className={`rounded-xl border-2 ${tone} bg-panel p-4`} data-testid="decision-record" aria-labelledby="decision-record-heading">
      <h2 id="decision-record-heading" className="text-lg font-semibold">
        {TITLES[decision.outcome]}
      </h2>
      {expiredOrReplaced ? <p className="mt-1 font-medium text-warn">{expiredOrReplaced}</p> : null}
      <p className="mt-2">“{decision.meaning}”</p>
      <dl className="mt-3 grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="text-muted">By</dt>
        <dd>
          {decision.signerName}, {decision.signerRole}
        </dd>
        <dt className="text-muted">At</dt>
        <dd>{utc(decision.decidedAt)}</dd>
        {decision.validUntil ? (
          <>
            <dt className="text-muted">Valid until</dt>
            <dd>{day(decision.validUntil)}, to the end of that day</dd>
          </>
        ) : null}
        <dt className="text-muted">Content hash</dt>
        <dd className="break-all font-mono text-xs">{decision.contentHash}</dd>
      </dl>
      {decision.conditions ? (
        <div className="mt-3">
          <p className="text-sm text-muted">Conditions</p>
          <p className="whitespace-pre-wrap rounded-md border border-line bg-ink p-3" data-testid="decision-conditions">
            {decision.conditions}
          </p>
        </div>
      ) : decision.outcome === "approved" ? (
        <p className="mt-3 text-sm text-muted">No conditions were added.</p>
      ) : null}
      {decision.reason ? (
        <div className="mt-3">
          <p className="text-sm text-muted">{decision.outcome === "rejected" ? "Reason" : "What has to change"}</p>
          <p className="whitespace-pre-wrap rounded-md border border-line bg-ink p-3">{decision.reason}</p>
        </div>
      ) : null}
      {h ? (
        <p className="mt-3 text-sm text-muted">
          Hazard picture when signed:{" "}
          {h.problem
            ? h.problem
            : h.version === 2
              ? `Class ${h.hazardClass?.value ?? "—"} (the most hazardous of ${h.lasers?.length ?? 0} laser${h.lasers?.length === 1 ? "" : "s"}), ${h.paths?.length ?? 0} beam paths, ${(h.openBeams ?? []).filter((o) => o.exceedsMpe).length} open beam${(h.openBeams ?? []).filter((o) => o.exceedsMpe).length === 1 ? "" : "s"} above the MPE, largest NOHD ${nohdWords(h.nohd?.value, (v) => fmt(v))}, ${h.governingOd ? `${eyewearWords(h.governingOd.value).line} at ${h.governingOd.elementId}` : "eyewear —"}.`
              : `Class ${h.hazardClass?.value ?? "—"}, MPE ${fmt(h.mpe?.value)} ${h.mpe?.unit ?? ""}, NOHD ${nohdWords(h.nohd?.value, (v) => fmt(v))}, ${h.governingOd ? `${eyewearWords(h.governingOd.value).line} at ${h.governingOd.elementId}` : "eyewear —"}.`}
        </p>
      ) : null}
      {h && !h.problem ? <FinalSay className="mt-2 text-muted" /> : null}
    </section>
  );
}
