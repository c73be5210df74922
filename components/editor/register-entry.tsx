"use client";
// The laser's link to the register, in the properties panel: the entry it refers to (model, label class, what the
// register lists), a choice among the entry's wavelengths, and plain-words warnings when the drawing asks more of the
// laser than the register lists. An ad hoc laser can be linked here; a linked one can be unlinked or re-picked.
import { useQuery } from "@tanstack/react-query";
import { useState } from "react";
import { laserEntryQuery } from "@/lib/api/bench-queries";
import type { LaserElement } from "@/lib/bench/schema";
import type { EditorAction } from "./editor-reducer";
import { LaserPicker, wavelengthsText } from "./laser-picker";
import { entryName, laserValuesFrom, listsWavelength, registerMismatches, type RegisterEntry } from "./register-check";

type Props = { laser: LaserElement; labId: string; labName: string; canEdit: boolean; dispatch: (action: EditorAction) => void };

const num = (x: number) => Number(x.toPrecision(4)).toString();
const SMALL_BUTTON = "inline-flex min-h-9 items-center rounded-md border border-line px-2.5 text-sm hover:bg-raised";

export function RegisterEntryBox({ laser, labId, labName, canEdit, dispatch }: Props) {
  const [picking, setPicking] = useState(false);
  const entry = useQuery({ ...laserEntryQuery(laser.registerId ?? ""), enabled: Boolean(laser.registerId) });

  const pick = (chosen: RegisterEntry) => {
    dispatch({ type: "update", id: laser.id, patch: laserValuesFrom(chosen) });
    setPicking(false);
  };
  const picker = picking ? (
    <div className="mt-2">
      <LaserPicker labId={labId} labName={labName} onPick={pick} onClose={() => setPicking(false)} currentId={laser.registerId} />
    </div>
  ) : null;

  if (!laser.registerId) {
    return (
      <div className="rounded-md border border-line p-3 text-sm" data-testid="register-entry" data-linked="false">
        <p>
          <span aria-hidden="true">◇ </span>Ad hoc laser: not linked to the laser register, so nothing checks these values against a real laser.
        </p>
        {canEdit && !picking ? (
          <button type="button" className={`${SMALL_BUTTON} mt-2`} onClick={() => setPicking(true)}>
            Pick from the register…
          </button>
        ) : null}
        {picker}
      </div>
    );
  }

  const data = entry.data;
  const mismatches = data ? registerMismatches(laser, data) : [];
  const wavelengthListed = data ? listsWavelength(data, laser.wavelengthNm) : true;
  return (
    <div className="rounded-md border border-line p-3 text-sm" data-testid="register-entry" data-linked="true">
      <p className="text-muted">From the laser register</p>
      {entry.isPending ? <p className="text-muted">Reading the register entry…</p> : null}
      {entry.error ? (
        <p className="text-warn" role="alert">
          <span aria-hidden="true">⚠ </span>The register entry this laser refers to cannot be read ({entry.error.message}). Pick the laser from the register again, or make it an ad hoc laser.
        </p>
      ) : null}
      {data ? (
        <>
          <p className="font-medium" data-testid="register-entry-name">
            {entryName(data)} <span className="ml-1 rounded-full border border-line px-2 text-xs font-normal">label Class {data.labelClass}</span>
          </p>
          <dl className="mt-1 grid grid-cols-[auto_minmax(0,1fr)] gap-x-3 gap-y-0.5 font-mono text-xs">
            <dt className="text-muted">wavelengths</dt>
            <dd>{wavelengthsText(data)}</dd>
            <dt className="text-muted">maximum power</dt>
            <dd>{num(data.maxPowerMw)} mW</dd>
            <dt className="text-muted">beam diameter</dt>
            <dd>{num(data.beamDiameterMm)} mm (1/e²)</dd>
            <dt className="text-muted">divergence</dt>
            <dd>{num(data.divergenceMrad)} mrad</dd>
            {data.pulseDurationS !== null ? (
              <>
                <dt className="text-muted">pulses</dt>
                <dd>
                  {data.pulseEnergyMj != null ? `${num(data.pulseEnergyMj)} mJ, ` : ""}
                  {data.pulseDurationS} s{data.pulseRepetitionRateHz !== null ? ` at ${data.pulseRepetitionRateHz} Hz` : ", single"}
                </dd>
                {data.pulsesPerBurst != null && data.burstPulseRateHz != null ? (
                  <>
                    <dt className="text-muted">bursts</dt>
                    <dd>
                      {num(data.pulsesPerBurst)} pulses at {num(data.burstPulseRateHz)} Hz inside a burst
                    </dd>
                  </>
                ) : null}
              </>
            ) : null}
          </dl>
          {data.wavelengthsNm.length > 1 && canEdit ? (
            <label className="mt-2 flex items-center gap-2">
              <span className="text-muted">Line used</span>
              <select
                value={wavelengthListed ? String(data.wavelengthsNm.find((w) => listsWavelength({ wavelengthsNm: [w] }, laser.wavelengthNm))) : ""}
                onChange={(e) => dispatch({ type: "update", id: laser.id, patch: { wavelengthNm: Number(e.target.value) } })}
                className="min-h-9 rounded-md border border-line bg-ink px-2 font-mono"
                data-testid="register-wavelength"
              >
                {!wavelengthListed ? <option value="">{num(laser.wavelengthNm)} nm (not listed)</option> : null}
                {data.wavelengthsNm.map((w) => (
                  <option key={w} value={String(w)}>
                    {num(w)} nm
                  </option>
                ))}
              </select>
            </label>
          ) : null}
          {mismatches.length > 0 ? (
            <ul className="mt-2 flex flex-col gap-1 text-warn" aria-label="Differences from the register" data-testid="register-warnings">
              {mismatches.map((m) => (
                <li key={m.code} data-code={m.code}>
                  <span aria-hidden="true">⚠ </span>
                  {m.message}
                </li>
              ))}
              <li className="text-xs text-muted">The safety officer&apos;s register check says the same when the bench is sent for review.</li>
            </ul>
          ) : null}
        </>
      ) : null}
      {canEdit && !picking ? (
        <div className="mt-2 flex flex-wrap gap-2">
          <button type="button" className={SMALL_BUTTON} onClick={() => setPicking(true)}>
            Pick another…
          </button>
          <button type="button" className={SMALL_BUTTON} onClick={() => dispatch({ type: "update", id: laser.id, patch: { registerId: undefined } })} title="Keep the values, but no longer refer to the register entry">
            Make it ad hoc
          </button>
        </div>
      ) : null}
      {picker}
    </div>
  );
}
