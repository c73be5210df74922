"use client";
import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { apiFetch, ApiError, checkBeforeSending, fieldError } from "@/lib/api/client";
import { laserInput, laserUpdateInput } from "@/lib/api/contracts/register";
import { HAZARD_CLASSES } from "@/lib/safety/types";

type Option = { id: string; name: string };
export type LaserFormValues = {
  labId: string;
  labelClass: string;
  wavelengthsNm: number[];
  maxPowerMw: number;
  pulseEnergyMj: number | null;
  pulseDurationS: number | null;
  pulseRepetitionRateHz: number | null;
  pulsesPerBurst?: number | null;
  burstPulseRateHz?: number | null;
  lines?: { wavelengthNm: number; powerMw: number }[] | null;
  beamDiameterMm: number;
  divergenceMrad: number;
  model: string;
  serialNumber: string | null;
  location: string | null;
  status: string;
  responsibleUserId: string | null;
};

const STATUS_OPTIONS = [
  { value: "in-service", label: "In service" },
  { value: "out-of-service", label: "Out of service" },
  { value: "disposed", label: "Disposed of" },
];

const text = (v: number | null | undefined) => (v === null || v === undefined ? "" : String(v));
const numberOrNull = (v: string) => (v.trim() === "" ? null : Number(v.replace(",", ".")));

function Select({ id, label, value, onChange, options, error }: { id: string; label: string; value: string; onChange: (v: string) => void; options: { value: string; label: string }[]; error?: string }) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium text-muted">
        {label}
      </label>
      <select id={id} value={value} onChange={(e) => onChange(e.target.value)} aria-invalid={error ? true : undefined} className={`min-h-11 rounded-md border bg-ink px-3 py-2 text-base text-text ${error ? "border-danger" : "border-line"}`}>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      {error ? (
        <p className="text-sm text-danger" role="alert">
          {error}
        </p>
      ) : null}
    </div>
  );
}

/** The officer's form for a new laser or an edit; an edit carries the version it started from (409 when stale). */
export function LaserForm({ labs, people, initial, laserId, version }: { labs: Option[]; people: Option[]; initial?: LaserFormValues; laserId?: string; version?: number }) {
  const router = useRouter();
  const [v, setV] = useState({
    labId: initial?.labId ?? labs[0]?.id ?? "",
    labelClass: initial?.labelClass ?? "3R",
    wavelengths: initial ? initial.wavelengthsNm.join(", ") : "",
    maxPowerMw: text(initial?.maxPowerMw),
    pulsed: Boolean(initial && (initial.pulseDurationS !== null || initial.pulseEnergyMj !== null)),
    pulseEnergyMj: text(initial?.pulseEnergyMj),
    pulseDurationS: text(initial?.pulseDurationS),
    pulseRepetitionRateHz: text(initial?.pulseRepetitionRateHz),
    bursts: Boolean(initial && (initial.pulsesPerBurst != null || initial.burstPulseRateHz != null)),
    pulsesPerBurst: text(initial?.pulsesPerBurst),
    burstPulseRateHz: text(initial?.burstPulseRateHz),
    beamDiameterMm: text(initial?.beamDiameterMm),
    divergenceMrad: text(initial?.divergenceMrad),
    model: initial?.model ?? "",
    serialNumber: initial?.serialNumber ?? "",
    location: initial?.location ?? "",
    status: initial?.status ?? "in-service",
    responsibleUserId: initial?.responsibleUserId ?? "",
  });
  // Further emission lines (a doubled laser's residual fundamental and pump): wavelength and power, as text until sent.
  const [lines, setLines] = useState<{ wavelengthNm: string; powerMw: string }[]>((initial?.lines ?? []).map((l) => ({ wavelengthNm: String(l.wavelengthNm), powerMw: String(l.powerMw) })));
  const set = (key: keyof typeof v) => (value: string | boolean) => setV((old) => ({ ...old, [key]: value }));
  const save = useMutation({
    mutationFn: () => {
      const body = {
        labId: v.labId,
        labelClass: v.labelClass,
        wavelengthsNm: v.wavelengths
          .split(/[,;\s]+/)
          .filter(Boolean)
          .map((w) => Number(w)),
        maxPowerMw: numberOrNull(v.maxPowerMw),
        pulseEnergyMj: v.pulsed ? numberOrNull(v.pulseEnergyMj) : null,
        pulseDurationS: v.pulsed ? numberOrNull(v.pulseDurationS) : null,
        pulseRepetitionRateHz: v.pulsed ? numberOrNull(v.pulseRepetitionRateHz) : null,
        pulsesPerBurst: v.pulsed && v.bursts ? numberOrNull(v.pulsesPerBurst) : null,
        burstPulseRateHz: v.pulsed && v.bursts ? numberOrNull(v.burstPulseRateHz) : null,
        beamDiameterMm: numberOrNull(v.beamDiameterMm),
        divergenceMrad: numberOrNull(v.divergenceMrad),
        model: v.model,
        serialNumber: v.serialNumber,
        location: v.location,
        status: v.status,
        responsibleUserId: v.responsibleUserId || null,
        lines: lines.map((l) => ({ wavelengthNm: numberOrNull(l.wavelengthNm), powerMw: numberOrNull(l.powerMw) })),
        ...(laserId ? { version } : {}),
      };
      // checked against the routes' own schema first: each mistake is named under its field without a round trip
      checkBeforeSending(laserId ? laserUpdateInput : laserInput, body);
      return apiFetch<{ id: string }>(laserId ? `/api/lasers/${laserId}` : "/api/lasers", { method: laserId ? "PUT" : "POST", body: JSON.stringify(body) });
    },
    onSuccess: (saved) => {
      router.push(`/lasers/${saved.id}`);
      router.refresh();
    },
  });
  const err = (path: string) => fieldError(save.error, path);
  const conflict = save.error instanceof ApiError && save.error.status === 409;

  return (
    <form
      className="flex flex-col gap-5 rounded-xl border border-line bg-panel p-5"
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate();
      }}
      noValidate
      aria-label={laserId ? "Change the laser's entry" : "Register a laser"}
    >
      <div className="grid gap-4 sm:grid-cols-2">
        <Field id="laser-model" label="Manufacturer and model" value={v.model} onChange={(e) => set("model")(e.target.value)} error={err("model")} />
        <Field id="laser-serial" label="Serial number" value={v.serialNumber} onChange={(e) => set("serialNumber")(e.target.value)} error={err("serialNumber")} />
        <Select id="laser-lab" label="Lab" value={v.labId} onChange={set("labId")} options={labs.map((l) => ({ value: l.id, label: l.name }))} error={err("labId")} />
        <Field id="laser-location" label="Location (room, table)" value={v.location} onChange={(e) => set("location")(e.target.value)} error={err("location")} />
        <Select id="laser-class" label="Class on the label" value={v.labelClass} onChange={set("labelClass")} options={HAZARD_CLASSES.map((c) => ({ value: c, label: `Class ${c}` }))} error={err("labelClass")} />
        <Select id="laser-status" label="Status" value={v.status} onChange={set("status")} options={STATUS_OPTIONS} error={err("status")} />
        <Field id="laser-wavelengths" label="Wavelengths (nm)" hint="Separate several with commas, e.g. 532, 1064" value={v.wavelengths} onChange={(e) => set("wavelengths")(e.target.value)} error={err("wavelengthsNm")} inputMode="decimal" />
        <Field id="laser-power" label="Maximum power (mW)" hint="Average power for a pulsed laser" value={v.maxPowerMw} onChange={(e) => set("maxPowerMw")(e.target.value)} error={err("maxPowerMw")} inputMode="decimal" />
        <Field id="laser-diameter" label="Beam diameter (mm, 1/e²)" value={v.beamDiameterMm} onChange={(e) => set("beamDiameterMm")(e.target.value)} error={err("beamDiameterMm")} inputMode="decimal" />
        <Field id="laser-divergence" label="Divergence (mrad, 1/e² full angle)" value={v.divergenceMrad} onChange={(e) => set("divergenceMrad")(e.target.value)} error={err("divergenceMrad")} inputMode="decimal" />
        <Select
          id="laser-responsible"
          label="Responsible person"
          value={v.responsibleUserId}
          onChange={set("responsibleUserId")}
          options={[{ value: "", label: "Nobody named yet" }, ...people.map((p) => ({ value: p.id, label: p.name }))]}
          error={err("responsibleUserId")}
        />
      </div>
      <fieldset className="flex flex-col gap-3">
        <label className="flex min-h-11 items-center gap-2">
          <input type="checkbox" className="size-5" checked={v.pulsed} onChange={(e) => set("pulsed")(e.target.checked)} />
          The laser is pulsed
        </label>
        {v.pulsed ? (
          <div className="grid gap-4 sm:grid-cols-3">
            <Field id="laser-pulse-energy" label="Pulse energy (mJ)" value={v.pulseEnergyMj} onChange={(e) => set("pulseEnergyMj")(e.target.value)} error={err("pulseEnergyMj")} inputMode="decimal" />
            <Field id="laser-pulse-duration" label="Pulse duration (s)" hint="e.g. 1e-8 for 10 ns" value={v.pulseDurationS} onChange={(e) => set("pulseDurationS")(e.target.value)} error={err("pulseDurationS")} inputMode="decimal" />
            <Field
              id="laser-pulse-rate"
              label="Repetition rate (Hz)"
              hint={v.bursts ? "Average pulses per second: pulses per burst × bursts per second" : "Empty for a single pulse"}
              value={v.pulseRepetitionRateHz}
              onChange={(e) => set("pulseRepetitionRateHz")(e.target.value)}
              error={err("pulseRepetitionRateHz")}
              inputMode="decimal"
            />
          </div>
        ) : null}
        {v.pulsed ? (
          <label className="flex min-h-11 items-center gap-2">
            <input type="checkbox" className="size-5" checked={v.bursts} onChange={(e) => set("bursts")(e.target.checked)} />
            The pulses come in bursts
          </label>
        ) : null}
        {v.pulsed && v.bursts ? (
          <div className="grid gap-4 sm:grid-cols-3">
            <Field id="laser-pulses-per-burst" label="Pulses per burst" hint="A whole number, 2 or more" value={v.pulsesPerBurst} onChange={(e) => set("pulsesPerBurst")(e.target.value)} error={err("pulsesPerBurst")} inputMode="numeric" />
            <Field id="laser-burst-pulse-rate" label="Pulse rate inside a burst (Hz)" hint="e.g. 1e6 for pulses 1 µs apart" value={v.burstPulseRateHz} onChange={(e) => set("burstPulseRateHz")(e.target.value)} error={err("burstPulseRateHz")} inputMode="decimal" />
          </div>
        ) : null}
      </fieldset>
      <fieldset className="flex flex-col gap-3">
        <legend className="mb-1 font-medium">Further emission lines</legend>
        <p className="text-sm text-muted">Lines that leave with the main beam, each with its own power — e.g. the residual 1064 nm and the pump of a doubled 532 nm laser.</p>
        {lines.map((l, i) => (
          <div key={i} className="grid items-start gap-3 sm:grid-cols-[1fr_1fr_auto]">
            <Field id={`laser-line-${i}-wavelength`} label={`Line ${i + 2} wavelength (nm)`} value={l.wavelengthNm} onChange={(e) => setLines((old) => old.map((x, j) => (j === i ? { ...x, wavelengthNm: e.target.value } : x)))} error={err(`lines.${i}.wavelengthNm`)} inputMode="decimal" />
            <Field id={`laser-line-${i}-power`} label={`Line ${i + 2} power (mW)`} value={l.powerMw} onChange={(e) => setLines((old) => old.map((x, j) => (j === i ? { ...x, powerMw: e.target.value } : x)))} error={err(`lines.${i}.powerMw`)} inputMode="decimal" />
            <Button type="button" variant="quiet" className="sm:mt-6" onClick={() => setLines((old) => old.filter((_, j) => j !== i))}>
              Remove line {i + 2}
            </Button>
          </div>
        ))}
        {err("lines") && !lines.some((_, i) => err(`lines.${i}.wavelengthNm`) || err(`lines.${i}.powerMw`)) ? <p className="text-sm text-danger" role="alert">{err("lines")}</p> : null}
        <div>
          <Button type="button" variant="quiet" onClick={() => setLines((old) => [...old, { wavelengthNm: "", powerMw: "" }])}>
            Add a further line
          </Button>
        </div>
      </fieldset>
      {save.error instanceof ApiError ? (
        <div role="alert" className="rounded-md border border-danger p-3 text-danger">
          <p>{save.error.message}</p>
          {conflict ? (
            <Button type="button" variant="quiet" className="mt-2" onClick={() => window.location.reload()}>
              Reload the entry
            </Button>
          ) : null}
        </div>
      ) : null}
      <div className="flex gap-3">
        <Button type="submit" disabled={save.isPending}>
          {save.isPending ? "Saving…" : laserId ? "Save the changes" : "Register the laser"}
        </Button>
      </div>
    </form>
  );
}
