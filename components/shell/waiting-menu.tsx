"use client";
// "Waiting for you": a small menu in the header listing, per role, what waits for the signed-in person.
// A disclosure button (Escape or a click elsewhere closes it); each line links to the thing itself.
import Link from "next/link";
import { useEffect, useId, useRef, useState } from "react";
import { CountBadge } from "./inbox-badge";
import { useInbox } from "./use-inbox";

export function WaitingMenu() {
  const { data, error, isPending } = useInbox();
  const [open, setOpen] = useState(false);
  const panelId = useId();
  const root = useRef<HTMLDivElement>(null);
  const button = useRef<HTMLButtonElement>(null);

  useEffect(() => {
    if (!open) return;
    const onKey = (e: KeyboardEvent) => {
      if (e.key === "Escape") {
        setOpen(false);
        button.current?.focus();
      }
    };
    const onPointer = (e: PointerEvent) => {
      if (root.current && !root.current.contains(e.target as Node)) setOpen(false);
    };
    document.addEventListener("keydown", onKey);
    document.addEventListener("pointerdown", onPointer);
    return () => {
      document.removeEventListener("keydown", onKey);
      document.removeEventListener("pointerdown", onPointer);
    };
  }, [open]);

  // Roles with nothing to wait for (an administrator) get no menu at all.
  if (data && data.sections.length === 0) return null;
  const total = data?.total ?? 0;

  return (
    <div ref={root} className="relative" data-testid="waiting-menu">
      <button
        ref={button}
        type="button"
        aria-expanded={open}
        aria-controls={panelId}
        className="inline-flex min-h-11 items-center gap-2 rounded-md border border-line px-3 text-sm hover:bg-raised"
        onClick={() => setOpen((v) => !v)}
      >
        Waiting for you
        {total > 0 ? <CountBadge count={total} words={`: ${total}`} testId="inbox-total" /> : <span className="text-muted">(none)</span>}
      </button>
      {open ? (
        <div id={panelId} className="absolute right-0 z-20 mt-2 w-[min(26rem,calc(100vw-2rem))] rounded-lg border border-line bg-panel p-3 shadow-lg" data-testid="waiting-list">
          {isPending ? <p className="text-muted">Looking…</p> : null}
          {error && !data ? <p role="alert" className="text-danger">The list could not be loaded: {error.message}</p> : null}
          {data?.sections.map((s) => (
            <section key={s.role} className="mb-3 last:mb-0" aria-label={s.label}>
              <h2 className="flex items-center justify-between gap-2 text-sm font-semibold">
                <Link href={s.listHref} className="text-text" onClick={() => setOpen(false)}>
                  {s.label}
                </Link>
                <span className="text-muted">{s.count === 0 ? "nothing waiting" : `${s.count} waiting`}</span>
              </h2>
              {s.items.length ? (
                <ul className="mt-1 flex flex-col gap-1">
                  {s.items.map((i) => (
                    <li key={i.id}>
                      <Link href={i.href} className="block rounded-md px-2 py-1.5 no-underline hover:bg-raised" onClick={() => setOpen(false)}>
                        <span className="block text-text">{i.title}</span>
                        <span className="block text-sm text-muted">{i.detail}</span>
                      </Link>
                    </li>
                  ))}
                </ul>
              ) : null}
              {s.count > s.items.length ? (
                <p className="mt-1 px-2 text-sm">
                  <Link href={s.listHref} onClick={() => setOpen(false)}>
                    and {s.count - s.items.length} more…
                  </Link>
                </p>
              ) : null}
            </section>
          ))}
        </div>
      ) : null}
    </div>
  );
}
