import type { CoverageData } from "./coverage-list";
import { otherStandardNotes, standardSentence } from "./standard-words";

const od = (v: number | null) => (v === null || !Number.isFinite(v) ? "—" : v.toFixed(1));
const nm = (v: number) => String(Number(v.toPrecision(6)));

/** The build sheet's eyewear block: per line, the OD needed and the lab's items that cover it, or that none does (plain print styles). */
export function PrintCoverage({ data, asOf }: { data: CoverageData; asOf: string }) {
  const { coverage } = data;
  return (
    <div className="box" style={{ marginBottom: "3mm" }} data-testid="sheet-eyewear">
      <p style={{ margin: "0 0 1mm", fontWeight: 700 }}>Eyewear on the lab&apos;s list, per line (list as of {asOf})</p>
      <ul style={{ margin: 0, paddingLeft: "5mm" }}>
        {coverage.lines.map((l, i) => (
          <li key={i}>
            <strong>
              {nm(l.wavelengthNm)} nm{l.label ? ` (${l.label})` : ""}, OD needed {od(l.opticalDensityRequired)}:
            </strong>{" "}
            {l.status === "none-needed"
              ? "no eyewear needed by the estimate."
              : l.status === "unknown"
                ? "OD not computed — no eyewear counted as covering it."
                : l.status === "covered"
                  ? `☐ ${l.coveredBy.map((c) => `${c.name} (OD ${od(c.opticalDensity)}${c.en207ScaleNumber ? `, LB${c.en207ScaleNumber}` : ""})`).join("; ")}`
                  : "✕ NONE of this lab's eyewear covers it — do not switch on until the laser safety officer provides eyewear."}
          </li>
        ))}
      </ul>
      {coverage.lines.filter((l) => l.status !== "none-needed").length > 1 ? (
        <p style={{ margin: "1mm 0 0" }}>{coverage.coversAll.length ? `One item for every line: ${coverage.coversAll.map((c) => c.name).join("; ")}.` : "No single item on the list covers every line at once."}</p>
      ) : null}
      <p style={{ margin: "1mm 0 0", fontSize: "9.5pt" }}>{coverage.note}</p>
    </div>
  );
}

/** The sheet's one line naming the standard the figures follow. */
export function PrintStandard({ data, safety }: { data: Pick<CoverageData, "standard">; safety: unknown }) {
  return (
    <div style={{ margin: "0 0 2mm", fontSize: "10.5pt" }} data-testid="sheet-standard">
      <p style={{ margin: 0 }}>
        <strong>Standard:</strong> {standardSentence(data.standard, safety)}
      </p>
      {otherStandardNotes(safety).map((n, i) => (
        <p key={i} style={{ margin: "1mm 0 0", fontSize: "9.5pt" }}>
          {n}
        </p>
      ))}
    </div>
  );
}
