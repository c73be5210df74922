import type { BenchSafetyAssessment } from "@/lib/safety";
import { fmt } from "./format";

const WHERE_WORDS = { element: "at", focus: "at the focus after", "open-end-focus": "at the focus beyond the open end after" } as const;

function Figure({ label, value, source, strong }: { label: string; value: string; source: string; strong?: boolean }) {
  return (
    <div className="rounded-lg border border-line bg-panel p-3">
      <dt className="text-sm text-muted">{label}</dt>
      <dd className={`font-mono ${strong ? "text-2xl font-semibold" : "text-lg"}`}>{value}</dd>
      <dd className="mt-1 text-xs text-muted">{source}</dd>
    </div>
  );
}

// The laser hazard assessment beside the drawing: class check, MPE, NOHD, governing OD and where, cautions.
export function HazardPanel({ safety }: { safety: BenchSafetyAssessment }) {
  const g = safety.governing;
  const label = safety.laser.labelCheck;
  return (
    <div className="flex flex-col gap-4" data-testid="hazard-panel">
      <dl className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <Figure label="Laser class (estimated)" value={`Class ${safety.laser.hazardClass}`} source={safety.laser.figures.hazardClass.source} strong />
        <Figure label={`MPE (eye, ${fmt(safety.laser.exposureS)} s)`} value={`${fmt(safety.mpe.value)} ${safety.mpe.unit}`} source={safety.mpe.source} />
        <Figure label="NOHD of the free beam" value={`${fmt(safety.laser.nohdM)} m`} source={safety.laser.figures.nohd.source} />
        <Figure
          label="Eyewear OD needed (highest on the bench)"
          value={g ? fmt(g.opticalDensityRequired, 2) : "—"}
          source={g ? `${WHERE_WORDS[g.where]} ${g.elementId}, ${fmt(g.positionMm)} mm. ${g.source}` : "No light reaches anything."}
          strong
        />
      </dl>
      <p className={`rounded-md border px-3 py-2 text-sm ${label && !label.matches ? "border-danger" : "border-line"}`}>
        {label ? (
          label.matches ? (
            <>✓ The label says Class {label.labelClass}, which matches the estimate.</>
          ) : (
            <>
              <span aria-hidden="true" className="text-danger">✕ </span>
              <strong>Class mismatch:</strong> {label.warning}
            </>
          )
        ) : (
          <>○ No label class to compare with: the laser is not linked to a laser register entry, so only the estimate is shown.</>
        )}
      </p>
      {safety.warnings.length ? (
        <ul className="flex flex-col gap-1 text-sm">
          {safety.warnings.map((w, i) => (
            <li key={`${w.code}-${i}`} className="rounded-md border border-warn/60 px-3 py-2">
              <span aria-hidden="true" className="text-warn">▲ </span>
              {w.message}
            </li>
          ))}
        </ul>
      ) : null}
      {safety.lensHazards.length || safety.screenHazards.length ? (
        <ul className="text-sm text-muted">
          {safety.lensHazards.map((h) => (
            <li key={`lens-${h.elementId}`}>
              Behind {h.elementId}: hazard distance {fmt(h.fromLensM)} m from the lens ({h.source}).
            </li>
          ))}
          {safety.screenHazards.map((h) => (
            <li key={`screen-${h.elementId}`}>
              Off {h.elementId}: diffuse reflection hazard zone {fmt(h.diffuseReflectionNhzM)} m ({h.source}).
            </li>
          ))}
        </ul>
      ) : null}
      <details className="rounded-lg border border-line bg-panel p-3" open>
        <summary className="cursor-pointer font-medium">Cautions ({safety.cautions.length})</summary>
        <ul className="mt-2 flex flex-col gap-2 text-sm">
          {safety.cautions.map((c) => (
            <li key={c.id}>
              <p className="font-medium">{c.title}</p>
              <p className="text-muted">
                {c.text} <span className="text-xs">({c.reference})</span>
              </p>
            </li>
          ))}
        </ul>
      </details>
      <p className="text-sm text-muted">{safety.finalSay}</p>
    </div>
  );
}
