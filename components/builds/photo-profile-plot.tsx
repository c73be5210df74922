// The screen photo's radial profile over the predicted one, as a static SVG: x the distance from the pattern's centre
// on the screen (mm, from the fitted scale), y the intensity relative to the open beam. Dots: the photo (the median of
// each ring of pixels, turned back to intensity through the fitted tone curve); solid: the pattern fitted to it; dashed:
// the pattern predicted at the distance drawn.
const W = 340;
const H = 200;
const LEFT = 40;
const RIGHT = 10;
const TOP = 26;
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

export function PhotoProfilePlot({ radiusMm, measured, fitted, predicted, label }: { radiusMm: number[]; measured: number[]; fitted: number[]; predicted: number[]; label: string }) {
  const ink = "#eef3f1";
  const grid = "#33444d";
  const photo = "#f2b134";
  const drawn = "#7cc4ff";
  const maxR = radiusMm[radiusMm.length - 1] || 1;
  const maxI = Math.max(1, ...measured, ...fitted, ...predicted) * 1.05;
  const xs = (r: number) => LEFT + (r / maxR) * (W - LEFT - RIGHT);
  const ys = (v: number) => TOP + (1 - Math.min(v, maxI) / maxI) * (H - TOP - BOTTOM);
  const line = (values: number[]) => radiusMm.map((r, i) => `${i ? "L" : "M"} ${xs(r).toFixed(2)} ${ys(values[i]).toFixed(2)}`).join(" ");
  const every = Math.max(1, Math.floor(radiusMm.length / 160));
  return (
    <svg viewBox={`0 0 ${W} ${H}`} className="w-full" role="img" aria-label={label} fontFamily="Inter Variable, sans-serif" data-testid="photo-profile-plot">
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
      <path d={line(predicted)} fill="none" stroke={drawn} strokeWidth={1.4} strokeDasharray="5 3" />
      <path d={line(fitted)} fill="none" stroke={ink} strokeWidth={1.4} />
      {radiusMm.map((r, i) => (i % every === 0 ? <circle key={i} cx={xs(r)} cy={ys(measured[i])} r={1.3} fill={photo} /> : null))}
      <line x1={LEFT} x2={LEFT} y1={TOP} y2={H - BOTTOM} stroke={ink} strokeWidth={0.8} />
      <line x1={LEFT} x2={W - RIGHT} y1={H - BOTTOM} y2={H - BOTTOM} stroke={ink} strokeWidth={0.8} />
      <g fontSize={9.5} fill={ink}>
        <circle cx={LEFT + 6} cy={10} r={2.5} fill={photo} />
        <text x={LEFT + 12} y={13}>photo</text>
        <line x1={LEFT + 50} x2={LEFT + 66} y1={10} y2={10} stroke={ink} strokeWidth={1.4} />
        <text x={LEFT + 70} y={13}>fitted</text>
        <line x1={LEFT + 108} x2={LEFT + 124} y1={10} y2={10} stroke={drawn} strokeWidth={1.4} strokeDasharray="5 3" />
        <text x={LEFT + 128} y={13}>predicted as drawn</text>
      </g>
      <text x={(LEFT + W - RIGHT) / 2} y={H - 4} textAnchor="middle" fontSize={10.5} fill={ink}>
        distance from the pattern&apos;s centre on the screen (mm)
      </text>
    </svg>
  );
}
