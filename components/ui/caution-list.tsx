// The cautions beside a hazard result, one look on every screen (the editor's panels, the review screen of a rail and
// of a table): folded under "Cautions (n)", each with its title, its text in plain words and where it comes from. The
// eyewear caution is left out here as everywhere: the one eyewear line says it (components/ui/cautions.ts).
import { displayedCautions } from "./cautions";

type CautionLike = { id: string; title: string; text: string; reference: string };

/** `boxed`: a panel of its own, open (the review screens); otherwise a folded line inside a panel (the editors). */
export function CautionList({ cautions, boxed = false }: { cautions: readonly CautionLike[]; boxed?: boolean }) {
  const shown = displayedCautions(cautions);
  if (shown.length === 0) return null;
  return (
    <details className={boxed ? "rounded-lg border border-line bg-panel p-3" : "text-sm"} open={boxed} data-testid="cautions">
      <summary className="cursor-pointer font-medium">Cautions ({shown.length})</summary>
      <ul className="mt-2 flex flex-col gap-2 text-sm">
        {shown.map((c) => (
          <li key={c.id}>
            <span className="font-medium">{c.title}.</span> <span className="text-muted">{c.text}</span> <span className="text-xs text-muted">({c.reference})</span>
          </li>
        ))}
      </ul>
    </details>
  );
}
