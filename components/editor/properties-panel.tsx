"use client";
// Properties of the selected element: one field per number, with its unit, checked against the shared schema; for the
// laser also its link to the laser register (register-entry.tsx).
import type { BenchElement } from "@/lib/bench/schema";
import { ElementIcon } from "./element-icon";
import { checkField } from "./field-check";
import { KIND_INFO } from "./element-kinds";
import { LaserLines } from "./laser-lines";
import { NumberField } from "./number-field";
import { RegisterEntryBox } from "./register-entry";
import { LaserRegimeLine } from "@/components/review/pulse-regime";
import type { EditorAction } from "./editor-reducer";

type Props = {
  selected: BenchElement[];
  canEdit: boolean;
  dispatch: (action: EditorAction) => void;
  warnings: { code: string; message: string }[];
  labId: string;
  labName: string;
};

export function PropertiesPanel({ selected, canEdit, dispatch, warnings, labId, labName }: Props) {
  if (selected.length === 0) {
    return (
      <section aria-labelledby="props-heading" className="rounded-lg border border-line bg-panel p-4">
        <h2 id="props-heading" className="mb-1 text-lg font-semibold">Properties</h2>
        <p className="text-sm text-muted">Select an element on the drawing or in the list to see and change its values.</p>
      </section>
    );
  }
  if (selected.length > 1) {
    return (
      <section aria-labelledby="props-heading" className="rounded-lg border border-line bg-panel p-4">
        <h2 id="props-heading" className="mb-1 text-lg font-semibold">Properties</h2>
        <p className="text-sm">{selected.length} elements selected: {selected.map((e) => e.id).join(", ")}.</p>
        <p className="mt-1 text-sm text-muted">Drag one of them or use ← → (Shift: 10 mm) to move them together.</p>
      </section>
    );
  }
  const element = selected[0];
  const info = KIND_INFO[element.kind];
  const values = element as Record<string, unknown>;
  return (
    <section aria-labelledby="props-heading" className="rounded-lg border border-line bg-panel p-4" data-testid="properties">
      <h2 id="props-heading" className="mb-3 flex items-center gap-2 text-lg font-semibold">
        <ElementIcon kind={element.kind} size={24} diverging={element.kind === "lens" && element.focalLengthMm < 0} />
        {info.label} <span className="font-mono text-base font-normal text-muted">{element.id}</span>
      </h2>
      {element.kind === "laser" ? (
        <div className="mb-3">
          <RegisterEntryBox laser={element} labId={labId} labName={labName} canEdit={canEdit} dispatch={dispatch} />
        </div>
      ) : null}
      <div className="grid gap-3">
        {info.fields.map((f) => (
          <NumberField
            key={`${element.id}-${f.key}`}
            id={`field-${f.key}`}
            label={f.label}
            unit={f.unit}
            hint={f.hint}
            optional={f.optional}
            allowEmpty={f.allowEmpty}
            step={f.step}
            readOnly={!canEdit}
            value={values[f.key] as number | undefined}
            check={checkField(element, f.key)}
            onCommit={(v, editSession) => dispatch({ type: "update", id: element.id, patch: { [f.key]: v }, coalesce: `field-${element.id}-${f.key}-${editSession}` })}
          />
        ))}
      </div>
      {element.kind === "laser" ? <LaserRegimeLine laser={element} /> : null}
      {element.kind === "laser" ? <LaserLines laser={element} canEdit={canEdit} dispatch={dispatch} /> : null}
      {warnings.length > 0 ? (
        <ul className="mt-3 flex flex-col gap-1 text-sm text-warn" aria-label={`Warnings about ${element.id}`}>
          {warnings.map((w, i) => (
            <li key={`${w.code}-${i}`}>
              <span aria-hidden="true">⚠ </span>
              {w.message}
            </li>
          ))}
        </ul>
      ) : null}
    </section>
  );
}
