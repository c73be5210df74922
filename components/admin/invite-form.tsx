"use client";
import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { apiFetch, ApiError, checkBeforeSending, fieldError } from "@/lib/api/client";
import { inviteInput } from "@/lib/api/contracts/people";
import { ROLE_LABELS, ROLES, type RoleName } from "@/lib/auth/permissions";

export function InviteForm({ labs }: { labs: { id: string; name: string }[] }) {
  const router = useRouter();
  const [email, setEmail] = useState("");
  const [name, setName] = useState("");
  const [roles, setRoles] = useState<RoleName[]>(["researcher"]);
  const [labIds, setLabIds] = useState<string[]>([]);
  const invite = useMutation({
    mutationFn: async () => {
      checkBeforeSending(inviteInput, { email, name, roles, labIds });
      return apiFetch<{ id: string }>("/api/invitations", { method: "POST", body: JSON.stringify({ email, name, roles, labIds }) });
    },
    onSuccess: () => {
      setEmail("");
      setName("");
      router.refresh();
    },
  });
  const toggle = <T,>(list: T[], item: T) => (list.includes(item) ? list.filter((x) => x !== item) : [...list, item]);

  return (
    <form
      className="flex flex-col gap-4 rounded-xl border border-line bg-panel p-5"
      onSubmit={(e) => {
        e.preventDefault();
        invite.mutate();
      }}
      noValidate
    >
      <h2 className="text-lg font-semibold">Invite someone</h2>
      <div className="grid gap-4 sm:grid-cols-2">
        <Field id="invite-name" label="Name" value={name} onChange={(e) => setName(e.target.value)} error={fieldError(invite.error, "name")} />
        <Field id="invite-email" label="E-mail" type="email" value={email} onChange={(e) => setEmail(e.target.value)} error={fieldError(invite.error, "email")} />
      </div>
      <fieldset>
        <legend className="mb-1 text-sm font-medium text-muted">Roles</legend>
        <div className="flex flex-wrap gap-3">
          {ROLES.map((r) => (
            <label key={r} className="flex min-h-11 items-center gap-2">
              <input type="checkbox" checked={roles.includes(r)} onChange={() => setRoles(toggle(roles, r))} className="size-5" />
              {ROLE_LABELS[r]}
            </label>
          ))}
        </div>
        {fieldError(invite.error, "roles") ? <p className="text-sm text-danger">{fieldError(invite.error, "roles")}</p> : null}
      </fieldset>
      <fieldset>
        <legend className="mb-1 text-sm font-medium text-muted">Labs (researchers and technicians work in these)</legend>
        <div className="flex flex-wrap gap-3">
          {labs.map((l) => (
            <label key={l.id} className="flex min-h-11 items-center gap-2">
              <input type="checkbox" checked={labIds.includes(l.id)} onChange={() => setLabIds(toggle(labIds, l.id))} className="size-5" />
              {l.name}
            </label>
          ))}
        </div>
      </fieldset>
      {invite.error instanceof ApiError ? <p role="alert" className="text-danger">{invite.error.message}</p> : null}
      {invite.isSuccess ? <p role="status" className="text-ok">Invitation sent. The link works for 7 days.</p> : null}
      <div>
        <Button type="submit" disabled={invite.isPending}>{invite.isPending ? "Sending…" : "Send the invitation"}</Button>
      </div>
    </form>
  );
}
