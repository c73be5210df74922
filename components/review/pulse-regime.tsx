// The pulse regime of each line, in words (lib/format/pulse-regime.ts): on the review screen, and on the build sheet.
import { fmt } from "@/components/review/format";
import type { BenchDocumentV2, LaserV2Element } from "@/lib/bench/schema-v2";
import { plainText } from "@/lib/format";
import { laserAveragePowerMw } from "@/lib/bench/laser-power";
import { pulseRegimeWords, regimeRows, type PulseFields, type RegimeRow } from "@/lib/format/pulse-regime";
import type { TableSafetyAssessment } from "@/lib/safety";

/** A table's rows: every laser on it, each of its lines with the rule the engine names, and the pulsed MPE's source. */
export function tableRegime(doc: BenchDocumentV2, safety: Pick<TableSafetyAssessment, "lasers">): { rows: RegimeRow[]; source: string | null } {
  const rows = safety.lasers.flatMap((l) => {
    const laser = doc.elements.find((e): e is LaserV2Element => e.kind === "laser" && e.id === l.laserId);
    if (!laser) return [];
    return regimeRows(l.laserId, laser, l.lines.map((line) => ({ wavelengthNm: line.wavelengthNm, main: line.source === "main", powerMw: line.powerMw, rule: line.pulseRule })));
  });
  const pulsed = safety.lasers.flatMap((l) => l.lines).find((line) => line.pulseRule != null);
  return { rows, source: pulsed ? pulsed.mpeSource : null };
}

const lineName = (r: RegimeRow, showLaser: boolean) => `${showLaser ? `${r.laserId}, ` : ""}${fmt(r.wavelengthNm, 5)} nm${r.main ? "" : " (further line)"}`;

/** Where a table's line figures come from (MPE and NOHD of every line), each once; "not assessed" left out. */
export function tableLineSources(safety: Pick<TableSafetyAssessment, "lasers">): string[] {
  return [...new Set(safety.lasers.flatMap((l) => l.lines.flatMap((line) => [line.mpeSource, line.nohdSource])).filter((x) => x !== "not assessed"))];
}

/** The review screen's list: one line per emission line, the regime, its figures and the rule that governs the MPE. */
export function PulseRegimeList({ rows, source, showLaser = false }: { rows: readonly RegimeRow[]; source: string | null; showLaser?: boolean }) {
  if (rows.length === 0) return null;
  return (
    <div className="rounded-lg border border-line bg-panel p-3" data-testid="pulse-regime">
      <h3 className="text-sm text-muted">Pulse regime of each line</h3>
      <ul className="mt-1 flex flex-col gap-1.5 text-sm">
        {rows.map((r, i) => (
          <li key={`${r.laserId}-${i}`} data-testid="pulse-regime-line">
            <span className="font-medium">{lineName(r, showLaser)}:</span> <span className="font-semibold">{r.words.title}</span> — {r.words.figures}
            {r.words.rule ? <span className="block text-muted">{r.words.rule}.</span> : null}
          </li>
        ))}
      </ul>
      {source ? <p className="mt-2 text-xs text-muted">{plainText(source)}</p> : null}
    </div>
  );
}

/** The build sheet's table of the same. */
export function PrintPulseRegime({ rows, source, showLaser = false }: { rows: readonly RegimeRow[]; source: string | null; showLaser?: boolean }) {
  if (rows.length === 0) return null;
  return (
    <>
      <table style={{ marginBottom: "2mm" }} data-testid="sheet-pulse-regime">
        <thead>
          <tr>
            <th>Line</th>
            <th>Pulse regime</th>
            <th>MPE governed by</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r, i) => (
            <tr key={`${r.laserId}-${i}`}>
              <td className="num">{lineName(r, showLaser)}</td>
              <td>
                <strong>{r.words.title}</strong>: {r.words.figures}
              </td>
              <td>{r.words.rule ? r.words.rule.replace(/^MPE governed by /, "") : "continuous-wave MPE"}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {source ? <p style={{ margin: "0 0 3mm", fontSize: "9.5pt" }}>{plainText(source)}</p> : null}
    </>
  );
}

/** The editor's line under a laser's fields: its regime and figures as typed (the rule comes with the review screen's figures). */
export function LaserRegimeLine({ laser }: { laser: PulseFields & { powerMw?: number } }) {
  const words = pulseRegimeWords(laser, { main: true, powerMw: laserAveragePowerMw(laser) ?? laser.powerMw ?? 0 }, null);
  return (
    <p className="mt-2 text-sm" data-testid="laser-regime">
      <span className="text-muted">Pulse regime: </span>
      <span className="font-medium">{words.title}</span> — {words.figures}
    </p>
  );
}
