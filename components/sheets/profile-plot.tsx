// The radial intensity on the screen as a static SVG line plot for print (and the build page): x the
// distance from the axis in mm, y the intensity relative to the open beam's on-axis intensity.
const W = 300;
const H = 170;
const LEFT = 40;
const RIGHT = 10;
const TOP = 10;
const BOTTOM = 34;

function ticks(max: number, count = 4): number[] {
  if (!(max > 0)) return [0];
  const raw = max / count;
  const pow = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * pow).find((s) => s >= raw) ?? raw;
  const out: number[] = [];
  for (let v = 0; v <= max + 1e-9; v += step) out.push(Number(v.toPrecision(6)));
  return out;
}

export function ProfilePlot({ radiusMm, relativeIntensity, shadowRadiusMm, label, dark = false }: { radiusMm: number[]; relativeIntensity: number[]; shadowRadiusMm?: number | null; label: string; dark?: boolean }) {
  const ink = dark ? "#eef3f1" : "#000";
  const grid = dark ? "#33444d" : "#bbb";
  const maxR = radiusMm[radiusMm.length - 1] || 1;
  const maxI = Math.max(1, ...relativeIntensity);
  const xs = (r: number) => LEFT + (r / maxR) * (W - LEFT - RIGHT);
  const ys = (v: number) => TOP + (1 - v / maxI) * (H - TOP - BOTTOM);
  const d = radiusMm.map((r, i) => `${i ? "L" : "M"} ${xs(r).toFixed(2)} ${ys(relativeIntensity[i]).toFixed(2)}`).join(" ");
  return (
    <svg viewBox={`0 0 ${W} ${H}`} className="profile-plot" role="img" aria-label={label} fontFamily="Inter Variable, sans-serif">
      {ticks(maxI).map((t) => (
        <g key={`y${t}`}>
          <line x1={LEFT} x2={W - RIGHT} y1={ys(t)} y2={ys(t)} stroke={grid} strokeWidth={0.5} />
          <text x={LEFT - 4} y={ys(t) + 3.5} textAnchor="end" fontSize={10} fill={ink}>
            {t}
          </text>
        </g>
      ))}
      {ticks(maxR).map((t) => (
        <g key={`x${t}`}>
          <line x1={xs(t)} x2={xs(t)} y1={H - BOTTOM} y2={H - BOTTOM + 4} stroke={ink} strokeWidth={0.8} />
          <text x={xs(t)} y={H - BOTTOM + 14} textAnchor="middle" fontSize={10} fill={ink}>
            {t}
          </text>
        </g>
      ))}
      <line x1={LEFT} x2={W - RIGHT} y1={ys(1)} y2={ys(1)} stroke={ink} strokeWidth={0.8} strokeDasharray="3 3" />
      <text x={W - RIGHT} y={ys(1) - 3} textAnchor="end" fontSize={9} fill={ink}>
        open beam = 1
      </text>
      {shadowRadiusMm && shadowRadiusMm < maxR ? <line x1={xs(shadowRadiusMm)} x2={xs(shadowRadiusMm)} y1={TOP} y2={H - BOTTOM} stroke={ink} strokeWidth={0.8} strokeDasharray="1 3" /> : null}
      <path d={d} fill="none" stroke={ink} strokeWidth={1.6} />
      <line x1={LEFT} x2={LEFT} y1={TOP} y2={H - BOTTOM} stroke={ink} strokeWidth={0.8} />
      <line x1={LEFT} x2={W - RIGHT} y1={H - BOTTOM} y2={H - BOTTOM} stroke={ink} strokeWidth={0.8} />
      <text x={(LEFT + W - RIGHT) / 2} y={H - 4} textAnchor="middle" fontSize={10.5} fill={ink}>
        distance from the beam axis on the screen (mm)
      </text>
    </svg>
  );
}
