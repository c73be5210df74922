"use client";
// For the selected aperture: the finder's best screen positions for a bright or a dark centre, the same places the
// ticks mark on the rail, each with a button that moves the screen there (one undo step).
import type { KeyedScreenSearch } from "@/lib/api/bench-queries";
import { sig } from "./format";
import { CENTRE_SYMBOL, FINDER_SHOWN, screenTarget, type FinderRange } from "./screen-finder";
import type { ScreenCandidate } from "@/lib/optics";

type Props = {
  apertureId: string;
  range: FinderRange | null;
  data: KeyedScreenSearch | undefined;
  stale: boolean;
  loading: boolean;
  error: string | null;
  canEdit: boolean;
  onMoveScreen: (positionMm: number) => void;
};

const BUTTON = "inline-flex min-h-10 items-center justify-center rounded-md border border-line px-3 text-sm hover:bg-raised disabled:cursor-not-allowed disabled:opacity-40";

export function FinderPanel({ apertureId, range, data, stale, loading, error, canEdit, onMoveScreen }: Props) {
  const verb = range?.screenId ? "Move the screen here" : "Put a screen here";
  const list = (goal: "bright" | "dark", candidates: ScreenCandidate[]) => (
    <div>
      <h4 className="mb-1 text-sm font-semibold">
        {goal === "bright" ? "● Bright centre (odd zone count)" : "○ Dark centre (even zone count)"}
      </h4>
      {candidates.length === 0 ? (
        <p className="text-sm text-muted">None in the searched stretch.</p>
      ) : (
        <ul className="flex flex-col gap-1.5" data-testid={`finder-${goal}`}>
          {candidates.slice(0, FINDER_SHOWN).map((c, i) => (
            <li key={`${goal}-${i}`} className="flex flex-wrap items-center gap-x-3 gap-y-1 rounded-md border border-line px-2 py-1.5" data-testid="finder-candidate" data-centre={c.centre} data-position-mm={screenTarget(c)}>
              <span className="min-w-0 flex-1">
                <span className="font-semibold">
                  <span aria-hidden="true">{CENTRE_SYMBOL[c.centre]} </span>
                  {c.zoneCount} zone{c.zoneCount === 1 ? "" : "s"} · centre {c.centre}
                </span>
                <span className="ml-2 font-mono">{sig(screenTarget(c), 5)} mm</span>
                <span className="block text-xs text-muted">
                  {sig(c.observationDistanceMm, 4)} mm behind {apertureId}; holds for ±{sig(c.toleranceMm, 2)} mm
                </span>
              </span>
              {canEdit ? (
                <button
                  type="button"
                  className={BUTTON}
                  disabled={stale}
                  onClick={() => onMoveScreen(screenTarget(c))}
                  aria-label={`${verb}: ${sig(screenTarget(c), 5)} mm, ${c.zoneCount} zones, centre ${c.centre}`}
                >
                  {verb}
                </button>
              ) : null}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
  return (
    <section aria-labelledby="finder-heading" className={`mt-4 ${stale ? "opacity-60" : ""}`} data-testid="finder" data-stale={stale} aria-busy={loading}>
      <h3 id="finder-heading" className="mb-1 flex items-center justify-between gap-2 text-base font-semibold">
        Where to put the screen for {apertureId}
        {stale || (loading && !data) ? <span className="text-sm font-normal text-muted">updating…</span> : null}
      </h3>
      <p className="mb-2 text-xs text-muted">
        {range ? `Searched from ${sig(range.fromMm, 5)} to ${sig(range.toMm, 5)} mm. ` : ""}Best first: the widest tolerance is the easiest to set up. The
        same places are ticked on the ruler (● bright, ○ dark, ◐ in between; the number is the zone count).
      </p>
      {error ? <p className="text-sm text-danger">✕ The finder failed: {error}</p> : null}
      {data ? (
        <>
          <div className="flex flex-col gap-3">
            {list("bright", data.bright)}
            {list("dark", data.dark)}
          </div>
          {data.notes.length > 0 ? (
            <ul className="mt-2 text-xs text-muted">
              {data.notes.map((n) => (
                <li key={n}>{n}</li>
              ))}
            </ul>
          ) : null}
        </>
      ) : !error ? (
        <p className="text-sm text-muted">{range ? "Searching…" : "The finder needs a valid drawing with this aperture lit."}</p>
      ) : null}
    </section>
  );
}
