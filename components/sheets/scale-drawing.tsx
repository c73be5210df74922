import type { BenchDocument, BenchElement } from "@/lib/bench/schema";

// The bench at a stated scale for print: the SVG's user unit is one millimetre of paper, so at 100 %
// printing the rail is exactly 1:scale. Heights are not to scale. Dimension lines run from the laser
// (the datum) to every element, one row each, so each distance can be read and measured directly.
const NICE_SCALES = [1, 2, 2.5, 5, 10, 20, 25, 50, 100, 200, 250, 500, 1000, 2000, 5000];
const PAPER_WIDTH_MM = 176;
const SIDE_MM = 10;
const LABEL_TOP = 5;
const LABEL_ROW_MM = 4.6;
const ROW_MM = 6.5;
const TEXT = "#000";

export function chooseScale(lengthMm: number, availableMm = PAPER_WIDTH_MM - 2 * SIDE_MM): number {
  return NICE_SCALES.find((s) => lengthMm / s <= availableMm) ?? NICE_SCALES[NICE_SCALES.length - 1];
}

function Symbol({ e, x, y }: { e: BenchElement; x: number; y: number }) {
  switch (e.kind) {
    case "laser":
      return <rect x={x - 9} y={y - 4} width={9} height={8} fill="#fff" stroke={TEXT} strokeWidth={0.5} />;
    case "lens":
      return e.focalLengthMm > 0 ? (
        <ellipse cx={x} cy={y} rx={1.3} ry={7} fill="#e6e6e6" stroke={TEXT} strokeWidth={0.45} />
      ) : (
        <path d={`M ${x - 1.6} ${y - 7} Q ${x} ${y} ${x - 1.6} ${y + 7} L ${x + 1.6} ${y + 7} Q ${x} ${y} ${x + 1.6} ${y - 7} Z`} fill="#e6e6e6" stroke={TEXT} strokeWidth={0.45} />
      );
    case "aperture":
      return (
        <g stroke={TEXT} strokeWidth={1.2}>
          <line x1={x} y1={y - 8} x2={x} y2={y - 1.6} />
          <line x1={x} y1={y + 1.6} x2={x} y2={y + 8} />
        </g>
      );
    case "filter":
      return <rect x={x - 0.9} y={y - 6} width={1.8} height={12} fill="#bbb" stroke={TEXT} strokeWidth={0.35} />;
    case "beam-block":
      return <rect x={x - 1.6} y={y - 5} width={3.2} height={10} fill={TEXT} />;
    case "screen":
      return <line x1={x} y1={y - 9} x2={x} y2={y + 9} stroke={TEXT} strokeWidth={1} />;
    default:
      return <circle cx={x} cy={y} r={1.5} stroke={TEXT} fill="none" />;
  }
}

function Arrow({ x, y, pointsLeft }: { x: number; y: number; pointsLeft: boolean }) {
  const d = pointsLeft ? `M ${x} ${y} l 1.8 -0.7 l 0 1.4 Z` : `M ${x} ${y} l -1.8 -0.7 l 0 1.4 Z`;
  return <path d={d} fill={TEXT} />;
}

export function ScaleDrawing({ doc }: { doc: BenchDocument }) {
  const elements = [...doc.elements].sort((a, b) => a.positionMm - b.positionMm || a.id.localeCompare(b.id));
  if (elements.length === 0) return null;
  const laser = elements.find((e) => e.kind === "laser");
  const datum = laser?.positionMm ?? elements[0].positionMm;
  const min = elements[0].positionMm;
  const max = Math.max(elements[elements.length - 1].positionMm, min + 1);
  const scale = chooseScale(max - min);
  const x = (mm: number) => SIDE_MM + (mm - min) / scale;
  // Element names above the drawing, on as many rows as needed so that neighbours never overlap.
  const rowEnds: number[] = [];
  const labelRows = elements.map((e) => {
    const half = (e.id.length * 2.1) / 2 + 1;
    const cx = x(e.positionMm);
    let row = rowEnds.findIndex((end) => end < cx - half);
    if (row === -1) row = rowEnds.length;
    rowEnds[row] = cx + half;
    return row;
  });
  const AXIS_Y = LABEL_TOP + rowEnds.length * LABEL_ROW_MM + 10;
  const axisY = AXIS_Y;
  const stop = elements.find((e) => laser && e.positionMm > laser.positionMm && (e.kind === "screen" || e.kind === "beam-block"));
  const dims = elements.filter((e) => e !== laser);
  const dimTop = AXIS_Y + 16;
  const barTop = dimTop + dims.length * ROW_MM + 6;
  const height = barTop + 14;
  // A scale bar of a round real length, about a quarter of the drawing.
  const barMm = chooseBar((max - min) / 4);
  const barPaper = barMm / scale;
  return (
    <figure className="scale-drawing">
      <svg width={`${PAPER_WIDTH_MM}mm`} height={`${height}mm`} viewBox={`0 0 ${PAPER_WIDTH_MM} ${height}`} role="img" aria-label={`Bench drawn at scale 1:${scale}`} fontFamily="Inter Variable, sans-serif">
        {/* rail */}
        <line x1={x(min) - 4} y1={AXIS_Y + 11} x2={x(max) + 4} y2={AXIS_Y + 11} stroke="#999" strokeWidth={1.6} />
        {laser ? <line x1={x(laser.positionMm)} y1={AXIS_Y} x2={stop ? x(stop.positionMm) : PAPER_WIDTH_MM - 2} y2={AXIS_Y} stroke="#c00" strokeWidth={0.6} strokeDasharray={stop ? undefined : "2 1.5"} /> : null}
        {elements.map((e, i) => {
          const ex = x(e.positionMm);
          const row = labelRows[i];
          const ly = LABEL_TOP + row * LABEL_ROW_MM;
          return (
            <g key={e.id}>
              <Symbol e={e} x={ex} y={axisY} />
              <text x={ex} y={ly} textAnchor="middle" fontSize={3.6} fontWeight={700} fill={TEXT}>
                {e.id}
              </text>
              <line x1={ex} y1={ly + 1.2} x2={ex} y2={axisY - 9} stroke="#777" strokeWidth={0.2} />
            </g>
          );
        })}
        {/* extension lines first, so every dimension's label (with its white halo) sits on top of them */}
        <g stroke="#777" strokeWidth={0.2}>
          {dims.length ? <line x1={x(datum)} y1={AXIS_Y + 9} x2={x(datum)} y2={dimTop + (dims.length - 1) * ROW_MM + 1.5} /> : null}
          {dims.map((e, i) => (
            <line key={`ext-${e.id}`} x1={x(e.positionMm)} y1={AXIS_Y + 9} x2={x(e.positionMm)} y2={dimTop + i * ROW_MM + 1.5} />
          ))}
        </g>
        {/* baseline dimensions from the laser */}
        {dims.map((e, i) => {
          const y = dimTop + i * ROW_MM;
          const x0 = x(datum);
          const x1 = x(e.positionMm);
          const distance = e.positionMm - datum;
          const label = `${e.id}: ${Number(distance.toFixed(2))} mm`;
          const labelMm = label.length * 2.0;
          const left = Math.min(x0, x1);
          const right = Math.max(x0, x1);
          // Centred over the line when it fits between the arrows, else beside it on whichever side has room.
          const inside = right - left > labelMm + 4;
          const textX = inside ? (left + right) / 2 : right + 1.5 + labelMm < PAPER_WIDTH_MM ? right + 1.5 : left - 1.5;
          const anchor = inside ? "middle" : textX > right ? "start" : "end";
          return (
            <g key={`dim-${e.id}`}>
              <line x1={x0} y1={y} x2={x1} y2={y} stroke={TEXT} strokeWidth={0.3} />
              <Arrow x={left} y={y} pointsLeft />
              <Arrow x={right} y={y} pointsLeft={false} />
              <text x={textX} y={inside ? y - 0.9 : y + 1.3} textAnchor={anchor} fontSize={3.6} fontWeight={600} fill={TEXT} stroke="#fff" strokeWidth={1.1} paintOrder="stroke">
                {label}
              </text>
            </g>
          );
        })}
        {/* scale bar */}
        <g>
          <rect x={SIDE_MM} y={barTop} width={barPaper / 2} height={2} fill={TEXT} />
          <rect x={SIDE_MM + barPaper / 2} y={barTop} width={barPaper / 2} height={2} fill="#fff" stroke={TEXT} strokeWidth={0.3} />
          <text x={SIDE_MM} y={barTop + 6.5} fontSize={3.2} fill={TEXT}>
            0
          </text>
          <text x={SIDE_MM + barPaper} y={barTop + 6.5} fontSize={3.2} textAnchor="middle" fill={TEXT}>
            {barMm} mm
          </text>
          {/* two short lines, so the sentence stays inside the drawing whatever the bar's length */}
          <text x={SIDE_MM + barPaper + 12} y={barTop + 1.6} fontSize={3.6} fontWeight={700} fill={TEXT} data-testid="scale-words">
            <tspan x={SIDE_MM + barPaper + 12}>Scale 1:{scale} along the rail (printed at 100 %);</tspan>
            <tspan x={SIDE_MM + barPaper + 12} dy={4.6}>
              heights not to scale
            </tspan>
          </text>
        </g>
      </svg>
      <figcaption>
        Distances are measured along the beam from the laser{laser && laser.positionMm !== 0 ? ` (drawn at ${laser.positionMm} mm; rail position = ${laser.positionMm} mm + distance)` : ""}.
        {stop ? ` The beam ends at ${stop.id}.` : " No beam block or screen stops the beam (dashed): add one before switching on."}
      </figcaption>
    </figure>
  );
}

function chooseBar(targetMm: number): number {
  const steps = [1, 2, 5, 10, 20, 25, 50, 100, 200, 250, 500, 1000, 2000, 5000, 10000];
  return [...steps].reverse().find((s) => s <= targetMm) ?? 1;
}
