"use client";
import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { apiFetch, ApiError } from "@/lib/api/client";
import type { StandardName } from "./standard-words";

const STANDARDS: { value: StandardName; label: string }[] = [
  { value: "ANSI Z136.1-2014", label: "ANSI Z136.1-2014" },
  { value: "IEC 60825-1:2014", label: "IEC 60825-1:2014 (with the EU directive's exposure limits)" },
];

/** An admin or safety officer picks the standard a lab's hazard figures follow (audited on the server). */
export function StandardPicker({ labId, labName, current }: { labId: string; labName: string; current: StandardName }) {
  const router = useRouter();
  const [value, setValue] = useState<StandardName>(current);
  const save = useMutation({
    mutationFn: () => apiFetch(`/api/eyewear/standards/${labId}`, { method: "PUT", body: JSON.stringify({ standard: value }) }),
    onSuccess: () => router.refresh(),
  });
  const id = `standard-${labId}`;
  return (
    <form
      className="flex flex-wrap items-end gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate();
      }}
      aria-label={`Choose the standard for ${labName}`}
    >
      <div className="flex flex-col gap-1">
        <label htmlFor={id} className="text-sm font-medium text-muted">
          Safety standard for {labName}
        </label>
        <select id={id} value={value} onChange={(e) => setValue(e.target.value as StandardName)} className="min-h-11 rounded-md border border-line bg-ink px-3 py-2 text-base text-text">
          {STANDARDS.map((s) => (
            <option key={s.value} value={s.value}>
              {s.label}
            </option>
          ))}
        </select>
      </div>
      <Button type="submit" variant="quiet" disabled={save.isPending || value === current}>
        {save.isPending ? "Saving…" : "Use this standard"}
      </Button>
      {save.isSuccess && value === current ? <span className="text-sm text-muted" role="status">Saved.</span> : null}
      {save.error instanceof ApiError ? (
        <p role="alert" className="w-full text-sm text-danger">
          {save.error.message}
        </p>
      ) : null}
    </form>
  );
}
