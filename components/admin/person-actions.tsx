"use client";
import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { apiFetch, ApiError, checkBeforeSending } from "@/lib/api/client";
import { rolesInput } from "@/lib/api/contracts/people";
import { ROLE_LABELS, ROLES, type RoleName } from "@/lib/auth/permissions";

/** Roles, deactivation and reactivation for one person; the server refuses what would lock the institution out. */
export function PersonActions({ person, isSelf }: { person: { id: string; name: string; roles: RoleName[]; active: boolean }; isSelf: boolean }) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const [roles, setRoles] = useState<RoleName[]>(person.roles);
  const done = () => {
    setOpen(false);
    router.refresh();
  };
  const saveRoles = useMutation({ mutationFn: async () => apiFetch(`/api/admin/people/${person.id}/roles`, { method: "PUT", body: JSON.stringify(checkBeforeSending(rolesInput, { roles })) }), onSuccess: done });
  const deactivate = useMutation({ mutationFn: () => apiFetch(`/api/admin/people/${person.id}/deactivate`, { method: "POST", body: JSON.stringify({}) }), onSuccess: done });
  const reactivate = useMutation({ mutationFn: () => apiFetch(`/api/admin/people/${person.id}/reactivate`, { method: "POST", body: JSON.stringify({}) }), onSuccess: done });
  const error = [saveRoles.error, deactivate.error, reactivate.error].find((e) => e instanceof ApiError);
  const changed = roles.slice().sort().join() !== person.roles.slice().sort().join();

  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap gap-2">
        <Button type="button" variant="quiet" className="min-h-9 px-3 py-1 text-sm" onClick={() => setOpen(!open)} aria-expanded={open} aria-label={`Change ${person.name}'s roles`}>
          Roles…
        </Button>
        {person.active ? (
          !isSelf ? (
            <Button
              type="button"
              variant="danger"
              className="min-h-9 px-3 py-1 text-sm"
              disabled={deactivate.isPending}
              aria-label={`Deactivate ${person.name}`}
              onClick={() => {
                if (window.confirm(`Deactivate ${person.name}? They are signed out at once and cannot sign in; their benches, comments and signatures stay as they are.`)) deactivate.mutate();
              }}
            >
              Deactivate
            </Button>
          ) : null
        ) : (
          <Button type="button" variant="quiet" className="min-h-9 px-3 py-1 text-sm" disabled={reactivate.isPending} aria-label={`Reactivate ${person.name}`} onClick={() => reactivate.mutate()}>
            Reactivate
          </Button>
        )}
      </div>
      {open ? (
        <form
          className="flex flex-col gap-2 rounded-md border border-line p-2"
          onSubmit={(e) => {
            e.preventDefault();
            saveRoles.mutate();
          }}
        >
          <fieldset className="flex flex-col gap-1">
            <legend className="sr-only">Roles of {person.name}</legend>
            {ROLES.map((r) => (
              <label key={r} className="flex items-center gap-2 text-sm">
                <input type="checkbox" className="size-4" checked={roles.includes(r)} onChange={() => setRoles(roles.includes(r) ? roles.filter((x) => x !== r) : [...roles, r])} />
                {ROLE_LABELS[r]}
              </label>
            ))}
          </fieldset>
          <Button type="submit" className="min-h-9 px-3 py-1 text-sm" disabled={!changed || roles.length === 0 || saveRoles.isPending}>
            Save the roles
          </Button>
        </form>
      ) : null}
      {error ? (
        <p role="alert" className="text-sm text-danger">
          {error.message}
        </p>
      ) : null}
    </div>
  );
}
