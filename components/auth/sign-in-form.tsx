"use client";
import { useRouter, useSearchParams } from "next/navigation";
import { useState } from "react";
import { authClient } from "@/lib/auth/auth-client";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { safeCallbackPath } from "./safe-callback";

export function SignInForm() {
  const router = useRouter();
  const params = useSearchParams();
  const passwordSaved = params.get("done") === "1";
  const callback = safeCallbackPath(params.get("callbackURL"));
  const [email, setEmail] = useState("");
  const [password, setPassword] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function onSubmit(event: React.FormEvent) {
    event.preventDefault();
    setError(null);
    if (!email.includes("@")) return setError("Enter your e-mail address.");
    if (!password) return setError("Enter your password.");
    setBusy(true);
    const { error: failure } = await authClient.signIn.email({ email, password });
    setBusy(false);
    if (failure) {
      // One sentence for every wrong-credential case: no hint whether the account exists.
      setError(failure.status === 429 ? refusalOf(failure) : "Wrong e-mail or password.");
      return;
    }
    router.replace(callback);
    router.refresh();
  }

  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-4" noValidate>
      <h1 className="text-xl font-semibold">Sign in</h1>
      {passwordSaved ? <p role="status" className="text-ok">Your password is saved. Sign in with it.</p> : null}
      <Field id="email" label="E-mail" type="email" autoComplete="username" value={email} onChange={(e) => setEmail(e.target.value)} required />
      <Field id="password" label="Password" type="password" autoComplete="current-password" value={password} onChange={(e) => setPassword(e.target.value)} required />
      {error ? (
        <p role="alert" className="rounded-md border border-danger px-3 py-2 text-danger">
          {error}
        </p>
      ) : null}
      <Button type="submit" disabled={busy}>
        {busy ? "Signing in…" : "Sign in"}
      </Button>
      <a href="/forgot-password" className="text-sm">
        Forgot your password?
      </a>
    </form>
  );
}

/** The server's own sentence for a refused sign-in (it names the wait); the longest wait when it gives none. */
function refusalOf(failure: { message?: string; error?: { message?: string } }): string {
  const message = failure.error?.message ?? failure.message ?? "";
  return /^Too many wrong/.test(message) ? message : "Too many attempts. Wait up to 15 minutes, then try again.";
}
