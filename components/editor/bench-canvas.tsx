"use client";
// The bench drawing (react-konva, loaded in the browser only): the rail at true scale with a millimetre ruler,
// dimension lines between neighbours, the elements to drag (with snapping), the beam envelope and, per aperture,
// the zone badge. The view (scale and pan) belongs to the editor; this component reports gestures.
import type Konva from "konva";
import { useMemo, useRef } from "react";
import { Group, Layer, Line, Rect, Stage, Text, Circle, Wedge } from "react-konva";
import type { BenchDocument, BenchElement } from "@/lib/bench/schema";
import type { KeyedAnalysis } from "@/lib/api/bench-queries";
import { CANVAS_HEIGHT } from "./canvas-constants";
import { CanvasSymbol, SYMBOL_HALF_HEIGHT } from "./canvas-symbol";
import { shortLabel, snapMm } from "./element-kinds";
import { THEME } from "./palette-colours";
import { clampScale, type View } from "./view";

const DIM_Y = 26;
const RAIL_Y = 190;
const RAIL_BAR_Y = RAIL_Y + SYMBOL_HALF_HEIGHT + 12;
const LABEL_Y = RAIL_BAR_Y + 16;
const RULER_Y = CANVAS_HEIGHT - 44;
const BADGE_Y = RAIL_Y - SYMBOL_HALF_HEIGHT - 52;
const MAX_BEAM_PX = RAIL_Y - DIM_Y - 20;

export type BenchCanvasProps = {
  doc: BenchDocument;
  selection: string[];
  analysis: KeyedAnalysis | undefined;
  stale: boolean;
  canEdit: boolean;
  view: View;
  width: number;
  exaggeration: number;
  snapStepMm: number;
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
  const { doc, selection, analysis, stale, canEdit, view, width, exaggeration, snapStepMm } = props;
  const { pxPerMm, panPx } = view;
  const drag = useRef<{ session: string; start: Record<string, number> } | null>(null);

  const visibleMm = { from: -panPx / pxPerMm, to: (width - panPx) / pxPerMm };
  const sorted = useMemo(() => [...doc.elements].sort((a, b) => a.positionMm - b.positionMm), [doc.elements]);
  const warningsById = useMemo(() => {
    const m = new Map<string, number>();
    for (const w of analysis?.analysis.warnings ?? []) if (w.elementId) m.set(w.elementId, (m.get(w.elementId) ?? 0) + 1);
    return m;
  }, [analysis]);

  const ruler = useMemo(() => {
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

  const onWheel = (e: Konva.KonvaEventObject<WheelEvent>) => {
    e.evt.preventDefault();
    const stage = e.target.getStage();
    const pointer = stage?.getPointerPosition();
    if (!pointer) return;
    const next = clampScale(pxPerMm * Math.exp(-e.evt.deltaY * 0.0015));
    const mmAtPointer = (pointer.x - panPx) / pxPerMm;
    props.onViewChange({ pxPerMm: next, panPx: pointer.x - mmAtPointer * next });
  };

  const startDrag = (element: BenchElement) => {
    const moving = selection.includes(element.id) ? selection : [element.id];
    if (!selection.includes(element.id)) props.onSelect([element.id]);
    const start: Record<string, number> = {};
    for (const e of doc.elements) if (moving.includes(e.id)) start[e.id] = e.positionMm;
    drag.current = { session: `drag-${Date.now()}-${Math.random().toString(36).slice(2, 7)}`, start };
  };

  const moveDrag = (element: BenchElement, node: Konva.Node) => {
    const d = drag.current;
    if (!d) return;
    const deltaMm = node.x() / pxPerMm - d.start[element.id];
    const positions: Record<string, number> = {};
    for (const [id, mm] of Object.entries(d.start)) positions[id] = id === element.id ? node.x() / pxPerMm : mm + deltaMm;
    props.onMove(positions, d.session);
  };

  return (
    <Stage
      width={width}
      height={CANVAS_HEIGHT}
      x={panPx}
      draggable
      dragBoundFunc={(pos) => ({ x: pos.x, y: 0 })}
      onDragMove={(e) => {
        if (e.target === e.target.getStage()) props.onViewChange({ pxPerMm, panPx: e.target.x() });
      }}
      onWheel={onWheel}
      onClick={(e) => {
        if (e.target === e.target.getStage() || e.target.name() === "background") props.onSelect([]);
      }}
    >
      <Layer>
        <Rect name="background" x={-panPx} y={0} width={width} height={CANVAS_HEIGHT} fill={THEME.ink} />
        {/* optical axis and the rail the posts stand on */}
        <Line points={[visibleMm.from * pxPerMm, RAIL_Y, visibleMm.to * pxPerMm, RAIL_Y]} stroke={THEME.line} strokeWidth={1} dash={[6, 6]} listening={false} />
        <Rect x={visibleMm.from * pxPerMm} y={RAIL_BAR_Y} width={width} height={7} fill={THEME.raised} stroke={THEME.line} strokeWidth={1} listening={false} />
        {/* ruler */}
        <Line points={[visibleMm.from * pxPerMm, RULER_Y, visibleMm.to * pxPerMm, RULER_Y]} stroke={THEME.muted} strokeWidth={1} listening={false} />
        {ruler.map((t) => (
          <Group key={t.x} listening={false}>
            <Line points={[t.x, RULER_Y, t.x, RULER_Y + (t.major ? 12 : 5)]} stroke={t.major ? THEME.text : THEME.muted} strokeWidth={1} />
            {t.label !== undefined ? <Text x={t.x + 3} y={RULER_Y + 15} text={t.label} fontSize={12} fill={THEME.muted} /> : null}
          </Group>
        ))}
        <Text x={-panPx + 6} y={CANVAS_HEIGHT - 16} text="mm along the rail" fontSize={11} fill={THEME.muted} listening={false} />
        {/* dimension lines between neighbours */}
        {sorted.slice(1).map((e, i) => {
          const prev = sorted[i];
          const x1 = prev.positionMm * pxPerMm;
          const x2 = e.positionMm * pxPerMm;
          if (x2 - x1 < 2) return null;
          const label = `${fmt(e.positionMm - prev.positionMm)} mm`;
          return (
            <Group key={`dim-${prev.id}-${e.id}`} listening={false}>
              <Line points={[x1, DIM_Y, x2, DIM_Y]} stroke={THEME.muted} strokeWidth={1} />
              <Line points={[x1, DIM_Y - 6, x1, DIM_Y + 6]} stroke={THEME.muted} strokeWidth={1} />
              <Line points={[x2, DIM_Y - 6, x2, DIM_Y + 6]} stroke={THEME.muted} strokeWidth={1} />
              <Line points={[x1, DIM_Y + 6, x1, RAIL_Y - SYMBOL_HALF_HEIGHT - 4]} stroke={THEME.line} strokeWidth={1} dash={[2, 4]} />
              {x2 - x1 > 58 ? <Text x={x1} y={DIM_Y - 17} width={x2 - x1} align="center" text={label} fontSize={12} fill={THEME.text} /> : null}
            </Group>
          );
        })}
      </Layer>
      <Layer listening={false} opacity={stale ? 0.35 : 1}>
        {envelope ? (
          <>
            <Line points={envelope.outline} closed fill="rgba(111, 214, 200, 0.16)" strokeEnabled={false} />
            <Line points={envelope.upper} stroke={THEME.accent} strokeWidth={1.5} dash={stale ? [4, 4] : undefined} />
            <Line points={envelope.lower} stroke={THEME.accent} strokeWidth={1.5} dash={stale ? [4, 4] : undefined} />
          </>
        ) : null}
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
      </Layer>
      <Layer>
        {doc.elements.map((e) => {
          const selected = selection.includes(e.id);
          const warnings = warningsById.get(e.id) ?? 0;
          return (
            <Group
              key={e.id}
              x={e.positionMm * pxPerMm}
              y={RAIL_Y}
              draggable={canEdit}
              dragBoundFunc={(pos) => ({ x: snapMm((pos.x - panPx) / pxPerMm, snapStepMm) * pxPerMm + panPx, y: RAIL_Y })}
              onDragStart={() => startDrag(e)}
              onDragMove={(ev) => moveDrag(e, ev.target)}
              onDragEnd={(ev) => {
                moveDrag(e, ev.target);
                drag.current = null;
              }}
              onClick={(ev) => {
                ev.cancelBubble = true;
                if (ev.evt.shiftKey) props.onToggleSelect(e.id);
                else props.onSelect([e.id]);
              }}
              onTap={() => props.onSelect([e.id])}
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
              <Text x={-60} y={LABEL_Y - RAIL_Y} width={120} align="center" text={e.id} fontSize={13} fontStyle={selected ? "bold" : "normal"} fill={selected ? THEME.accentStrong : THEME.text} />
              <Text x={-60} y={LABEL_Y - RAIL_Y + 16} width={120} align="center" text={shortLabel(e)} fontSize={12} fill={THEME.muted} />
              {warnings > 0 ? (
                <Group x={20} y={-SYMBOL_HALF_HEIGHT - 2}>
                  <Line points={[0, -10, 9, 6, -9, 6]} closed fill={THEME.warn} />
                  <Text x={-3} y={-5} text="!" fontSize={11} fontStyle="bold" fill={THEME.ink} />
                </Group>
              ) : null}
            </Group>
          );
        })}
      </Layer>
    </Stage>
  );
}
