"use client";
// The elements in beam order as focusable rows: the keyboard's way into the drawing. Click or Enter selects,
// Shift+click or Shift+Enter adds to the selection, ↑ ↓ move between rows (the editor handles ← → Delete etc.).
import type { KeyboardEvent } from "react";
import type { BenchElement } from "@/lib/bench/schema";
import { ElementIcon } from "./element-icon";
import { KIND_INFO, formatMm, shortLabel } from "./element-kinds";

type Props = {
  elements: BenchElement[];
  selection: string[];
  warningsById: Map<string, number>;
  onSelect: (ids: string[]) => void;
  onToggle: (id: string) => void;
};

export function ElementList({ elements, selection, warningsById, onSelect, onToggle }: Props) {
  const sorted = [...elements].sort((a, b) => a.positionMm - b.positionMm || (a.id < b.id ? -1 : 1));
  const onKeyDown = (e: KeyboardEvent<HTMLButtonElement>, id: string) => {
    if ((e.key === "Enter" || e.key === " ") && e.shiftKey) {
      e.preventDefault();
      onToggle(id);
    } else if (e.key === "ArrowDown" || e.key === "ArrowUp") {
      e.preventDefault();
      const rows = Array.from(e.currentTarget.closest("ul")?.querySelectorAll<HTMLButtonElement>("button[data-element-row]") ?? []);
      const i = rows.indexOf(e.currentTarget);
      const next = rows[e.key === "ArrowDown" ? Math.min(rows.length - 1, i + 1) : Math.max(0, i - 1)];
      next?.focus();
      if (next && !e.shiftKey) onSelect([next.dataset.elementRow!]);
    }
  };
  return (
    <section aria-labelledby="elements-heading" className="rounded-lg border border-line bg-panel p-4">
      <h2 id="elements-heading" className="mb-2 text-lg font-semibold">Elements in beam order</h2>
      {sorted.length === 0 ? (
        <p className="text-sm text-muted">The rail is empty. Start with a laser from the palette.</p>
      ) : (
        <ul className="flex flex-col gap-1" aria-label="Elements">
          {sorted.map((e) => {
            const selected = selection.includes(e.id);
            const warnings = warningsById.get(e.id) ?? 0;
            return (
              <li key={e.id}>
                <button
                  type="button"
                  data-element-row={e.id}
                  aria-pressed={selected}
                  onClick={(ev) => (ev.shiftKey ? onToggle(e.id) : onSelect([e.id]))}
                  onKeyDown={(ev) => onKeyDown(ev, e.id)}
                  className={`flex w-full items-center gap-3 rounded-md border px-3 py-2 text-left ${selected ? "border-accent bg-raised" : "border-transparent hover:bg-raised"}`}
                >
                  <span className={selected ? "text-accent-strong" : "text-muted"}>
                    <ElementIcon kind={e.kind} size={24} diverging={e.kind === "lens" && e.focalLengthMm < 0} />
                  </span>
                  <span className="flex-1">
                    <span className="font-mono">{e.id}</span> <span className="text-sm text-muted">{KIND_INFO[e.kind].label}</span>
                    <span className="block text-sm text-muted">{shortLabel(e)}</span>
                  </span>
                  {warnings > 0 ? (
                    <span className="text-sm text-warn" title={`${warnings} warning${warnings === 1 ? "" : "s"}`}>
                      ⚠ {warnings}
                    </span>
                  ) : null}
                  <span className="font-mono text-sm">{formatMm(e.positionMm)}</span>
                  {selected ? <span className="sr-only">(selected)</span> : null}
                </button>
              </li>
            );
          })}
        </ul>
      )}
    </section>
  );
}
