// Beside every hazard result: the one deferral sentence, and the hazard engine's scope limits (what it does not cover).
import { LIMITATIONS } from "@/lib/safety/limitations";
import { FINAL_SAY } from "@/lib/safety/types";
import { limitationText, ONE_OVER_E_NOTE } from "@/lib/format";

/** The deferral sentence, the same everywhere a hazard figure appears. */
export function FinalSay({ className = "" }: { className?: string }) {
  return (
    <p className={`text-sm font-medium ${className}`} data-testid="final-say">
      <span aria-hidden="true">⚠ </span>
      {FINAL_SAY}
    </p>
  );
}

/** The scope limits of the hazard figures, folded so they sit beside a result without crowding it. */
export function HazardScope({ open = false, oneOverE = true }: { open?: boolean; oneOverE?: boolean }) {
  return (
    <details className="rounded-md border border-line px-3 py-2 text-sm" open={open} data-testid="hazard-scope">
      <summary className="cursor-pointer font-medium">What these hazard figures do not cover ({LIMITATIONS.length})</summary>
      <ul className="mt-2 flex list-disc flex-col gap-1 pl-5 text-muted">
        {oneOverE ? <li>{ONE_OVER_E_NOTE}</li> : null}
        {LIMITATIONS.map((l) => (
          <li key={l.id}>{limitationText(l)}</li>
        ))}
      </ul>
    </details>
  );
}

/** Both, as the foot of a hazard result. */
export function HazardNotes({ openScope = false }: { openScope?: boolean }) {
  return (
    <div className="flex flex-col gap-2">
      <HazardScope open={openScope} />
      <FinalSay />
    </div>
  );
}
