import type { TableAssessment } from "@/lib/review/hazard";
import { beamEnds, directionWords, edgeWords, kindLabel, kindNoun, pathRows, type PathRow } from "@/lib/review/table-paths";
import { centreWords, eyewearWords, HAZARD_LABELS, nohdWords, plainText } from "@/lib/format";
import { CautionList } from "@/components/ui/caution-list";
import { HazardNotes } from "@/components/ui/hazard-notes";
import { TablePlan } from "@/components/table/table-plan";
import { fmt } from "./format";
import { PulseRegimeList, tableRegime } from "./pulse-regime";

// The review screen of a table (bench document version 2): the plan at a readable size with the nominal hazard zone,
// the open beams named in red, where every beam ends, each laser's class and lines, and every path with its power,
// hazard band and eyewear OD. Server-rendered; the figures are the engines' (lib/optics, lib/safety).
type Ok = Extract<TableAssessment, { ok: true }>;

const BAND_WORDS: Record<PathRow["band"], string> = { "above-mpe": "▲ above the MPE", "within-mpe": "○ within the MPE", "not-assessed": "? not assessed" };

function Section({ title, id, children }: { title: string; id: string; children: React.ReactNode }) {
  return (
    <section aria-labelledby={id} className="flex flex-col gap-3">
      <h2 id={id} className="text-xl font-semibold">
        {title}
      </h2>
      {children}
    </section>
  );
}

export function OpenBeamList({ assessed }: { assessed: Ok }) {
  const { doc, safety, analysis } = assessed;
  if (safety.openBeams.length === 0) {
    return (
      <p className="rounded-md border border-ok px-3 py-2" data-testid="open-beams">
        ✓ No beam leaves the table: every beam ends on a block, a screen or another stop.
      </p>
    );
  }
  return (
    <ul className="flex flex-col gap-2" data-testid="open-beams">
      {safety.openBeams.map((o) => {
        const path = analysis.paths.find((p) => p.id === o.pathId);
        const start = doc.elements.find((e) => e.id === o.startElementId);
        return (
          <li key={o.pathId} className={`rounded-md border-2 px-3 py-2 ${o.exceedsMpe ? "border-danger text-danger" : "border-warn"}`} data-open-beam={o.pathId} data-exceeds-mpe={o.exceedsMpe}>
            <p className="font-semibold">
              <span aria-hidden="true">{o.exceedsMpe ? "✕ " : "▲ "}</span>
              {o.exceedsMpe ? "Open beam above the MPE" : "Open beam within the MPE"}: beam {o.pathId} of laser {o.laserId}, from {start ? `${kindNoun(start.kind)} ${start.id}` : o.startElementId}
              {o.role !== "emitted" ? ` (${o.role.replace(/-/g, " ")})` : ""}
            </p>
            <p className="text-sm">
              Leaves the {edgeWords(doc, o)} at ({fmt(o.xMm, 4)}, {fmt(o.yMm, 4)}) mm heading {directionWords(path?.directionDeg ?? o.directionDeg)}; {fmt(o.powerMw)} mW; {o.nohdM > 0 ? `NOHD ${nohdWords(o.nohdM, (v) => fmt(v))} beyond the edge` : "no NOHD (below the MPE)"}; eyewear {o.opticalDensityRequired > 0 ? `OD ${fmt(o.opticalDensityRequired, 2)} needed` : "not needed for this beam"}.
              {o.exceedsMpe ? " Put a beam block where it leaves, or enclose it." : ""}
            </p>
          </li>
        );
      })}
    </ul>
  );
}

export function BeamEndList({ rows }: { rows: PathRow[] }) {
  return (
    <ol className="flex list-decimal flex-col gap-1 pl-6 text-sm" data-testid="beam-ends">
      {beamEnds(rows).map((r) => (
        <li key={r.id} className={r.end.kind === "edge" && r.end.open?.exceedsMpe ? "font-semibold text-danger" : r.end.kind === "stop" ? "" : "text-warn"}>
          Beam {r.id} (laser {r.laserId}, {fmt(r.powerMw)} mW from {kindNoun(r.startKind)} {r.startElementId}) {r.end.words}.
        </li>
      ))}
    </ol>
  );
}

export function TableReview({ assessed, eyewear }: { assessed: Ok; eyewear?: React.ReactNode }) {
  const { doc, analysis, safety } = assessed;
  const rows = pathRows(doc, analysis, safety);
  const regime = tableRegime(doc, safety);
  const g = safety.governing;
  const governingWords = eyewearWords(g?.opticalDensityRequired ?? 0);
  return (
    <div className="flex flex-col gap-8" data-testid="table-review">
      <Section id="plan-heading" title="The table">
        <div className="rounded-lg border border-line bg-panel p-2" data-testid="review-table-plan">
          <TablePlan doc={doc} analysis={analysis} safety={safety} idPrefix="review-plan" zones={{ screenHazards: safety.screenHazards }} />
        </div>
        <p className="text-sm text-muted">
          {doc.table.widthMm} × {doc.table.depthMm} mm, holes every {doc.table.holePitchMm} mm; {doc.elements.length} elements, {analysis.paths.length} beam paths from{" "}
          {safety.lasers.length} laser{safety.lasers.length === 1 ? "" : "s"}.
        </p>
      </Section>

      <Section id="open-heading" title="Beams that leave the table">
        <OpenBeamList assessed={assessed} />
      </Section>

      <Section id="ends-heading" title="Every beam ends here">
        <BeamEndList rows={rows} />
      </Section>

      <Section id="hazard-heading" title="Laser hazard">
        <div className="flex flex-col gap-3" data-testid="hazard-panel">
          <div className="overflow-x-auto">
            <table className="w-full min-w-[36rem] text-left text-sm">
              <caption className="sr-only">Each laser&apos;s class and, per line, MPE, NOHD and eyewear OD</caption>
              <thead className="text-muted">
                <tr>
                  <th className="py-1 pr-3">Laser</th>
                  <th className="py-1 pr-3">{HAZARD_LABELS.hazardClass}</th>
                  <th className="py-1 pr-3">Line</th>
                  <th className="py-1 pr-3">{HAZARD_LABELS.mpe}</th>
                  <th className="py-1 pr-3">{HAZARD_LABELS.nohd}</th>
                  <th className="py-1 pr-3">OD at the laser</th>
                </tr>
              </thead>
              <tbody>
                {safety.lasers.flatMap((l) =>
                  l.lines.map((line, i) => (
                    <tr key={`${l.laserId}-${i}`} className="border-t border-line">
                      <td className="py-1 pr-3 font-medium">{i === 0 ? l.laserId : ""}</td>
                      <td className="py-1 pr-3 font-semibold">{i === 0 ? `Class ${l.hazardClass}` : ""}</td>
                      <td className="py-1 pr-3">
                        {fmt(line.wavelengthNm, 5)} nm, {fmt(line.powerMw)} mW{line.source === "line" ? " (further line)" : ""}
                      </td>
                      <td className="py-1 pr-3 font-mono" title={plainText(line.mpeSource)}>
                        {line.mpeWPerCm2 !== null ? `${fmt(line.mpeWPerCm2)} W/cm²` : line.perPulseJPerCm2 !== null ? `${fmt(line.perPulseJPerCm2)} J/cm² per pulse` : "—"}
                      </td>
                      <td className="py-1 pr-3 font-mono" title={plainText(line.nohdSource)}>
                        {nohdWords(line.nohdM, (v) => fmt(v))}
                      </td>
                      <td className="py-1 pr-3 font-mono">{fmt(line.opticalDensityRequired, 2)}</td>
                    </tr>
                  )),
                )}
              </tbody>
            </table>
          </div>
          <PulseRegimeList rows={regime.rows} source={regime.source} showLaser={safety.lasers.length > 1} />
          <p className="rounded-md border border-line px-3 py-2 text-sm" data-testid="eyewear-od">
            <span className="font-medium">{HAZARD_LABELS.eyewear}: </span>
            {governingWords.wear}
            {g ? ` (${governingWords.need}, on beam ${g.pathId} at ${kindNoun(g.kind)} ${g.elementId})` : ""}.
          </p>
          {safety.warnings.length || analysis.warnings.length ? (
            <ul className="flex flex-col gap-1 text-sm">
              {[...safety.warnings, ...analysis.warnings.filter((w) => !safety.warnings.some((s) => s.message === w.message))].map((w, i) => (
                <li key={`${w.code}-${i}`} className="rounded-md border border-warn/60 px-3 py-2">
                  <span aria-hidden="true" className="text-warn">▲ </span>
                  {plainText(w.message)}
                </li>
              ))}
            </ul>
          ) : null}
          {safety.screenHazards.length || safety.lensHazards.length ? (
            <ul className="text-sm text-muted">
              {safety.lensHazards.map((h) => (
                <li key={`lens-${h.elementId}-${h.pathId}`}>
                  Behind {h.elementId} (beam {h.pathId}): hazard distance {fmt(h.fromLensM)} m from the lens ({plainText(h.source)}).
                </li>
              ))}
              {safety.screenHazards.map((h) => (
                <li key={`screen-${h.elementId}-${h.pathId}`}>
                  Off {h.elementId} (beam {h.pathId}): diffuse reflection hazard zone {fmt(h.diffuseReflectionNhzM)} m ({plainText(h.source)}).
                </li>
              ))}
            </ul>
          ) : null}
        </div>
      </Section>

      {eyewear ? (
        <Section id="eyewear-heading" title="Eyewear for each line">
          {eyewear}
        </Section>
      ) : null}

      <Section id="paths-heading" title="Every beam path">
        <div className="overflow-x-auto">
          <table className="w-full min-w-[44rem] text-left text-sm" data-testid="path-table">
            <caption className="sr-only">Each straight run of light: where it starts, its power, hazard band, eyewear OD and where it ends</caption>
            <thead className="text-muted">
              <tr>
                <th className="py-1 pr-3">Beam</th>
                <th className="py-1 pr-3">From</th>
                <th className="py-1 pr-3">Power at its start</th>
                <th className="py-1 pr-3">Hazard</th>
                <th className="py-1 pr-3">Eyewear OD on it</th>
                <th className="py-1 pr-3">Runs</th>
                <th className="py-1 pr-3">Ends</th>
              </tr>
            </thead>
            <tbody>
              {rows.map((r) => (
                <tr key={r.id} className="border-t border-line align-top" data-path-id={r.id} data-band={r.band}>
                  <td className="py-1 pr-3 font-mono">
                    {r.id}
                    <span className="block text-xs text-muted">laser {r.laserId}</span>
                  </td>
                  <td className="py-1 pr-3">
                    {kindLabel(r.startKind)} {r.startElementId}
                  </td>
                  <td className="py-1 pr-3 font-mono">{fmt(r.powerMw)} mW</td>
                  <td className={`py-1 pr-3 ${r.band === "above-mpe" ? "font-semibold text-danger" : ""}`}>{BAND_WORDS[r.band]}</td>
                  <td className="py-1 pr-3 font-mono">{r.opticalDensityRequired === null ? "—" : fmt(r.opticalDensityRequired, 2)}</td>
                  <td className="py-1 pr-3">{directionWords(r.directionDeg)}</td>
                  <td className="py-1 pr-3">{r.end.words}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </Section>

      {analysis.screens.length || analysis.apertures.length ? (
        <Section id="predictions-heading" title="What the light will do">
          <ul className="flex flex-col gap-1 text-sm" data-testid="table-predictions">
            {analysis.apertures.map((a) => (
              <li key={`a-${a.pathId}-${a.id}-${a.screenId}`}>
                Aperture {a.id} on beam {a.pathId}: Fresnel number {fmt(a.fresnelNumber)} seen from {a.screenId ?? "no screen"}
                {a.screenId ? `, ${centreWords(a.centre)}` : ""}; {fmt(a.transmittedFraction * 100)} % of the power passes.
              </li>
            ))}
            {analysis.screens.map((s) => (
              <li key={`s-${s.pathId}-${s.id}`}>
                Screen {s.id} on beam {s.pathId}: {fmt(s.powerMw)} mW arrives{s.centre ? `, ${centreWords(s.centre)}` : ""}.
              </li>
            ))}
          </ul>
        </Section>
      ) : null}

      <CautionList cautions={safety.cautions} boxed />
      <p className="text-sm text-muted">Not yet checked against the standard&apos;s text — confirm with your laser safety officer.</p>
      <HazardNotes />
    </div>
  );
}
