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

  const submit = (e: FormEvent) => {
    e.preventDefault();
    create.mutate({ labId, title }, { onSuccess: ({ id }) => router.push(`/benches/${id}`) });
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
