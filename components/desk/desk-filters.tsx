"use client";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { HAZARD_CLASSES } from "@/lib/safety/types";
import { useDeskUrl } from "./use-desk-url";

type Option = { id: string; name: string };
const STATES = [
  { value: "approved", label: "Signed off (in force)" },
  { value: "expired", label: "Sign-off expired" },
  { value: "superseded", label: "Replaced by a newer sign-off" },
];
const FILTER_KEYS = ["q", "lab", "class", "state", "officer", "from", "to", "expiring", "builds"] as const;

const inputClass = "min-h-11 rounded-md border border-line bg-ink px-3 py-2 text-base text-text";

export function DeskFilters({ labs, officers }: { labs: Option[]; officers: Option[] }) {
  const { params, update, pending } = useDeskUrl();
  const initial = Object.fromEntries(FILTER_KEYS.map((k) => [k, params.get(k) ?? ""])) as Record<(typeof FILTER_KEYS)[number], string>;
  const [v, setV] = useState(initial);
  const set = (k: (typeof FILTER_KEYS)[number]) => (e: React.ChangeEvent<HTMLInputElement | HTMLSelectElement>) => setV((old) => ({ ...old, [k]: e.target.value }));
  const active = FILTER_KEYS.some((k) => params.get(k));

  return (
    <form
      role="search"
      aria-label="Filter the sign-offs"
      className="flex flex-col gap-4 rounded-xl border border-line bg-panel p-4"
      onSubmit={(e) => {
        e.preventDefault();
        update(v);
      }}
    >
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <label className="flex flex-col gap-1 text-sm font-medium text-muted lg:col-span-2">
          Bench title contains
          <input type="search" className={inputClass} value={v.q} onChange={set("q")} placeholder="e.g. interferometer" />
        </label>
        <label className="flex flex-col gap-1 text-sm font-medium text-muted">
          Lab
          <select className={inputClass} value={v.lab} onChange={set("lab")}>
            <option value="">Every lab</option>
            {labs.map((l) => (
              <option key={l.id} value={l.id}>
                {l.name}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm font-medium text-muted">
          Class at signing
          <select className={inputClass} value={v.class} onChange={set("class")}>
            <option value="">Any class</option>
            {HAZARD_CLASSES.map((c) => (
              <option key={c} value={c}>
                Class {c}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm font-medium text-muted">
          State now
          <select className={inputClass} value={v.state} onChange={set("state")}>
            <option value="">Any state</option>
            {STATES.map((s) => (
              <option key={s.value} value={s.value}>
                {s.label}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm font-medium text-muted">
          Signed by
          <select className={inputClass} value={v.officer} onChange={set("officer")}>
            <option value="">Any officer</option>
            {officers.map((o) => (
              <option key={o.id} value={o.id}>
                {o.name}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm font-medium text-muted">
          Builds
          <select className={inputClass} value={v.builds} onChange={set("builds")}>
            <option value="">Built or not</option>
            <option value="mismatch">A build found a mismatch</option>
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm font-medium text-muted">
          Signed from
          <input type="date" className={inputClass} value={v.from} onChange={set("from")} />
        </label>
        <label className="flex flex-col gap-1 text-sm font-medium text-muted">
          Signed up to
          <input type="date" className={inputClass} value={v.to} onChange={set("to")} />
        </label>
        <label className="flex flex-col gap-1 text-sm font-medium text-muted">
          Expiring within (days)
          <input type="number" min={0} max={3650} inputMode="numeric" className={inputClass} value={v.expiring} onChange={set("expiring")} placeholder="e.g. 30" />
        </label>
      </div>
      <div className="flex flex-wrap gap-3">
        <Button type="submit" disabled={pending}>
          {pending ? "Filtering…" : "Apply the filters"}
        </Button>
        {active ? (
          <Button
            type="button"
            variant="quiet"
            onClick={() => {
              const cleared = Object.fromEntries(FILTER_KEYS.map((k) => [k, ""])) as typeof v;
              setV(cleared);
              update(cleared);
            }}
          >
            Clear the filters
          </Button>
        ) : null}
      </div>
    </form>
  );
}
