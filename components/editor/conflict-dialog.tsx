"use client";
// Someone saved the bench after this drawing was loaded: show what differs and let the user choose.
import { useEffect, useRef } from "react";
import { Button } from "@/components/ui/button";
import type { DraftView } from "@/lib/api/bench-queries";
import type { AnyBenchDocument, BenchDocument } from "@/lib/bench/schema";
import { documentDifferences } from "./element-diff";

type Props = { mine: AnyBenchDocument; current: DraftView; message: string; onKeepMine: () => void; onTakeTheirs: () => void };

export function ConflictDialog({ mine, current, message, onKeepMine, onTakeTheirs }: Props) {
  // Element by element when both are rails or both are tables (the sentences read a rail position or a place on the
  // table); a table saved over a rail, or the other way, cannot be compared so: every element then differs.
  const differences = current.document.version === mine.version ? documentDifferences(mine as BenchDocument, current.document as BenchDocument) : [];
  const heading = useRef<HTMLHeadingElement>(null);
  useEffect(() => heading.current?.focus(), []);
  return (
    <section role="alertdialog" aria-labelledby="conflict-heading" aria-describedby="conflict-text" className="rounded-lg border-2 border-danger bg-panel p-4" data-testid="conflict">
      <h2 id="conflict-heading" ref={heading} tabIndex={-1} className="text-lg font-semibold">
        <span aria-hidden="true">✕ </span>This bench was saved elsewhere while you were editing
      </h2>
      <p id="conflict-text" className="mt-1 text-sm text-muted">
        {message} Your drawing is still here. What differs between yours and the saved one (revision {current.revisionNumber}, version {current.version}):
      </p>
      {differences.length > 0 ? (
        <ul className="mt-2 list-disc pl-6 text-sm" data-testid="conflict-differences">
          {differences.map((d, i) => (
            <li key={`${d.id}-${i}`}>{d.sentence}</li>
          ))}
        </ul>
      ) : (
        <p className="mt-2 text-sm">The two drawings are the same.</p>
      )}
      <div className="mt-3 flex flex-wrap gap-2">
        <Button type="button" onClick={onKeepMine}>
          Keep mine (save it over the saved version)
        </Button>
        <Button type="button" variant="quiet" onClick={onTakeTheirs}>
          Take the saved version (undo brings mine back)
        </Button>
      </div>
    </section>
  );
}
