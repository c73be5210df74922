import type { BenchDocumentV2 } from "@/lib/bench/schema-v2";
import type { TableAnalysis } from "@/lib/optics/table";
import type { TableSafetyAssessment } from "@/lib/safety/table";
import { tablePlan, type HazardBand } from "./table-plan-geometry";

// A read-only top view of an optical table at true scale: the hole grid, every element's outline turned to its angle,
// every path's beam coloured by its hazard band, and the beams that leave the table marked at the edge. No hooks and
// no browser APIs, so the review screen and the printed build sheet can both render it on the server.

const BAND_COLOUR: Record<HazardBand, string> = {
  "above-mpe": "var(--color-danger)",
  "below-mpe": "var(--color-ok)",
  unknown: "var(--color-accent)",
};
const BAND_WORDS: Record<HazardBand, string> = {
  "above-mpe": "above the MPE (eyewear needed)",
  "below-mpe": "within the MPE",
  unknown: "not assessed",
};

const fmt = (v: number) => (Number.isFinite(v) ? String(Number(v.toPrecision(3))) : "unbounded");

type Props = {
  doc: BenchDocumentV2;
  analysis: TableAnalysis;
  safety?: Pick<TableSafetyAssessment, "points" | "openBeams"> | null;
  /** Distinguishes the hole pattern when several plans share a page. */
  idPrefix?: string;
  /** Hide the legend (the build sheet prints its own). */
  legend?: boolean;
  /**
   * Draw the nominal hazard zone: beyond the edge, each open beam above the MPE as a red corridor out to its NOHD (cut
   * at the drawing's margin, with the distance written), and round each screen its diffuse-reflection hazard zone.
   */
  zones?: { screenHazards?: readonly { elementId: string; diffuseReflectionNhzM: number }[] } | null;
  /**
   * The height of labels in table millimetres. On screen the default (1/70 of the longer side) scales with the view;
   * the build sheet passes a size that prints at a readable height whatever the scale.
   */
  labelMm?: number;
  /** Number the holes along the front and left edges (every fifth, and the first), so a position can be counted on paper. */
  holeNumbers?: boolean;
};

/** The hole numbers written along an edge: the first, every fifth, and the last when it is not too close to a fifth. */
export function numberedHoles(count: number): number[] {
  const out: number[] = [];
  for (let n = 1; n <= count; n++) if (n === 1 || n % 5 === 0 || (n === count && n % 5 > 2)) out.push(n);
  return out;
}

export function TablePlan({ doc, analysis, safety = null, idPrefix = "table-plan", legend = true, zones = null, labelMm, holeNumbers = false }: Props) {
  const plan = tablePlan(doc, analysis, safety);
  const { widthMm: w, depthMm: d } = plan;
  const size = Math.max(w, d);
  const margin = size * (zones ? 0.14 : 0.04);
  const text = labelMm ?? size / 70;
  const holeX = (column: number) => plan.holes.offsetMm + (column - 1) * plan.holePitchMm;
  const beamWidth = size / 400;
  const flipY = (y: number) => d - y;
  const patternId = `${idPrefix}-holes`;
  const arrowId = `${idPrefix}-arrow`;
  const openAbove = plan.openBeams.filter((o) => o.exceedsMpe).length;
  // beams leaving at the same point (a window's two ghosts) share one mark
  const groups = new Map<string, typeof plan.openBeams>();
  for (const o of plan.openBeams) {
    const key = `${Math.round(o.xMm * 10)}:${Math.round(o.yMm * 10)}`;
    groups.set(key, [...(groups.get(key) ?? []), o]);
  }
  const openGroups = [...groups].map(([key, beams]) => ({ key, beams }));
  const summary = `Top view of the ${fmt(w)} × ${fmt(d)} mm table with ${plan.elements.length} elements and ${plan.beams.length} beam segments; ${plan.openBeams.length} beam${plan.openBeams.length === 1 ? "" : "s"} leave${plan.openBeams.length === 1 ? "s" : ""} the table${plan.openBeams.length ? `, ${openAbove} above the MPE` : ""}.`;

  return (
    <figure className="space-y-2">
      <svg viewBox={`${-margin} ${-margin} ${w + 2 * margin} ${d + 2 * margin}`} className="h-auto w-full" role="img" aria-label={summary}>
        <defs>
          <pattern id={patternId} x={plan.holes.offsetMm - plan.holePitchMm / 2} y={plan.holes.offsetMm - plan.holePitchMm / 2} width={plan.holePitchMm} height={plan.holePitchMm} patternUnits="userSpaceOnUse">
            <circle cx={plan.holePitchMm / 2} cy={plan.holePitchMm / 2} r={plan.holePitchMm * 0.12} fill="var(--color-line)" />
          </pattern>
          <marker id={arrowId} viewBox="0 0 10 10" refX="5" refY="5" markerWidth="4" markerHeight="4" orient="auto-start-reverse">
            <path d="M 0 0 L 10 5 L 0 10 z" fill="var(--color-danger)" />
          </marker>
        </defs>
        <rect x={0} y={0} width={w} height={d} fill="var(--color-raised)" stroke="var(--color-line)" strokeWidth={beamWidth} />
        <rect x={0} y={0} width={w} height={d} fill={`url(#${patternId})`} />
        {holeNumbers ? (
          <g data-testid="hole-numbers" fill="var(--color-muted)" fontSize={text * 0.8}>
            {numberedHoles(plan.holes.columns).map((n) => (
              <g key={`c${n}`}>
                <line x1={holeX(n)} y1={d} x2={holeX(n)} y2={d + text * 0.5} stroke="var(--color-muted)" strokeWidth={beamWidth * 0.6} />
                <text x={holeX(n)} y={d + text * 1.4} textAnchor="middle">
                  {n}
                </text>
              </g>
            ))}
            {numberedHoles(plan.holes.rows).map((n) => (
              <g key={`r${n}`}>
                <line x1={0} y1={flipY(holeX(n))} x2={-text * 0.5} y2={flipY(holeX(n))} stroke="var(--color-muted)" strokeWidth={beamWidth * 0.6} />
                <text x={-text * 0.7} y={flipY(holeX(n)) + text * 0.3} textAnchor="end">
                  {n}
                </text>
              </g>
            ))}
          </g>
        ) : null}
        {zones ? (
          <g data-testid="hazard-zone">
            {plan.openBeams
              .filter((o) => o.exceedsMpe)
              .map((o) => {
                // the corridor beyond the edge: as long as the NOHD, cut where the drawing ends
                const a = (o.directionDeg * Math.PI) / 180;
                const reachMm = Math.min(o.nohdM * 1000, margin * 0.92);
                const half = text * 0.9;
                const ux = Math.cos(a);
                const uy = Math.sin(a);
                const px = -uy * half;
                const py = ux * half;
                const far = { x: o.xMm + ux * reachMm, y: o.yMm + uy * reachMm };
                const pts = [
                  [o.xMm + px, o.yMm + py],
                  [far.x + px * 1.6, far.y + py * 1.6],
                  [far.x - px * 1.6, far.y - py * 1.6],
                  [o.xMm - px, o.yMm - py],
                ];
                return (
                  <polygon
                    key={`nhz-${o.pathId}`}
                    points={pts.map(([x, y]) => `${x},${flipY(y)}`).join(" ")}
                    fill="var(--color-danger)"
                    fillOpacity={0.22}
                    stroke="var(--color-danger)"
                    strokeWidth={beamWidth * 0.6}
                    strokeDasharray={o.nohdM * 1000 > reachMm ? `${beamWidth * 4} ${beamWidth * 2}` : undefined}
                    data-nhz-path={o.pathId}
                  >
                    <title>{`Nominal hazard zone of beam ${o.pathId}: along the beam to ${fmt(o.nohdM)} m beyond the table edge${o.nohdM * 1000 > reachMm ? " (drawn cut short)" : ""}`}</title>
                  </polygon>
                );
              })}
            {(zones.screenHazards ?? []).map((h) => {
              const screen = plan.elements.find((e) => e.id === h.elementId);
              if (!screen || !(h.diffuseReflectionNhzM > 0)) return null;
              return (
                <circle
                  key={`nhz-${h.elementId}`}
                  cx={screen.xMm}
                  cy={flipY(screen.yMm)}
                  r={Math.min(h.diffuseReflectionNhzM * 1000, size)}
                  fill="var(--color-danger)"
                  fillOpacity={0.1}
                  stroke="var(--color-danger)"
                  strokeWidth={beamWidth * 0.6}
                  strokeDasharray={`${beamWidth * 3} ${beamWidth * 2}`}
                  data-nhz-screen={h.elementId}
                >
                  <title>{`Diffuse-reflection hazard zone round ${h.elementId}: ${fmt(h.diffuseReflectionNhzM)} m`}</title>
                </circle>
              );
            })}
          </g>
        ) : null}
        {plan.beams.map((b) => (
          <line
            key={b.pathId}
            x1={b.from.xMm}
            y1={flipY(b.from.yMm)}
            x2={b.to.xMm}
            y2={flipY(b.to.yMm)}
            stroke={BAND_COLOUR[b.band]}
            strokeWidth={beamWidth * (b.band === "above-mpe" ? 1.6 : 1)}
            strokeDasharray={b.open ? `${beamWidth * 6} ${beamWidth * 3}` : undefined}
            markerEnd={b.open && b.band === "above-mpe" ? `url(#${arrowId})` : undefined}
            data-path-id={b.pathId}
            data-band={b.band}
          >
            <title>{`Beam ${b.pathId} of laser ${b.laserId}: ${fmt(b.powerMw)} mW at its start, ${BAND_WORDS[b.band]}${b.opticalDensityRequired > 0 ? `, OD ${fmt(b.opticalDensityRequired)}` : ""}${b.open ? ", leaves the table" : ""}`}</title>
          </line>
        ))}
        {plan.elements.map((e) => (
          <g key={e.id} data-element-id={e.id}>
            <polygon
              points={e.corners.map((c) => `${c.xMm},${flipY(c.yMm)}`).join(" ")}
              fill={e.kind === "beam-block" ? "var(--color-text)" : e.kind === "laser" ? "var(--color-panel)" : "var(--color-accent)"}
              fillOpacity={e.kind === "beam-block" || e.kind === "laser" ? 1 : 0.35}
              stroke={e.reached ? "var(--color-text)" : "var(--color-muted)"}
              strokeWidth={beamWidth * 0.8}
              strokeDasharray={e.reached ? undefined : `${beamWidth * 2} ${beamWidth * 2}`}
            >
              <title>{`${e.label} ${e.id} at (${fmt(e.xMm)}, ${fmt(e.yMm)}) mm, ${fmt(((e.angleDeg % 360) + 360) % 360)}°${e.reached ? "" : " — no beam reaches it"}`}</title>
            </polygon>
            <text x={e.xMm + text * 0.8} y={flipY(e.yMm) - text * 0.8} fontSize={text} fill="var(--color-text)">
              {e.id}
            </text>
          </g>
        ))}
        {openGroups.map(({ key, beams }) => {
          const o = beams[0];
          const above = beams.some((b) => b.exceedsMpe);
          const powerMw = Math.max(...beams.map((b) => b.powerMw));
          const nohdM = Math.max(...beams.map((b) => b.nohdM));
          const colour = above ? "var(--color-danger)" : "var(--color-warn)";
          return (
            <g key={key} data-open-beam={beams.map((b) => b.pathId).join(" ")}>
              <circle cx={o.xMm} cy={flipY(o.yMm)} r={text * 0.7} fill="none" stroke={colour} strokeWidth={beamWidth * 1.5} />
              <text x={Math.min(Math.max(o.xMm, text), w - text * 14)} y={Math.min(Math.max(flipY(o.yMm) + (o.yMm <= 0 ? text * 1.8 : -text), -margin + text), d + margin - text * 0.3)} fontSize={text} fill={colour}>
                {`${beams.length > 1 ? `${beams.length} open beams, up to` : "open beam"} ${fmt(powerMw)} mW${above ? `, NOHD ${fmt(nohdM)} m` : ""}`}
              </text>
            </g>
          );
        })}
      </svg>
      {legend ? (
        <figcaption className="text-sm text-muted">
          Top view to scale, holes every {fmt(plan.holePitchMm)} mm; y runs away from the viewer. Beams: red above the MPE, green within it; dashed where a beam
          leaves the table.{zones ? " Shaded red: the nominal hazard zone (open beams above the MPE out to their NOHD; dashed where cut short)." : ""} {plan.openBeams.length === 0 ? "Every beam ends on the table." : `${plan.openBeams.length} beam${plan.openBeams.length === 1 ? " leaves" : "s leave"} the table (circled).`}
        </figcaption>
      ) : null}
    </figure>
  );
}
