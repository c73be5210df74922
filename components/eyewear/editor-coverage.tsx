"use client";
// The editor's eyewear lines: the lab's list (sent with the page) against the lines of the live analysis.
import { useMemo } from "react";
import { eyewearCoverage, lineNeeds, type EyewearItem, type HazardAnswerLines } from "@/lib/safety/eyewear";
import { CoverageList } from "./coverage-list";
import type { StandardName } from "./standard-words";

export type LabShelfData = { standard: StandardName; items: EyewearItem[] };

export function EditorCoverage({ shelf, safety }: { shelf: LabShelfData; safety: HazardAnswerLines }) {
  const coverage = useMemo(() => eyewearCoverage(shelf.items, lineNeeds(safety)), [shelf.items, safety]);
  return (
    <details className="mt-3" open>
      <summary className="cursor-pointer text-sm font-medium">Eyewear on this lab&apos;s list</summary>
      <div className="mt-2">
        <CoverageList data={{ standard: shelf.standard, itemCount: shelf.items.length, coverage }} safety={safety} />
      </div>
    </details>
  );
}
