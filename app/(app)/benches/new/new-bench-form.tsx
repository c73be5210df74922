"use client";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { useCreateBench } from "@/lib/api/bench-queries";
import { fieldError } from "@/lib/api/client";

/** What the bench is drawn on: a straight rail (document version 1) or an optical table of a common size (version 2). */
const LAYOUTS = [
  { id: "rail", words: "A straight rail (one laser, elements along its beam)", table: null },
  { id: "table-metric", words: "An optical table, 1200 × 900 mm, holes every 25 mm", table: { widthMm: 1200, depthMm: 900, holePitchMm: 25 } },
  { id: "table-metric-large", words: "An optical table, 2400 × 1200 mm, holes every 25 mm", table: { widthMm: 2400, depthMm: 1200, holePitchMm: 25 } },
  { id: "table-imperial", words: "An optical table, 4 × 3 ft (1219.2 × 914.4 mm), holes every inch", table: { widthMm: 1219.2, depthMm: 914.4, holePitchMm: 25.4 } },
  { id: "breadboard", words: "A breadboard, 600 × 450 mm, holes every 25 mm", table: { widthMm: 600, depthMm: 450, holePitchMm: 25 } },
] as const;

export function NewBenchForm({ labs }: { labs: { id: string; name: string }[] }) {
  const router = useRouter();
  const create = useCreateBench();
  const [title, setTitle] = useState("");
  const [labId, setLabId] = useState(labs[0]?.id ?? "");
  const [layout, setLayout] = useState<(typeof LAYOUTS)[number]["id"]>("rail");

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const table = LAYOUTS.find((l) => l.id === layout)?.table ?? null;
    create.mutate({ labId, title, ...(table ? { table } : {}) }, { onSuccess: ({ id }) => router.push(`/benches/${id}`) });
  };

  const labError = fieldError(create.error, "labId");
  return (
    <form onSubmit={submit} className="flex flex-col gap-4 rounded-lg border border-line bg-panel p-5" noValidate>
      <Field id="bench-title" label="Title" value={title} onChange={(e) => setTitle(e.target.value)} error={fieldError(create.error, "title")} placeholder="e.g. HeNe through a 1 mm iris" maxLength={200} required />
      <div className="flex flex-col gap-1">
        <label htmlFor="bench-lab" className="text-sm font-medium text-muted">
          Lab
        </label>
        <select id="bench-lab" value={labId} onChange={(e) => setLabId(e.target.value)} className="min-h-11 rounded-md border border-line bg-ink px-3">
          {labs.map((l) => (
            <option key={l.id} value={l.id}>
              {l.name}
            </option>
          ))}
        </select>
        {labError ? <p className="text-sm text-danger" role="alert">{labError}</p> : null}
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor="bench-layout" className="text-sm font-medium text-muted">
          Drawn on
        </label>
        <select id="bench-layout" value={layout} onChange={(e) => setLayout(e.target.value as typeof layout)} className="min-h-11 rounded-md border border-line bg-ink px-3">
          {LAYOUTS.map((l) => (
            <option key={l.id} value={l.id}>
              {l.words}
            </option>
          ))}
        </select>
      </div>
      {create.error && !fieldError(create.error, "title") && !labError ? (
        <p role="alert" className="text-sm text-danger">
          {create.error.message}
        </p>
      ) : null}
      <div>
        <Button type="submit" disabled={create.isPending}>
          {create.isPending ? "Creating…" : "Create and open the editor"}
        </Button>
      </div>
    </form>
  );
}
