"use client";
// The laser chooser: the lab's in-service lasers from the register (model, wavelengths, maximum power, label class)
// or an ad hoc laser typed in by hand. Each register entry can be clicked (added at a sensible place) or dragged onto
// the rail; the same list serves the properties panel when an existing laser is linked to the register.
import { useQuery } from "@tanstack/react-query";
import { inServiceLasersQuery } from "@/lib/api/bench-queries";
import { KIND_DRAG_TYPE } from "./palette";
import { entryName, type RegisterEntry } from "./register-check";

/** Drag data naming the register entry a dragged laser comes from. */
export const REGISTER_DRAG_TYPE = "application/x-benchwarden-register-laser";

const num = (x: number) => Number(x.toPrecision(4)).toString();
export const wavelengthsText = (e: Pick<RegisterEntry, "wavelengthsNm">) => `${e.wavelengthsNm.map(num).join(" / ")} nm`;

type Props = {
  labId: string;
  labName: string;
  /** Called with the chosen entry (its first wavelength is used; the properties panel offers the others). */
  onPick: (entry: RegisterEntry) => void;
  /** Present when an ad hoc laser is on offer (adding a new laser); absent when linking an existing one. */
  onAdHoc?: () => void;
  /** Entries may be dragged onto the rail (adding a new laser). */
  draggable?: boolean;
  onClose?: () => void;
  /** The entry the laser already refers to, marked as current. */
  currentId?: string;
  id?: string;
};

export function LaserPicker({ labId, labName, onPick, onAdHoc, draggable = false, onClose, currentId, id }: Props) {
  const lasers = useQuery(inServiceLasersQuery(labId));
  const list = lasers.data ?? [];
  return (
    <div id={id} className="flex flex-col gap-2 rounded-md border border-line bg-ink p-3" data-testid="laser-picker" role="group" aria-label="Choose the laser">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <p className="text-sm font-medium">
          From the register <span className="font-normal text-muted">— in-service lasers of {labName}</span>
        </p>
        {onClose ? (
          <button type="button" onClick={onClose} className="min-h-9 rounded-md px-2 text-sm text-muted hover:bg-raised" aria-label="Close the laser chooser">
            ✕ Close
          </button>
        ) : null}
      </div>
      {lasers.isPending ? <p className="text-sm text-muted">Reading the laser register…</p> : null}
      {lasers.error ? <p className="text-sm text-danger" role="alert">✕ The register could not be read: {lasers.error.message}</p> : null}
      {lasers.data && list.length === 0 ? (
        <p className="text-sm text-muted">The register lists no laser in service for {labName}. Ask the laser safety officer to enter it{onAdHoc ? ", or add an ad hoc laser below" : ""}.</p>
      ) : null}
      {list.length > 0 ? (
        <ul className="flex flex-col gap-1.5" aria-label={`In-service lasers of ${labName}`}>
          {list.map((entry) => (
            <li key={entry.id}>
              <button
                type="button"
                draggable={draggable}
                onDragStart={(e) => {
                  e.dataTransfer.setData(KIND_DRAG_TYPE, "laser");
                  e.dataTransfer.setData(REGISTER_DRAG_TYPE, entry.id);
                  e.dataTransfer.effectAllowed = "copy";
                }}
                onClick={() => onPick(entry)}
                className={`grid w-full grid-cols-[minmax(0,1fr)_auto] items-center gap-x-3 gap-y-0.5 rounded-md border px-3 py-2 text-left text-sm hover:bg-raised ${entry.id === currentId ? "border-accent" : "border-line"}`}
                data-testid="register-laser"
                data-laser-id={entry.id}
                title={draggable ? "Add this laser (or drag it onto the rail)" : "Use this laser's register values"}
              >
                <span className="font-medium">
                  {entry.id === currentId ? <span aria-label="current">● </span> : null}
                  {entryName(entry)}
                </span>
                <span className="rounded-full border border-line px-2 text-xs" title="The class on the laser's label">
                  Class {entry.labelClass}
                </span>
                <span className="font-mono text-xs text-muted">
                  {wavelengthsText(entry)} · max {num(entry.maxPowerMw)} mW · beam ⌀ {num(entry.beamDiameterMm)} mm
                  {entry.pulseDurationS !== null ? " · pulsed" : ""}
                </span>
                <span className="text-xs text-accent">{draggable ? "Add" : "Use"}</span>
              </button>
            </li>
          ))}
        </ul>
      ) : null}
      {onAdHoc ? (
        <div className="flex flex-wrap items-center gap-2 border-t border-line pt-2">
          <button
            type="button"
            draggable={draggable}
            onDragStart={(e) => {
              e.dataTransfer.setData(KIND_DRAG_TYPE, "laser");
              e.dataTransfer.effectAllowed = "copy";
            }}
            onClick={onAdHoc}
            className="inline-flex min-h-10 items-center rounded-md border border-line px-3 text-sm hover:bg-raised"
            data-testid="laser-ad-hoc"
          >
            Ad hoc laser
          </button>
          <span className="text-xs text-muted">Values typed in by hand, not linked to the register (the safety officer will ask which laser it is).</span>
        </div>
      ) : null}
    </div>
  );
}
