"use client";
// The laser's further emission lines (a doubled laser's residual fundamental and pump), each with its power; validated
// by the shared bench schema, so each line's eyewear need shows in the safety panel.
import type { LaserElement } from "@/lib/bench/schema";
import { laserSchema } from "@/lib/bench/schema";
import type { EditorAction } from "./editor-reducer";
import { NumberField } from "./number-field";

type Line = { wavelengthNm: number; powerMw: number };

function checkLine(laser: LaserElement, index: number, key: keyof Line) {
  return (value: number | undefined): string | null => {
    if (value === undefined) return `${key === "wavelengthNm" ? "Line wavelength" : "Line power"} is required; remove the line instead`;
    const lines = (laser.lines ?? []).map((l, i) => (i === index ? { ...l, [key]: value } : l));
    const result = laserSchema.safeParse({ ...laser, lines });
    if (result.success) return null;
    return result.error.issues.find((i) => i.path[0] === "lines" && i.path[1] === index && i.path[2] === key)?.message ?? null;
  };
}

export function LaserLines({ laser, canEdit, dispatch }: { laser: LaserElement; canEdit: boolean; dispatch: (action: EditorAction) => void }) {
  const lines: Line[] = laser.lines ?? [];
  const commit = (next: Line[], coalesce?: string) => dispatch({ type: "update", id: laser.id, patch: { lines: next.length ? next : undefined }, coalesce });
  return (
    <fieldset className="mt-3 flex flex-col gap-2" data-testid="laser-lines">
      <legend className="text-sm font-medium">Further emission lines</legend>
      {lines.length === 0 ? <p className="text-sm text-muted">None. Add the residual lines a frequency-doubled or pumped laser also emits.</p> : null}
      {lines.map((l, i) => (
        <div key={`${laser.id}-line-${i}`} className="grid grid-cols-[1fr_1fr] items-end gap-2 rounded-md border border-line p-2">
          <NumberField
            id={`field-line-${i}-wavelength`}
            label={`Line ${i + 2} wavelength`}
            unit="nm"
            value={l.wavelengthNm}
            readOnly={!canEdit}
            check={checkLine(laser, i, "wavelengthNm")}
            onCommit={(v, session) => v !== undefined && commit(lines.map((x, j) => (j === i ? { ...x, wavelengthNm: v } : x)), `line-${laser.id}-${i}-w-${session}`)}
          />
          <NumberField
            id={`field-line-${i}-power`}
            label={`Line ${i + 2} power`}
            unit="mW"
            value={l.powerMw}
            readOnly={!canEdit}
            check={checkLine(laser, i, "powerMw")}
            onCommit={(v, session) => v !== undefined && commit(lines.map((x, j) => (j === i ? { ...x, powerMw: v } : x)), `line-${laser.id}-${i}-p-${session}`)}
          />
          {canEdit ? (
            <button type="button" className="col-span-2 min-h-10 justify-self-start rounded-md border border-line px-3 text-sm hover:bg-raised" onClick={() => commit(lines.filter((_, j) => j !== i))}>
              Remove line {i + 2}
            </button>
          ) : null}
        </div>
      ))}
      {canEdit && lines.length < 16 ? (
        <button
          type="button"
          className="min-h-10 self-start rounded-md border border-line px-3 text-sm hover:bg-raised"
          onClick={() => commit([...lines, { wavelengthNm: laser.wavelengthNm === 532 ? 1064 : Math.min(laser.wavelengthNm * 2, 1_000_000), powerMw: Math.max((laser.powerMw ?? 1) / 10, 0.001) }])}
        >
          Add a further line
        </button>
      ) : null}
    </fieldset>
  );
}
