import Link from "next/link";
import { fmt } from "@/components/review/format";
import type { LaserView } from "@/lib/api/contracts/register";
import { ClassCheck } from "./class-check";
import { LaserStatusBadge } from "./laser-status-badge";

export function pulseText(l: Pick<LaserView, "pulseEnergyMj" | "pulseDurationS" | "pulseRepetitionRateHz"> & Partial<Pick<LaserView, "pulsesPerBurst" | "burstPulseRateHz">>): string | null {
  if (l.pulseDurationS === null && l.pulseEnergyMj === null) return null;
  const parts = [l.pulseEnergyMj !== null ? `${fmt(l.pulseEnergyMj)} mJ` : null, l.pulseDurationS !== null ? `${fmt(l.pulseDurationS)} s` : null, l.pulseRepetitionRateHz !== null ? `${fmt(l.pulseRepetitionRateHz)} Hz` : null];
  if (l.pulsesPerBurst != null && l.burstPulseRateHz != null) parts.push(`bursts of ${fmt(l.pulsesPerBurst)} pulses at ${fmt(l.burstPulseRateHz)} Hz inside a burst`);
  return `Pulsed: ${parts.filter(Boolean).join(" · ")}`;
}

export function LaserTable({ lasers }: { lasers: LaserView[] }) {
  if (lasers.length === 0) return <p className="rounded-lg border border-dashed border-line p-4 text-muted">No laser is registered in your labs yet.</p>;
  return (
    <div tabIndex={0} role="region" aria-label="Table; scrolls sideways on a narrow screen" className="overflow-x-auto rounded-lg border border-line">
      <table className="w-full text-left" data-testid="laser-table">
        <caption className="sr-only">Registered lasers</caption>
        <thead className="bg-raised text-sm text-muted">
          <tr>
            <th className="px-3 py-2 font-medium">Laser</th>
            <th className="px-3 py-2 font-medium">Lab and location</th>
            <th className="px-3 py-2 font-medium">Wavelength</th>
            <th className="px-3 py-2 font-medium">Max. power</th>
            <th className="px-3 py-2 font-medium">Beam (1/e²)</th>
            <th className="px-3 py-2 font-medium">Class</th>
            <th className="px-3 py-2 font-medium">Status</th>
          </tr>
        </thead>
        <tbody>
          {lasers.map((l) => (
            <tr key={l.id} className="border-t border-line align-top">
              <td className="px-3 py-3">
                <Link href={`/lasers/${l.id}`} className="font-medium">
                  {l.model}
                </Link>
                <p className="text-sm text-muted">{l.serialNumber ? `Serial ${l.serialNumber}` : "No serial recorded"}</p>
                {l.responsibleName ? <p className="text-sm text-muted">Responsible: {l.responsibleName}</p> : null}
              </td>
              <td className="px-3 py-3">
                {l.labName}
                <p className="text-sm text-muted">{l.location ?? "—"}</p>
              </td>
              <td className="px-3 py-3 whitespace-nowrap">{l.wavelengthsNm.map((w) => fmt(w, 4)).join(", ")} nm</td>
              <td className="px-3 py-3 whitespace-nowrap">
                {fmt(l.maxPowerMw)} mW
                {pulseText(l) ? <p className="text-sm text-muted">{pulseText(l)}</p> : null}
              </td>
              <td className="px-3 py-3 whitespace-nowrap text-sm">
                {fmt(l.beamDiameterMm)} mm · {fmt(l.divergenceMrad)} mrad
              </td>
              <td className="px-3 py-3">
                <ClassCheck labelClass={l.labelClass} computed={l.computed} />
              </td>
              <td className="px-3 py-3">
                <LaserStatusBadge status={l.status} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
