// How to read the beam on the drawing: the required eyewear OD bands in words, each with its swatch (fill, hatching,
// edge dash — not colour alone), and the finder's tick marks when an aperture is selected.
import { FINAL_SAY } from "@/lib/safety/types";
import { HAZARD_BANDS, type HazardSegment } from "./hazard-bands";
import { BAND_STYLES } from "./palette-colours";

function Swatch({ band }: { band: (typeof HAZARD_BANDS)[number] }) {
  const s = BAND_STYLES[band.id];
  const id = `hatch-${band.id}`;
  return (
    <svg width="44" height="18" viewBox="0 0 44 18" aria-hidden="true" className="shrink-0">
      <defs>
        <pattern id={id} width={s.hatch === "cross" ? 6 : 7} height={s.hatch === "cross" ? 6 : 7} patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
          <line x1="0" y1="0" x2="0" y2="8" stroke={s.edge} strokeWidth="1.2" />
          {s.hatch === "cross" ? <line x1="0" y1="0" x2="8" y2="0" stroke={s.edge} strokeWidth="1.2" /> : null}
        </pattern>
      </defs>
      <rect x="1" y="3" width="42" height="12" fill={s.fill} />
      {s.hatch !== "none" ? <rect x="1" y="3" width="42" height="12" fill={`url(#${id})`} /> : null}
      <line x1="1" y1="3" x2="43" y2="3" stroke={s.edge} strokeWidth={s.edgeWidth} strokeDasharray={s.dash?.join(" ")} />
      <line x1="1" y1="15" x2="43" y2="15" stroke={s.edge} strokeWidth={s.edgeWidth} strokeDasharray={s.dash?.join(" ")} />
    </svg>
  );
}

type Props = { assessed: boolean; shown: HazardSegment[]; finderFor: string | null };

export function HazardLegend({ assessed, shown, finderFor }: Props) {
  const present = new Set(shown.map((s) => s.band.id));
  return (
    <div className="flex flex-wrap items-center gap-x-4 gap-y-1.5 px-1 text-sm" data-testid="hazard-legend" data-bands-shown={[...present].join(" ")}>
      {assessed ? (
        <>
          <span className="text-muted">Beam by the computed eyewear OD need:</span>
          {HAZARD_BANDS.map((b) => (
            <span key={b.id} className={`inline-flex items-center gap-1.5 ${present.has(b.id) ? "" : "opacity-50"}`} title={b.pattern} data-band={b.id}>
              <Swatch band={b} />
              {b.words}
              {present.has(b.id) ? null : <span className="sr-only">(not on this beam)</span>}
            </span>
          ))}
        </>
      ) : (
        <span className="text-muted">Beam drawn plain: there is no hazard assessment for this drawing yet.</span>
      )}
      {assessed ? (
        <span className="basis-full text-xs text-muted" data-testid="legend-final-say">
          {FINAL_SAY}
        </span>
      ) : null}
      {finderFor ? (
        <span className="inline-flex items-center gap-1.5">
          <span className="text-muted">Ruler ticks for {finderFor}:</span> ● bright · ○ dark · ◐ between, number = half-period zones
        </span>
      ) : null}
    </div>
  );
}
