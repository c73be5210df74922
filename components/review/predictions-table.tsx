import type { BenchAnalysis } from "@/lib/optics";
import type { BenchSafetyAssessment } from "@/lib/safety";
import { fmt, KIND_WORDS } from "./format";

// The beam at every element (from the optics engine) with the eyewear OD needed there (from the safety engine),
// and the Fresnel zone figures at every aperture the light reaches.
export function PredictionsTable({ analysis, safety }: { analysis: BenchAnalysis; safety: BenchSafetyAssessment }) {
  const odAt = new Map(safety.points.filter((p) => p.where === "element").map((p) => [p.elementId, p]));
  return (
    <div className="flex flex-col gap-4">
      <div tabIndex={0} role="region" aria-label="Table; scrolls sideways on a narrow screen" className="overflow-x-auto rounded-lg border border-line">
        <table className="w-full text-left text-sm">
          <caption className="sr-only">The beam arriving at each element</caption>
          <thead className="bg-raised text-muted">
            <tr>
              <th className="px-3 py-2 font-medium">Element</th>
              <th className="px-3 py-2 font-medium">Position</th>
              <th className="px-3 py-2 font-medium">Beam radius arriving (1/e²)</th>
              <th className="px-3 py-2 font-medium">Power arriving</th>
              <th className="px-3 py-2 font-medium">Eyewear OD needed there</th>
            </tr>
          </thead>
          <tbody>
            {analysis.elements.map((e) => {
              const p = odAt.get(e.id);
              const lit = e.incident.powerMw > 0 || e.kind === "laser";
              return (
                <tr key={e.id} className="border-t border-line">
                  <td className="px-3 py-2">
                    {KIND_WORDS[e.kind] ?? e.kind} <span className="text-muted">({e.id})</span>
                  </td>
                  <td className="px-3 py-2 font-mono">{e.positionMm} mm</td>
                  <td className="px-3 py-2 font-mono">{lit ? `${fmt(e.incident.radiusMm)} mm` : "no light"}</td>
                  <td className="px-3 py-2 font-mono">{lit ? `${fmt(e.kind === "laser" ? (p?.powerMw ?? e.incident.powerMw) : e.incident.powerMw)} mW` : "—"}</td>
                  <td className="px-3 py-2 font-mono">{p && p.opticalDensityRaw !== null ? fmt(p.opticalDensityRequired, 2) : "—"}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      {analysis.apertures.length ? (
        <div tabIndex={0} role="region" aria-label="Table; scrolls sideways on a narrow screen" className="overflow-x-auto rounded-lg border border-line">
          <table className="w-full text-left text-sm">
            <caption className="sr-only">Fresnel zones at each aperture</caption>
            <thead className="bg-raised text-muted">
              <tr>
                <th className="px-3 py-2 font-medium">Aperture</th>
                <th className="px-3 py-2 font-medium">Seen from</th>
                <th className="px-3 py-2 font-medium">Fresnel number (half-period zones)</th>
                <th className="px-3 py-2 font-medium">Centre of the pattern</th>
                <th className="px-3 py-2 font-medium">Light through</th>
              </tr>
            </thead>
            <tbody>
              {analysis.apertures.map((a) => (
                <tr key={a.id} className="border-t border-line">
                  <td className="px-3 py-2">
                    {a.id} <span className="text-muted">⌀ {a.diameterMm} mm</span>
                  </td>
                  <td className="px-3 py-2">{a.screenId ? `${a.screenId}, ${fmt(a.observationDistanceMm)} mm away` : "no screen (far field)"}</td>
                  <td className="px-3 py-2 font-mono">{fmt(a.fresnelNumber)}</td>
                  <td className="px-3 py-2">
                    {a.centre === "bright" ? "● bright" : a.centre === "dark" ? "○ dark" : "◐ between"} <span className="text-muted">(×{fmt(a.centreIntensityRatio)} of the open beam)</span>
                  </td>
                  <td className="px-3 py-2 font-mono">{fmt(a.transmittedFraction * 100)} %</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
      {analysis.screens?.length ? (
        <div className="overflow-x-auto rounded-lg border border-line">
          <table className="w-full text-left text-sm" data-testid="review-screens">
            <caption className="sr-only">What reaches each screen</caption>
            <thead className="bg-raised text-muted">
              <tr>
                <th className="px-3 py-2 font-medium">Screen</th>
                <th className="px-3 py-2 font-medium">Centre, every aperture in place</th>
                <th className="px-3 py-2 font-medium">Power arriving</th>
              </tr>
            </thead>
            <tbody>
              {analysis.screens.map((s) => (
                <tr key={s.id} className="border-t border-line">
                  <td className="px-3 py-2">{s.id}</td>
                  <td className="px-3 py-2">
                    {s.centre === "bright" ? "● bright" : s.centre === "dark" ? "○ dark" : "◐ between"} <span className="text-muted">(×{fmt(s.centreIntensityRatio)} of the open beam)</span>
                  </td>
                  <td className="px-3 py-2 font-mono">{fmt(s.powerMw)} mW</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
      {analysis.warnings.length ? (
        <ul className="flex flex-col gap-1 text-sm">
          {analysis.warnings.map((w, i) => (
            <li key={`${w.code}-${i}`} className="rounded-md border border-warn/60 px-3 py-2">
              <span aria-hidden="true" className="text-warn">▲ </span>
              {w.message}
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
