"use client";
// Our element symbols on the Konva canvas. Each kind differs by outline, not by colour alone:
// laser = box with an output chevron, lens = biconvex or biconcave outline, aperture = two plates with a gap,
// filter = hatched slab, beam block = solid block with a cross, screen = tall bar with a foot and a bracket.
import { Group, Line, Path, Rect, Shape } from "react-konva";
import type { BenchElement } from "@/lib/bench/schema";
import { SYMBOL_COLOURS } from "./palette-colours";

export const SYMBOL_HALF_HEIGHT = 46;
const gap = (halfPx: number) => Math.min(SYMBOL_HALF_HEIGHT - 8, Math.max(3, halfPx));

/** apertureHalfPx: the opening's half-height drawn to the same vertical scale as the beam (clamped to the symbol). */
export function CanvasSymbol({ element, apertureHalfPx = 10 }: { element: BenchElement; apertureHalfPx?: number }) {
  const c = SYMBOL_COLOURS;
  switch (element.kind) {
    case "laser":
      return (
        <Group>
          <Rect x={-46} y={-18} width={42} height={36} cornerRadius={3} fill={c.laserFill} stroke={c.laser} strokeWidth={2} />
          <Line points={[-36, -18, -36, -26, -14, -26, -14, -18]} stroke={c.laser} strokeWidth={2} />
          <Line points={[-4, -10, 8, 0, -4, 10]} closed fill={c.laser} stroke={c.laser} strokeWidth={1} />
        </Group>
      );
    case "lens": {
      const converging = element.focalLengthMm > 0;
      const d = converging
        ? "M0,-42 Q14,0 0,42 Q-14,0 0,-42 Z"
        : "M-9,-42 L9,-42 Q2,0 9,42 L-9,42 Q-2,0 -9,-42 Z";
      return (
        <Group>
          <Path data={d} fill={c.lensFill} stroke={c.lens} strokeWidth={2} />
          {converging ? null : <Line points={[-9, -42, 9, -42]} stroke={c.lens} strokeWidth={3} />}
        </Group>
      );
    }
    case "aperture":
      return (
        <Group>
          <Rect x={-4} y={-SYMBOL_HALF_HEIGHT} width={8} height={SYMBOL_HALF_HEIGHT - gap(apertureHalfPx)} fill={c.aperture} />
          <Rect x={-4} y={gap(apertureHalfPx)} width={8} height={SYMBOL_HALF_HEIGHT - gap(apertureHalfPx)} fill={c.aperture} />
          <Line points={[-9, -gap(apertureHalfPx), 9, -gap(apertureHalfPx)]} stroke={c.aperture} strokeWidth={2} />
          <Line points={[-9, gap(apertureHalfPx), 9, gap(apertureHalfPx)]} stroke={c.aperture} strokeWidth={2} />
        </Group>
      );
    case "filter":
      return (
        <Group>
          <Rect x={-7} y={-34} width={14} height={68} stroke={c.filter} strokeWidth={2} fill={c.filterFill} />
          <Shape
            sceneFunc={(ctx, shape) => {
              ctx.beginPath();
              for (let y = -34; y <= 20; y += 9) {
                ctx.moveTo(-7, y + 14);
                ctx.lineTo(7, y);
              }
              ctx.strokeShape(shape);
            }}
            stroke={c.filter}
            strokeWidth={1.5}
            listening={false}
          />
        </Group>
      );
    case "beam-block":
      return (
        <Group>
          <Rect x={-11} y={-26} width={22} height={52} fill={c.block} cornerRadius={2} />
          <Line points={[-8, -22, 8, 22]} stroke={c.blockMark} strokeWidth={3} />
          <Line points={[8, -22, -8, 22]} stroke={c.blockMark} strokeWidth={3} />
        </Group>
      );
    case "screen":
      return (
        <Group>
          <Rect x={-2.5} y={-46} width={5} height={92} fill={c.screen} />
          <Line points={[-10, -46, -2, -46]} stroke={c.screen} strokeWidth={2} />
          <Line points={[-10, 46, -2, 46]} stroke={c.screen} strokeWidth={2} />
          <Line points={[-10, -46, -10, -38]} stroke={c.screen} strokeWidth={2} />
          <Line points={[-10, 46, -10, 38]} stroke={c.screen} strokeWidth={2} />
        </Group>
      );
  }
}
