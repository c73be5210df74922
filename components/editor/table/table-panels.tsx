"use client";
// The table editor's side panels: the selected element's values (its kind's fields from the one record per kind, plus
// its place and angle), the figures of a clicked beam, and the open beams with the lasers' hazard figures, the hazard
// notes and the deferral sentence.
import { memo } from "react";
import { ELEMENT_KIND_RECORDS, tableFieldsOf } from "@/lib/bench/element-kinds";
import { benchDocumentV2Schema, type BenchDocumentV2, type TableElement, type TableGeometry } from "@/lib/bench/schema-v2";
import { CautionList } from "@/components/ui/caution-list";
import { HazardNotes } from "@/components/ui/hazard-notes";
import { plainText } from "@/lib/format";
import type { LaserElement } from "@/lib/bench/schema";
import type { EditorAction } from "../editor-reducer";
import { LaserLines } from "../laser-lines";
import { NumberField } from "../number-field";
import { RegisterEntryBox } from "../register-entry";
import { LaserRegimeLine } from "@/components/review/pulse-regime";
import { holeOf } from "./table-geometry";
import { powerText } from "./table-canvas";
import type { TablePredictions } from "./table-engine";
import type { TableAction } from "./table-reducer";

const fmt = (v: number | null | undefined, digits = 3) => (v === null || v === undefined || !Number.isFinite(v) ? "—" : String(Number(v.toPrecision(digits))));

/** Which edge of the table a point lies on, in words a person standing at the front understands. */
export function edgeWords(table: TableGeometry, p: { xMm: number; yMm: number }): string {
  const { widthMm, depthMm } = table;
  const near = (a: number, b: number) => Math.abs(a - b) < 1e-6;
  if (near(p.yMm, 0)) return "the front edge (towards where people stand)";
  if (near(p.yMm, depthMm)) return "the back edge";
  if (near(p.xMm, 0)) return "the left edge";
  if (near(p.xMm, widthMm)) return "the right edge";
  return "the table's edge";
}

/** A direction as a bearing on the plan. */
export function directionWords(deg: number): string {
  const names = ["right (+x)", "right and back", "back (+y)", "left and back", "left (−x)", "left and front", "front (−y)", "right and front"];
  const n = ((deg % 360) + 360) % 360;
  const k = Math.round(n / 45) % 8;
  return Math.abs(n - k * 45) < 0.01 ? names[k] : `${fmt(n, 4)}° (${names[k]})`;
}

/** The document's problems with a field of an element: the element's own schema and the whole table's rules, naming the element. */
function checkTableField(doc: BenchDocumentV2, element: TableElement, key: string) {
  return (value: number | undefined): string | null => {
    const candidate = { ...element, [key]: value } as Record<string, unknown>;
    if (value === undefined) delete candidate[key];
    const index = doc.elements.findIndex((e) => e.id === element.id);
    const next = { ...doc, elements: doc.elements.map((e, i) => (i === index ? candidate : e)) };
    const result = benchDocumentV2Schema.safeParse(next);
    if (result.success) return null;
    const issue = result.error.issues.find((i) => i.path[0] === "elements" && i.path[1] === index && i.path[2] === key);
    return issue?.message ?? null;
  };
}

type PropertiesProps = { doc: BenchDocumentV2; selected: TableElement[]; canEdit: boolean; dispatch: (a: TableAction) => void; labId: string; labName: string };

export const TableProperties = memo(function TableProperties({ doc, selected, canEdit, dispatch, labId, labName }: PropertiesProps) {
  if (selected.length === 0) {
    return (
      <section aria-labelledby="table-props-heading" className="rounded-lg border border-line bg-panel p-4">
        <h2 id="table-props-heading" className="mb-1 text-lg font-semibold">Properties</h2>
        <p className="text-sm text-muted">Select an element on the table to see and change its values, or click a beam to see its figures.</p>
      </section>
    );
  }
  if (selected.length > 1) {
    return (
      <section aria-labelledby="table-props-heading" className="rounded-lg border border-line bg-panel p-4" data-testid="properties">
        <h2 id="table-props-heading" className="mb-1 text-lg font-semibold">Properties</h2>
        <p className="text-sm">
          {selected.length} elements selected: {selected.map((e) => e.id).join(", ")}.
        </p>
        <p className="mt-1 text-sm text-muted">Drag one of them or use the arrow keys to move them together; R turns each by 45°.</p>
      </section>
    );
  }
  const element = selected[0];
  const record = ELEMENT_KIND_RECORDS[element.kind];
  const values = element as Record<string, unknown>;
  const hole = holeOf(element, doc.table);
  const place = [
    { key: "xMm", label: "x (from the left edge)", unit: "mm", step: 1 },
    { key: "yMm", label: "y (from the front edge)", unit: "mm", step: 1 },
    { key: "angleDeg", label: element.kind === "laser" ? "Beam direction" : "Face normal", unit: "°", step: 1, hint: "Counter-clockwise from +x (to the right)." },
  ];
  const fields = [...place, ...tableFieldsOf(element.kind)];
  // A laser on the table carries the rail laser's fields (and a place instead of a rail position): the register link and
  // the further lines are the rail editor's own panels, whose "update" action the table's reducer takes as it is.
  const laser = element.kind === "laser" ? (element as unknown as LaserElement) : null;
  const laserDispatch = (action: EditorAction) => {
    if (action.type === "update") dispatch(action);
  };
  return (
    <section aria-labelledby="table-props-heading" className="rounded-lg border border-line bg-panel p-4" data-testid="properties">
      <h2 id="table-props-heading" className="mb-1 text-lg font-semibold">
        {record.label} <span className="font-mono text-base font-normal text-muted">{element.id}</span>
      </h2>
      <p className="mb-3 text-sm text-muted">
        {record.effect} {hole ? `On hole ${hole.column}, row ${hole.row}.` : "Between holes."}
      </p>
      {laser ? (
        <div className="mb-3">
          <RegisterEntryBox laser={laser} labId={labId} labName={labName} canEdit={canEdit} dispatch={laserDispatch} />
        </div>
      ) : null}
      <div className="grid gap-3 sm:grid-cols-2">
        {fields.map((f) => (
          <NumberField
            key={`${element.id}-${f.key}`}
            id={`table-field-${f.key}`}
            label={f.label}
            unit={f.unit}
            hint={f.hint}
            optional={"optional" in f ? f.optional : false}
            step={f.step}
            readOnly={!canEdit}
            value={values[f.key] as number | undefined}
            check={checkTableField(doc, element, f.key)}
            onCommit={(v, session) => dispatch({ type: "update", id: element.id, patch: { [f.key]: v }, coalesce: `field-${element.id}-${f.key}-${session}` })}
          />
        ))}
      </div>
      {laser ? <LaserRegimeLine laser={laser} /> : null}
      {laser ? <LaserLines laser={laser} canEdit={canEdit} dispatch={laserDispatch} /> : null}
    </section>
  );
});

type BeamProps = { table: TableGeometry; pathId: string; predictions: TablePredictions | undefined; onClose: () => void };

/** The figures of one beam run: power, beam size where it ends, where it ends, and its hazard band (MPE, OD, NOHD). */
export function BeamFigures({ table, pathId, predictions, onClose }: BeamProps) {
  const path = predictions?.analysis.paths.find((p) => p.id === pathId);
  if (!path) {
    return (
      <section className="rounded-lg border border-line bg-panel p-4" data-testid="beam-figures">
        <h2 className="text-lg font-semibold">Beam {pathId}</h2>
        <p className="text-sm text-muted">Its figures come with the next answer of the engine.</p>
      </section>
    );
  }
  const safety = predictions?.safety;
  const points = (safety?.points ?? []).filter((p) => p.pathId === pathId);
  const worst = points.reduce<(typeof points)[number] | null>((w, p) => (p.opticalDensityRaw !== null && (!w || (w.opticalDensityRaw ?? -Infinity) < p.opticalDensityRaw) ? p : w), null);
  const open = safety?.openBeams.find((o) => o.pathId === pathId);
  const laser = safety?.lasers.find((l) => l.laserId === path.laserId);
  const main = laser?.lines[0];
  const odMax = Math.max(worst?.opticalDensityRaw ?? -Infinity, open ? (open.exceedsMpe ? Math.max(open.opticalDensityRequired, 1e-9) : -1) : -Infinity);
  const above = safety ? odMax > 0 : null;
  const startAt = path.startElementId;
  const end =
    "elementId" in path.end ? `ends on ${path.end.elementId}` : "edge" in path.end ? `leaves the table at ${edgeWords(table, path.end.edge)}` : `goes on as ${path.end.continuesAs.join(", ")}`;
  const entry = predictions?.analysis.elements.filter((e) => e.pathId === pathId).at(-1);
  const radiusMm = path.arrival?.radiusMm ?? entry?.incident.radiusMm ?? null;
  return (
    <section aria-labelledby="beam-heading" className={`rounded-lg border bg-panel p-4 ${above ? "border-danger" : "border-line"}`} data-testid="beam-figures" data-path-id={pathId}>
      <h2 id="beam-heading" className="mb-1 flex items-center justify-between gap-2 text-lg font-semibold">
        <span>
          Beam <span className="font-mono">{pathId}</span>
        </span>
        <button type="button" className="rounded-md border border-line px-2 text-sm" onClick={onClose}>
          Close
        </button>
      </h2>
      <p className="mb-2 text-sm text-muted">
        From {startAt} ({path.role === "emitted" ? "the laser's own beam" : path.role.replace("-", " ")}) of laser {path.laserId}, heading {directionWords(path.directionDeg)}; {fmt(path.lengthMm, 4)} mm long; {end}.
      </p>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="text-muted">Power at its start</dt>
        <dd className="font-mono" data-testid="beam-power">{powerText(path.powerMw)}</dd>
        <dt className="text-muted">Beam diameter (1/e²) at its end</dt>
        <dd className="font-mono">{radiusMm === null ? "—" : `${fmt(2 * radiusMm)} mm`}</dd>
        <dt className="text-muted">Hazard band</dt>
        <dd className={above ? "font-semibold text-danger" : ""} data-testid="beam-band">
          {above === null ? "not assessed" : above ? `above the MPE: eyewear of OD ${fmt(odMax, 2)} or more needed on this beam` : "within the MPE"}
        </dd>
        {main ? (
          <>
            <dt className="text-muted">MPE ({fmt(main.wavelengthNm, 4)} nm)</dt>
            <dd className="font-mono">{main.mpeWPerCm2 === null ? `${fmt(main.perPulseJPerCm2)} J/cm² per pulse` : `${fmt(main.mpeWPerCm2)} W/cm²`}</dd>
          </>
        ) : null}
        {worst ? (
          <>
            <dt className="text-muted">Highest irradiance on it (over the limiting aperture)</dt>
            <dd className="font-mono">{fmt(worst.averagedIrradianceWPerCm2)} W/cm² at {worst.elementId}</dd>
          </>
        ) : null}
        {open ? (
          <>
            <dt className="text-muted">NOHD beyond the edge</dt>
            <dd className="font-mono">{fmt(open.nohdM)} m</dd>
          </>
        ) : null}
      </dl>
    </section>
  );
}

/** Warnings shown at once; the rest fold away (a big table can have dozens). */
const WARNINGS_SHOWN = 6;

function WarningItems({ warnings }: { warnings: { code: string; message: string }[] }) {
  return (
    <ul className="flex flex-col gap-1 text-sm text-warn" aria-label="Warnings">
      {warnings.map((w, i) => (
        <li key={`${w.code}-${i}`}>
          <span aria-hidden="true">⚠ </span>
          {plainText(w.message)}
        </li>
      ))}
    </ul>
  );
}

type SafetyProps = {
  table: TableGeometry;
  predictions: TablePredictions | undefined;
  /** The figures are for an earlier state of the drawing (it is moving, or it cannot be analysed as it stands). */
  stale: boolean;
  onBeam: (pathId: string) => void;
};

/** Open beams first (red when above the MPE), then each laser's class and per-line figures, warnings, and the notes. */
export const TableSafety = memo(function TableSafety({ table, predictions, stale, onBeam }: SafetyProps) {
  const safety = predictions?.safety;
  const open = safety?.openBeams ?? [];
  const hazardous = open.filter((o) => o.exceedsMpe);
  const weak = open.filter((o) => !o.exceedsMpe);
  const warnings = [...(predictions?.analysis.warnings ?? []), ...(safety?.warnings ?? [])];
  return (
    <section aria-labelledby="table-safety-heading" className="flex flex-col gap-3 rounded-lg border border-line bg-panel p-4" data-testid="table-safety">
      <h2 id="table-safety-heading" className="text-lg font-semibold">Laser safety on the table</h2>
      {!predictions ? <p className="text-sm text-muted">Place a laser to see where its light goes.</p> : null}
      {predictions && stale ? (
        <p className="rounded-md border border-warn/60 p-2 text-sm text-warn" data-testid="safety-stale">
          <span aria-hidden="true">◌ </span>These figures are for the drawing as it was a moment ago; they follow as soon as the drawing as it stands can be analysed.
        </p>
      ) : null}
      {hazardous.length > 0 ? (
        <div role="alert" className="rounded-md border-2 border-danger bg-danger/10 p-3" data-testid="open-beam-warning">
          <p className="font-semibold text-danger">
            <span aria-hidden="true">⚠ </span>
            {hazardous.length === 1 ? "A beam above the MPE leaves the table" : `${hazardous.length} beams above the MPE leave the table`}
          </p>
          <ul className="mt-1 flex flex-col gap-1 text-sm">
            {hazardous.map((o) => (
              <li key={o.pathId}>
                <button type="button" className="font-mono text-danger underline underline-offset-2" onClick={() => onBeam(o.pathId)}>
                  {o.pathId}
                </button>{" "}
                from {o.startElementId} leaves at {edgeWords(table, o)} (x {fmt(o.xMm, 4)} mm, y {fmt(o.yMm, 4)} mm) heading {directionWords(o.directionDeg)}: {powerText(o.powerMw)}, NOHD{" "}
                {fmt(o.nohdM)} m beyond the edge, eyewear OD {fmt(o.opticalDensityRequired, 2)}.
              </li>
            ))}
          </ul>
          <p className="mt-1 text-sm">Put a beam block in its way on the table, or enclose it, before the laser is switched on.</p>
        </div>
      ) : predictions && safety && !stale ? (
        <p className="rounded-md border border-ok/60 p-3 text-sm" data-testid="no-open-beam">
          <span aria-hidden="true">✓ </span>No beam above the MPE leaves the table{weak.length > 0 ? `; ${weak.length} weaker beam${weak.length === 1 ? "" : "s"} (within the MPE) do.` : "."}
        </p>
      ) : null}
      {weak.length > 0 ? (
        <ul className="flex flex-col gap-1 text-sm text-muted" aria-label="Beams within the MPE that leave the table">
          {weak.map((o) => (
            <li key={o.pathId}>
              <button type="button" className="font-mono underline underline-offset-2" onClick={() => onBeam(o.pathId)}>
                {o.pathId}
              </button>{" "}
              leaves at {edgeWords(table, o)} heading {directionWords(o.directionDeg)}, {powerText(o.powerMw)} (within the MPE).
            </li>
          ))}
        </ul>
      ) : null}
      {safety && safety.lasers.length > 0 ? (
        <table className="w-full text-left text-sm">
          <caption className="sr-only">Each laser&rsquo;s class and figures per line</caption>
          <thead className="text-muted">
            <tr>
              <th className="py-1 font-normal">Laser</th>
              <th className="py-1 font-normal">Class</th>
              <th className="py-1 font-normal">Line</th>
              <th className="py-1 font-normal">MPE</th>
              <th className="py-1 font-normal">NOHD</th>
              <th className="py-1 font-normal">OD at exit</th>
            </tr>
          </thead>
          <tbody>
            {safety.lasers.flatMap((l) =>
              l.lines.map((line, i) => (
                <tr key={`${l.laserId}-${i}`} className="border-t border-line">
                  <td className="py-1 font-mono">{i === 0 ? l.laserId : ""}</td>
                  <td className="py-1">{i === 0 ? l.hazardClass : ""}</td>
                  <td className="py-1 font-mono">
                    {fmt(line.wavelengthNm, 4)} nm, {powerText(line.powerMw)}
                  </td>
                  <td className="py-1 font-mono">{line.mpeWPerCm2 === null ? `${fmt(line.perPulseJPerCm2)} J/cm²` : `${fmt(line.mpeWPerCm2)} W/cm²`}</td>
                  <td className="py-1 font-mono">{fmt(line.nohdM)} m</td>
                  <td className="py-1 font-mono">{fmt(line.opticalDensityRequired, 2)}</td>
                </tr>
              )),
            )}
          </tbody>
        </table>
      ) : null}
      {warnings.length > 0 ? (
        <div data-testid="table-warnings">
          <WarningItems warnings={warnings.slice(0, WARNINGS_SHOWN)} />
          {warnings.length > WARNINGS_SHOWN ? (
            <details className="mt-1 text-sm">
              <summary className="cursor-pointer text-warn">{warnings.length - WARNINGS_SHOWN} more warnings</summary>
              <WarningItems warnings={warnings.slice(WARNINGS_SHOWN)} />
            </details>
          ) : null}
        </div>
      ) : null}
      <CautionList cautions={safety?.cautions ?? []} />
      <HazardNotes />
    </section>
  );
});

type ListProps = { elements: readonly TableElement[]; selection: readonly string[]; flagged: ReadonlySet<string>; dispatch: (a: TableAction) => void };

/** Every element as a button (the keyboard's way to pick one): kind, place and angle; Shift+click adds to the selection. */
export const TableElementList = memo(function TableElementList({ elements, selection, flagged, dispatch }: ListProps) {
  return (
    <section aria-labelledby="table-list-heading" className="rounded-lg border border-line bg-panel p-4">
      <h2 id="table-list-heading" className="mb-2 text-lg font-semibold">
        Elements ({elements.length})
      </h2>
      {elements.length === 0 ? (
        <p className="text-sm text-muted">The table is empty: add a laser from the palette, then mirrors, splitters and the rest.</p>
      ) : (
        <ul className="flex max-h-72 flex-col gap-1 overflow-y-auto">
          {elements.map((e) => (
            <li key={e.id}>
              <button
                type="button"
                data-table-row={e.id}
                aria-pressed={selection.includes(e.id)}
                onClick={(ev) => dispatch(ev.shiftKey ? { type: "toggle-select", id: e.id } : { type: "select", ids: [e.id] })}
                className={`flex w-full items-baseline justify-between gap-2 rounded-md border px-2 py-1 text-left text-sm ${selection.includes(e.id) ? "border-accent bg-raised" : "border-transparent hover:bg-raised"}`}
              >
                <span>
                  <span className="font-mono">{e.id}</span> <span className="text-muted">{ELEMENT_KIND_RECORDS[e.kind].label}</span>
                  {flagged.has(e.id) ? <span className="ml-1 text-warn">⚠ see the message above</span> : null}
                </span>
                <span className="font-mono text-xs text-muted">
                  ({fmt(e.xMm, 6)}, {fmt(e.yMm, 6)}) mm, {fmt(e.angleDeg, 6)}°
                </span>
              </button>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
});
