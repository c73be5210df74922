import type { BenchSafetyAssessment } from "@/lib/safety";
import { eyewearWords, HAZARD_LABELS, nohdWords, plainText } from "@/lib/format";
import { CautionList } from "@/components/ui/caution-list";
import { HazardNotes } from "@/components/ui/hazard-notes";
import { regimeRows, type PulseFields } from "@/lib/format/pulse-regime";
import { fmt } from "./format";
import { PulseRegimeList } from "./pulse-regime";

const WHERE_WORDS = { element: "at", focus: "at the focus after", "open-end-focus": "at the focus beyond the open end after" } as const;

function Figure({ label, value, source, strong, testId }: { label: string; value: string; source: string; strong?: boolean; testId?: string }) {
  return (
    <div className="rounded-lg border border-line bg-panel p-3">
      <dt className="text-sm text-muted">{label}</dt>
      <dd className={strong ? "text-xl font-semibold" : "font-mono text-lg"} data-testid={testId}>
        {value}
      </dd>
      <dd className="mt-1 text-xs text-muted">{plainText(source)}</dd>
    </div>
  );
}

// The laser hazard assessment beside the drawing: class check, MPE, NOHD, governing OD and where, the pulse regime of
// each line with the rule that governs its MPE (given the drawing's laser), cautions.
export function HazardPanel({ safety, laser }: { safety: BenchSafetyAssessment; laser?: PulseFields }) {
  const g = safety.governing;
  const label = safety.laser.labelCheck;
  const eyewear = eyewearWords(g?.opticalDensityRequired ?? 0, safety.wavelengthNm);
  const regime = laser
    ? regimeRows(
        safety.laserId,
        laser,
        safety.lines.lines.map((l) => ({ wavelengthNm: l.wavelengthNm, main: l.main, powerMw: l.powerMw, rule: l.assessment.pulsedMpe?.governingRule ?? null })),
      )
    : [];
  return (
    <div className="flex flex-col gap-4" data-testid="hazard-panel">
      <dl className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <Figure label={HAZARD_LABELS.hazardClass} value={`Class ${safety.laser.hazardClass}`} source={safety.laser.figures.hazardClass.source} strong />
        <Figure label={`${HAZARD_LABELS.mpe} (${fmt(safety.laser.exposureS)} s)`} value={`${fmt(safety.mpe.value)} ${safety.mpe.unit}`} source={safety.mpe.source} />
        <Figure label={HAZARD_LABELS.nohd} value={nohdWords(safety.laser.nohdM, (v) => fmt(v))} source={safety.laser.figures.nohd.source} />
        <Figure
          label={HAZARD_LABELS.eyewear}
          value={eyewear.wear}
          source={g ? `${eyewear.need}, ${WHERE_WORDS[g.where]} ${g.elementId}, ${fmt(g.positionMm)} mm. ${g.source}` : "No light reaches anything."}
          strong
          testId="eyewear-od"
        />
      </dl>
      <PulseRegimeList rows={regime} source={safety.laser.pulsedMpe?.source ?? null} />
      <p className={`rounded-md border px-3 py-2 text-sm ${label && !label.matches ? "border-danger" : "border-line"}`}>
        {label ? (
          label.matches ? (
            <>✓ The label says Class {label.labelClass}, which matches the estimate.</>
          ) : (
            <>
              <span aria-hidden="true" className="text-danger">✕ </span>
              <strong>Class mismatch:</strong> {plainText(label.warning ?? "")}
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
              {plainText(w.message)}
            </li>
          ))}
        </ul>
      ) : null}
      {safety.lensHazards.length || safety.screenHazards.length ? (
        <ul className="text-sm text-muted">
          {safety.lensHazards.map((h) => (
            <li key={`lens-${h.elementId}`}>
              Behind {h.elementId}: hazard distance {fmt(h.fromLensM)} m from the lens ({plainText(h.source)}).
            </li>
          ))}
          {safety.screenHazards.map((h) => (
            <li key={`screen-${h.elementId}`}>
              Off {h.elementId}: diffuse reflection hazard zone {fmt(h.diffuseReflectionNhzM)} m ({plainText(h.source)}).
            </li>
          ))}
        </ul>
      ) : null}
      <CautionList cautions={safety.cautions} boxed />
      <HazardNotes />
    </div>
  );
}
