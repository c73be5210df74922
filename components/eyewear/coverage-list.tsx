import type { EyewearCoverage } from "@/lib/safety/eyewear";
import { otherStandardNotes, standardSentence, type StandardName } from "./standard-words";

export type CoverageData = { standard: StandardName; itemCount: number; coverage: EyewearCoverage };

function od(value: number | null): string {
  if (value === null || !Number.isFinite(value)) return "—";
  return value.toFixed(1);
}

function nm(value: number): string {
  return String(Number(value.toPrecision(6)));
}

/** The lab's standard in one sentence (screens and the sheet). */
export function StandardLine({ standard, safety, className = "" }: { standard: StandardName; safety: unknown; className?: string }) {
  return (
    <div className={`text-sm ${className}`} data-testid="safety-standard">
      <p>
        <span className="font-medium">Standard: </span>
        {standardSentence(standard, safety)}
      </p>
      {otherStandardNotes(safety).map((n, i) => (
        <p key={i} className="mt-1">
          <span aria-hidden="true">◇ </span>
          {n}
        </p>
      ))}
    </div>
  );
}

/**
 * Per emission line: the OD needed and whether eyewear the lab keeps covers it (and which), or that none does.
 * Server- and client-safe (no hooks); the print sheet uses it with `print`.
 */
export function CoverageList({ data, print = false, showStandard = true, safety }: { data: CoverageData; print?: boolean; showStandard?: boolean; safety?: unknown }) {
  const { coverage } = data;
  const muted = print ? "text-gray-600" : "text-muted";
  return (
    <div className="flex flex-col gap-2" data-testid="eyewear-coverage">
      {showStandard ? <StandardLine standard={data.standard} safety={safety} /> : null}
      {coverage.lines.length === 0 ? <p className={`text-sm ${muted}`}>No emission line to check: the hazard figures could not be computed.</p> : null}
      <ul className="flex flex-col gap-1 text-sm">
        {coverage.lines.map((line, i) => {
          const head = `${nm(line.wavelengthNm)} nm${line.label ? ` (${line.label})` : ""}, OD needed ${od(line.opticalDensityRequired)}`;
          const mark = line.status === "covered" || line.status === "none-needed" ? "✓" : line.status === "unknown" ? "?" : "✕";
          const colour = line.status === "not-covered" ? "border-danger" : line.status === "unknown" ? "border-warn" : "border-line";
          return (
            <li key={`${line.laserId}-${line.wavelengthNm}-${i}`} className={`rounded-md border px-3 py-2 ${colour}`} data-line-status={line.status}>
              <span aria-hidden="true">{mark} </span>
              <span className="font-medium">{head}: </span>
              {line.status === "none-needed" ? (
                <>no eyewear needed for this line at the bench&apos;s exposure.</>
              ) : line.status === "unknown" ? (
                <>the OD needed could not be computed, so no eyewear is counted as covering it.</>
              ) : line.status === "covered" ? (
                <>
                  covered by {line.coveredBy.map((c) => `${c.name} (OD ${od(c.opticalDensity)}${c.en207ScaleNumber ? `, LB${c.en207ScaleNumber}` : ""})`).join("; ")}.
                </>
              ) : (
                <>
                  <strong>none of this lab&apos;s eyewear covers it</strong>
                  {line.shortOf.length ? <> ({line.shortOf.map((c) => `${c.name} gives only OD ${od(c.opticalDensity)}`).join("; ")})</> : null}
                  {data.itemCount === 0 ? <> — the lab has no eyewear on its list</> : null}.
                </>
              )}
            </li>
          );
        })}
      </ul>
      {coverage.lines.filter((l) => l.status !== "none-needed").length > 1 ? (
        <p className="text-sm">
          {coverage.coversAll.length ? (
            <>
              <span className="font-medium">One item for every line: </span>
              {coverage.coversAll.map((c) => c.name).join("; ")}.
            </>
          ) : (
            <>
              <span aria-hidden="true">▲ </span>No single item the lab keeps covers every line at once.
            </>
          )}
        </p>
      ) : null}
      <p className={`text-xs ${muted}`}>
        OD needed is the highest on the bench for each line. {coverage.note} Eyewear choice is advisory: the institution&apos;s laser safety officer and local regulations decide.
      </p>
    </div>
  );
}
