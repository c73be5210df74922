"use client";
// The table drawing (react-konva, loaded in the browser only): the table from above at true scale with its hole grid,
// every element drawn from its kind's symbol (lib/bench/element-kinds.ts) and turned to its angle, every beam run
// coloured by its hazard band with its power, and the beams that leave the table marked at the edge. Elements are
// dragged (snapping to holes or onto a beam), turned by their handle, selected by click, Shift+click or a box.
// A drag stays inside this component while it lasts: the moving elements' places go up as a preview once per frame
// (the editor traces the beams and asks the browser's engine for figures), and once, on drop, as one change.
import Konva from "konva";
import { memo, useEffect, useLayoutEffect, useMemo, useRef, useState } from "react";
import { Circle, Group, Layer, Line, Rect, Shape, Stage, Text } from "react-konva";
import { ELEMENT_KIND_RECORDS } from "@/lib/bench/element-kinds";
import type { BenchDocumentV2, TableElement } from "@/lib/bench/schema-v2";
import { THEME } from "../palette-colours";
import { facesBeamWhenDropped, facingBeamDeg, handleAngle, holeOffsetMm, snapPlacement, type BeamSegment, type PointMm, type SnapMode } from "./table-geometry";

/** A beam as drawn: its segment, power and hazard band. */
export type DrawnBeam = BeamSegment & { laserId: string; powerMw: number; open: boolean; band: "above-mpe" | "below-mpe" | "unknown" };
export type Place = { xMm: number; yMm: number; angleDeg?: number };

export const MARGIN_PX = 34;
const MAX_HEIGHT_PX = 640;
/** A dragged element goes onto a beam whose axis passes within this many pixels. */
const BEAM_SNAP_PX = 10;
const HANDLE_PX = 42;

export function tableScale(doc: BenchDocumentV2, width: number): number {
  const byWidth = (width - 2 * MARGIN_PX) / doc.table.widthMm;
  const byHeight = (MAX_HEIGHT_PX - 2 * MARGIN_PX) / doc.table.depthMm;
  return Math.max(0.02, Math.min(byWidth, byHeight));
}

/** Where the table's left edge sits in the drawing: centred when the drawing is wider than the table needs. */
export function tableLeftPx(doc: BenchDocumentV2, width: number): number {
  return Math.max(MARGIN_PX, (width - doc.table.widthMm * tableScale(doc, width)) / 2);
}

const BAND_COLOUR = { "above-mpe": THEME.danger, "below-mpe": THEME.ok, unknown: THEME.accent } as const;

type Props = {
  doc: BenchDocumentV2;
  /** Places of elements being dragged (the preview), by id. */
  preview: Record<string, Place> | null;
  selection: string[];
  beams: DrawnBeam[];
  /** Beams as they stood when the drag began, without the dragged elements: what a drag snaps onto. */
  snapBeams: (without: string[]) => BeamSegment[];
  selectedBeam: string | null;
  /** Elements with a problem (off the table, on another's spot): drawn with a red ring. */
  flagged: Set<string>;
  canEdit: boolean;
  width: number;
  snapMode: SnapMode;
  onSelect: (ids: string[]) => void;
  onToggleSelect: (id: string) => void;
  onPreview: (places: Record<string, Place> | null) => void;
  onPlace: (places: Record<string, Place>, coalesce: string) => void;
  onBeamClick: (pathId: string | null) => void;
};

let dragSessions = 0;

export function TableCanvas(props: Props) {
  const { doc, preview, selection, beams, selectedBeam, flagged, canEdit, width } = props;
  const s = tableScale(doc, width);
  const W = doc.table.widthMm;
  const D = doc.table.depthMm;
  const height = Math.round(D * s + 2 * MARGIN_PX);
  const left = tableLeftPx(doc, width);
  const sx = (x: number) => left + x * s;
  const sy = (y: number) => MARGIN_PX + (D - y) * s;
  const toMm = (px: number, py: number): PointMm => ({ xMm: (px - left) / s, yMm: D - (py - MARGIN_PX) / s });

  const drag = useRef<{ session: string; id: string; start: Record<string, PointMm>; snap: BeamSegment[]; frame: number | null; pending: Record<string, Place> | null } | null>(null);
  const [box, setBox] = useState<{ from: { x: number; y: number }; to: { x: number; y: number } } | null>(null);

  const shown = useMemo(
    () => (preview ? doc.elements.map((e) => (e.id in preview ? ({ ...e, ...preview[e.id] } as TableElement) : e)) : doc.elements),
    [doc.elements, preview],
  );
  const single = selection.length === 1 ? shown.find((e) => e.id === selection[0]) : undefined;

  useEffect(
    () => () => {
      if (drag.current?.frame) cancelAnimationFrame(drag.current.frame);
    },
    [],
  );

  const sendPreview = (places: Record<string, Place>) => {
    const d = drag.current;
    if (!d) return;
    d.pending = places;
    if (d.frame !== null) return;
    d.frame = requestAnimationFrame(() => {
      if (!drag.current) return;
      drag.current.frame = null;
      if (drag.current.pending) props.onPreview(drag.current.pending);
    });
  };

  const startDrag = (id: string) => {
    const ids = selection.includes(id) ? selection : [id];
    if (!selection.includes(id)) props.onSelect([id]);
    const start: Record<string, PointMm> = {};
    for (const e of doc.elements) if (ids.includes(e.id)) start[e.id] = { xMm: e.xMm, yMm: e.yMm };
    drag.current = { session: `drag-${++dragSessions}`, id, start, snap: props.snapBeams(ids), frame: null, pending: null };
  };

  const moveDrag = (node: Konva.Node, element: TableElement) => {
    const d = drag.current;
    if (!d) return;
    const raw = toMm(node.x(), node.y());
    const snapped = snapPlacement(raw, doc.table, d.snap, BEAM_SNAP_PX / s, props.snapMode);
    node.position({ x: sx(snapped.point.xMm), y: sy(snapped.point.yMm) });
    const origin = d.start[d.id];
    const dx = snapped.point.xMm - origin.xMm;
    const dy = snapped.point.yMm - origin.yMm;
    const places: Record<string, Place> = {};
    for (const [id, p] of Object.entries(d.start)) {
      places[id] = {
        xMm: Math.round(Math.min(W, Math.max(0, p.xMm + dx)) * 1000) / 1000,
        yMm: Math.round(Math.min(D, Math.max(0, p.yMm + dy)) * 1000) / 1000,
      };
    }
    // dropped onto a beam, a lens, iris, filter, block or screen turns to face it
    if (snapped.onBeam && Object.keys(d.start).length === 1 && facesBeamWhenDropped(element.kind)) places[d.id].angleDeg = facingBeamDeg(snapped.onBeam);
    sendPreview(places);
  };

  const endDrag = () => {
    const d = drag.current;
    if (!d) return;
    if (d.frame !== null) cancelAnimationFrame(d.frame);
    drag.current = null;
    if (d.pending) props.onPlace(d.pending, d.session);
    props.onPreview(null);
  };

  const holes = useMemo(() => {
    const pitch = doc.table.holePitchMm;
    const off = holeOffsetMm(pitch);
    return { pitch, off, r: Math.max(0.6, Math.min(3, pitch * s * 0.12)) };
  }, [doc.table.holePitchMm, s]);

  const openMarks = beams.filter((b) => b.open);
  // One path for every hole, drawn again only when the table or the scale changes (a new function would redraw the layer).
  const drawHoles = useMemo(
    () => (ctx: Konva.Context, shape: Konva.Shape) => {
      ctx.beginPath();
      for (let x = holes.off; x <= W + 1e-9; x += holes.pitch) {
        for (let y = holes.off; y <= D + 1e-9; y += holes.pitch) {
          const px = left + x * s;
          const py = MARGIN_PX + (D - y) * s;
          ctx.moveTo(px + holes.r, py);
          ctx.arc(px, py, holes.r, 0, Math.PI * 2);
        }
      }
      ctx.fillShape(shape);
    },
    [holes, W, D, s, left],
  );

  // The elements' gesture handlers as one stable object (calling the newest closures), so an element whose own props
  // did not change is not drawn again while another one is dragged.
  const latest = useRef({ selection, startDrag, moveDrag, endDrag, onSelect: props.onSelect, onToggleSelect: props.onToggleSelect });
  useLayoutEffect(() => {
    latest.current = { selection, startDrag, moveDrag, endDrag, onSelect: props.onSelect, onToggleSelect: props.onToggleSelect };
  });
  const events = useMemo<SymbolEvents>(
    () => ({
      pick: (id, shift) => {
        const l = latest.current;
        if (shift) l.onToggleSelect(id);
        else if (!l.selection.includes(id)) l.onSelect([id]);
      },
      dragStart: (id) => latest.current.startDrag(id),
      dragMove: (node, element) => latest.current.moveDrag(node, element),
      dragEnd: () => latest.current.endDrag(),
    }),
    [],
  );

  const onStageDown = (e: Konva.KonvaEventObject<MouseEvent | TouchEvent>) => {
    if (e.target !== e.target.getStage() && e.target.name() !== "table-top") return;
    const pos = e.target.getStage()!.getPointerPosition();
    if (!pos) return;
    props.onBeamClick(null);
    setBox({ from: pos, to: pos });
  };
  const onStageMove = (e: Konva.KonvaEventObject<MouseEvent | TouchEvent>) => {
    if (!box) return;
    const pos = e.target.getStage()!.getPointerPosition();
    if (pos) setBox({ ...box, to: pos });
  };
  const onStageUp = (e: Konva.KonvaEventObject<MouseEvent | TouchEvent>) => {
    if (!box) return;
    const x0 = Math.min(box.from.x, box.to.x);
    const x1 = Math.max(box.from.x, box.to.x);
    const y0 = Math.min(box.from.y, box.to.y);
    const y1 = Math.max(box.from.y, box.to.y);
    setBox(null);
    const additive = (e.evt as MouseEvent).shiftKey;
    if (x1 - x0 < 4 && y1 - y0 < 4) {
      if (!additive) props.onSelect([]);
      return;
    }
    const inside = doc.elements.filter((el) => sx(el.xMm) >= x0 && sx(el.xMm) <= x1 && sy(el.yMm) >= y0 && sy(el.yMm) <= y1).map((el) => el.id);
    props.onSelect(additive ? [...new Set([...selection, ...inside])] : inside);
  };

  return (
    <Stage
      width={width}
      height={height}
      onMouseDown={onStageDown}
      onMouseMove={onStageMove}
      onMouseUp={onStageUp}
      onTouchStart={onStageDown}
      onTouchMove={onStageMove}
      onTouchEnd={onStageUp}
    >
      {/* The table and its holes: redrawn only when the table or the scale changes. */}
      <Layer listening={false}>
        <Rect x={sx(0)} y={sy(D)} width={W * s} height={D * s} fill={THEME.raised} stroke={THEME.line} strokeWidth={1.5} cornerRadius={2} />
        <Shape sceneFunc={drawHoles} fill={THEME.line} />
        <Text x={sx(0)} y={sy(0) + 8} text="front edge (y = 0)" fontSize={11} fill={THEME.muted} />
        <Text x={sx(W) - 320} y={sy(0) + 8} width={320} align="right" text={`${fmt(W)} × ${fmt(D)} mm, holes every ${fmt(holes.pitch)} mm`} fontSize={11} fill={THEME.muted} />
      </Layer>
      <Layer>
        <Rect name="table-top" x={sx(0)} y={sy(D)} width={W * s} height={D * s} fill="rgba(0,0,0,0)" />
        {beams.map((b) => (
          <BeamLine key={b.pathId} beam={b} selected={b.pathId === selectedBeam} sx={sx} sy={sy} onClick={() => props.onBeamClick(b.pathId)} />
        ))}
        {openMarks.map((b) => (
          <Group key={`open-${b.pathId}`} x={sx(b.to.xMm)} y={sy(b.to.yMm)} listening={false}>
            <Circle radius={9} stroke={b.band === "above-mpe" ? THEME.danger : THEME.warn} strokeWidth={2.5} />
            <Line points={[-5, -5, 5, 5]} stroke={b.band === "above-mpe" ? THEME.danger : THEME.warn} strokeWidth={2} />
            <Line points={[5, -5, -5, 5]} stroke={b.band === "above-mpe" ? THEME.danger : THEME.warn} strokeWidth={2} />
          </Group>
        ))}
        {shown.map((e) => (
          <ElementSymbol
            key={e.id}
            element={e}
            x={sx(e.xMm)}
            y={sy(e.yMm)}
            s={s}
            selected={selection.includes(e.id)}
            flagged={flagged.has(e.id)}
            draggable={canEdit}
            events={events}
          />
        ))}
        {single && canEdit ? (
          <RotateHandle
            element={single}
            cx={sx(single.xMm)}
            cy={sy(single.yMm)}
            onTurn={(angleDeg, session) => props.onPlace({ [single.id]: { xMm: single.xMm, yMm: single.yMm, angleDeg } }, session)}
            toMm={toMm}
          />
        ) : null}
        {box ? (
          <Rect
            x={Math.min(box.from.x, box.to.x)}
            y={Math.min(box.from.y, box.to.y)}
            width={Math.abs(box.to.x - box.from.x)}
            height={Math.abs(box.to.y - box.from.y)}
            stroke={THEME.accent}
            dash={[4, 3]}
            fill="rgba(111, 214, 200, 0.08)"
            listening={false}
          />
        ) : null}
      </Layer>
    </Stage>
  );
}

const fmt = (v: number) => String(Number(v.toPrecision(4)));

/** Power as people read it: "4.95 mW", "120 µW", "1.2 W". */
export function powerText(mw: number): string {
  if (!Number.isFinite(mw)) return "—";
  if (mw >= 1000) return `${fmt(mw / 1000)} W`;
  if (mw >= 1 || mw === 0) return `${fmt(mw)} mW`;
  if (mw >= 1e-3) return `${fmt(mw * 1000)} µW`;
  return `${fmt(mw * 1e6)} nW`;
}

const BeamLine = memo(function BeamLine({ beam, selected, sx, sy, onClick }: { beam: DrawnBeam; selected: boolean; sx: (x: number) => number; sy: (y: number) => number; onClick: () => void }) {
  const colour = BAND_COLOUR[beam.band];
  // thicker for more power: 1.5 px at 1 µW or less, up to 5 px at 1 W and above
  const widthPx = 1.5 + Math.min(3.5, Math.max(0, (Math.log10(Math.max(beam.powerMw, 1e-12)) + 3) * (3.5 / 6)));
  const x1 = sx(beam.from.xMm);
  const y1 = sy(beam.from.yMm);
  const x2 = sx(beam.to.xMm);
  const y2 = sy(beam.to.yMm);
  const lengthPx = Math.hypot(x2 - x1, y2 - y1);
  const angle = Math.atan2(y2 - y1, x2 - x1);
  // the power label sits beside the run's middle, upright
  const mx = (x1 + x2) / 2 - Math.sin(angle) * 10;
  const my = (y1 + y2) / 2 + Math.cos(angle) * 10;
  return (
    <Group>
      <Line
        points={[x1, y1, x2, y2]}
        stroke={colour}
        strokeWidth={selected ? widthPx + 2 : widthPx}
        opacity={selected ? 1 : 0.9}
        dash={beam.open ? [10, 5] : undefined}
        hitStrokeWidth={14}
        shadowColor={selected ? colour : undefined}
        shadowBlur={selected ? 8 : 0}
        onClick={onClick}
        onTap={onClick}
        name="beam"
        perfectDrawEnabled={false}
      />
      {lengthPx > 70 ? <Text x={mx - 40} y={my - 6} width={80} align="center" text={powerText(beam.powerMw)} fontSize={10} fill={colour} listening={false} /> : null}
    </Group>
  );
});

type SymbolEvents = {
  pick: (id: string, shift: boolean) => void;
  dragStart: (id: string) => void;
  dragMove: (node: Konva.Node, element: TableElement) => void;
  dragEnd: () => void;
};

type SymbolProps = { element: TableElement; x: number; y: number; s: number; selected: boolean; flagged: boolean; draggable: boolean; events: SymbolEvents };

const ElementSymbol = memo(function ElementSymbol({ element, x, y, s, selected, flagged, draggable, events }: SymbolProps) {
  const record = ELEMENT_KIND_RECORDS[element.kind];
  const { shape, faceMm, depthMm } = record.symbol;
  const laser = element.kind === "laser";
  const face = Math.max(6, (laser || element.kind === "beam-splitter" ? faceMm : ("clearApertureMm" in element && element.clearApertureMm) || faceMm) * s);
  const depth = Math.max(3, depthMm * s);
  const stroke = selected ? THEME.accentStrong : laser ? THEME.danger : element.kind === "beam-block" ? THEME.muted : THEME.text;
  const strokeWidth = selected ? 2.5 : 1.5;
  // u runs along the normal (the beam, for a laser) and v along the face; the group turns by −angle (y points down on screen)
  const body = (() => {
    switch (shape) {
      case "box":
        return (
          <>
            <Rect x={-depth} y={-face / 2} width={depth} height={face} fill="#3a2320" stroke={stroke} strokeWidth={strokeWidth} cornerRadius={2} />
            <Line points={[0, -5, 8, 0, 0, 5]} closed fill={THEME.danger} />
          </>
        );
      case "lens":
        return <Shape sceneFunc={(ctx, sh) => { ctx.beginPath(); ctx.ellipse(0, 0, depth / 2 + 1, face / 2, 0, 0, Math.PI * 2); ctx.fillStrokeShape(sh); }} fill="rgba(111, 214, 200, 0.25)" stroke={selected ? stroke : THEME.accentStrong} strokeWidth={strokeWidth} />;
      case "iris":
        return (
          <>
            <Rect x={-depth / 2} y={-face / 2} width={depth} height={face * 0.35} fill={stroke} />
            <Rect x={-depth / 2} y={face * 0.15} width={depth} height={face * 0.35} fill={stroke} />
          </>
        );
      case "slab":
        return <Rect x={-depth / 2} y={-face / 2} width={depth} height={face} fill="rgba(255, 207, 92, 0.25)" stroke={selected ? stroke : THEME.warn} strokeWidth={strokeWidth} />;
      case "block":
        return (
          <>
            <Rect x={-depth / 2} y={-face / 2} width={depth} height={face} fill={THEME.muted} stroke={stroke} strokeWidth={strokeWidth} />
            <Line points={[-depth / 2, -face / 2, depth / 2, face / 2]} stroke={THEME.ink} strokeWidth={2} />
            <Line points={[depth / 2, -face / 2, -depth / 2, face / 2]} stroke={THEME.ink} strokeWidth={2} />
          </>
        );
      case "bar":
        return <Rect x={-depth / 2} y={-face / 2} width={depth} height={face} fill={THEME.text} stroke={stroke} strokeWidth={selected ? 2.5 : 0} />;
      case "mirror":
        return (
          <>
            <Rect x={-depth} y={-face / 2} width={depth} height={face} fill="#55656d" stroke={stroke} strokeWidth={strokeWidth} />
            <Line points={[0, -face / 2, 0, face / 2]} stroke={THEME.accentStrong} strokeWidth={3} />
          </>
        );
      case "cube":
        return (
          <>
            <Rect x={-face / 2} y={-face / 2} width={face} height={face} fill="rgba(111, 214, 200, 0.12)" stroke={stroke} strokeWidth={strokeWidth} />
            {/* the reflecting diagonal lies along the face (perpendicular to the normal) */}
            <Line points={[0, -face / 2, 0, face / 2]} stroke={THEME.accentStrong} strokeWidth={2} />
          </>
        );
      case "plate":
        return <Rect x={-depth / 2} y={-face / 2} width={depth} height={face} fill="rgba(238, 243, 241, 0.2)" stroke={selected ? stroke : THEME.text} strokeWidth={strokeWidth} dash={[3, 2]} />;
    }
  })();
  return (
    <Group
      x={x}
      y={y}
      draggable={draggable}
      data-element-id={element.id}
      onMouseDown={(e) => {
        e.cancelBubble = true;
        events.pick(element.id, e.evt.shiftKey);
      }}
      onTouchStart={(e) => {
        e.cancelBubble = true;
        events.pick(element.id, false);
      }}
      onDragStart={() => events.dragStart(element.id)}
      onDragMove={(e) => events.dragMove(e.target, element)}
      onDragEnd={events.dragEnd}
    >
      <Group rotation={-element.angleDeg}>
        {/* a generous invisible hit area, so small optics are easy to take */}
        <Rect x={-Math.max(face, depth, 18) / 2 - (laser ? depth / 2 : 0)} y={-Math.max(face, 18) / 2} width={Math.max(face, depth, 18)} height={Math.max(face, 18)} fill="rgba(0,0,0,0)" />
        {body}
      </Group>
      {flagged ? <Circle radius={Math.max(face, depth) / 2 + 8} stroke={THEME.danger} strokeWidth={2} dash={[4, 3]} listening={false} /> : null}
      {/* the name sits above the symbol; a laser's above the middle of its body, clear of the turning handle */}
      <Text
        x={laser ? -Math.cos((element.angleDeg * Math.PI) / 180) * (depth / 2) - 20 : 8}
        y={(laser ? Math.sin((element.angleDeg * Math.PI) / 180) * (depth / 2) : 0) - Math.max(face, 18) / 2 - 14}
        text={element.id}
        fontSize={11}
        fill={selected ? THEME.accentStrong : THEME.muted}
        listening={false}
      />
    </Group>
  );
});

function RotateHandle({ element, cx, cy, onTurn, toMm }: { element: TableElement; cx: number; cy: number; onTurn: (angleDeg: number, session: string) => void; toMm: (px: number, py: number) => PointMm }) {
  const a = (element.angleDeg * Math.PI) / 180;
  const hx = cx + Math.cos(a) * HANDLE_PX;
  const hy = cy - Math.sin(a) * HANDLE_PX;
  const session = useRef("turn-0");
  return (
    <Group>
      <Line points={[cx, cy, hx, hy]} stroke={THEME.accentStrong} strokeWidth={1.5} dash={[3, 3]} listening={false} />
      <Circle
        x={hx}
        y={hy}
        radius={7}
        fill={THEME.ink}
        stroke={THEME.accentStrong}
        strokeWidth={2}
        draggable
        name="rotate-handle"
        onMouseDown={(e) => {
          e.cancelBubble = true;
        }}
        onDragStart={() => {
          session.current = `turn-${++dragSessions}`;
        }}
        onDragMove={(e) => {
          const node = e.target;
          const p = toMm(node.x(), node.y());
          const c = toMm(cx, cy);
          const angleDeg = handleAngle(c, p, e.evt.shiftKey);
          if (angleDeg !== element.angleDeg) onTurn(angleDeg, session.current);
        }}
        onDragEnd={(e) => {
          // the handle goes back onto the element's circle
          const b = (element.angleDeg * Math.PI) / 180;
          e.target.position({ x: cx + Math.cos(b) * HANDLE_PX, y: cy - Math.sin(b) * HANDLE_PX });
        }}
      />
    </Group>
  );
}
