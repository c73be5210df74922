"use client";
import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { apiFetch, ApiError } from "@/lib/api/client";
import { EyewearForm, type EyewearFormItem } from "./eyewear-form";

const od = (v: number) => String(Number(v.toPrecision(3)));

/** One item of the lab's list: its bands, and for officers a change and a remove button. */
export function EyewearItemRow({ item, mayManage }: { item: EyewearFormItem; mayManage: boolean }) {
  const router = useRouter();
  const [editing, setEditing] = useState(false);
  const remove = useMutation({
    mutationFn: () => apiFetch(`/api/eyewear/${item.id}`, { method: "DELETE" }),
    onSuccess: () => router.refresh(),
  });
  if (editing) return <EyewearForm labId={item.labId} item={item} onDone={() => setEditing(false)} />;
  return (
    <li className="flex flex-col gap-2 rounded-lg border border-line bg-panel p-3" data-testid="eyewear-item">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <p className="font-medium">
          {item.name} <span className="text-sm text-muted">× {item.quantity}</span>
        </p>
        {mayManage ? (
          <div className="flex gap-2">
            <Button type="button" variant="quiet" onClick={() => setEditing(true)}>
              Change
            </Button>
            <Button
              type="button"
              variant="danger"
              disabled={remove.isPending}
              onClick={() => {
                if (window.confirm(`Take ${item.name} off this lab's list?`)) remove.mutate();
              }}
            >
              Remove
            </Button>
          </div>
        ) : null}
      </div>
      <ul className="flex flex-wrap gap-2 text-sm">
        {item.bands.map((b, i) => (
          <li key={i} className="rounded-md border border-line px-2 py-1 font-mono">
            {b.fromNm}–{b.toNm} nm: OD {od(b.opticalDensity)}
            {b.en207ScaleNumber ? `, LB${b.en207ScaleNumber}` : ""}
          </li>
        ))}
      </ul>
      {item.note ? <p className="text-sm text-muted">{item.note}</p> : null}
      {remove.error instanceof ApiError ? (
        <p role="alert" className="text-sm text-danger">
          {remove.error.message}
        </p>
      ) : null}
    </li>
  );
}
