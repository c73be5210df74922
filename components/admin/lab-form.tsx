"use client";
import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { apiFetch, ApiError, checkBeforeSending, fieldError } from "@/lib/api/client";
import { createLabInput } from "@/lib/api/contracts/people";

export function LabForm() {
  const router = useRouter();
  const [name, setName] = useState("");
  const [room, setRoom] = useState("");
  const create = useMutation({
    mutationFn: async () => {
      checkBeforeSending(createLabInput, { name, room });
      return apiFetch("/api/labs", { method: "POST", body: JSON.stringify({ name, room }) });
    },
    onSuccess: () => {
      setName("");
      setRoom("");
      router.refresh();
    },
  });
  return (
    <form
      className="flex flex-col gap-4 rounded-xl border border-line bg-panel p-5"
      onSubmit={(e) => {
        e.preventDefault();
        create.mutate();
      }}
      noValidate
    >
      <h2 className="text-lg font-semibold">Add a lab</h2>
      <div className="grid gap-4 sm:grid-cols-2">
        <Field id="lab-name" label="Name" value={name} onChange={(e) => setName(e.target.value)} error={fieldError(create.error, "name")} />
        <Field id="lab-room" label="Room" value={room} onChange={(e) => setRoom(e.target.value)} error={fieldError(create.error, "room")} />
      </div>
      {create.error instanceof ApiError && create.error.fields.length === 0 ? <p role="alert" className="text-danger">{create.error.message}</p> : null}
      <div>
        <Button type="submit" disabled={create.isPending}>Add the lab</Button>
      </div>
    </form>
  );
}
