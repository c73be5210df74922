"use client";
// The editor for a bench on an optical table (bench document version 2): palette, the table drawing (client-only
// Konva), the selected element's values, a clicked beam's figures, the open beams and the hazard figures, and the save
// state. The working document is client state with undo/redo (table-reducer.ts); it autosaves exactly as the rail
// editor does (../use-autosave.ts). Predictions follow a drag live from the browser's engine; the server's answer
// stands once the drawing rests.
import dynamic from "next/dynamic";
import { useQueryClient } from "@tanstack/react-query";
import { useCallback, useEffect, useMemo, useReducer, useRef, useState, type DragEvent, type KeyboardEvent } from "react";
import { draftQuery, type DraftView } from "@/lib/api/bench-queries";
import { ELEMENT_KIND_RECORDS } from "@/lib/bench/element-kinds";
import { benchDocumentV2Schema, TABLE_ELEMENT_KINDS, type BenchDocumentV2, type TableElement, type TableElementKind } from "@/lib/bench/schema-v2";
import { SubmitForReview } from "@/components/review/submit-for-review";
import { ChangesSinceReview } from "../changes-since-review";
import { EditorNotices } from "../editor-notices";
import { EditorTitle } from "../editor-title";
import { RevisionsPanel } from "../revisions-panel";
import { ImportExport } from "../import-export";
import { documentKey } from "../document-key";
import { LaserPicker } from "../laser-picker";
import { laserValuesFrom, type RegisterEntry } from "../register-check";
import { SaveStatus } from "../save-status";
import { forgetUnsaved, readUnsaved } from "../unsaved-copy";
import { useAutosave } from "../use-autosave";
import { MARGIN_PX, tableLeftPx, tableScale, type DrawnBeam, type Place } from "./table-canvas";
import { traceBeams } from "./table-engine";
import { arrowDelta, HOLE_PITCHES, movedBy, placementFor, snapPlacement, turnBy, type BeamSegment, type SnapMode } from "./table-geometry";
import { BeamFigures, TableElementList, TableProperties, TableSafety } from "./table-panels";
import { initialTableState, tableReducer, type TablePatch } from "./table-reducer";
import { useTablePredictions } from "./use-table-predictions";

const TableCanvas = dynamic(() => import("./table-canvas").then((m) => m.TableCanvas), {
  ssr: false,
  loading: () => <div className="flex h-full min-h-80 items-center justify-center text-muted">Loading the table…</div>,
});

export const TABLE_KIND_DRAG_TYPE = "application/x-benchwarden-table-kind";
const BUTTON = "inline-flex min-h-10 min-w-10 items-center justify-center gap-1 rounded-md border border-line px-2.5 text-sm hover:bg-raised disabled:cursor-not-allowed disabled:opacity-40";
/** The palette's order: sources, then what turns light, then what it passes, then what stops it. */
const PALETTE: TableElementKind[] = ["laser", "mirror", "beam-splitter", "window", "lens", "aperture", "filter", "beam-block", "screen"];

type Props = { benchId: string; labName: string; authorName: string; initial: DraftView; start: BenchDocumentV2 };

export function TableEditor({ benchId, labName, authorName, initial, start }: Props) {
  const canEdit = initial.canEdit;
  const [state, dispatch] = useReducer(tableReducer, start, initialTableState);
  const { doc, selection } = state;
  const save = useAutosave(benchId, initial, doc, canEdit);
  const queryClient = useQueryClient();

  // A drawing left unsaved in this browser comes back as it was, if the bench has not moved on since (as on the rail).
  const restoreChecked = useRef(false);
  useEffect(() => {
    if (restoreChecked.current || !canEdit) return;
    restoreChecked.current = true;
    const copy = readUnsaved(benchId);
    if (!copy || copy.document.version !== 2) return;
    if (copy.baseRevision === initial.revisionNumber && copy.baseVersion === initial.version && copy.key !== documentKey(initial.document)) {
      dispatch({ type: "replace", doc: copy.document });
    } else forgetUnsaved(benchId);
  }, [benchId, canEdit, initial]);

  const [preview, setPreview] = useState<Record<string, Place> | null>(null);
  const [selectedBeam, setSelectedBeam] = useState<string | null>(null);
  const [snapMode, setSnapMode] = useState<SnapMode>("holes");
  const [laserChooserOpen, setLaserChooserOpen] = useState(false);
  const [width, setWidth] = useState(0);
  const frame = useRef<HTMLDivElement>(null);

  useEffect(() => {
    const el = frame.current;
    if (!el) return;
    const observer = new ResizeObserver(([entry]) => setWidth(Math.floor(entry.contentRect.width)));
    observer.observe(el);
    return () => observer.disconnect();
  }, []);

  // What is on screen now: the committed drawing, with a drag's preview places on top.
  const live = useMemo<BenchDocumentV2>(
    () => (preview ? { ...doc, elements: doc.elements.map((e) => (e.id in preview ? ({ ...e, ...preview[e.id] } as TableElement) : e)) } : doc),
    [doc, preview],
  );
  const predictions = useTablePredictions(doc, live);
  const traced = useMemo(() => traceBeams(live), [live]);
  // Hazard band per path from the newest predictions (a path the engine has not answered for yet shows as not assessed).
  const beams = useMemo<DrawnBeam[]>(() => {
    const safety = predictions.data?.safety;
    const od = new Map<string, number>();
    for (const p of safety?.points ?? []) if (p.opticalDensityRaw !== null) od.set(p.pathId, Math.max(od.get(p.pathId) ?? -Infinity, p.opticalDensityRaw));
    for (const o of safety?.openBeams ?? []) od.set(o.pathId, Math.max(od.get(o.pathId) ?? -Infinity, o.exceedsMpe ? 1 : -1));
    return traced.map((b) => {
      const v = od.get(b.pathId);
      return { ...b, band: !safety || v === undefined ? "unknown" : v > 0 ? "above-mpe" : "below-mpe" };
    });
  }, [traced, predictions.data]);
  const snapBeams = useCallback((without: string[]): BeamSegment[] => traceBeams({ ...doc, elements: doc.elements.filter((e) => !without.includes(e.id)) }), [doc]);

  const validity = useMemo(() => benchDocumentV2Schema.safeParse(doc), [doc]);
  const problems = useMemo(() => (validity.success ? [] : validity.error.issues), [validity]);
  const flagged = useMemo(() => {
    const ids = new Set<string>();
    for (const issue of problems) if (issue.path[0] === "elements" && typeof issue.path[1] === "number" && doc.elements[issue.path[1]]) ids.add(doc.elements[issue.path[1]].id);
    return ids;
  }, [problems, doc.elements]);

  const selected = useMemo(() => doc.elements.filter((e) => selection.includes(e.id)), [doc.elements, selection]);

  const add = (kind: TableElementKind, at?: { xMm: number; yMm: number; angleDeg: number }, values?: TablePatch) => {
    if (!canEdit) return;
    dispatch({ type: "add", kind, at: at ?? placementFor(kind, doc, traced), values });
    if (kind === "laser") setLaserChooserOpen(false);
    frame.current?.focus({ preventScroll: true });
  };

  const onDrop = (e: DragEvent<HTMLDivElement>) => {
    const kind = e.dataTransfer.getData(TABLE_KIND_DRAG_TYPE) as TableElementKind;
    if (!canEdit || !(TABLE_ELEMENT_KINDS as readonly string[]).includes(kind) || width === 0) return;
    e.preventDefault();
    const rect = e.currentTarget.getBoundingClientRect();
    const s = tableScale(doc, width);
    const raw = { xMm: (e.clientX - rect.left - tableLeftPx(doc, width)) / s, yMm: doc.table.depthMm - (e.clientY - rect.top - MARGIN_PX) / s };
    const snapped = snapPlacement(raw, doc.table, traced, 10 / s, snapMode);
    const facing = snapped.onBeam && ELEMENT_KIND_RECORDS[kind].action !== "source" && ELEMENT_KIND_RECORDS[kind].action !== "turn";
    add(kind, { ...snapped.point, angleDeg: facing ? snapped.onBeam!.directionDeg + 180 : kind === "laser" ? 0 : 180 });
  };

  const turnSelection = (sign: 1 | -1, step: "coarse" | "fine" | "finest") => {
    const places: Record<string, Place> = {};
    for (const e of selected) places[e.id] = { xMm: e.xMm, yMm: e.yMm, angleDeg: turnBy(e.angleDeg, sign, step) };
    dispatch({ type: "place", places });
  };

  const onKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    const target = e.target as HTMLElement;
    if (target.closest("input, textarea, select, [contenteditable=true]")) return;
    const mod = e.ctrlKey || e.metaKey;
    const key = e.key.toLowerCase();
    if (mod && key === "z") {
      e.preventDefault();
      if (canEdit) dispatch({ type: e.shiftKey ? "redo" : "undo" });
    } else if (mod && key === "y") {
      e.preventDefault();
      if (canEdit) dispatch({ type: "redo" });
    } else if (mod && key === "a" && target.closest("[data-editor-surface]")) {
      e.preventDefault();
      dispatch({ type: "select", ids: doc.elements.map((el) => el.id) });
    } else if (!mod && selection.length > 0 && arrowDelta(e.key, doc.table.holePitchMm, e.shiftKey)) {
      e.preventDefault();
      if (canEdit) dispatch({ type: "place", places: movedBy(doc.elements, selection, arrowDelta(e.key, doc.table.holePitchMm, e.shiftKey)!, doc.table) });
    } else if (!mod && key === "r" && selection.length > 0) {
      e.preventDefault();
      if (canEdit) turnSelection(e.shiftKey ? -1 : 1, "coarse");
    } else if (!mod && (e.code === "BracketLeft" || e.code === "BracketRight") && selection.length > 0) {
      // ] turns counter-clockwise, [ clockwise: 1°, with Shift 0.1°
      e.preventDefault();
      if (canEdit) turnSelection(e.code === "BracketRight" ? 1 : -1, e.shiftKey ? "finest" : "fine");
    } else if ((e.key === "Delete" || e.key === "Backspace") && selection.length > 0) {
      e.preventDefault();
      if (canEdit) dispatch({ type: "remove" });
    } else if (e.key === "Escape") {
      dispatch({ type: "select", ids: [] });
      setSelectedBeam(null);
    }
  };

  const baseState = save.base.state;
  const staleLook = predictions.stale;
  const hasLaser = doc.elements.some((e) => e.kind === "laser");

  return (
    <div onKeyDown={onKeyDown} className="flex flex-col gap-4" data-testid="table-editor">
      <header className="flex flex-wrap items-start justify-between gap-3">
        <EditorTitle labName={labName} authorName={authorName} revisionNumber={save.base.revisionNumber} state={baseState} onWhat="on an optical table" title={doc.title} canEdit={canEdit} onTitle={(title) => dispatch({ type: "set-title", title, coalesce: "title" })} />
        <div className="flex items-start gap-3">
          <ImportExport doc={doc} canEdit={canEdit} onImport={(d: BenchDocumentV2) => dispatch({ type: "replace", doc: d })} benchId={benchId} base={save.base} />
          <SaveStatus state={save.state} />
        </div>
      </header>

      <EditorNotices doc={doc} save={save} canEdit={canEdit} labName={labName} what="the table" onTakeTheirs={(theirs) => dispatch({ type: "replace", doc: theirs as BenchDocumentV2 })} />

      <div className="flex flex-col gap-2 rounded-lg border border-line bg-panel p-2">
        <div className="flex flex-wrap items-center justify-between gap-2">
          {canEdit ? (
            <div role="group" aria-label="Add an element" className="flex flex-wrap items-center gap-1.5">
              <span className="mr-1 text-sm text-muted">Add</span>
              {PALETTE.map((kind) => (
                <button
                  key={kind}
                  type="button"
                  draggable
                  onDragStart={(e) => {
                    e.dataTransfer.setData(TABLE_KIND_DRAG_TYPE, kind);
                    e.dataTransfer.effectAllowed = "copy";
                  }}
                  onClick={() => (kind === "laser" ? setLaserChooserOpen((o) => !o) : add(kind))}
                  className={BUTTON}
                  data-testid={`table-palette-${kind}`}
                  aria-expanded={kind === "laser" ? laserChooserOpen : undefined}
                  title={`${ELEMENT_KIND_RECORDS[kind].effect} Click to add, or drag onto the table.`}
                >
                  {ELEMENT_KIND_RECORDS[kind].label}
                </button>
              ))}
            </div>
          ) : (
            <span className="px-1 text-sm text-muted">Table</span>
          )}
          {canEdit ? (
            <div className="flex flex-wrap items-center gap-1.5">
              <button type="button" className={BUTTON} onClick={() => dispatch({ type: "undo" })} disabled={state.past.length === 0} title="Undo (Ctrl+Z)">
                ↶ Undo
              </button>
              <button type="button" className={BUTTON} onClick={() => dispatch({ type: "redo" })} disabled={state.future.length === 0} title="Redo (Ctrl+Shift+Z)">
                ↷ Redo
              </button>
              <button type="button" className={BUTTON} onClick={() => turnSelection(1, "coarse")} disabled={selection.length === 0} title="Turn 45° counter-clockwise (R; Shift+R the other way)">
                ⟲ 45°
              </button>
              <button type="button" className={BUTTON} onClick={() => dispatch({ type: "remove" })} disabled={selection.length === 0} title="Delete the selection (Delete)">
                ✕ Delete
              </button>
            </div>
          ) : null}
        </div>
        {canEdit && laserChooserOpen ? (
          <LaserPicker
            id="table-laser-chooser"
            labId={initial.labId}
            labName={labName}
            onPick={(entry: RegisterEntry) => add("laser", undefined, laserValuesFrom(entry))}
            onAdHoc={() => add("laser")}
            onClose={() => setLaserChooserOpen(false)}
          />
        ) : null}
        {canEdit ? (
          <div className="flex flex-wrap items-center gap-x-4 gap-y-2 px-1 text-sm">
            <label className="flex items-center gap-2">
              <span className="text-muted">Snap</span>
              <select value={snapMode} onChange={(e) => setSnapMode(e.target.value as SnapMode)} className="min-h-9 rounded-md border border-line bg-ink px-2" data-testid="table-snap">
                <option value="holes">to holes and beams</option>
                <option value="free">free (0.1 mm), onto beams</option>
              </select>
            </label>
            <label className="flex items-center gap-2">
              <span className="text-muted">Holes</span>
              <select
                value={doc.table.holePitchMm}
                onChange={(e) => dispatch({ type: "set-table", table: { holePitchMm: Number(e.target.value) } })}
                className="min-h-9 rounded-md border border-line bg-ink px-2"
                data-testid="table-pitch"
              >
                {HOLE_PITCHES.map((p) => (
                  <option key={p.value} value={p.value}>
                    {p.label}
                  </option>
                ))}
              </select>
            </label>
            <TableSize doc={doc} onChange={(table) => dispatch({ type: "set-table", table, coalesce: "table-size" })} />
          </div>
        ) : null}
        <div
          ref={frame}
          tabIndex={0}
          data-editor-surface
          role="application"
          aria-roledescription="table drawing"
          aria-label={`Optical table seen from above, ${doc.elements.length} elements. Arrow keys move the selection one hole (Shift: 1 mm); R turns it 45° (Shift+R back); ] and [ turn 1° (Shift: 0.1°); Delete removes; Ctrl+A selects all; Ctrl+Z undoes.`}
          className="relative overflow-hidden rounded-md border border-line bg-ink focus-visible:outline-3"
          style={{ touchAction: "pan-y", minHeight: 200 }}
          onDragOver={(e) => {
            if (canEdit && e.dataTransfer.types.includes(TABLE_KIND_DRAG_TYPE)) {
              e.preventDefault();
              e.dataTransfer.dropEffect = "copy";
            }
          }}
          onDrop={onDrop}
          onMouseDown={(e) => e.currentTarget.focus({ preventScroll: true })}
          data-testid="table-canvas"
          data-px-per-mm={width > 0 ? tableScale(doc, width) : 0}
          data-left-px={width > 0 ? tableLeftPx(doc, width) : MARGIN_PX}
          data-top-px={MARGIN_PX}
          data-depth-mm={doc.table.depthMm}
          data-beams={beams.map((b) => `${b.pathId}:${b.band}${b.open ? ":open" : ""}`).join(" ")}
        >
          {width > 0 ? (
            <TableCanvas
              doc={doc}
              preview={preview}
              selection={selection}
              beams={beams}
              snapBeams={snapBeams}
              selectedBeam={selectedBeam}
              flagged={flagged}
              canEdit={canEdit}
              width={width}
              snapMode={snapMode}
              onSelect={(ids) => dispatch({ type: "select", ids })}
              onToggleSelect={(id) => dispatch({ type: "toggle-select", id })}
              onPreview={setPreview}
              onPlace={(places, coalesce) => dispatch({ type: "place", places, coalesce })}
              onBeamClick={setSelectedBeam}
            />
          ) : null}
          <p
            className={`pointer-events-none absolute top-1 right-2 max-w-[70%] rounded-full border bg-panel/90 px-3 py-0.5 text-xs ${predictions.blockedBy ? "border-warn text-warn" : predictions.error ? "border-danger text-danger" : "border-line text-muted"}`}
            data-testid="prediction-source"
            data-source={predictions.source ?? "none"}
            data-stale={staleLook}
          >
            {predictions.blockedBy && hasLaser
              ? `Predictions paused: ${predictions.blockedBy}`
              : predictions.error
              ? `Predictions failed: ${predictions.error}`
              : !predictions.data
                ? hasLaser
                  ? "computing…"
                  : "no laser yet"
                : predictions.source === "browser"
                  ? `live, from this browser${staleLook ? " (catching up)" : ""}`
                  : staleLook
                    ? "updating…"
                    : "from the server"}
          </p>
        </div>
        <p className="px-1 text-xs text-muted">
          Red beams are above the MPE (eyewear needed), green within it; dashed beams leave the table, marked ⊗ at the edge. The figure beside each beam is its power where
          it starts. Click a beam for its figures. Drag the small circle beside a selected element to turn it (45° steps; hold Shift for fine turning).
        </p>
      </div>

      {problems.length > 0 ? (
        <div role="alert" className="rounded-lg border border-warn bg-panel p-3 text-sm" data-testid="table-problems">
          <p className="font-semibold text-warn">
            <span aria-hidden="true">⚠ </span>The table cannot be saved or sent for review until this is put right (your drawing is kept in this browser meanwhile):
          </p>
          <ul className="mt-1 list-disc pl-5">
            {problems.slice(0, 8).map((p, i) => (
              <li key={i}>{p.message}</li>
            ))}
          </ul>
        </div>
      ) : null}

      <div className="grid gap-4 lg:grid-cols-[minmax(0,5fr)_minmax(0,7fr)]">
        <div className="flex flex-col gap-4">
          {selectedBeam ? <BeamFigures table={doc.table} pathId={selectedBeam} predictions={predictions.data} onClose={() => setSelectedBeam(null)} /> : null}
          <TableProperties doc={doc} selected={selected} canEdit={canEdit} dispatch={dispatch} labId={initial.labId} labName={labName} />
          <TableElementList elements={doc.elements} selection={selection} flagged={flagged} dispatch={dispatch} />
          <SubmitForReview
            revisionId={save.base.revisionId}
            contentHash={save.state.kind === "saved" ? save.base.contentHash : null}
            waitingFor={canEdit && save.state.kind !== "saved" ? "Waiting until your changes are saved…" : null}
            onChanged={async () => {
              const fresh = await queryClient.fetchQuery({ ...draftQuery(benchId), staleTime: 0 });
              save.adopt(fresh);
            }}
          />
          <RevisionsPanel benchId={benchId} canEdit={canEdit} doc={doc} base={save.base} saveState={save.state} onMade={save.adopt} />
          <ChangesSinceReview benchId={benchId} doc={doc} />
        </div>
        <div className={staleLook ? "opacity-80" : ""} data-testid="predictions" data-stale={staleLook} data-source={predictions.source ?? "none"} data-live-runs={predictions.liveRuns}>
          <TableSafety table={doc.table} predictions={predictions.data} stale={staleLook} onBeam={setSelectedBeam} />
        </div>
      </div>
    </div>
  );
}

function TableSize({ doc, onChange }: { doc: BenchDocumentV2; onChange: (t: { widthMm?: number; depthMm?: number }) => void }) {
  const field = (key: "widthMm" | "depthMm", label: string) => (
    <label className="flex items-center gap-1">
      <span className="text-muted">{label}</span>
      <input
        type="number"
        min={100}
        step={doc.table.holePitchMm}
        defaultValue={doc.table[key]}
        key={`${key}-${doc.table[key]}`}
        onBlur={(e) => {
          const v = Number(e.target.value);
          if (Number.isFinite(v) && v > 0 && v !== doc.table[key]) onChange({ [key]: v });
        }}
        className="min-h-9 w-24 rounded-md border border-line bg-ink px-2 font-mono"
        aria-label={`Table ${label.toLowerCase()} in mm`}
      />
      <span className="text-muted">mm</span>
    </label>
  );
  return (
    <span className="flex items-center gap-3">
      {field("widthMm", "Width")}
      {field("depthMm", "Depth")}
    </span>
  );
}
