"use client";
// What reaches each lit screen with every aperture upstream in place: the centre, its ratio to the open beam, the power.
import type { ScreenAnalysis } from "@/lib/optics";
import { CentreMark } from "./centre-mark";
import { sig } from "./format";

export function ScreenTable({ screens }: { screens: readonly ScreenAnalysis[] | undefined }) {
  if (!screens || screens.length === 0) return null;
  return (
    <div className="mt-3 overflow-x-auto rounded-md border border-line">
      <table className="w-full text-left text-sm" data-testid="screen-table">
        <caption className="sr-only">What reaches each screen</caption>
        <thead className="bg-raised text-muted">
          <tr>
            <th className="px-2 py-1.5 font-medium">Screen</th>
            <th className="px-2 py-1.5 font-medium">Centre</th>
            <th className="px-2 py-1.5 font-medium" title="On-axis intensity with every aperture upstream in place ÷ with none">Ratio</th>
            <th className="px-2 py-1.5 font-medium">Power arriving</th>
          </tr>
        </thead>
        <tbody>
          {screens.map((s) => (
            <tr key={s.id} className="border-t border-line" data-testid={`screen-row-${s.id}`}>
              <td className="px-2 py-1.5 font-mono">{s.id}</td>
              <td className="px-2 py-1.5">
                <CentreMark centre={s.centre} />
              </td>
              <td className="px-2 py-1.5 font-mono">{sig(s.centreIntensityRatio)}×</td>
              <td className="px-2 py-1.5 font-mono">{sig(s.powerMw)} mW</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
