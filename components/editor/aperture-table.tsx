"use client";
// One row per aperture the light reaches: Fresnel number, zones, regime, centre, ratio, on-axis irradiance.
import type { ApertureAnalysis } from "@/lib/optics";
import { CentreMark } from "./centre-mark";
import { REGIME_WORDS, sig } from "./format";

export function ApertureTable({ apertures, selectedId, onSelect }: { apertures: ApertureAnalysis[]; selectedId: string | null; onSelect: (id: string) => void }) {
  if (apertures.length === 0) return <p className="text-sm text-muted">No aperture is lit, so there is no diffraction pattern to predict.</p>;
  return (
    <div tabIndex={0} role="region" aria-label="Table; scrolls sideways on a narrow screen" className="overflow-x-auto rounded-md border border-line">
      <table className="w-full text-left text-sm" data-testid="aperture-table">
        <caption className="sr-only">Fresnel analysis per aperture</caption>
        <thead className="bg-raised text-muted">
          <tr>
            <th className="px-2 py-1.5 font-medium">Aperture</th>
            <th className="px-2 py-1.5 font-medium" title="The Fresnel number N = (R²/λ)(1/ρ + 1/b): how many half-period zones the aperture exposes">
              Half-period zones (N)
            </th>
            <th className="px-2 py-1.5 font-medium">Regime</th>
            <th className="px-2 py-1.5 font-medium">Centre</th>
            <th className="px-2 py-1.5 font-medium" title="On-axis intensity with the aperture ÷ without it">Ratio</th>
            <th className="px-2 py-1.5 font-medium">On axis (W/cm²)</th>
          </tr>
        </thead>
        <tbody>
          {apertures.map((a) => (
            <tr key={a.id} className={`border-t border-line ${a.id === selectedId ? "bg-raised" : ""}`} data-testid={`aperture-row-${a.id}`}>
              <td className="px-2 py-1.5">
                <button type="button" className="font-mono text-accent underline-offset-2 hover:underline" onClick={() => onSelect(a.id)} aria-pressed={a.id === selectedId}>
                  {a.id}
                </button>
                <span className="block text-xs text-muted">⌀ {a.diameterMm} mm{a.observationDistanceMm !== null ? `, ${sig(a.observationDistanceMm)} mm to ${a.screenId}` : ", no screen"}</span>
              </td>
              <td className="px-2 py-1.5 font-mono" data-testid="zone-count">{sig(a.zonesExposed)}</td>
              <td className="px-2 py-1.5">{REGIME_WORDS[a.regime] ?? a.regime}</td>
              <td className="px-2 py-1.5" data-testid="centre">
                <CentreMark centre={a.centre} />
              </td>
              <td className="px-2 py-1.5 font-mono">{sig(a.centreIntensityRatio)}×</td>
              <td className="px-2 py-1.5 font-mono">{sig(a.onAxisIrradianceWPerCm2)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
