import type { CSSProperties } from "react";
import { fmt } from "@/components/review/format";
import { displayedCautions } from "@/components/ui/cautions";
import { capitalise, eyewearWords, HAZARD_LABELS, nohdWords, plainText } from "@/lib/format";
import type { TableSheetContent } from "@/lib/build/sheet";
import { directionWords, edgeWords, kindLabel, kindNoun, tableElementSettings } from "@/lib/review/table-paths";
import type { CoverageData } from "@/components/eyewear/coverage-list";
import { PrintCoverage, PrintStandard } from "@/components/eyewear/print-coverage";
import { TablePlan } from "@/components/table/table-plan";
import { EMPTY_TABLE_ANALYSIS } from "@/lib/review/hazard";
import { ApprovalBox, NotComputed, PrintCautions, PrintNotes, PrintScope, ScreenFigures, SHEET_CSS, SheetHead } from "./print-sheet";
import { PrintPulseRegime, tableLineSources, tableRegime } from "@/components/review/pulse-regime";

/** Where the lines' MPE and NOHD come from, each once, in words (the clause and that it is not yet checked). */
function SheetSources({ safety }: { safety: NonNullable<TableSheetContent["safety"]> }) {
  const sources = tableLineSources(safety);
  if (sources.length === 0) return null;
  return (
    <ul className="scope" style={{ margin: "0 0 3mm" }} data-testid="sheet-sources">
      {sources.map((x) => (
        <li key={x}>{plainText(x)}</li>
      ))}
    </ul>
  );
}

// The printed build sheet of a table (bench document version 2): the plan at a stated scale with every element's
// hole and angle, the build order following the light, "every beam ends here", what the screens should show, the
// laser safety of every laser and path, and the approval. Black on white, as the rail's sheet.
const NICE_SCALES = [1, 2, 2.5, 5, 10, 20, 25, 50, 100];
const PLAN_WIDTH_MM = 176;
/** The plan's margin round the table, as TablePlan draws it with the hazard zone (a fraction of the longer side). */
const PLAN_MARGIN = 0.14;
/** Labels on the printed plan stand this high on paper (about 8 pt), whatever the plan's scale. */
const PLAN_LABEL_MM = 2.6;

/** The screen palette mapped to ink: the plan prints black on white, red kept for what is above the MPE. */
const PRINT_COLOURS = {
  "--color-raised": "#ffffff",
  "--color-panel": "#ffffff",
  "--color-line": "#9a9a9a",
  "--color-text": "#000000",
  "--color-muted": "#555555",
  "--color-accent": "#555555",
  "--color-ok": "#000000",
  "--color-warn": "#8a5a00",
  "--color-danger": "#c00000",
} as CSSProperties;

export function PrintTableSheet({ sheet, paper, eyewear = null }: { sheet: TableSheetContent; paper: "A4" | "Letter"; eyewear?: CoverageData | null }) {
  const { document: doc, analysis, safety, revision } = sheet;
  const size = Math.max(doc.table.widthMm, doc.table.depthMm);
  const drawnWidthMm = doc.table.widthMm + 2 * PLAN_MARGIN * size;
  const scale = NICE_SCALES.find((s) => drawnWidthMm / s <= PLAN_WIDTH_MM) ?? NICE_SCALES[NICE_SCALES.length - 1];
  const governing = safety?.governing ?? null;
  const eyewearText = eyewearWords(governing?.opticalDensityRequired ?? 0);
  const cautions = safety ? displayedCautions(safety.cautions) : [];
  const openAbove = (safety?.openBeams ?? []).filter((o) => o.exceedsMpe);
  return (
    <div className="sheet" data-print-ready="" data-paper={paper} data-sheet-kind="table">
      <style dangerouslySetInnerHTML={{ __html: SHEET_CSS }} />
      <SheetHead sheet={sheet} />
      {sheet.decision?.conditions ? <p className="warn">Conditions of the sign-off: {sheet.decision.conditions}</p> : null}
      {revision.status !== "valid" ? <p className="warn">{revision.statusSentence}</p> : null}
      {openAbove.length ? (
        <p className="warn">
          {openAbove.length} beam{openAbove.length === 1 ? " leaves" : "s leave"} the table above the MPE: {openAbove.map((o) => `${o.pathId} at the ${edgeWords(doc, o)}`).join("; ")}. Block or enclose {openAbove.length === 1 ? "it" : "each"} before switching on (see “Every beam ends here”).
        </p>
      ) : null}

      <section>
        <h2>The table, at scale</h2>
        <div style={{ ...PRINT_COLOURS, width: `${drawnWidthMm / scale}mm` }} data-testid="sheet-table-plan">
          <TablePlan doc={doc} analysis={analysis ?? EMPTY_TABLE_ANALYSIS} safety={safety} idPrefix="sheet-plan" legend={false} zones={safety ? { screenHazards: safety.screenHazards } : null} labelMm={PLAN_LABEL_MM * scale} holeNumbers />
        </div>
        <p style={{ fontSize: "10.5pt", margin: "1mm 0 0" }}>
          Scale 1:{scale} when printed at 100 %. Table {doc.table.widthMm} × {doc.table.depthMm} mm seen from above, front edge at the bottom; holes every {doc.table.holePitchMm} mm, the first half a pitch in from
          the front left corner (hole 1, 1); hole numbers along the front edge (columns) and the left edge (rows). Red: beams above the MPE and the nominal hazard zone; dashed: beams that leave the table.
        </p>
      </section>

      <section>
        <h2>Build order, following the light</h2>
        <p style={{ margin: "0 0 2mm" }}>Place each element on its hole (x to the right, y away from you), turn it to its angle (counter-clockwise from the +x direction; a laser: the way it points; anything else: its face normal).</p>
        <ol className="steps">
          {sheet.steps.map((s) => {
            const e = s.element;
            const settings = tableElementSettings(e);
            return (
              <li key={e.id}>
                <strong style={{ fontSize: "13.5pt" }}>
                  {kindLabel(e.kind)} {e.id}: {s.hole}, {Number(s.angleDeg.toFixed(2))}°
                </strong>
                <p>
                  At ({e.xMm}, {e.yMm}) mm{e.kind === "laser" ? `, aimed ${directionWords(e.angleDeg)}` : ""}
                  {settings ? `; ${settings}` : ""}.
                </p>
                <p>
                  {e.kind === "laser"
                    ? "Switch on only when the whole path is built and blocked, at the lowest power that lets you align."
                    : s.reached
                      ? `Reached by beam ${s.pathId}${s.powerMw !== null ? `, ${fmt(s.powerMw)} mW arriving` : ""}.`
                      : "No beam reaches it as drawn: check its place and angle with the officer before relying on it."}
                </p>
              </li>
            );
          })}
        </ol>
      </section>

      <section>
        <h2>Every beam ends here</h2>
        {sheet.problem ? <p className="warn">The beams cannot be traced for this drawing: {sheet.problem}</p> : null}
        <table data-testid="sheet-beam-ends">
          <thead>
            <tr>
              <th>Beam</th>
              <th>From</th>
              <th>Power</th>
              <th>Ends</th>
              <th style={{ width: "11mm" }}>Seen</th>
            </tr>
          </thead>
          <tbody>
            {sheet.ends.map((r) => (
              <tr key={r.id}>
                <td>
                  <strong>{r.id}</strong>
                  <br />
                  laser {r.laserId}
                </td>
                <td>
                  {kindNoun(r.startKind)} {r.startElementId}
                </td>
                <td className="num">{fmt(r.powerMw)} mW</td>
                <td style={r.end.kind === "edge" && r.end.open?.exceedsMpe ? { fontWeight: 800 } : undefined}>
                  {r.end.words}
                  {r.end.kind === "edge" && r.end.open ? `; NOHD ${nohdWords(r.end.open.nohdM, (v) => fmt(v))} beyond the edge` : ""}
                </td>
                <td>
                  <span className="tick" />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
        <p style={{ margin: "2mm 0 0", fontSize: "10.5pt" }}>
          Trace every beam with a viewing card at low power and tick where you saw it end. A beam on no line of this list was not drawn: stop and ask the laser safety officer.
        </p>
      </section>

      <section>
        <h2>As-built checklist (also in Benchwarden)</h2>
        <table>
          <thead>
            <tr>
              <th style={{ width: "11mm" }}>Done</th>
              <th>Item</th>
            </tr>
          </thead>
          <tbody>
            {sheet.checklist.map((c) => (
              <tr key={c.itemKey}>
                <td>
                  <span className="tick" />
                </td>
                <td>
                  <strong>{c.label}</strong>
                  {c.group !== "control" || c.itemKey.startsWith("open-beam:") ? <div style={{ fontSize: "10.5pt" }}>{c.detail}</div> : null}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>

      <section>
        <h2>What you should see</h2>
        {analysis?.screens.length ? <ScreenFigures screens={analysis.screens} /> : <p>No screen is reached, so no pattern is predicted.</p>}
        {analysis?.apertures.length ? (
          <table style={{ marginBottom: "3mm" }}>
            <thead>
              <tr>
                <th>Aperture</th>
                <th>Seen on</th>
                <th>Half-period zones</th>
                <th>Centre</th>
                <th>Light through</th>
              </tr>
            </thead>
            <tbody>
              {analysis.apertures.map((a) => (
                <tr key={`${a.pathId}-${a.id}-${a.screenId}`}>
                  <td>
                    <strong>{a.id}</strong> (⌀ {a.diameterMm} mm, beam {a.pathId})
                  </td>
                  <td>{a.screenId ? `${a.screenId}, ${fmt(a.observationDistanceMm)} mm on` : "no screen"}</td>
                  <td className="num">{fmt(a.fresnelNumber)}</td>
                  <td>{a.screenId ? a.centre : "—"}</td>
                  <td className="num">{fmt(a.transmittedFraction * 100)} %</td>
                </tr>
              ))}
            </tbody>
          </table>
        ) : null}
        <PrintNotes title="Notes on the beams" warnings={analysis?.warnings ?? []} />
      </section>

      <section className="page">
        <h2>Laser safety</h2>
        {eyewear ? <PrintStandard data={eyewear} safety={safety} /> : null}
        {safety ? (
          <>
            <table style={{ marginBottom: "3mm" }}>
              <thead>
                <tr>
                  <th>Laser</th>
                  <th>{HAZARD_LABELS.hazardClass}</th>
                  <th>Line</th>
                  <th>{HAZARD_LABELS.mpe}</th>
                  <th>{HAZARD_LABELS.nohd}</th>
                </tr>
              </thead>
              <tbody>
                {safety.lasers.flatMap((l) =>
                  l.lines.map((line, i) => (
                    <tr key={`${l.laserId}-${i}`}>
                      <td>{i === 0 ? <strong>{l.laserId}</strong> : ""}</td>
                      <td className="big">{i === 0 ? `Class ${l.hazardClass}` : ""}</td>
                      <td className="num">
                        {fmt(line.wavelengthNm, 5)} nm, {fmt(line.powerMw)} mW
                      </td>
                      <td className="num">{line.mpeWPerCm2 !== null ? `${fmt(line.mpeWPerCm2)} W/cm²` : line.perPulseJPerCm2 !== null ? `${fmt(line.perPulseJPerCm2)} J/cm² per pulse` : "—"}</td>
                      <td className="num">{nohdWords(line.nohdM, (v) => fmt(v))}</td>
                    </tr>
                  )),
                )}
              </tbody>
            </table>
            <SheetSources safety={safety} />
            <PrintPulseRegime {...tableRegime(doc, safety)} showLaser={safety.lasers.length > 1} />
            {sheet.registers.map((r) => (
              <p key={r.laserId} style={{ fontSize: "10.5pt", margin: "0 0 1mm" }}>
                <strong>Laser register, {r.laserId}:</strong>{" "}
                {r.entry ? `${r.entry.model}${r.entry.serialNumber ? `, S/N ${r.entry.serialNumber}` : ""}, label Class ${r.entry.labelClass} (${r.entry.status})` : `entry ${r.registerId} was not found — ask the laser safety officer.`}
              </p>
            ))}
            <div className="box" style={{ marginBottom: "3mm" }}>
              <p style={{ margin: 0 }}>{HAZARD_LABELS.eyewear}</p>
              <p className="big" style={{ fontSize: "16pt", margin: 0 }} data-testid="sheet-eyewear">
                {eyewearText.wear}
              </p>
              <p style={{ margin: 0 }}>{capitalise(eyewearText.need)}{governing ? `, on beam ${governing.pathId} at ${governing.elementId}` : ""}.</p>
            </div>
            {eyewear ? <PrintCoverage data={eyewear} asOf={new Date().toISOString().slice(0, 10)} /> : null}
            <h3>Eyewear OD on each beam</h3>
            <table style={{ marginBottom: "3mm" }}>
              <thead>
                <tr>
                  <th>Beam</th>
                  <th>Power at its start</th>
                  <th>Hazard</th>
                  <th>OD needed on it</th>
                </tr>
              </thead>
              <tbody>
                {sheet.rows.map((r) => (
                  <tr key={r.id}>
                    <td>
                      {r.id} (laser {r.laserId})
                    </td>
                    <td className="num">{fmt(r.powerMw)} mW</td>
                    <td>{r.band === "above-mpe" ? "above the MPE" : r.band === "within-mpe" ? "within the MPE" : "not assessed"}</td>
                    <td className="num">{r.opticalDensityRequired === null ? "—" : fmt(r.opticalDensityRequired, 2)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
            <PrintCautions cautions={cautions} warnings={safety.warnings} />
          </>
        ) : (
          <NotComputed problem={sheet.problem} />
        )}
        <PrintScope />
      </section>

      <ApprovalBox sheet={sheet} />
    </div>
  );
}
