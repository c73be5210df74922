"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";

/** Choose a password: used both after a reset link and when accepting an invitation. */
export function NewPasswordForm({ title, submit }: { title: string; submit: (password: string) => Promise<string | null> }) {
  const router = useRouter();
  const [password, setPassword] = useState("");
  const [repeat, setRepeat] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function onSubmit(event: React.FormEvent) {
    event.preventDefault();
    if (password.length < 10) return setError("The password must be at least 10 characters long.");
    if (password !== repeat) return setError("The two passwords differ.");
    setBusy(true);
    const failure = await submit(password);
    setBusy(false);
    if (failure) return setError(failure);
    router.replace("/sign-in?done=1");
  }

  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-4" noValidate>
      <h1 className="text-xl font-semibold">{title}</h1>
      <Field id="password" label="New password" type="password" autoComplete="new-password" value={password} onChange={(e) => setPassword(e.target.value)} hint="At least 10 characters." />
      <Field id="repeat" label="The same password again" type="password" autoComplete="new-password" value={repeat} onChange={(e) => setRepeat(e.target.value)} error={error ?? undefined} />
      <Button type="submit" disabled={busy}>Save the password</Button>
    </form>
  );
}
