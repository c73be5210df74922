"use client";
import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { apiFetch, ApiError, fieldError } from "@/lib/api/client";

type Choice = "approve" | "request-changes" | "reject";

const CHOICES: { value: Choice; label: string; hint: string }[] = [
  { value: "approve", label: "Sign off", hint: "The laser may be used on this setup as drawn, under your conditions." },
  { value: "request-changes", label: "Ask for changes", hint: "The author changes the drawing and sends a new revision." },
  { value: "reject", label: "Turn down", hint: "This setup must not be built or operated." },
];

function inMonths(months: number): string {
  const d = new Date();
  d.setUTCMonth(d.getUTCMonth() + months);
  return d.toISOString().slice(0, 10);
}

/** The officer's decision: sign off (conditions, validity, password), ask for changes (comment), turn down (reason). */
export function DecisionPanel({ revisionId, revisionNumber, contentHash, meaning }: { revisionId: string; revisionNumber: number; contentHash: string; meaning: string }) {
  const router = useRouter();
  const [choice, setChoice] = useState<Choice>("approve");
  const [conditions, setConditions] = useState("");
  const [validUntil, setValidUntil] = useState(inMonths(12));
  const [password, setPassword] = useState("");
  const [text, setText] = useState("");

  const decide = useMutation({
    mutationFn: () => {
      const body =
        choice === "approve"
          ? { outcome: choice, contentHash, conditions: conditions.trim() || undefined, validUntil, password }
          : choice === "request-changes"
            ? { outcome: choice, contentHash, comment: text }
            : { outcome: choice, contentHash, reason: text };
      return apiFetch(`/api/revisions/${revisionId}/decision`, { method: "POST", body: JSON.stringify(body) });
    },
    onSuccess: () => {
      setPassword("");
      router.refresh();
    },
    onError: () => setPassword(""),
  });

  const textPath = choice === "reject" ? "reason" : "comment";
  const general = decide.error instanceof ApiError && !decide.error.fields.some((f) => ["password", "validUntil", textPath].includes(f.path)) ? decide.error.message : null;

  return (
    <form
      className="flex flex-col gap-4 rounded-xl border border-line bg-panel p-4"
      aria-labelledby="decision-heading"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        decide.mutate();
      }}
    >
      <h2 id="decision-heading" className="text-lg font-semibold">
        Your decision on revision {revisionNumber}
      </h2>
      <fieldset className="flex flex-col gap-2">
        <legend className="sr-only">Decision</legend>
        {CHOICES.map((c) => (
          <label key={c.value} className={`flex cursor-pointer gap-3 rounded-lg border p-3 ${choice === c.value ? "border-accent bg-raised" : "border-line"}`}>
            <input type="radio" name="decision" value={c.value} checked={choice === c.value} onChange={() => setChoice(c.value)} className="mt-1 accent-[var(--color-accent)]" />
            <span>
              <span className="block font-medium">{c.label}</span>
              <span className="block text-sm text-muted">{c.hint}</span>
            </span>
          </label>
        ))}
      </fieldset>

      {choice === "approve" ? (
        <>
          <div className="flex flex-col gap-1">
            <label htmlFor="conditions" className="text-sm font-medium text-muted">
              Conditions (optional)
            </label>
            <textarea
              id="conditions"
              rows={4}
              value={conditions}
              onChange={(e) => setConditions(e.target.value)}
              placeholder="e.g. Eyewear OD 2 at 633 nm; the room door stays locked while the laser is on."
              className="rounded-md border border-line bg-ink px-3 py-2 text-base text-text placeholder:text-muted/60"
            />
          </div>
          <Field id="valid-until" type="date" label="Valid until" value={validUntil} onChange={(e) => setValidUntil(e.target.value)} hint="12 months unless you choose otherwise." error={fieldError(decide.error, "validUntil")} />
          <div className="rounded-lg border border-line bg-ink p-3 text-sm">
            <p className="text-muted">Your signature will mean:</p>
            <p className="font-medium">“{meaning}”</p>
            <p className="mt-1 break-all font-mono text-xs text-muted">for content hash {contentHash}</p>
          </div>
          <Field id="sign-password" type="password" autoComplete="current-password" label="Your password, to sign" value={password} onChange={(e) => setPassword(e.target.value)} error={fieldError(decide.error, "password")} />
        </>
      ) : (
        <div className="flex flex-col gap-1">
          <label htmlFor="decision-text" className="text-sm font-medium text-muted">
            {choice === "reject" ? "Reason for turning it down (required)" : "What has to change (required)"}
          </label>
          <textarea
            id="decision-text"
            rows={5}
            value={text}
            onChange={(e) => setText(e.target.value)}
            aria-invalid={fieldError(decide.error, textPath) ? true : undefined}
            className={`rounded-md border bg-ink px-3 py-2 text-base text-text ${fieldError(decide.error, textPath) ? "border-danger" : "border-line"}`}
          />
          {fieldError(decide.error, textPath) ? (
            <p role="alert" className="text-sm text-danger">
              {fieldError(decide.error, textPath)}
            </p>
          ) : null}
        </div>
      )}

      {general ? (
        <p role="alert" className="text-danger">
          {general}
        </p>
      ) : null}
      <Button type="submit" variant={choice === "reject" ? "danger" : "primary"} disabled={decide.isPending}>
        {choice === "approve" ? "Sign off this revision" : choice === "request-changes" ? "Send back with changes asked" : "Turn down this revision"}
      </Button>
    </form>
  );
}
