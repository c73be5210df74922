"use client";
import { useState } from "react";
import { authClient } from "@/lib/auth/auth-client";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";

export function ForgotPasswordForm() {
  const [email, setEmail] = useState("");
  const [done, setDone] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function onSubmit(event: React.FormEvent) {
    event.preventDefault();
    if (!email.includes("@")) return setError("Enter the e-mail address of your account.");
    setError(null);
    const { error: failure } = await authClient.requestPasswordReset({ email, redirectTo: "/reset-password" });
    if (failure?.status === 429) return setError("Too many requests. Wait a minute, then try again.");
    // Same answer whether or not the account exists.
    setDone(true);
  }

  if (done) return <p role="status">If an account uses {email}, a link to choose a new password is on its way. It works for one hour.</p>;
  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-4" noValidate>
      <h1 className="text-xl font-semibold">Reset your password</h1>
      <Field id="email" label="E-mail" type="email" value={email} onChange={(e) => setEmail(e.target.value)} error={error ?? undefined} />
      <Button type="submit">Send me a link</Button>
      <a href="/sign-in" className="text-sm">Back to sign-in</a>
    </form>
  );
}
