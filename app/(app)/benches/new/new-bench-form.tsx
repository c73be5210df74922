"use client";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { useCreateBench } from "@/lib/api/bench-queries";
import { fieldError } from "@/lib/api/client";

export function NewBenchForm({ labs }: { labs: { id: string; name: string }[] }) {
  const router = useRouter();
  const create = useCreateBench();
  const [title, setTitle] = useState("");
  const [labId, setLabId] = useState(labs[0]?.id ?? "");
  const [layout, setLayout] = useState<"rail" | "table">("rail");

  const submit = (e: FormEvent) => {
    e.preventDefault();
    create.mutate({ labId, title }, { onSuccess: ({ id }) => router.push(layout === "table" ? `/benches/${id}?on=table` : `/benches/${id}`) });
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
      <fieldset className="flex flex-col gap-1">
        <legend className="mb-1 text-sm font-medium text-muted">Draw it</legend>
        <label className="flex items-start gap-2">
          <input type="radio" name="bench-layout" value="rail" checked={layout === "rail"} onChange={() => setLayout("rail")} className="mt-1" />
          <span>
            On a rail <span className="text-sm text-muted">— one laser and the optics in a straight line</span>
          </span>
        </label>
        <label className="flex items-start gap-2">
          <input type="radio" name="bench-layout" value="table" checked={layout === "table"} onChange={() => setLayout("table")} className="mt-1" />
          <span>
            On an optical table <span className="text-sm text-muted">— seen from above with its holes: mirrors, beam splitters, windows, several lasers</span>
          </span>
        </label>
      </fieldset>
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
