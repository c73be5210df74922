"use client";
// Record what was seen on the screen: centre bright/dark/between, spot or ring size, power at the screen.
// The server compares it with the prediction and flags a mismatch (and e-mails the bench's author).
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { fieldError } from "@/lib/api/client";
import { capitalise, CENTRE_MARKS, CENTRE_WORDS } from "@/lib/format";
import { useObservation } from "./build-queries";

const toNumber = (v: string) => (v.trim() === "" ? null : Number(v.replace(",", ".")));

export function ObservationForm({ buildId, apertureId, label }: { buildId: string; apertureId: string | null; label: string }) {
  const record = useObservation(buildId);
  const [centre, setCentre] = useState<"bright" | "dark" | "between" | "">("");
  const [spot, setSpot] = useState("");
  const [power, setPower] = useState("");
  const [note, setNote] = useState("");
  const id = apertureId ?? "screen";
  const last = record.data?.observation;
  return (
    <form
      className="flex flex-col gap-3 rounded-lg border border-line p-3"
      aria-label={`Record an observation: ${label}`}
      data-testid={`observation-form-${id}`}
      onSubmit={(e) => {
        e.preventDefault();
        record.mutate(
          { apertureId, centreSeen: centre || null, spotDiameterMm: toNumber(spot), screenPowerMw: toNumber(power), note: note.trim() || null },
          { onSuccess: () => { setCentre(""); setSpot(""); setPower(""); setNote(""); } },
        );
      }}
    >
      {apertureId ? (
        <fieldset className="flex flex-wrap gap-4">
          <legend className="mb-1 text-sm font-medium text-muted">Centre of the pattern</legend>
          {(["bright", "dark", "between"] as const).map((c) => (
            <label key={c} className="flex min-h-11 items-center gap-2">
              <input type="radio" name={`centre-${id}`} value={c} checked={centre === c} onChange={() => setCentre(c)} className="h-5 w-5" />
              {CENTRE_MARKS[c]} {capitalise(CENTRE_WORDS[c])}
            </label>
          ))}
        </fieldset>
      ) : null}
      <div className="grid gap-3 sm:grid-cols-2">
        <Field id={`spot-${id}`} label={apertureId ? "Ring pattern diameter (mm)" : "Spot diameter (mm)"} inputMode="decimal" value={spot} onChange={(e) => setSpot(e.target.value)} error={fieldError(record.error, "spotDiameterMm")} />
        <Field id={`power-${id}`} label="Power at the screen (mW)" inputMode="decimal" value={power} onChange={(e) => setPower(e.target.value)} error={fieldError(record.error, "screenPowerMw")} />
      </div>
      <label className="flex flex-col gap-1 text-sm font-medium text-muted" htmlFor={`note-${id}`}>
        Note
        <textarea id={`note-${id}`} className="min-h-16 rounded-md border border-line bg-ink px-3 py-2 text-base text-text" value={note} onChange={(e) => setNote(e.target.value)} />
      </label>
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={record.isPending}>
          {record.isPending ? "Recording…" : "Record the observation"}
        </Button>
        {record.error && !fieldError(record.error, "spotDiameterMm") && !fieldError(record.error, "screenPowerMw") ? <p role="alert" className="text-danger">{record.error.message}</p> : null}
        {last ? (
          last.mismatch ? (
            <p role="alert" className="font-semibold text-danger">✕ Does not match the prediction; the bench&apos;s author has been e-mailed.</p>
          ) : (
            <p role="status" className="text-ok">✓ Matches the prediction.</p>
          )
        ) : null}
      </div>
    </form>
  );
}
