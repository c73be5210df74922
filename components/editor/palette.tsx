"use client";
// The palette of element kinds: click (or Enter) adds one at a sensible place; drag one onto the drawing to place it.
// The laser opens the laser chooser instead (from the register or ad hoc); dragging it places an ad hoc laser.
import { ELEMENT_KINDS, type ElementKind } from "@/lib/bench/schema";
import { ElementIcon } from "./element-icon";
import { KIND_INFO } from "./element-kinds";

export const KIND_DRAG_TYPE = "application/x-benchwarden-kind";

type Props = {
  onAdd: (kind: ElementKind) => void;
  hasLaser: boolean;
  /** Opens or closes the laser chooser (the laser entry's click). */
  onLaser: () => void;
  laserChooserOpen: boolean;
  laserChooserId: string;
};

export function Palette({ onAdd, hasLaser, onLaser, laserChooserOpen, laserChooserId }: Props) {
  return (
    <div role="group" aria-label="Add an element" className="flex flex-wrap items-center gap-1.5">
      <span className="mr-1 text-sm text-muted">Add</span>
      {ELEMENT_KINDS.map((kind) => {
        const disabled = kind === "laser" && hasLaser;
        const laser = kind === "laser";
        return (
          <button
            key={kind}
            type="button"
            draggable={!disabled}
            disabled={disabled}
            title={
              disabled
                ? "A bench holds exactly one laser"
                : laser
                  ? "Add a laser from the lab's register or an ad hoc one (dragging places an ad hoc laser)"
                  : `Add a ${KIND_INFO[kind].label.toLowerCase()} (or drag it onto the rail)`
            }
            aria-expanded={laser && !disabled ? laserChooserOpen : undefined}
            aria-controls={laser && !disabled ? laserChooserId : undefined}
            onDragStart={(e) => {
              e.dataTransfer.setData(KIND_DRAG_TYPE, kind);
              e.dataTransfer.effectAllowed = "copy";
            }}
            onClick={() => (laser ? onLaser() : onAdd(kind))}
            className="inline-flex min-h-10 items-center gap-1.5 rounded-md border border-line bg-panel px-2.5 py-1 text-sm hover:bg-raised disabled:cursor-not-allowed disabled:opacity-40"
            data-testid={`palette-${kind}`}
          >
            <ElementIcon kind={kind} size={22} />
            {KIND_INFO[kind].label}
            {laser && !disabled ? <span aria-hidden="true">{laserChooserOpen ? "▴" : "▾"}</span> : null}
          </button>
        );
      })}
    </div>
  );
}
