import { plainText } from "@/lib/format";
import type { ComputedClass } from "@/lib/api/contracts/register";

/** The label class beside the engine's estimate; a mismatch is a warning in words and a shape, never a correction. */
export function ClassCheck({ labelClass, computed, long = false }: { labelClass: string; computed: ComputedClass; long?: boolean }) {
  if (computed.hazardClass === null) {
    return <span className="text-sm text-muted">Label {labelClass} · estimate unavailable</span>;
  }
  if (computed.matchesLabel) {
    return (
      <span className="inline-flex items-center gap-1 text-sm text-ok">
        <span aria-hidden="true">✓</span> Label {labelClass} · estimate {computed.hazardClass}
      </span>
    );
  }
  return (
    <span className="flex flex-col gap-1" data-testid="class-mismatch">
      <span className="inline-flex items-center gap-1 rounded-full border border-warn px-2 py-0.5 text-sm text-warn">
        <span aria-hidden="true">▲</span> Label {labelClass} · estimate {computed.hazardClass}: they differ
      </span>
      {long && computed.warning ? <span className="text-sm text-muted">{plainText(computed.warning)}</span> : null}
    </span>
  );
}
