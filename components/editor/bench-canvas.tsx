"use client";
// The bench drawing (react-konva, loaded in the browser only): the rail at true scale with a millimetre ruler,
// dimension lines between neighbours, the elements to drag (with snapping), the beam envelope patterned by the
// required eyewear OD, per aperture the zone badge, and the finder's screen positions as ticks on the ruler.
// The view (scale and pan) belongs to the editor; this component reports gestures (wheel, drag, two-finger pinch).
// An element drag stays inside this component while it lasts (the moving elements' positions as local state, so only
// the drawing redraws per pointer move: the elements that moved and the dimension lines); the editor hears of it
// once, on drag end (select the dragged element if needed, then one set-positions: one undo step, one analysis).
import Konva from "konva";
import { memo, useEffect, useLayoutEffect, useMemo, useRef, useState } from "react";
import { Group, Layer, Line, Rect, Shape, Stage, Text, Circle, Wedge } from "react-konva";
import type { BenchDocument, BenchElement } from "@/lib/bench/schema";
import type { KeyedAnalysis } from "@/lib/api/bench-queries";
import { CANVAS_HEIGHT } from "./canvas-constants";
import { CanvasSymbol, SYMBOL_HALF_HEIGHT } from "./canvas-symbol";
import { dragPositions, dragStart } from "./drag";
import { shortLabel, snapMm } from "./element-kinds";
import { envelopeSlice, type HazardSegment } from "./hazard-bands";
import { BAND_STYLES, THEME, type HatchKind } from "./palette-colours";
import { CENTRE_SYMBOL, type FinderTick } from "./screen-finder";
import { clampScale, pinchZoom, touchPair, type View } from "./view";
import { computedOdText } from "@/lib/format/eyewear";

// Touch moves must reach the stage while it is being dragged, or a second finger could never start a pinch.
Konva.hitOnDragEnabled = true;

/** A drag started by a finger (which a second finger may turn into a pinch) rather than a mouse or pen. */
const isTouch = (evt: Event | undefined) =>
  evt !== undefined && ((typeof TouchEvent !== "undefined" && evt instanceof TouchEvent) || (evt as PointerEvent).pointerType === "touch");

const DIM_Y = 26;
const RAIL_Y = 190;
const RAIL_BAR_Y = RAIL_Y + SYMBOL_HALF_HEIGHT + 12;
const LABEL_Y = RAIL_BAR_Y + 16;
const RULER_Y = CANVAS_HEIGHT - 44;
const BADGE_Y = RAIL_Y - SYMBOL_HALF_HEIGHT - 52;
// The beam stays above the rail bar (and so off the labels and the ruler below it), the same height up and down.
const MAX_BEAM_PX = Math.min(RAIL_Y - DIM_Y - 20, RAIL_BAR_Y - RAIL_Y - 4);
const TICK_LABEL_Y = RULER_Y - 34;
/** A second row of element labels sits this far below the first. */
const LABEL_ROW_PX = 30;

/** Half the width a label takes under the rail (id and short description), estimated from the characters. */
function labelHalfWidthPx(e: BenchDocument["elements"][number]): number {
  return Math.max(e.id.length * 7.5, shortLabel(e).length * 6.5, 24) / 2;
}

export type BenchCanvasProps = {
  doc: BenchDocument;
  selection: string[];
  analysis: KeyedAnalysis | undefined;
  /** The beam's stretches by required eyewear OD (hazard-bands.ts); empty when there is no safety assessment. */
  hazardSegments: HazardSegment[];
  stale: boolean;
  canEdit: boolean;
  view: View;
  width: number;
  exaggeration: number;
  snapStepMm: number;
  /** The finder's best screen positions for the selected aperture (empty when none is selected). */
  finderTicks: FinderTick[];
  finderStale: boolean;
  onViewChange: (view: View) => void;
  onSelect: (ids: string[]) => void;
  onToggleSelect: (id: string) => void;
  onMove: (positions: Record<string, number>, coalesce: string) => void;
};

const TICK_STEPS_MM = [0.1, 0.2, 0.5, 1, 2, 5, 10, 20, 25, 50, 100, 200, 250, 500, 1000, 2000, 2500, 5000, 10000, 20000, 50000];

function stepFor(pxPerMm: number, minPx: number): number {
  return TICK_STEPS_MM.find((s) => s * pxPerMm >= minPx) ?? TICK_STEPS_MM[TICK_STEPS_MM.length - 1];
}

const fmt = (mm: number) => `${Number(mm.toFixed(2))}`;

export function BenchCanvas(props: BenchCanvasProps) {
  const { doc, selection, analysis, hazardSegments, stale, canEdit, view, width, exaggeration, snapStepMm, finderTicks, finderStale } = props;
  const { pxPerMm, panPx } = view;
  const drag = useRef<{ session: string; start: Record<string, number>; select: string[] | null; last: Record<string, number> | null } | null>(null);
  // While an element is dragged: where the moving elements stand now, and the selection the drawing shows (the
  // dragged element alone when it was not selected; the editor is told on drag end).
  const [preview, setPreview] = useState<{ positions: Record<string, number> | null; selection: string[] } | null>(null);
  useEffect(
    () => () => {
      Konva.hitOnDragEnabled = true; // should the drawing go away in the middle of a mouse drag
    },
    [],
  );
  const pinch = useRef<{ start: View; distancePx: number; centrePx: number } | null>(null);

  const visibleMm = { from: -panPx / pxPerMm, to: (width - panPx) / pxPerMm };
  const previewPositions = preview?.positions ?? null;
  const shown = useMemo(
    () => (previewPositions ? doc.elements.map((e) => (e.id in previewPositions ? ({ ...e, positionMm: previewPositions[e.id] } as BenchElement) : e)) : doc.elements),
    [doc.elements, previewPositions],
  );
  const shownSelection = preview?.selection ?? selection;
  const sorted = useMemo(() => [...shown].sort((a, b) => a.positionMm - b.positionMm), [shown]);
  // Labels under the rail: a label that would run into its left neighbour's drops to a second row.
  const labelRows = useMemo(() => {
    const rows = new Map<string, number>();
    const rightEdge = [-Infinity, -Infinity];
    for (const e of sorted) {
      const x = e.positionMm * pxPerMm;
      const half = labelHalfWidthPx(e);
      const row = rightEdge[0] + 6 <= x - half ? 0 : rightEdge[1] + 6 <= x - half ? 1 : rightEdge[0] <= rightEdge[1] ? 0 : 1;
      rightEdge[row] = x + half;
      rows.set(e.id, row);
    }
    return rows;
  }, [sorted, pxPerMm]);
  const warningsById = useMemo(() => {
    const m = new Map<string, number>();
    for (const w of analysis?.analysis.warnings ?? []) if (w.elementId) m.set(w.elementId, (m.get(w.elementId) ?? 0) + 1);
    return m;
  }, [analysis]);

  const ruler = useMemo(() => {
    // a figure that would run past the right edge is written to the left of its tick, so the last one is never cut
    const major = stepFor(pxPerMm, 90);
    const minor = stepFor(pxPerMm, 9);
    const ticks: { x: number; major: boolean; label?: string }[] = [];
    const start = Math.floor(visibleMm.from / minor) * minor;
    for (let mm = start; mm <= visibleMm.to + minor; mm += minor) {
      const isMajor = Math.abs(mm / major - Math.round(mm / major)) < 1e-6;
      ticks.push({ x: mm * pxPerMm, major: isMajor, label: isMajor ? fmt(mm) : undefined });
      if (ticks.length > 600) break;
    }
    return ticks;
  }, [pxPerMm, visibleMm.from, visibleMm.to]);

  // The same element objects while the view stands still (e.g. during an element drag), so React skips them.
  const rulerNodes = useMemo(
    () =>
      ruler.map((t) => {
        const labelWidthPx = (t.label?.length ?? 0) * 7 + 4;
        const flip = t.x + panPx + 3 + labelWidthPx > width;
        return (
          <Group key={t.x} listening={false}>
            <Line points={[t.x, RULER_Y, t.x, RULER_Y + (t.major ? 12 : 5)]} stroke={t.major ? THEME.text : THEME.muted} strokeWidth={1} />
            {t.label !== undefined ? (
              <Text x={flip ? t.x - 3 - labelWidthPx : t.x + 3} y={RULER_Y + 15} width={labelWidthPx} align={flip ? "right" : "left"} text={t.label} fontSize={12} fill={THEME.muted} />
            ) : null}
          </Group>
        );
      }),
    [ruler, panPx, width],
  );

  const envelope = useMemo(() => {
    const points = analysis?.analysis.envelope ?? [];
    if (points.length < 2) return null;
    const upper: number[] = [];
    const lower: number[] = [];
    for (const p of points) {
      const r = Math.min(p.radiusMm * pxPerMm * exaggeration, MAX_BEAM_PX);
      upper.push(p.positionMm * pxPerMm, RAIL_Y - r);
      lower.push(p.positionMm * pxPerMm, RAIL_Y + r);
    }
    const outline = [...upper];
    for (let i = lower.length - 2; i >= 0; i -= 2) outline.push(lower[i], lower[i + 1]);
    return { outline, upper, lower };
  }, [analysis, pxPerMm, exaggeration]);

  // The beam in stretches by required eyewear OD (when the safety engine could assess the bench).
  const hazard = useMemo(() => {
    const env = analysis?.analysis.envelope ?? [];
    if (env.length < 2) return [];
    return hazardSegments.map((segment) => {
      const slice = envelopeSlice(env, segment.fromMm, segment.toMm);
      const upper: number[] = [];
      const lower: number[] = [];
      let widestPx = 0;
      for (const p of slice) {
        const r = Math.min(p.radiusMm * pxPerMm * exaggeration, MAX_BEAM_PX);
        widestPx = Math.max(widestPx, r);
        upper.push(p.positionMm * pxPerMm, RAIL_Y - r);
        lower.push(p.positionMm * pxPerMm, RAIL_Y + r);
      }
      const outline = [...upper];
      for (let i = lower.length - 2; i >= 0; i -= 2) outline.push(lower[i], lower[i + 1]);
      return { segment, upper, lower, outline, widestPx };
    });
  }, [analysis, hazardSegments, pxPerMm, exaggeration]);

  // Finder ticks: labels that would overlap the previous one are lifted a row.
  const ticks = useMemo(() => {
    const placed: { tick: (typeof finderTicks)[number]; x: number; labelY: number }[] = [];
    let lastX = -Infinity;
    let lifted = false;
    for (const t of finderTicks) {
      const x = t.positionMm * pxPerMm;
      lifted = x - lastX < 46 ? !lifted : false;
      lastX = x;
      placed.push({ tick: t, x, labelY: TICK_LABEL_Y - (lifted ? 16 : 0) });
    }
    return placed;
  }, [finderTicks, pxPerMm]);

  const onWheel = (e: Konva.KonvaEventObject<WheelEvent>) => {
    e.evt.preventDefault();
    const stage = e.target.getStage();
    const pointer = stage?.getPointerPosition();
    if (!pointer) return;
    const next = clampScale(pxPerMm * Math.exp(-e.evt.deltaY * 0.0015));
    const mmAtPointer = (pointer.x - panPx) / pxPerMm;
    props.onViewChange({ pxPerMm: next, panPx: pointer.x - mmAtPointer * next });
  };

  const startDrag = (element: BenchElement, evt: Event | undefined) => {
    // A mouse drag needs no pointer events on other shapes while it lasts: Konva then skips redrawing the
    // elements layer's hit graph every frame (restored on drag end; a touch drag keeps it for the pinch).
    if (!isTouch(evt)) Konva.hitOnDragEnabled = false;
    const alreadySelected = selection.includes(element.id);
    drag.current = {
      session: `drag-${Date.now()}-${Math.random().toString(36).slice(2, 7)}`,
      start: dragStart(doc.elements, selection, element.id),
      select: alreadySelected ? null : [element.id],
      last: null,
    };
    setPreview({ positions: null, selection: alreadySelected ? selection : [element.id] });
  };

  const moveDrag = (element: BenchElement, node: Konva.Node) => {
    const d = drag.current;
    if (!d) return;
    const positions = dragPositions(d.start, element.id, node.x() / pxPerMm);
    // Snapping reports the same place for many pointer moves: redraw only when something moved.
    if (d.last && Object.keys(positions).every((id) => d.last![id] === positions[id])) return;
    d.last = positions;
    setPreview((p) => ({ positions, selection: p?.selection ?? selection }));
  };

  const endDrag = (element: BenchElement, node: Konva.Node) => {
    Konva.hitOnDragEnabled = true;
    const d = drag.current;
    if (!d) return;
    drag.current = null;
    const positions = dragPositions(d.start, element.id, node.x() / pxPerMm);
    if (d.select) props.onSelect(d.select);
    if (Object.keys(positions).some((id) => positions[id] !== d.start[id])) props.onMove(positions, d.session);
    setPreview(null);
  };

  // Stable handlers for the memoised element nodes: they read the latest props through a ref.
  const latest = useRef({ startDrag, moveDrag, endDrag, props });
  useLayoutEffect(() => {
    latest.current = { startDrag, moveDrag, endDrag, props };
  });
  const handlers = useMemo<ElementHandlers>(
    () => ({
      dragStart: (e, evt) => latest.current.startDrag(e, evt),
      dragMove: (e, node) => latest.current.moveDrag(e, node),
      dragEnd: (e, node) => latest.current.endDrag(e, node),
      select: (ids) => latest.current.props.onSelect(ids),
      toggle: (id) => latest.current.props.onToggleSelect(id),
    }),
    [],
  );

  // Two fingers: stop any drag (stage pan or element move) and zoom about the fingers' midpoint.
  const touchesOf = (e: Konva.KonvaEventObject<TouchEvent>) => {
    const stage = e.target.getStage();
    if (!stage) return null;
    const rect = stage.container().getBoundingClientRect();
    const list = Array.from(e.evt.touches).slice(0, 2).map((t) => ({ x: t.clientX - rect.left, y: t.clientY - rect.top }));
    return { stage, list };
  };
  const onTouchMove = (e: Konva.KonvaEventObject<TouchEvent>) => {
    const t = touchesOf(e);
    if (!t || t.list.length < 2) return;
    e.evt.preventDefault();
    if (t.stage.isDragging()) t.stage.stopDrag();
    for (const node of t.stage.find(".element")) if (node.isDragging()) node.stopDrag();
    const pair = touchPair(t.list[0], t.list[1]);
    if (!pinch.current) {
      pinch.current = { start: view, ...pair };
      return;
    }
    props.onViewChange(pinchZoom(pinch.current.start, pinch.current.distancePx, pinch.current.centrePx, pair.distancePx, pair.centrePx));
  };
  const onTouchEnd = (e: Konva.KonvaEventObject<TouchEvent>) => {
    if (e.evt.touches.length < 2) pinch.current = null;
  };

  const onStageDragMove = (e: Konva.KonvaEventObject<DragEvent>) => {
    if (e.target === e.target.getStage()) props.onViewChange({ pxPerMm, panPx: e.target.x() });
  };
  const onStageClick = (e: Konva.KonvaEventObject<MouseEvent>) => {
    if (e.target === e.target.getStage() || e.target.name() === "background") props.onSelect([]);
  };
  // The stage's handlers as stable functions (reading the latest through a ref), so a re-render does not rebind them.
  const stageLatest = useRef({ onWheel, onTouchMove, onTouchEnd, onStageDragMove, onStageClick });
  useLayoutEffect(() => {
    stageLatest.current = { onWheel, onTouchMove, onTouchEnd, onStageDragMove, onStageClick };
  });
  const stageHandlers = useMemo(
    () => ({
      onWheel: (e: Konva.KonvaEventObject<WheelEvent>) => stageLatest.current.onWheel(e),
      onTouchMove: (e: Konva.KonvaEventObject<TouchEvent>) => stageLatest.current.onTouchMove(e),
      onTouchEnd: (e: Konva.KonvaEventObject<TouchEvent>) => stageLatest.current.onTouchEnd(e),
      onDragMove: (e: Konva.KonvaEventObject<DragEvent>) => stageLatest.current.onStageDragMove(e),
      onClick: (e: Konva.KonvaEventObject<MouseEvent>) => stageLatest.current.onStageClick(e),
    }),
    [],
  );

  // Everything below the elements is built once per change of its own inputs, so an element drag (which changes
  // only the moving elements and the dimension lines) neither re-renders nor redraws it.
  const fromPx = visibleMm.from * pxPerMm;
  const toPx = visibleMm.to * pxPerMm;
  const backgroundNodes = useMemo(
    () => (
      <>
        <Rect name="background" x={-panPx} y={0} width={width} height={CANVAS_HEIGHT} fill={THEME.ink} />
        {/* optical axis and the rail the posts stand on */}
        <Line points={[fromPx, RAIL_Y, toPx, RAIL_Y]} stroke={THEME.line} strokeWidth={1} dash={[6, 6]} listening={false} />
        <Rect x={fromPx} y={RAIL_BAR_Y} width={width} height={7} fill={THEME.raised} stroke={THEME.line} strokeWidth={1} listening={false} />
        {/* ruler */}
        <Line points={[fromPx, RULER_Y, toPx, RULER_Y]} stroke={THEME.muted} strokeWidth={1} listening={false} />
        {rulerNodes}
        <Text x={-panPx + 6} y={CANVAS_HEIGHT - 16} text="mm along the rail" fontSize={11} fill={THEME.muted} listening={false} />
      </>
    ),
    [panPx, width, fromPx, toPx, rulerNodes],
  );

  // Dimension lines between neighbours: one memoised node per pair, so a drag re-renders only the pairs it changes.
  const dimensionNodes = useMemo(
    () =>
      sorted.slice(1).map((e, i) => {
        const prev = sorted[i];
        const x1 = prev.positionMm * pxPerMm;
        const x2 = e.positionMm * pxPerMm;
        if (x2 - x1 < 2) return null;
        return <DimensionLine key={`dim-${prev.id}-${e.id}`} x1={x1} x2={x2} label={`${fmt(e.positionMm - prev.positionMm)} mm`} />;
      }),
    [sorted, pxPerMm],
  );

  const beamNodes = useMemo(
    () => (
      <>
        {envelope && hazard.length === 0 ? (
          <>
            <Line points={envelope.outline} closed fill="rgba(111, 214, 200, 0.16)" strokeEnabled={false} />
            <Line points={envelope.upper} stroke={THEME.accent} strokeWidth={1.5} dash={stale ? [4, 4] : undefined} />
            <Line points={envelope.lower} stroke={THEME.accent} strokeWidth={1.5} dash={stale ? [4, 4] : undefined} />
          </>
        ) : null}
        {hazard.map(({ segment, upper, lower, outline, widestPx }) => {
          const style = BAND_STYLES[segment.band.id];
          const x1 = segment.fromMm * pxPerMm;
          const x2 = segment.toMm * pxPerMm;
          const labelY = Math.min(RAIL_Y + widestPx + 6, RAIL_BAR_Y - 18);
          return (
            <Group key={`hazard-${segment.fromMm}-${segment.toMm}`}>
              <Line points={outline} closed fill={style.fill} strokeEnabled={false} />
              {style.hatch !== "none" ? (
                <Group
                  clipFunc={(ctx) => {
                    ctx.beginPath();
                    ctx.moveTo(outline[0], outline[1]);
                    for (let i = 2; i < outline.length; i += 2) ctx.lineTo(outline[i], outline[i + 1]);
                    ctx.closePath();
                  }}
                >
                  <Hatching x1={x1} x2={x2} top={RAIL_Y - widestPx} bottom={RAIL_Y + widestPx} kind={style.hatch} stroke={style.edge} />
                </Group>
              ) : null}
              <Line points={upper} stroke={style.edge} strokeWidth={style.edgeWidth} dash={stale ? [4, 4] : style.dash} />
              <Line points={lower} stroke={style.edge} strokeWidth={style.edgeWidth} dash={stale ? [4, 4] : style.dash} />
              {x2 - x1 > 120 ? (
                <Text x={(x1 + x2) / 2 - 60} y={labelY} width={120} align="center" text={segment.opticalDensity > 0 ? `need OD ${computedOdText(segment.opticalDensity)}` : "below the MPE"} fontSize={12} fontStyle={segment.band.id === "high" ? "bold" : "normal"} fill={THEME.text} />
              ) : null}
            </Group>
          );
        })}
        {(analysis?.analysis.apertures ?? []).map((a) => {
          const x = a.positionMm * pxPerMm;
          const word = a.centre;
          return (
            <Group key={`badge-${a.id}`} x={x} y={BADGE_Y}>
              <Rect x={-50} y={0} width={100} height={40} cornerRadius={6} fill={THEME.panel} stroke={THEME.accent} strokeWidth={1.5} />
              <Text x={-50} y={5} width={100} align="center" text={`${a.zonesExposed.toFixed(2)} zones`} fontSize={13} fontStyle="bold" fill={THEME.text} />
              <Group x={-30} y={28}>
                {word === "bright" ? <Circle radius={5.5} fill={THEME.text} /> : null}
                {word === "dark" ? <Circle radius={5} stroke={THEME.text} strokeWidth={1.5} /> : null}
                {word === "between" ? (
                  <>
                    <Circle radius={5} stroke={THEME.text} strokeWidth={1.5} />
                    <Wedge radius={5} angle={180} rotation={90} fill={THEME.text} />
                  </>
                ) : null}
              </Group>
              <Text x={-20} y={22} text={`centre ${word}`} fontSize={12} fill={THEME.muted} />
            </Group>
          );
        })}
      </>
    ),
    [envelope, hazard, analysis, stale, pxPerMm],
  );

  const tickNodes = useMemo(
    () =>
      ticks.map(({ tick, x, labelY }) => (
        <Group key={`tick-${tick.goal}-${tick.rank}`} x={x}>
          <Line points={[0, labelY + 16, 0, RULER_Y + 12]} stroke={THEME.accentStrong} strokeWidth={2} dash={finderStale ? [3, 3] : undefined} />
          <Text x={-30} y={labelY} width={60} align="center" text={`${CENTRE_SYMBOL[tick.centre]}${tick.zoneCount}`} fontSize={15} fontStyle="bold" fill={THEME.accentStrong} />
        </Group>
      )),
    [ticks, finderStale],
  );

  return (
    <Stage
      width={width}
      height={CANVAS_HEIGHT}
      x={panPx}
      draggable
      dragBoundFunc={stageDragBound}
      onDragMove={stageHandlers.onDragMove}
      onWheel={stageHandlers.onWheel}
      onTouchMove={stageHandlers.onTouchMove}
      onTouchEnd={stageHandlers.onTouchEnd}
      onTouchCancel={stageHandlers.onTouchEnd}
      onClick={stageHandlers.onClick}
    >
      <Layer>{backgroundNodes}</Layer>
      <Layer listening={false}>{dimensionNodes}</Layer>
      <Layer listening={false} opacity={stale ? 0.35 : 1}>
        {beamNodes}
      </Layer>
      <Layer listening={false} opacity={finderStale ? 0.4 : 1}>
        {tickNodes}
      </Layer>
      <Layer>
        {shown.map((e) => (
          <ElementNode
            key={e.id}
            element={e}
            selected={shownSelection.includes(e.id)}
            warnings={warningsById.get(e.id) ?? 0}
            labelRow={labelRows.get(e.id) ?? 0}
            canEdit={canEdit}
            pxPerMm={pxPerMm}
            panPx={panPx}
            snapStepMm={snapStepMm}
            exaggeration={exaggeration}
            handlers={handlers}
          />
        ))}
      </Layer>
    </Stage>
  );
}

const stageDragBound = (pos: { x: number; y: number }) => ({ x: pos.x, y: 0 });

/** A dimension line between two neighbours on the rail, with the distance between them when there is room. */
const DimensionLine = memo(function DimensionLine({ x1, x2, label }: { x1: number; x2: number; label: string }) {
  return (
    <Group listening={false}>
      <Line points={[x1, DIM_Y, x2, DIM_Y]} stroke={THEME.muted} strokeWidth={1} />
      <Line points={[x1, DIM_Y - 6, x1, DIM_Y + 6]} stroke={THEME.muted} strokeWidth={1} />
      <Line points={[x2, DIM_Y - 6, x2, DIM_Y + 6]} stroke={THEME.muted} strokeWidth={1} />
      <Line points={[x1, DIM_Y + 6, x1, RAIL_Y - SYMBOL_HALF_HEIGHT - 4]} stroke={THEME.line} strokeWidth={1} dash={[2, 4]} />
      {x2 - x1 > 58 ? <Text x={x1} y={DIM_Y - 17} width={x2 - x1} align="center" text={label} fontSize={12} fill={THEME.text} /> : null}
    </Group>
  );
});

type ElementHandlers = {
  dragStart: (e: BenchElement, evt: Event | undefined) => void;
  dragMove: (e: BenchElement, node: Konva.Node) => void;
  dragEnd: (e: BenchElement, node: Konva.Node) => void;
  select: (ids: string[]) => void;
  toggle: (id: string) => void;
};

type ElementNodeProps = {
  element: BenchElement;
  selected: boolean;
  warnings: number;
  labelRow: number;
  canEdit: boolean;
  pxPerMm: number;
  panPx: number;
  snapStepMm: number;
  exaggeration: number;
  handlers: ElementHandlers;
};

/** One element on the rail; memoised, so a drag re-renders only the elements that moved. */
const ElementNode = memo(function ElementNode({ element: e, selected, warnings, labelRow, canEdit, pxPerMm, panPx, snapStepMm, exaggeration, handlers }: ElementNodeProps) {
  return (
    <Group
      name="element"
      x={e.positionMm * pxPerMm}
      y={RAIL_Y}
      draggable={canEdit}
      dragBoundFunc={(pos) => ({ x: snapMm((pos.x - panPx) / pxPerMm, snapStepMm) * pxPerMm + panPx, y: RAIL_Y })}
      onDragStart={(ev) => handlers.dragStart(e, ev.evt)}
      onDragMove={(ev) => handlers.dragMove(e, ev.target)}
      onDragEnd={(ev) => handlers.dragEnd(e, ev.target)}
      onClick={(ev) => {
        ev.cancelBubble = true;
        if (ev.evt.shiftKey) handlers.toggle(e.id);
        else handlers.select([e.id]);
      }}
      onTap={() => handlers.select([e.id])}
      onMouseEnter={(ev) => {
        const c = ev.target.getStage()?.container();
        if (c) c.style.cursor = canEdit ? "grab" : "pointer";
      }}
      onMouseLeave={(ev) => {
        const c = ev.target.getStage()?.container();
        if (c) c.style.cursor = "";
      }}
    >
      <Rect x={-26} y={-SYMBOL_HALF_HEIGHT - 6} width={52} height={SYMBOL_HALF_HEIGHT * 2 + 12} fill="rgba(0,0,0,0.001)" />
      {selected ? (
        <Rect x={-30} y={-SYMBOL_HALF_HEIGHT - 8} width={60} height={SYMBOL_HALF_HEIGHT * 2 + 16} stroke={THEME.accentStrong} strokeWidth={2} dash={[5, 4]} cornerRadius={4} />
      ) : null}
      <CanvasSymbol element={e} apertureHalfPx={e.kind === "aperture" ? (e.diameterMm / 2) * pxPerMm * exaggeration : undefined} />
      <Line points={[0, SYMBOL_HALF_HEIGHT, 0, RAIL_BAR_Y - RAIL_Y]} stroke={THEME.line} strokeWidth={2} />
      {labelRow > 0 ? <Line points={[0, RAIL_BAR_Y - RAIL_Y + 8, 0, LABEL_Y - RAIL_Y + LABEL_ROW_PX * labelRow - 2]} stroke={THEME.line} strokeWidth={1} dash={[2, 3]} /> : null}
      <Text x={-60} y={LABEL_Y - RAIL_Y + LABEL_ROW_PX * labelRow} width={120} align="center" text={e.id} fontSize={13} fontStyle={selected ? "bold" : "normal"} fill={selected ? THEME.accentStrong : THEME.text} />
      <Text x={-60} y={LABEL_Y - RAIL_Y + LABEL_ROW_PX * labelRow + 16} width={120} align="center" text={shortLabel(e)} fontSize={12} fill={THEME.muted} />
      {warnings > 0 ? (
        // beside the symbol, below the zone badge (which sits above the symbol), so it never covers it
        <Group x={36} y={-SYMBOL_HALF_HEIGHT + 14}>
          <Line points={[0, -10, 9, 6, -9, 6]} closed fill={THEME.warn} />
          <Text x={-3} y={-5} text="!" fontSize={11} fontStyle="bold" fill={THEME.ink} />
        </Group>
      ) : null}
    </Group>
  );
});

/** Diagonal hatching (one direction or crossed) over a box; the caller clips it to the beam. */
function Hatching({ x1, x2, top, bottom, kind, stroke }: { x1: number; x2: number; top: number; bottom: number; kind: Exclude<HatchKind, "none">; stroke: string }) {
  const spacing = kind === "cross" ? 7 : 8;
  const h = bottom - top;
  return (
    <Shape
      listening={false}
      stroke={stroke}
      strokeWidth={1}
      opacity={0.5}
      sceneFunc={(ctx, shape) => {
        ctx.beginPath();
        for (let x = x1 - h; x <= x2 + h; x += spacing) {
          ctx.moveTo(x, bottom);
          ctx.lineTo(x + h, top);
          if (kind === "cross") {
            ctx.moveTo(x, top);
            ctx.lineTo(x + h, bottom);
          }
        }
        ctx.strokeShape(shape);
      }}
    />
  );
}

