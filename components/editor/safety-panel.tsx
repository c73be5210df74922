"use client";
// The laser safety summary when the analysis carries one: class, MPE, NOHD, the eyewear (one OD rule) and the cautions,
// with the scope limits of the figures and the sentence that the laser safety officer and local regulations decide.
import type { BenchSafetyAssessment } from "@/lib/safety";
import { eyewearWords, formatNumber, HAZARD_LABELS, nohdWords, plainText } from "@/lib/format";
import { HazardNotes } from "@/components/ui/hazard-notes";
import { CautionList } from "@/components/ui/caution-list";
import { EditorCoverage, type LabShelfData } from "@/components/eyewear/editor-coverage";

export function SafetyPanel({ safety, shelf = null }: { safety: BenchSafetyAssessment | undefined; shelf?: LabShelfData | null }) {
  if (!safety) return null;
  const od = safety.governing;
  const eyewear = eyewearWords(od?.opticalDensityRequired ?? 0, safety.wavelengthNm);
  return (
    <section aria-labelledby="safety-heading" className="rounded-lg border border-warn/60 bg-panel p-4" data-testid="safety">
      <h2 id="safety-heading" className="mb-2 text-lg font-semibold">Laser safety (advice)</h2>
      <dl className="grid grid-cols-2 gap-x-4 gap-y-2 text-sm sm:grid-cols-4">
        <div>
          <dt className="text-muted">{HAZARD_LABELS.hazardClass}</dt>
          <dd className="text-xl font-semibold" title={plainText(safety.laser?.figures?.hazardClass?.source ?? "")}>Class {safety.laser?.hazardClass ?? "—"}</dd>
        </div>
        <div>
          <dt className="text-muted">{HAZARD_LABELS.mpe}</dt>
          <dd className="font-mono" title={plainText(safety.mpe?.source ?? "")}>
            {formatNumber(safety.mpe?.value)} {safety.mpe?.unit}
          </dd>
        </div>
        <div>
          <dt className="text-muted">{HAZARD_LABELS.nohd}</dt>
          <dd className="font-mono" title={plainText(safety.laser?.figures?.nohd?.source ?? "")}>{nohdWords(safety.laser?.nohdM, (v) => formatNumber(v))}</dd>
        </div>
        <div className="col-span-2 sm:col-span-1">
          <dt className="text-muted">{HAZARD_LABELS.eyewear}</dt>
          <dd title={plainText(od?.source ?? "")} data-testid="eyewear-od">
            <span className="font-semibold">{eyewear.wear}</span>
            <span className="block text-xs text-muted">
              {eyewear.need}
              {od ? ` — highest at ${od.elementId} (${formatNumber(od.positionMm, { digits: 6 })} mm)` : ""}
            </span>
            {eyewear.check ? <span className="block text-xs text-muted">{eyewear.check}</span> : null}
          </dd>
        </div>
      </dl>
      {shelf ? <EditorCoverage shelf={shelf} safety={safety} /> : null}
      <div className="mt-3">
        <CautionList cautions={safety.cautions} />
      </div>
      <div className="mt-3">
        <HazardNotes />
      </div>
    </section>
  );
}
