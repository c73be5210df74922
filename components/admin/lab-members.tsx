"use client";
import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { apiFetch, ApiError } from "@/lib/api/client";
import { ROLE_LABELS, type RoleName } from "@/lib/auth/permissions";

type Member = { id: string; name: string; roles: RoleName[]; active: boolean };

export function LabMembers({ labId, labName, members, people }: { labId: string; labName: string; members: Member[]; people: { id: string; name: string }[] }) {
  const router = useRouter();
  const candidates = people.filter((p) => !members.some((m) => m.id === p.id));
  const [userId, setUserId] = useState("");
  const add = useMutation({
    mutationFn: () => apiFetch(`/api/admin/labs/${labId}/members`, { method: "POST", body: JSON.stringify({ userId }) }),
    onSuccess: () => {
      setUserId("");
      router.refresh();
    },
  });
  const remove = useMutation({ mutationFn: (id: string) => apiFetch(`/api/admin/labs/${labId}/members/${id}`, { method: "DELETE" }), onSuccess: () => router.refresh() });
  const error = [add.error, remove.error].find((e) => e instanceof ApiError);
  return (
    <div className="flex flex-col gap-3">
      {members.length === 0 ? (
        <p className="text-sm text-muted">Nobody is a member yet.</p>
      ) : (
        <ul className="flex flex-col gap-1">
          {members.map((m) => (
            <li key={m.id} className="flex items-center justify-between gap-2">
              <span>
                {m.name} <span className="text-sm text-muted">· {m.roles.map((r) => ROLE_LABELS[r]).join(", ") || "no role"}{m.active ? "" : " · deactivated"}</span>
              </span>
              <Button type="button" variant="quiet" className="min-h-9 px-3 py-1 text-sm" aria-label={`Remove ${m.name} from ${labName}`} disabled={remove.isPending} onClick={() => remove.mutate(m.id)}>
                Remove
              </Button>
            </li>
          ))}
        </ul>
      )}
      <form
        className="flex flex-wrap items-end gap-2"
        onSubmit={(e) => {
          e.preventDefault();
          if (userId) add.mutate();
        }}
      >
        <label className="flex flex-col gap-1 text-sm text-muted">
          Add a person to {labName}
          <select className="min-h-11 rounded-md border border-line bg-ink px-3 text-text" value={userId} onChange={(e) => setUserId(e.target.value)}>
            <option value="">Choose…</option>
            {candidates.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name}
              </option>
            ))}
          </select>
        </label>
        <Button type="submit" variant="quiet" disabled={!userId || add.isPending}>
          Add
        </Button>
      </form>
      {error ? (
        <p role="alert" className="text-sm text-danger">
          {error.message}
        </p>
      ) : null}
    </div>
  );
}
