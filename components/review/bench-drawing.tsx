import type { BenchDocument, BenchElement } from "@/lib/bench/schema";
import { KIND_WORDS } from "./format";

// A static side view of the bench: the rail, each element at its position, the beam from the laser
// to the first beam block or screen. Positions are to scale along the rail; heights are not.
// Drawn at about its printed size (never shrunk below MIN_WIDTH_PX: on a narrow screen it scrolls sideways instead), so
// the labels stay as large as the page's own small text.
const WIDTH = 760;
const HEIGHT = 196;
const MARGIN = 52;
const AXIS_Y = 80;
const MIN_WIDTH_PX = 640;

function Symbol({ element, x, pinned }: { element: BenchElement; x: number; pinned: boolean }) {
  const stroke = pinned ? "stroke-warn" : "stroke-text";
  switch (element.kind) {
    case "laser":
      return <rect x={x - 34} y={AXIS_Y - 14} width={34} height={28} rx={3} className={`fill-raised ${stroke}`} strokeWidth={2} />;
    case "lens":
      return element.focalLengthMm > 0 ? (
        <ellipse cx={x} cy={AXIS_Y} rx={6} ry={30} className={`fill-accent/20 ${stroke}`} strokeWidth={2} />
      ) : (
        <path d={`M ${x - 7} ${AXIS_Y - 30} Q ${x} ${AXIS_Y} ${x - 7} ${AXIS_Y + 30} L ${x + 7} ${AXIS_Y + 30} Q ${x} ${AXIS_Y} ${x + 7} ${AXIS_Y - 30} Z`} className={`fill-accent/20 ${stroke}`} strokeWidth={2} />
      );
    case "aperture":
      return (
        <g className={stroke} strokeWidth={5}>
          <line x1={x} y1={AXIS_Y - 34} x2={x} y2={AXIS_Y - 8} />
          <line x1={x} y1={AXIS_Y + 8} x2={x} y2={AXIS_Y + 34} />
        </g>
      );
    case "filter":
      return <rect x={x - 4} y={AXIS_Y - 26} width={8} height={52} className={`fill-muted/40 ${stroke}`} strokeWidth={1.5} />;
    case "beam-block":
      return <rect x={x - 7} y={AXIS_Y - 22} width={14} height={44} className={`fill-text ${stroke}`} strokeWidth={1.5} />;
    case "screen":
      return <line x1={x} y1={AXIS_Y - 40} x2={x} y2={AXIS_Y + 40} className={stroke} strokeWidth={4} />;
    default:
      return <circle cx={x} cy={AXIS_Y} r={6} className={stroke} />;
  }
}

export function BenchDrawing({ doc, pinnedElementId }: { doc: BenchDocument; pinnedElementId?: string | null }) {
  const elements = [...doc.elements].sort((a, b) => a.positionMm - b.positionMm);
  if (elements.length === 0) return <p className="rounded-lg border border-dashed border-line p-4 text-muted">The bench has no elements yet.</p>;
  const min = elements[0].positionMm;
  const max = Math.max(elements[elements.length - 1].positionMm, min + 1);
  const x = (mm: number) => MARGIN + ((mm - min) / (max - min)) * (WIDTH - 2 * MARGIN);
  const laser = elements.find((e) => e.kind === "laser");
  const stop = elements.find((e) => laser && e.positionMm > laser.positionMm && (e.kind === "screen" || e.kind === "beam-block"));
  const beamEnd = stop ? x(stop.positionMm) : WIDTH - 4;
  // Labels alternate above and below so neighbours do not overlap.
  return (
    <figure className="rounded-lg border border-line bg-panel p-3">
      <div className="overflow-x-auto" tabIndex={0} aria-label="Side view of the bench (scrolls sideways on a narrow screen)">
      <svg viewBox={`0 0 ${WIDTH} ${HEIGHT}`} className="h-auto w-full" style={{ minWidth: MIN_WIDTH_PX }} role="img" aria-label={`Side view of the bench: ${elements.map((e) => `${KIND_WORDS[e.kind] ?? e.kind} ${e.id} at ${e.positionMm} mm`).join(", ")}`}>
        <line x1={MARGIN - 30} y1={AXIS_Y + 46} x2={WIDTH - MARGIN + 30} y2={AXIS_Y + 46} className="stroke-line" strokeWidth={6} strokeLinecap="round" />
        {laser ? <line x1={x(laser.positionMm)} y1={AXIS_Y} x2={beamEnd} y2={AXIS_Y} className="stroke-accent" strokeWidth={2.5} strokeDasharray={stop ? undefined : "8 6"} /> : null}
        {elements.map((e, i) => {
          const ex = x(e.positionMm);
          const below = i % 2 === 1;
          return (
            <g key={e.id} data-element-id={e.id}>
              <Symbol element={e} x={ex} pinned={pinnedElementId === e.id} />
              <text x={ex} y={below ? AXIS_Y + 76 : 18} textAnchor="middle" className="fill-text text-[16px] font-medium">
                {e.id}
              </text>
              <text x={ex} y={below ? AXIS_Y + 95 : 36} textAnchor="middle" className="fill-muted text-[14px]">
                {e.positionMm} mm
              </text>
            </g>
          );
        })}
      </svg>
      </div>
      <figcaption className="mt-1 text-sm text-muted">
        Side view, to scale along the rail only. {stop ? `The beam ends at ${stop.id}.` : "No beam block or screen stops the beam (dashed)."}
      </figcaption>
    </figure>
  );
}
