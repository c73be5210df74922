"use client";
// The laser safety summary when the analysis carries one: class, MPE, NOHD, required OD and the cautions,
// always with the sentence that the institution's laser safety officer and local regulations decide.
import type { BenchSafetyAssessment } from "@/lib/safety";
import { EditorCoverage, type LabShelfData } from "@/components/eyewear/editor-coverage";
import { sig } from "./format";

const FINAL_WORD = "The institution's laser safety officer and local regulations decide; these figures advise, they never authorise.";

export function SafetyPanel({ safety, shelf = null }: { safety: BenchSafetyAssessment | undefined; shelf?: LabShelfData | null }) {
  if (!safety) return null;
  const od = safety.governing;
  return (
    <section aria-labelledby="safety-heading" className="rounded-lg border border-warn/60 bg-panel p-4" data-testid="safety">
      <h2 id="safety-heading" className="mb-2 text-lg font-semibold">Laser safety (advice)</h2>
      <dl className="grid grid-cols-2 gap-x-4 gap-y-2 text-sm sm:grid-cols-4">
        <div>
          <dt className="text-muted">Hazard class</dt>
          <dd className="text-xl font-semibold" title={safety.laser?.figures?.hazardClass?.source}>Class {safety.laser?.hazardClass ?? "—"}</dd>
        </div>
        <div>
          <dt className="text-muted">MPE (eye)</dt>
          <dd className="font-mono" title={safety.mpe?.source}>
            {sig(safety.mpe?.value)} {safety.mpe?.unit}
          </dd>
        </div>
        <div>
          <dt className="text-muted">NOHD</dt>
          <dd className="font-mono" title={safety.laser?.figures?.nohd?.source}>{sig(safety.laser?.nohdM)} m</dd>
        </div>
        <div>
          <dt className="text-muted">Eyewear OD needed</dt>
          <dd className="font-mono" title={od?.source}>
            {od ? `OD ${sig(od.opticalDensityRequired, 2)}` : "—"}
            {od ? <span className="block text-xs text-muted">highest at {od.elementId} ({od.positionMm} mm)</span> : null}
          </dd>
        </div>
      </dl>
      {shelf ? <EditorCoverage shelf={shelf} safety={safety} /> : null}
      {safety.cautions?.length ? (
        <details className="mt-3">
          <summary className="cursor-pointer text-sm font-medium">Cautions ({safety.cautions.length})</summary>
          <ul className="mt-2 flex flex-col gap-2 text-sm">
            {safety.cautions.map((c) => (
              <li key={c.id}>
                <span className="font-medium">{c.title}.</span> {c.text} <span className="text-xs text-muted">({c.reference})</span>
              </li>
            ))}
          </ul>
        </details>
      ) : null}
      <p className="mt-3 text-sm font-medium text-warn">
        <span aria-hidden="true">⚠ </span>
        {safety.finalSay || FINAL_WORD}
      </p>
    </section>
  );
}
