import type { TrailEntry } from "@/lib/server/trail";

import { ACTION_WORDS, centreWords, formatDate, formatDateTime, formatNumber } from "@/lib/format";

export { ACTION_WORDS };

const utc = (iso: string) => formatDateTime(iso);


const OUTCOME_WORDS: Record<string, { label: string; shape: string; className: string }> = {
  approved: { label: "Signed off", shape: "●", className: "border-ok text-ok" },
  "changes-requested": { label: "Changes asked", shape: "◑", className: "border-warn text-warn" },
  rejected: { label: "Turned down", shape: "✕", className: "border-danger text-danger" },
};

type Shown = TrailEntry | { kind: "saves"; at: string; lastAt: string; count: number; revisionNumber: number | null; by: string | null };

/** Autosaves come in dozens; consecutive ones on one revision are shown as one line with their count. */
function collapse(entries: TrailEntry[]): Shown[] {
  const out: Shown[] = [];
  for (const e of entries) {
    const prev = out[out.length - 1];
    if (e.kind === "event" && e.action === "draft-saved") {
      if (prev && prev.kind === "saves" && prev.revisionNumber === e.revisionNumber) {
        prev.count += 1;
        prev.lastAt = e.at;
        continue;
      }
      out.push({ kind: "saves", at: e.at, lastAt: e.at, count: 1, revisionNumber: e.revisionNumber, by: e.by });
      continue;
    }
    out.push(e);
  }
  return out;
}

function Marker({ kind }: { kind: Shown["kind"] }) {
  const look = { revision: "◆", decision: "✒", comment: "❝", event: "•", saves: "•" }[kind];
  return (
    <span aria-hidden="true" className="absolute -left-[2.25rem] top-0 flex size-6 items-center justify-center rounded-full border border-line bg-panel text-sm text-accent">
      {look}
    </span>
  );
}

function Body({ e }: { e: Shown }) {
  switch (e.kind) {
    case "revision":
      return (
        <>
          <p className="font-semibold">Revision {e.revisionNumber} created{e.by ? ` by ${e.by}` : ""}</p>
          <p className="break-all font-mono text-sm text-muted">
            {e.state === "draft" ? "Content hash as last saved" : "Content hash as sent for review"} {e.contentHash}
          </p>
        </>
      );
    case "decision": {
      const look = OUTCOME_WORDS[e.outcome] ?? { label: e.outcome, shape: "•", className: "border-line text-text" };
      return (
        <div className="rounded-lg border border-line bg-panel p-3" data-testid="trail-decision">
          <p className="flex flex-wrap items-center gap-2">
            <span className={`inline-flex items-center gap-1 rounded-full border px-2 py-0.5 text-sm ${look.className}`}>
              <span aria-hidden="true">{look.shape}</span>
              {look.label}
            </span>
            <span className="font-semibold">
              revision {e.revisionNumber} by {e.by}, {e.role}
            </span>
          </p>
          <p className="mt-2">
            <span className="text-sm text-muted">What the signature means: </span>“{e.meaning}”
          </p>
          {e.conditions ? (
            <p className="mt-1">
              <span className="text-sm text-muted">Conditions: </span>
              {e.conditions}
            </p>
          ) : null}
          {e.reason ? (
            <p className="mt-1">
              <span className="text-sm text-muted">{e.outcome === "rejected" ? "Reason: " : "What to change: "}</span>
              {e.reason}
            </p>
          ) : null}
          <p className="mt-1 text-sm text-muted">
            {e.validUntil ? `Valid until ${formatDate(e.validUntil)} · ` : ""}
            {e.hazardClass ? `Class ${e.hazardClass} at signing · ` : ""}
            {e.stepUpVerified ? "password re-entered to sign" : "signed without re-entering the password"}
          </p>
          <p className="break-all font-mono text-sm text-muted">Signed hash {e.contentHash}</p>
        </div>
      );
    }
    case "comment":
      return (
        <>
          <p className="font-semibold">
            {e.by} ({e.role}) commented on revision {e.revisionNumber}
            {e.elementId ? `, about ${e.elementId}` : ""}
          </p>
          <p className="whitespace-pre-wrap text-muted">{e.body}</p>
        </>
      );
    case "saves":
      return (
        <p>
          Draft{e.revisionNumber ? ` of revision ${e.revisionNumber}` : ""} saved {e.count === 1 ? "once" : `${e.count} times`}
          {e.by ? ` by ${e.by}` : ""}
          {e.count > 1 ? <span className="text-sm text-muted"> (last at {utc(e.lastAt)})</span> : null}
        </p>
      );
    case "event":
      return (
        <>
          <p>
            {ACTION_WORDS[e.action] ?? e.action}
            {e.revisionNumber ? ` · revision ${e.revisionNumber}` : ""}
            {e.by ? ` · ${e.by}` : ""}
          </p>
          {eventDetail(e.action, e.detail) ? (
            <p className={`text-sm ${isMismatch(e.action, e.detail) ? "text-danger" : "text-muted"}`} data-testid="trail-event-detail">
              {eventDetail(e.action, e.detail)}
            </p>
          ) : null}
          {e.contentHash ? <p className="break-all font-mono text-xs text-muted">{e.contentHash}</p> : null}
        </>
      );
  }
}

/** An observation (typed or read from a screen photo) that differs from the prediction: its line stands out in the trail. */
function isMismatch(action: string, detail: unknown): boolean {
  return action === "build-observation-recorded" && typeof detail === "object" && detail !== null && (detail as { mismatch?: unknown }).mismatch === true;
}

/** What a checklist line or an observation recorded, in words (the audit row's detail). */
export function eventDetail(action: string, detail: unknown): string | null {
  if (!detail || typeof detail !== "object") return null;
  const d = detail as Record<string, unknown>;
  if (action === "build-check-recorded") {
    const parts = [`Line ${String(d.itemKey ?? "—")}: ${d.done ? "ticked" : "not ticked"}`];
    if (typeof d.measuredPositionMm === "number") {
      parts.push(`measured ${formatNumber(d.measuredPositionMm, { digits: 6 })} mm${typeof d.expectedPositionMm === "number" ? ` (drawn ${formatNumber(d.expectedPositionMm, { digits: 6 })} mm)` : ""}`);
      if (d.withinTolerance === false) parts.push("out of tolerance");
    }
    if (typeof d.note === "string" && d.note) parts.push(`note “${d.note}”`);
    return parts.join(", ");
  }
  if (action === "build-observation-recorded") {
    const parts = [d.mismatch ? "✕ Mismatch with the prediction" : "✓ Matches the prediction"];
    if (d.photoReadingId) parts.push("read from a screen photo");
    if (d.apertureId) parts.push(`behind ${String(d.apertureId)}`);
    if (d.centreSeen) parts.push(`centre seen: ${centreWords(d.centreSeen === "unclear" ? "between" : String(d.centreSeen))} (predicted ${centreWords(d.centrePredicted as string | null)})`);
    if (Array.isArray(d.reasons) && d.reasons.length) parts.push(d.reasons.join(" "));
    return parts.join("; ");
  }
  if (action === "build-photo-read") {
    const file = typeof d.fileName === "string" ? `“${d.fileName}”` : "the photo";
    if (typeof d.refusal === "string" && d.refusal) return `${file} behind ${String(d.apertureId ?? "—")} could not be read: ${d.refusal}`;
    const parts = [`${file} behind ${String(d.apertureId ?? "—")}${typeof d.pathId === "string" && typeof d.screenId === "string" ? ` on ${d.screenId} (beam ${d.pathId})` : ""}`];
    if (typeof d.zoneCount === "number") parts.push(`${formatNumber(d.zoneCount)} half-period zones (predicted ${formatNumber(d.predictedZoneCount as number)})`);
    if (d.centreSeen) parts.push(centreWords(String(d.centreSeen)));
    if (typeof d.screenDistanceMm === "number") parts.push(`screen about ${formatNumber(d.screenDistanceMm, { digits: 4 })} mm behind the aperture (drawn ${formatNumber(d.drawnDistanceMm as number, { digits: 4 })} mm)`);
    return parts.join(", ");
  }
  return null;
}

export function TrailTimeline({ entries }: { entries: TrailEntry[] }) {
  const shown = collapse(entries);
  if (shown.length === 0) return <p className="text-muted">Nothing has happened to this bench yet.</p>;
  return (
    <ol className="ml-3 flex flex-col gap-4 border-l border-line pl-6" data-testid="trail-timeline">
      {shown.map((e, i) => (
        <li key={`${e.kind}-${e.at}-${i}`} className="relative">
          <Marker kind={e.kind} />
          <p className="text-sm text-muted">
            <time dateTime={e.at}>{utc(e.at)}</time>
          </p>
          <Body e={e} />
        </li>
      ))}
    </ol>
  );
}
