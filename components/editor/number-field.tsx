"use client";
// A number input with its unit, checked as the user types. A value that fails the check stays in the field with
// the reason beside it and is never committed; the field follows outside changes (drag, undo) when they differ.
import { useRef, useState } from "react";
import { parseNumber } from "./number-parse";

// Each visit to a field (focus) is one editing session: typing within it is one undo step, a later visit another.
let sessions = 0;

type Props = {
  id: string;
  label: string;
  unit: string;
  hint?: string;
  optional?: boolean;
  /** Empty is passed on as undefined (for the check to judge) without the label saying "optional". */
  allowEmpty?: boolean;
  value: number | undefined;
  step?: number;
  readOnly?: boolean;
  /** The schema's sentence for this value, or null when it is acceptable. */
  check: (value: number | undefined) => string | null;
  /** editSession names the visit to the field, for coalescing the typing into one undo step. */
  onCommit: (value: number | undefined, editSession: number) => void;
};

const show = (v: number | undefined) => (v === undefined ? "" : String(v));

export function NumberField({ id, label, unit, hint, optional = false, allowEmpty = false, value, step, readOnly, check, onCommit }: Props) {
  const emptyOk = optional || allowEmpty;
  const [text, setText] = useState(show(value));
  const [shown, setShown] = useState(value);
  const [error, setError] = useState<string | null>(null);
  const session = useRef(0);

  // An outside change (drag, undo, import) replaces the text unless the text already says that value.
  if (value !== shown) {
    setShown(value);
    const parsed = parseNumber(text, emptyOk);
    if (!("value" in parsed) || parsed.value !== value) {
      setText(show(value));
      setError(null);
    }
  }

  const change = (next: string) => {
    setText(next);
    const parsed = parseNumber(next, emptyOk);
    if ("error" in parsed) return setError(parsed.error);
    const problem = check(parsed.value);
    setError(problem);
    if (problem === null && parsed.value !== value) onCommit(parsed.value, session.current);
  };

  const describedBy = [error ? `${id}-error` : null, hint ? `${id}-hint` : null].filter(Boolean).join(" ") || undefined;
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium text-muted">
        {label}
        {optional ? <span className="font-normal"> (optional)</span> : null}
      </label>
      <div className="flex items-center gap-2">
        <input
          id={id}
          type="text"
          inputMode="decimal"
          autoComplete="off"
          value={text}
          readOnly={readOnly}
          step={step}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy}
          onFocus={() => {
            session.current = ++sessions;
          }}
          onChange={(e) => change(e.target.value)}
          className={`min-h-10 w-full min-w-0 rounded-md border bg-ink px-3 py-1.5 font-mono text-base text-text read-only:opacity-70 ${error ? "border-danger" : "border-line"}`}
        />
        {unit ? <span className="w-10 shrink-0 text-sm text-muted">{unit}</span> : null}
      </div>
      {hint && !error ? (
        <p id={`${id}-hint`} className="text-xs text-muted">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${id}-error`} className="text-sm text-danger" role="alert">
          <span aria-hidden="true">✕ </span>
          {error}
        </p>
      ) : null}
    </div>
  );
}
