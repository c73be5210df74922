"use client";
// The bench editor: palette and view controls, the drawing (client-only Konva), the element list and properties,
// live predictions and the save state. Server data (the draft, the analysis) comes through react-query; the
// working document is client state with undo/redo (use-editor-state).
import dynamic from "next/dynamic";
import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useCallback, useEffect, useMemo, useRef, useState, useSyncExternalStore, type DragEvent, type KeyboardEvent } from "react";
import { draftQuery, inServiceLasersQuery, type RailDraftView } from "@/lib/api/bench-queries";
import { ELEMENT_KINDS, type BenchDocument, type ElementKind } from "@/lib/bench/schema";
import type { AnyBenchDocument, BenchDocumentV2 } from "@/lib/bench/schema-v2";
import { railToTable } from "./table/table-reducer";
import { ApertureTable } from "./aperture-table";
import { ScreenTable } from "./screen-table";
import { CANVAS_HEIGHT } from "./canvas-constants";
import { ChangesSinceReview } from "./changes-since-review";
import { EditorNotices } from "./editor-notices";
import { EditorTitle } from "./editor-title";
import { ElementList } from "./element-list";
import { SNAP_CHOICES, snapMm } from "./element-kinds";
import { FinderPanel } from "./finder-panel";
import { hazardSegments } from "./hazard-bands";
import { HazardLegend } from "./hazard-legend";
import { ImportExport } from "./import-export";
import { LaserPicker, REGISTER_DRAG_TYPE } from "./laser-picker";
import { KIND_DRAG_TYPE, Palette } from "./palette";
import { placementFor } from "./placement";
import { ProfilePanel } from "./profile-panel";
import { PropertiesPanel } from "./properties-panel";
import { laserValuesFrom, type RegisterEntry } from "./register-check";
import { RevisionsPanel } from "./revisions-panel";
import type { LabShelfData } from "@/components/eyewear/editor-coverage";
import { SafetyPanel } from "./safety-panel";
import { SaveStatus } from "./save-status";
import { useAnalysis, useProfile } from "./use-analysis";
import { useAutosave } from "./use-autosave";
import { useEditorState } from "./use-editor-state";
import { documentKey } from "./document-key";
import { forgetUnsaved, readUnsaved, unsavedText } from "./unsaved-copy";
import { SubmitForReview } from "@/components/review/submit-for-review";
import { useScreenFinder } from "./use-screen-finder";
import { fitAll, mmAt, zoomAbout, type View } from "./view";
import type { ElementPatch } from "./editor-reducer";
import { sig } from "./format";
import { CENTRE_WORDS, VERTICAL_EXAGGERATION, plainText } from "@/lib/format";

const noChange = () => () => undefined;

// The table editor (and the engine it runs in the browser) loads only for a bench on a table.
const TableEditor = dynamic(() => import("./table/table-editor").then((m) => m.TableEditor), {
  ssr: false,
  loading: () => <p className="text-muted">Loading the table editor…</p>,
});

const BenchCanvas = dynamic(() => import("./bench-canvas").then((m) => m.BenchCanvas), {
  ssr: false,
  loading: () => <div className="flex h-full items-center justify-center text-muted">Loading the drawing…</div>,
});

type Props = { benchId: string; labId?: string; labName: string; authorName: string; shelf?: LabShelfData | null };

/**
 * The editor for the bench's working draft: the rail editor for a version 1 document, the table editor
 * (components/editor/table) for version 2 (a new bench made on a table starts as one). A rail bench moved onto a
 * table, and a table drawing left unsaved in this browser, open the table editor too.
 */
export function BenchEditor(props: Props) {
  const draft = useQuery(draftQuery(props.benchId));
  const [movedOnto, setMovedOnto] = useState<BenchDocumentV2 | null>(null);
  const initialDoc = draft.data?.document as AnyBenchDocument | undefined;
  // A rail moved onto a table but not yet saved (the page closed first) is still a rail draft on the server.
  // undefined while hydrating: nothing is drawn until this browser's copy has been looked at, because the rail editor
  // forgets a copy it does not hold and a table's copy must survive it
  const unsaved = useSyncExternalStore(noChange, () => unsavedText(props.benchId) ?? "", () => undefined);
  const unsavedTable = useMemo(() => {
    if (!unsaved || !draft.data || !draft.data.canEdit || initialDoc?.version !== 1) return null;
    const copy = readUnsaved(props.benchId);
    return copy && copy.document.version === 2 && copy.baseRevision === draft.data.revisionNumber && copy.baseVersion === draft.data.version ? copy.document : null;
  }, [unsaved, draft.data, initialDoc, props.benchId]);
  const tableStart = movedOnto ?? unsavedTable;
  if (draft.error) return <p role="alert" className="rounded-lg border border-danger p-4">{draft.error.message}</p>;
  if (!draft.data || !initialDoc || unsaved === undefined) return <p className="text-muted">Loading the bench…</p>;
  const common = { benchId: props.benchId, labName: props.labName, authorName: props.authorName, initial: draft.data };
  if (initialDoc.version === 2) return <TableEditor {...common} start={initialDoc} />;
  if (tableStart) return <TableEditor {...common} start={tableStart} />;
  return <EditorBody {...props} initial={draft.data as RailDraftView} onMoveToTable={(doc) => setMovedOnto(railToTable(doc))} />;
}

const BUTTON = "inline-flex min-h-10 min-w-10 items-center justify-center gap-1 rounded-md border border-line px-2.5 text-sm hover:bg-raised disabled:cursor-not-allowed disabled:opacity-40";

function EditorBody({ benchId, labId, labName, authorName, initial, shelf = null, onMoveToTable }: Props & { initial: RailDraftView; onMoveToTable: (doc: BenchDocument) => void }) {
  const canEdit = initial.canEdit;
  const { state, dispatch, selected, canUndo, canRedo } = useEditorState(initial.document as BenchDocument);
  const { doc, selection } = state;
  const analysis = useAnalysis(doc, labId);
  const save = useAutosave(benchId, initial, doc, canEdit);

  // A drawing left unsaved in this browser (the page was closed before the server had it) comes back as it was,
  // if the bench has not moved on since; autosave then sends it.
  const restoreChecked = useRef(false);
  useEffect(() => {
    if (restoreChecked.current || !canEdit) return;
    restoreChecked.current = true;
    const copy = readUnsaved(benchId);
    // a table drawing is the table editor's to restore (BenchEditor)
    if (!copy || copy.document.version !== 1) return;
    if (copy.baseRevision === initial.revisionNumber && copy.baseVersion === initial.version && copy.key !== documentKey(initial.document)) {
      dispatch({ type: "replace", doc: copy.document });
    } else forgetUnsaved(benchId);
  }, [benchId, canEdit, initial, dispatch]);

  const [snapStepMm, setSnapStepMm] = useState<number>(1);
  const [exaggeration, setExaggeration] = useState(40);
  const [width, setWidth] = useState(0);
  const [view, setView] = useState<View | null>(null);
  const [laserChooserOpen, setLaserChooserOpen] = useState(false);
  const frame = useRef<HTMLDivElement>(null);
  const queryClient = useQueryClient();

  // The first measured width fits the whole bench into view; later resizes keep the user's zoom and pan.
  const elementsNow = useRef(doc.elements);
  useEffect(() => {
    elementsNow.current = doc.elements;
  }, [doc.elements]);
  useEffect(() => {
    const el = frame.current;
    if (!el) return;
    const observer = new ResizeObserver(([entry]) => {
      const measured = Math.floor(entry.contentRect.width);
      setWidth(measured);
      if (measured > 0) setView((v) => v ?? fitAll(elementsNow.current, measured));
    });
    observer.observe(el);
    return () => observer.disconnect();
  }, []);

  const currentView = view ?? { pxPerMm: 1, panPx: 40 };
  const fit = useCallback(() => setView(fitAll(doc.elements, width || 800)), [doc.elements, width]);

  const warningsById = useMemo(() => {
    const m = new Map<string, number>();
    for (const w of analysis.data?.analysis.warnings ?? []) if (w.elementId) m.set(w.elementId, (m.get(w.elementId) ?? 0) + 1);
    return m;
  }, [analysis.data]);

  const hasLaser = doc.elements.some((e) => e.kind === "laser");

  // The beam by required eyewear OD; the filters' OD comes from the drawing (while stale the beam is dimmed anyway).
  const hazard = useMemo(() => {
    const points = analysis.data?.safety?.points;
    const envelope = analysis.data?.analysis.envelope ?? [];
    return points && envelope.length > 1 ? hazardSegments(points, doc, envelope[envelope.length - 1].positionMm) : [];
  }, [analysis.data, doc]);

  const add = (kind: ElementKind, at?: number, values?: ElementPatch) => {
    if (!canEdit) return;
    const positionMm = at ?? placementFor(kind, doc.elements);
    dispatch({ type: "add", kind, positionMm, values });
    if (kind === "laser") setLaserChooserOpen(false);
    // keep the new element in sight
    const x = positionMm * currentView.pxPerMm + currentView.panPx;
    if (width > 0 && (x < 20 || x > width - 20)) setView(fitAll([...doc.elements, { id: "_", kind: "screen", positionMm }], width));
  };

  const onDrop = (e: DragEvent<HTMLDivElement>) => {
    const kind = e.dataTransfer.getData(KIND_DRAG_TYPE) as ElementKind;
    if (!canEdit || !(ELEMENT_KINDS as readonly string[]).includes(kind)) return;
    e.preventDefault();
    const rect = e.currentTarget.getBoundingClientRect();
    // A laser dragged from the register's list carries its entry's id; its values come from the same cached list.
    const registerId = kind === "laser" ? e.dataTransfer.getData(REGISTER_DRAG_TYPE) : "";
    const entry = registerId ? queryClient.getQueryData(inServiceLasersQuery(initial.labId).queryKey)?.find((l) => l.id === registerId) : undefined;
    add(kind, snapMm(mmAt(currentView, e.clientX - rect.left), snapStepMm), entry ? laserValuesFrom(entry) : undefined);
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
    } else if (mod && key === "d") {
      e.preventDefault();
      if (canEdit) dispatch({ type: "duplicate" });
    } else if (mod && key === "a" && target.closest("[data-editor-surface]")) {
      e.preventDefault();
      dispatch({ type: "select", ids: doc.elements.map((el) => el.id) });
    } else if ((e.key === "ArrowLeft" || e.key === "ArrowRight") && !mod && selection.length > 0) {
      e.preventDefault();
      if (canEdit) dispatch({ type: "nudge", deltaMm: (e.key === "ArrowLeft" ? -1 : 1) * (e.shiftKey ? 10 : 1) });
    } else if ((e.key === "Delete" || e.key === "Backspace") && selection.length > 0) {
      e.preventDefault();
      if (canEdit) dispatch({ type: "remove" });
    } else if (e.key === "Escape") {
      dispatch({ type: "select", ids: [] });
    } else if (!mod && (e.key === "+" || e.key === "=")) {
      setView(zoomAbout(currentView, 1.25, width / 2));
    } else if (!mod && e.key === "-") {
      setView(zoomAbout(currentView, 0.8, width / 2));
    }
  };

  const selectedAperture = selected.length === 1 && selected[0].kind === "aperture" ? (analysis.data?.analysis.apertures.find((a) => a.id === selected[0].id) ?? null) : null;
  const profile = useProfile(analysis.settled, selectedAperture?.id ?? null, selectedAperture?.screenId != null);
  const selectedApertureId = selected.length === 1 && selected[0].kind === "aperture" ? selected[0].id : null;
  const finder = useScreenFinder(analysis.settled, selectedApertureId);
  const moveScreenTo = (positionMm: number) => {
    if (!canEdit || !finder.range) return;
    if (finder.range.screenId) dispatch({ type: "update", id: finder.range.screenId, patch: { positionMm } });
    else add("screen", positionMm);
    // keep the aperture selected, so its pattern and the finder stay in view
    if (selectedApertureId) dispatch({ type: "select", ids: [selectedApertureId] });
  };
  const staleLook = analysis.stale || (analysis.blockedBy !== null && analysis.data !== undefined);
  const elementWarnings = selected.length === 1 ? (analysis.data?.analysis.warnings ?? []).filter((w) => w.elementId === selected[0].id) : [];
  const baseState = save.base.state;

  return (
    <div onKeyDown={onKeyDown} className="flex flex-col gap-4" data-testid="bench-editor">
      <header className="flex flex-wrap items-start justify-between gap-3">
        <EditorTitle labName={labName} authorName={authorName} revisionNumber={save.base.revisionNumber} state={baseState} title={doc.title} canEdit={canEdit} onTitle={(title) => dispatch({ type: "set-title", title, coalesce: "title" })} />
        <div className="flex items-start gap-3">
          {canEdit ? (
            <button
              type="button"
              className={BUTTON}
              disabled={save.state.kind !== "saved"}
              onClick={() => onMoveToTable(doc)}
              data-testid="move-to-table"
              title={
                save.state.kind === "saved"
                  ? "Put this bench on an optical table: the rail becomes a straight beam along +x on the middle hole row, every value kept. Then mirrors, beam splitters and windows can fold and split the beam."
                  : "Waiting until your changes are saved"
              }
            >
              Move onto a table
            </button>
          ) : null}
          <ImportExport doc={doc} canEdit={canEdit} onImport={(d: BenchDocument) => dispatch({ type: "replace", doc: d })} benchId={benchId} base={save.base} />
          <SaveStatus state={save.state} />
        </div>
      </header>

      <EditorNotices doc={doc} save={save} canEdit={canEdit} labName={labName} what="the drawing" onTakeTheirs={(theirs) => dispatch({ type: "replace", doc: theirs as BenchDocument })} />

      <div className="flex flex-col gap-2 rounded-lg border border-line bg-panel p-2">
        <div className="flex flex-wrap items-center justify-between gap-2">
          {canEdit ? (
            <Palette onAdd={(k) => add(k)} hasLaser={hasLaser} onLaser={() => setLaserChooserOpen((o) => !o)} laserChooserOpen={laserChooserOpen && !hasLaser} laserChooserId="laser-chooser" />
          ) : (
            <span className="px-1 text-sm text-muted">Drawing</span>
          )}
          <div className="flex flex-wrap items-center gap-1.5">
            {canEdit ? (
              <>
                <button type="button" className={BUTTON} onClick={() => dispatch({ type: "undo" })} disabled={!canUndo} aria-keyshortcuts="Control+Z" title="Undo (Ctrl+Z)">
                  ↶ Undo
                </button>
                <button type="button" className={BUTTON} onClick={() => dispatch({ type: "redo" })} disabled={!canRedo} aria-keyshortcuts="Control+Shift+Z" title="Redo (Ctrl+Shift+Z)">
                  ↷ Redo
                </button>
                <button type="button" className={BUTTON} onClick={() => dispatch({ type: "duplicate" })} disabled={selection.length === 0} title="Duplicate the selection (Ctrl+D)">
                  ❐ Duplicate
                </button>
                <button type="button" className={BUTTON} onClick={() => dispatch({ type: "remove" })} disabled={selection.length === 0} title="Delete the selection (Delete)">
                  ✕ Delete
                </button>
              </>
            ) : null}
          </div>
        </div>
        {canEdit && laserChooserOpen && !hasLaser ? (
          <LaserPicker
            id="laser-chooser"
            labId={initial.labId}
            labName={labName}
            draggable
            onPick={(entry: RegisterEntry) => add("laser", undefined, laserValuesFrom(entry))}
            onAdHoc={() => add("laser")}
            onClose={() => setLaserChooserOpen(false)}
          />
        ) : null}
        <div className="flex flex-wrap items-center gap-x-4 gap-y-2 px-1 text-sm">
          {canEdit ? (
            <label className="flex items-center gap-2">
              <span className="text-muted">Snap</span>
              <select value={snapStepMm} onChange={(e) => setSnapStepMm(Number(e.target.value))} className="min-h-9 rounded-md border border-line bg-ink px-2">
                {SNAP_CHOICES.map((c) => (
                  <option key={c.value} value={c.value}>
                    {c.label}
                  </option>
                ))}
              </select>
            </label>
          ) : null}
          <div className="flex items-center gap-1" role="group" aria-label="Zoom">
            <button type="button" className={BUTTON} onClick={() => setView(zoomAbout(currentView, 0.8, width / 2))} aria-label="Zoom out">
              −
            </button>
            <button type="button" className={BUTTON} onClick={() => setView(zoomAbout(currentView, 1.25, width / 2))} aria-label="Zoom in">
              +
            </button>
            <button type="button" className={BUTTON} onClick={fit}>
              Fit all
            </button>
            <span className="ml-1 font-mono text-xs text-muted" aria-live="off">
              {sig(currentView.pxPerMm * 100, 3)} px per 100 mm
            </span>
          </div>
          <label className="flex items-center gap-2">
            <span className="text-muted">
              {VERTICAL_EXAGGERATION} ×{exaggeration}
            </span>
            <input type="range" min={1} max={400} step={1} value={exaggeration} onChange={(e) => setExaggeration(Number(e.target.value))} aria-label={VERTICAL_EXAGGERATION} />
          </label>
        </div>
        <div
          ref={frame}
          tabIndex={0}
          data-editor-surface
          role="application"
          aria-roledescription="bench drawing"
          aria-label={`Bench drawing, ${doc.elements.length} elements. Select elements in the list below; ← → move the selection by 1 mm, Shift for 10 mm; Delete removes; Ctrl+Z undoes; + and − zoom.`}
          className="relative overflow-hidden rounded-md border border-line bg-ink focus-visible:outline-3"
          // one finger may still scroll the page up and down; sideways drags and two-finger pinches belong to the drawing
          style={{ height: CANVAS_HEIGHT, touchAction: "pan-y" }}
          onDragOver={(e) => {
            if (canEdit && e.dataTransfer.types.includes(KIND_DRAG_TYPE)) {
              e.preventDefault();
              e.dataTransfer.dropEffect = "copy";
            }
          }}
          onDrop={onDrop}
          onMouseDown={(e) => e.currentTarget.focus({ preventScroll: true })}
          data-testid="bench-canvas"
          data-px-per-mm={currentView.pxPerMm}
          data-pan-px={currentView.panPx}
          data-finder-ticks={finder.ticks.map((t) => `${t.centre}-${t.zoneCount}@${t.positionMm.toFixed(1)}`).join(" ")}
        >
          {width > 0 ? (
            <BenchCanvas
              doc={doc}
              selection={selection}
              analysis={analysis.data}
              hazardSegments={hazard}
              stale={staleLook}
              canEdit={canEdit}
              view={currentView}
              width={width}
              exaggeration={exaggeration}
              snapStepMm={snapStepMm}
              finderTicks={finder.ticks}
              finderStale={finder.stale || staleLook}
              onViewChange={setView}
              onSelect={(ids) => dispatch({ type: "select", ids })}
              onToggleSelect={(id) => dispatch({ type: "toggle-select", id })}
              onMove={(positions, coalesce) => dispatch({ type: "set-positions", positions, coalesce })}
            />
          ) : null}
          <PredictionState analysis={analysis} />
        </div>
        <HazardLegend assessed={hazard.length > 0} shown={hazard} finderFor={finder.ticks.length > 0 ? selectedApertureId : null} />
      </div>

      <div className="grid gap-4 lg:grid-cols-[minmax(0,5fr)_minmax(0,7fr)]">
        <div className="flex flex-col gap-4">
          <ElementList
            elements={doc.elements}
            selection={selection}
            warningsById={warningsById}
            onSelect={(ids) => dispatch({ type: "select", ids })}
            onToggle={(id) => dispatch({ type: "toggle-select", id })}
          />
          <PropertiesPanel selected={selected} canEdit={canEdit} dispatch={dispatch} warnings={elementWarnings} labId={initial.labId} labName={labName} />
          <SubmitForReview
            revisionId={save.base.revisionId}
            contentHash={save.state.kind === "saved" ? save.base.contentHash : null}
            waitingFor={canEdit && save.state.kind !== "saved" ? "Waiting until your changes are saved…" : null}
            onChanged={async () => {
              // the revision changed state on the server (sent, withdrawn): the editor continues from it as it is now
              const fresh = await queryClient.fetchQuery({ ...draftQuery(benchId), staleTime: 0 });
              save.adopt(fresh);
            }}
          />
          <RevisionsPanel benchId={benchId} canEdit={canEdit} doc={doc} base={save.base} saveState={save.state} onMade={save.adopt} />
          <ChangesSinceReview benchId={benchId} doc={doc} />
        </div>
        <div className="flex flex-col gap-4">
          <section aria-labelledby="predictions-heading" className={`rounded-lg border border-line bg-panel p-4 ${staleLook ? "opacity-60" : ""}`} data-testid="predictions" data-stale={staleLook}>
            <h2 id="predictions-heading" className="mb-2 flex items-center justify-between gap-2 text-lg font-semibold">
              Predictions
              {staleLook ? <span className="text-sm font-normal text-muted">updating…</span> : null}
            </h2>
            {analysis.data ? (
              <>
                <ApertureTable apertures={analysis.data.analysis.apertures} selectedId={selectedAperture?.id ?? null} onSelect={(id) => dispatch({ type: "select", ids: [id] })} />
                <ScreenTable screens={analysis.data.analysis.screens} />
                {selectedAperture ? (
                  <div className="mt-4">
                    <ProfilePanel
                      aperture={selectedAperture}
                      profile={profile.data}
                      loading={profile.isFetching}
                      error={profile.error ? profile.error.message : null}
                      stale={staleLook || profile.isPlaceholderData}
                      wavelengthNm={analysis.data.analysis.wavelengthNm}
                    />
                  </div>
                ) : null}
                {selectedApertureId ? (
                  <FinderPanel
                    apertureId={selectedApertureId}
                    current={
                      selectedAperture && selectedAperture.screenId && selectedAperture.observationDistanceMm !== null
                        ? { positionMm: selectedAperture.positionMm + selectedAperture.observationDistanceMm, centre: selectedAperture.centre, zones: selectedAperture.zonesExposed }
                        : null
                    }
                    range={finder.range}
                    data={finder.data}
                    stale={finder.stale || staleLook}
                    loading={finder.loading}
                    error={finder.error}
                    canEdit={canEdit}
                    onMoveScreen={moveScreenTo}
                  />
                ) : analysis.data.analysis.apertures.length > 0 ? (
                  <p className="mt-2 text-sm text-muted">Select an aperture to see its pattern on the screen.</p>
                ) : null}
              </>
            ) : (
              <p className="text-sm text-muted">{analysis.blockedBy ? `No predictions yet: ${analysis.blockedBy}` : "Computing…"}</p>
            )}
          </section>
          <WarningsList analysis={analysis.data} onSelect={(id) => dispatch({ type: "select", ids: [id] })} />
          <SafetyPanel safety={analysis.data?.safety} shelf={shelf} />
        </div>
      </div>
    </div>
  );
}

function PredictionState({ analysis }: { analysis: ReturnType<typeof useAnalysis> }) {
  let text: string | null = null;
  let tone = "border-line text-muted";
  if (analysis.blockedBy) {
    text = `Predictions paused: ${analysis.blockedBy}`;
    tone = "border-warn text-warn";
  } else if (analysis.error) {
    text = `Predictions failed: ${analysis.error}`;
    tone = "border-danger text-danger";
  } else if (analysis.stale || (analysis.fetching && !analysis.data)) text = "◌ updating…";
  const summary = (analysis.data?.analysis.apertures ?? []).map((a) => `${a.id}: ${sig(a.zonesExposed)} zones, ${CENTRE_WORDS[a.centre]}`).join("; ");
  return (
    <>
      {text ? (
        <p className={`pointer-events-none absolute top-2 right-2 rounded-full border bg-panel/90 px-3 py-1 text-sm ${tone}`} data-testid="prediction-state">
          {text}
        </p>
      ) : null}
      <p className="sr-only" aria-live="polite">
        {analysis.stale ? "" : summary}
      </p>
    </>
  );
}

function WarningsList({ analysis, onSelect }: { analysis: ReturnType<typeof useAnalysis>["data"]; onSelect: (id: string) => void }) {
  const warnings = analysis?.analysis.warnings ?? [];
  if (warnings.length === 0) return null;
  return (
    <section aria-labelledby="warnings-heading" className="rounded-lg border border-warn/60 bg-panel p-4" data-testid="warnings">
      <h2 id="warnings-heading" className="mb-2 text-lg font-semibold">
        <span aria-hidden="true">⚠ </span>Warnings ({warnings.length})
      </h2>
      <ul className="flex flex-col gap-1.5 text-sm">
        {warnings.map((w, i) => (
          <li key={`${w.code}-${w.elementId ?? ""}-${i}`}>
            {w.elementId ? (
              <button type="button" className="mr-1 font-mono text-accent underline-offset-2 hover:underline" onClick={() => onSelect(w.elementId!)}>
                {w.elementId}
              </button>
            ) : null}
            {plainText(w.message)}
          </li>
        ))}
      </ul>
    </section>
  );
}
