"use client";
import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { apiFetch, ApiError, checkBeforeSending, fieldError } from "@/lib/api/client";
import { eyewearInput, eyewearUpdateInput } from "@/lib/api/contracts/eyewear";

export type EyewearFormItem = {
  id: string;
  labId: string;
  name: string;
  quantity: number;
  note: string | null;
  version: number;
  bands: { fromNm: number; toNm: number; opticalDensity: number; en207ScaleNumber: number | null }[];
};

type BandText = { fromNm: string; toNm: string; opticalDensity: string; en207ScaleNumber: string };
const text = (v: number | null | undefined) => (v === null || v === undefined ? "" : String(v));
// An empty box is sent as null so the server names the field; a comma is read as a decimal point.
const numberOrNull = (v: string) => (v.trim() === "" ? null : Number(v.replace(",", ".")));
const emptyBand: BandText = { fromNm: "", toNm: "", opticalDensity: "", en207ScaleNumber: "" };

/** The officer's form for an eyewear item of one lab: name, how many, and the protected bands (each with an OD, and an EN 207 scale number where marked). */
export function EyewearForm({ labId, item, onDone }: { labId: string; item?: EyewearFormItem; onDone?: () => void }) {
  const router = useRouter();
  const prefix = item ? `eyewear-${item.id}` : `eyewear-new-${labId}`;
  const [name, setName] = useState(item?.name ?? "");
  const [quantity, setQuantity] = useState(text(item?.quantity ?? 1));
  const [note, setNote] = useState(item?.note ?? "");
  const [bands, setBands] = useState<BandText[]>(
    item ? item.bands.map((b) => ({ fromNm: text(b.fromNm), toNm: text(b.toNm), opticalDensity: text(b.opticalDensity), en207ScaleNumber: text(b.en207ScaleNumber) })) : [{ ...emptyBand }],
  );
  const setBand = (i: number, key: keyof BandText, value: string) => setBands((old) => old.map((b, j) => (j === i ? { ...b, [key]: value } : b)));

  const save = useMutation({
    mutationFn: () => {
      const body = {
        labId,
        name,
        quantity: numberOrNull(quantity),
        note,
        bands: bands.map((b) => ({ fromNm: numberOrNull(b.fromNm), toNm: numberOrNull(b.toNm), opticalDensity: numberOrNull(b.opticalDensity), en207ScaleNumber: numberOrNull(b.en207ScaleNumber) })),
        ...(item ? { version: item.version } : {}),
      };
      // checked against the routes' own schema first: each mistake is named under its field without a round trip
      checkBeforeSending(item ? eyewearUpdateInput : eyewearInput, body);
      return apiFetch<{ id: string }>(item ? `/api/eyewear/${item.id}` : "/api/eyewear", { method: item ? "PUT" : "POST", body: JSON.stringify(body) });
    },
    onSuccess: () => {
      if (!item) {
        setName("");
        setQuantity("1");
        setNote("");
        setBands([{ ...emptyBand }]);
      }
      onDone?.();
      router.refresh();
    },
  });
  const err = (path: string) => fieldError(save.error, path);
  const conflict = save.error instanceof ApiError && save.error.status === 409;

  return (
    <form
      className="flex flex-col gap-4 rounded-xl border border-line bg-panel p-4"
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate();
      }}
      noValidate
      aria-label={item ? `Change ${item.name}` : "Add eyewear to this lab's list"}
    >
      <div className="grid gap-4 sm:grid-cols-[minmax(0,2fr)_8rem_minmax(0,2fr)]">
        <Field id={`${prefix}-name`} label="Name" value={name} onChange={(e) => setName(e.target.value)} error={err("name")} />
        <Field id={`${prefix}-quantity`} label="Pairs" value={quantity} onChange={(e) => setQuantity(e.target.value)} error={err("quantity")} inputMode="numeric" />
        <Field id={`${prefix}-note`} label="Note (where it is kept)" value={note} onChange={(e) => setNote(e.target.value)} error={err("note")} />
      </div>
      <fieldset className="flex flex-col gap-3">
        <legend className="mb-2 text-sm font-medium">Protected wavelength bands</legend>
        {bands.map((b, i) => (
          <div key={i} className="grid items-start gap-3 sm:grid-cols-[1fr_1fr_1fr_1fr_auto]">
            <Field id={`${prefix}-band-${i}-from`} label="From (nm)" value={b.fromNm} onChange={(e) => setBand(i, "fromNm", e.target.value)} error={err(`bands.${i}.fromNm`)} inputMode="decimal" />
            <Field id={`${prefix}-band-${i}-to`} label="To (nm)" value={b.toNm} onChange={(e) => setBand(i, "toNm", e.target.value)} error={err(`bands.${i}.toNm`)} inputMode="decimal" />
            <Field id={`${prefix}-band-${i}-od`} label="OD" value={b.opticalDensity} onChange={(e) => setBand(i, "opticalDensity", e.target.value)} error={err(`bands.${i}.opticalDensity`)} inputMode="decimal" />
            <Field id={`${prefix}-band-${i}-lb`} label="EN 207 LB (optional)" value={b.en207ScaleNumber} onChange={(e) => setBand(i, "en207ScaleNumber", e.target.value)} error={err(`bands.${i}.en207ScaleNumber`)} inputMode="numeric" />
            <Button type="button" variant="quiet" className="sm:mt-6" onClick={() => setBands((old) => old.filter((_, j) => j !== i))} disabled={bands.length === 1} aria-label={`Remove band ${i + 1}`}>
              Remove
            </Button>
          </div>
        ))}
        {err("bands") && !bands.some((_, i) => ["fromNm", "toNm", "opticalDensity", "en207ScaleNumber"].some((k) => err(`bands.${i}.${k}`))) ? (
          <p className="text-sm text-danger" role="alert">
            {err("bands")}
          </p>
        ) : null}
        <div>
          <Button type="button" variant="quiet" onClick={() => setBands((old) => [...old, { ...emptyBand }])}>
            Add a band
          </Button>
        </div>
      </fieldset>
      {save.error instanceof ApiError ? (
        <div role="alert" className="rounded-md border border-danger p-3 text-danger">
          <p>{save.error.message}</p>
          {conflict ? (
            <Button type="button" variant="quiet" className="mt-2" onClick={() => window.location.reload()}>
              Reload the list
            </Button>
          ) : null}
        </div>
      ) : null}
      <div className="flex gap-3">
        <Button type="submit" disabled={save.isPending}>
          {save.isPending ? "Saving…" : item ? "Save the changes" : "Add to the list"}
        </Button>
        {onDone ? (
          <Button type="button" variant="quiet" onClick={onDone}>
            Cancel
          </Button>
        ) : null}
      </div>
    </form>
  );
}
