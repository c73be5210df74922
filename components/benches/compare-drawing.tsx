import type { BenchDocument, BenchElement } from "@/lib/bench/schema";
import { KIND_WORDS } from "@/components/review/format";
import { markTag, type ElementMarks, type Mark, type RevisionMarks } from "./revision-marks";

// One revision's side view for the compare page, in the look of the review's static drawing (bench-drawing.tsx) but on
// a rail range shared by both revisions, so a moved element stands visibly elsewhere in the two drawings. Elements
// that moved, changed, were added or removed carry a tag (shape + word) and a dashed frame; the "to" drawing also
// shows where moved and removed elements used to stand (dashed outlines) with an arrow for each move.
const WIDTH = 1000;
const HEIGHT = 236;
/** The "to" drawing gets one more row at the bottom for the tags of removed elements. */
const GHOST_ROW = 26;
const MARGIN = 56;
const AXIS_Y = 112;
const RAIL_Y = AXIS_Y + 46;
const ARROW_Y = RAIL_Y + 14;

const MARK_STROKE: Record<Mark, string> = { added: "stroke-ok", removed: "stroke-danger", moved: "stroke-warn", changed: "stroke-accent" };
const MARK_FILL: Record<Mark, string> = { added: "fill-ok/15", removed: "fill-danger/15", moved: "fill-warn/15", changed: "fill-accent/15" };
const mainMark = (m: ElementMarks | undefined): Mark | null => (m && m.marks.length ? m.marks[0] : null);

function Symbol({ element, x, ghost = false }: { element: BenchElement; x: number; ghost?: boolean }) {
  const stroke = ghost ? "stroke-muted" : "stroke-text";
  const dash = ghost ? "5 4" : undefined;
  const fillOr = (cls: string) => (ghost ? "fill-none" : cls);
  switch (element.kind) {
    case "laser":
      return <rect x={x - 34} y={AXIS_Y - 14} width={34} height={28} rx={3} className={`${fillOr("fill-raised")} ${stroke}`} strokeWidth={2} strokeDasharray={dash} />;
    case "lens":
      return element.focalLengthMm > 0 ? (
        <ellipse cx={x} cy={AXIS_Y} rx={6} ry={30} className={`${fillOr("fill-accent/20")} ${stroke}`} strokeWidth={2} strokeDasharray={dash} />
      ) : (
        <path
          d={`M ${x - 7} ${AXIS_Y - 30} Q ${x} ${AXIS_Y} ${x - 7} ${AXIS_Y + 30} L ${x + 7} ${AXIS_Y + 30} Q ${x} ${AXIS_Y} ${x + 7} ${AXIS_Y - 30} Z`}
          className={`${fillOr("fill-accent/20")} ${stroke}`}
          strokeWidth={2}
          strokeDasharray={dash}
        />
      );
    case "aperture":
      return (
        <g className={stroke} strokeWidth={ghost ? 2 : 5} strokeDasharray={dash}>
          <line x1={x} y1={AXIS_Y - 34} x2={x} y2={AXIS_Y - 8} />
          <line x1={x} y1={AXIS_Y + 8} x2={x} y2={AXIS_Y + 34} />
        </g>
      );
    case "filter":
      return <rect x={x - 4} y={AXIS_Y - 26} width={8} height={52} className={`${fillOr("fill-muted/40")} ${stroke}`} strokeWidth={1.5} strokeDasharray={dash} />;
    case "beam-block":
      return <rect x={x - 7} y={AXIS_Y - 22} width={14} height={44} className={`${fillOr("fill-text")} ${stroke}`} strokeWidth={1.5} strokeDasharray={dash} />;
    case "screen":
      return <line x1={x} y1={AXIS_Y - 40} x2={x} y2={AXIS_Y + 40} className={stroke} strokeWidth={ghost ? 2 : 4} strokeDasharray={dash} />;
    default:
      return <circle cx={x} cy={AXIS_Y} r={6} className={stroke} strokeDasharray={dash} />;
  }
}

function Tag({ x, y, text, mark }: { x: number; y: number; text: string; mark: Mark }) {
  const widthPx = Math.max(60, text.length * 7.4 + 14);
  const left = Math.min(Math.max(x - widthPx / 2, 2), WIDTH - widthPx - 2);
  return (
    <g>
      <rect x={left} y={y} width={widthPx} height={20} rx={10} className={`${MARK_STROKE[mark]} ${MARK_FILL[mark]}`} strokeWidth={1.5} />
      <text x={left + widthPx / 2} y={y + 14} textAnchor="middle" className="fill-text text-[12.5px] font-semibold">
        {text}
      </text>
    </g>
  );
}

type Props = {
  doc: BenchDocument;
  side: "from" | "to";
  number: number;
  marks: RevisionMarks;
  /** The other revision's document, for the outlines of where moved and removed elements stood. */
  other: BenchDocument;
};

export function CompareDrawing({ doc, side, number, marks, other }: Props) {
  const { min, max } = marks.rangeMm;
  const x = (mm: number) => MARGIN + ((mm - min) / (max - min)) * (WIDTH - 2 * MARGIN);
  const elements = [...doc.elements].sort((a, b) => a.positionMm - b.positionMm);
  const laser = elements.find((e) => e.kind === "laser");
  const stop = elements.find((e) => laser && e.positionMm > laser.positionMm && (e.kind === "screen" || e.kind === "beam-block"));
  // In the "to" drawing: outlines where moved elements stood and where removed ones were.
  const ghosts =
    side === "to"
      ? other.elements.filter((e) => {
          const m = marks.byId.get(e.id);
          return m && (m.marks.includes("removed") || m.marks.includes("moved"));
        })
      : [];
  const removedGhosts = ghosts.filter((g) => marks.byId.get(g.id)?.marks.includes("removed"));
  const height = HEIGHT + (removedGhosts.length > 0 ? GHOST_ROW : 0);
  const marked = elements.filter((e) => (marks.byId.get(e.id)?.marks.length ?? 0) > 0).length + (side === "to" ? ghosts.filter((g) => marks.byId.get(g.id)?.marks.includes("removed")).length : 0);
  const description = elements.map((e) => {
    const m = marks.byId.get(e.id);
    const tag = m ? markTag(m, side) : null;
    return `${KIND_WORDS[e.kind] ?? e.kind} ${e.id} at ${e.positionMm} mm${tag ? ` (${tag.replace(/^[+−↔~] /, "")})` : ""}`;
  });

  return (
    <figure className="rounded-lg border border-line bg-panel p-3" data-testid={`compare-drawing-${side}`}>
      <figcaption className="mb-1 flex flex-wrap items-baseline gap-2">
        <span className="font-semibold">{side === "from" ? "From" : "To"}: revision {number}</span>
        <span className="text-sm text-muted">{marked === 0 ? "nothing marked" : `${marked} element${marked === 1 ? "" : "s"} marked`}</span>
      </figcaption>
      {elements.length === 0 ? (
        <p className="rounded-lg border border-dashed border-line p-4 text-muted">Revision {number} has no elements.</p>
      ) : (
        <svg viewBox={`0 0 ${WIDTH} ${height}`} className="h-auto w-full" role="img" aria-label={`Side view of revision ${number}: ${description.join(", ")}`}>
          <line x1={MARGIN - 40} y1={RAIL_Y} x2={WIDTH - MARGIN + 40} y2={RAIL_Y} className="stroke-line" strokeWidth={6} strokeLinecap="round" />
          {laser ? <line x1={x(laser.positionMm)} y1={AXIS_Y} x2={stop ? x(stop.positionMm) : WIDTH - 4} y2={AXIS_Y} className="stroke-accent" strokeWidth={2.5} strokeDasharray={stop ? undefined : "8 6"} /> : null}
          {ghosts.map((g) => {
            const m = marks.byId.get(g.id)!;
            const gx = x(g.positionMm);
            const moved = m.marks.includes("moved") && m.toMm !== null;
            return (
              <g key={`ghost-${g.id}`} data-ghost-of={g.id} data-mark={m.marks.join(" ")}>
                <Symbol element={g} x={gx} ghost />
                {moved ? (
                  <g className="stroke-warn" strokeWidth={2}>
                    <line x1={gx} y1={ARROW_Y} x2={x(m.toMm!)} y2={ARROW_Y} />
                    <path d={arrowHead(gx, x(m.toMm!))} className="fill-warn" />
                  </g>
                ) : (
                  <>
                    <line x1={gx - 14} y1={AXIS_Y - 14} x2={gx + 14} y2={AXIS_Y + 14} className="stroke-danger" strokeWidth={2.5} />
                    <line x1={gx - 14} y1={AXIS_Y + 14} x2={gx + 14} y2={AXIS_Y - 14} className="stroke-danger" strokeWidth={2.5} />
                    <line x1={gx} y1={AXIS_Y + 40} x2={gx} y2={height - 22} className="stroke-danger" strokeWidth={1} strokeDasharray="2 3" />
                    <Tag x={gx} y={height - 22} text={`− ${g.id} removed`} mark="removed" />
                  </>
                )}
              </g>
            );
          })}
          {elements.map((e, i) => {
            const ex = x(e.positionMm);
            const below = i % 2 === 1;
            const m = marks.byId.get(e.id);
            const mark = mainMark(m);
            const tag = m ? markTag(m, side) : null;
            return (
              <g key={e.id} data-element-id={e.id} data-mark={m?.marks.join(" ") ?? ""}>
                {mark ? <rect x={ex - 24} y={AXIS_Y - 48} width={48} height={96} rx={6} className={`${MARK_STROKE[mark]} fill-none`} strokeWidth={2} strokeDasharray="6 4" /> : null}
                <Symbol element={e} x={ex} />
                <text x={ex} y={below ? RAIL_Y + 32 : 44} textAnchor="middle" className={`fill-text text-[13px] ${mark ? "font-bold" : "font-medium"}`}>
                  {e.id}
                </text>
                <text x={ex} y={below ? RAIL_Y + 47 : 58} textAnchor="middle" className="fill-muted text-[12px]">
                  {e.positionMm} mm
                </text>
                {tag && mark ? <Tag x={ex} y={below ? HEIGHT - 22 : 2} text={tag} mark={mark} /> : null}
              </g>
            );
          })}
        </svg>
      )}
    </figure>
  );
}

function arrowHead(fromX: number, toX: number): string {
  const dir = toX >= fromX ? 1 : -1;
  return `M ${toX} ${ARROW_Y} L ${toX - dir * 9} ${ARROW_Y - 5} L ${toX - dir * 9} ${ARROW_Y + 5} Z`;
}
