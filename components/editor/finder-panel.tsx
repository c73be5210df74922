"use client";
// For the selected aperture: the finder's best screen positions for a bright or a dark centre, the same places the
// ticks mark on the rail, each with a button that moves the screen there (one undo step).
import type { KeyedScreenSearch } from "@/lib/api/bench-queries";
import { sig } from "./format";
import { CENTRE_WORDS } from "@/lib/format/words";
import { CENTRE_SYMBOL, FINDER_SHOWN, screenTarget, type FinderRange } from "./screen-finder";
import type { ScreenCandidate } from "@/lib/optics";

type Props = {
  apertureId: string;
  /** Where the screen stands now and what the analysis predicts there, listed with the finder's answers. */
  current?: { positionMm: number; centre: "bright" | "dark" | "between"; zones: number } | null;
  range: FinderRange | null;
  data: KeyedScreenSearch | undefined;
  stale: boolean;
  loading: boolean;
  error: string | null;
  canEdit: boolean;
  onMoveScreen: (positionMm: number) => void;
};

const BUTTON = "inline-flex min-h-10 items-center justify-center rounded-md border border-line px-3 text-sm hover:bg-raised disabled:cursor-not-allowed disabled:opacity-40";

const HEADINGS = {
  bright: "● Bright centre (odd zone count)",
  dark: "○ Dark centre (even zone count)",
  between: "◐ Centre between bright and dark",
} as const;

export function FinderPanel({ apertureId, current = null, range, data, stale, loading, error, canEdit, onMoveScreen }: Props) {
  const verb = range?.screenId ? "Move the screen here" : "Put a screen here";
  // each row under the heading of the centre it predicts, so heading and rows always agree
  const all = data ? [...data.bright.slice(0, FINDER_SHOWN), ...data.dark.slice(0, FINDER_SHOWN)] : [];
  // A place where the screen already stands is listed once, as "where it stands now", not again as a candidate.
  const standsThere = (c: ScreenCandidate) =>
    Boolean(current && range?.screenId && c.centre === current.centre && Math.abs(screenTarget(c) - current.positionMm) <= Math.max(c.toleranceMm, 0.5));
  const byCentre = (centre: "bright" | "dark" | "between") => all.filter((c) => c.centre === centre && !standsThere(c));
  const here = (centre: "bright" | "dark" | "between") =>
    current && current.centre === centre && range?.screenId ? (
      <li className="flex flex-wrap items-center gap-x-3 gap-y-1 rounded-md border border-accent px-2 py-1.5" data-testid="finder-current" data-centre={current.centre}>
        <span className="min-w-0 flex-1">
          <span className="font-semibold">
            <span aria-hidden="true">{CENTRE_SYMBOL[current.centre]} </span>
            {sig(current.zones)} zones · {CENTRE_WORDS[current.centre]}
          </span>
          <span className="ml-2 font-mono">{sig(current.positionMm, 5)} mm</span>
          <span className="block text-xs text-muted">where {range.screenId} stands now</span>
        </span>
      </li>
    ) : null;
  const list = (goal: "bright" | "dark" | "between", candidates: ScreenCandidate[]) => (
    <div>
      <h4 className="mb-1 text-sm font-semibold">{HEADINGS[goal]}</h4>
      {here(goal)}
      {candidates.length === 0 ? (
        <p className="text-sm text-muted">{here(goal) ? "No other place in the searched stretch." : "None in the searched stretch."}</p>
      ) : (
        <ul className="flex flex-col gap-1.5" data-testid={`finder-${goal}`}>
          {candidates.slice(0, FINDER_SHOWN).map((c, i) => (
            <li key={`${goal}-${i}`} className="flex flex-wrap items-center gap-x-3 gap-y-1 rounded-md border border-line px-2 py-1.5" data-testid="finder-candidate" data-centre={c.centre} data-position-mm={screenTarget(c)}>
              <span className="min-w-0 flex-1">
                <span className="font-semibold">
                  <span aria-hidden="true">{CENTRE_SYMBOL[c.centre]} </span>
                  {c.zoneCount} zone{c.zoneCount === 1 ? "" : "s"} · {CENTRE_WORDS[c.centre]}
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
                  aria-label={`${verb}: ${sig(screenTarget(c), 5)} mm, ${c.zoneCount} zones, ${CENTRE_WORDS[c.centre]}`}
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
        same places are ticked on the ruler (● bright, ○ dark, ◐ between; the number is the zone count).
      </p>
      {error ? <p className="text-sm text-danger">✕ The finder failed: {error}</p> : null}
      {data ? (
        <>
          <div className="flex flex-col gap-3">
            {list("bright", byCentre("bright"))}
            {list("dark", byCentre("dark"))}
            {byCentre("between").length > 0 ? list("between", byCentre("between")) : null}
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
