// The propagated field's power inside a centred circle, for the safety engine's irradiance behind a clipping aperture.
// Source: the field chain (chain.ts: Collins, JOSA 60, 1168 (1970)); the bench document contract revision 2 (E from the propagated field).
import type { BenchDocument } from "@/lib/bench/schema";
import { buildChain } from "./analyze";
import { traceBench } from "./propagate";

const M_PER_MM = 1e-3;

/** (positionMm, radiusMm, elementId?) → mW inside the circle, or null where the plain Gaussian holds. */
export type FieldPowerProbe = (positionMm: number, radiusMm: number, elementId?: string) => number | null;

/**
 * A probe for lib/safety's assessBench (BenchBeam.enclosedPowerMw), or undefined when nothing on the bench clips
 * the beam. With elementId, the light arriving at that element (clipping edges before it in beam order).
 */
export function fieldPowerProbe(doc: BenchDocument): FieldPowerProbe | undefined {
  const build = buildChain(traceBench(doc));
  if (build === null || build.chain.planes.length === 0) return undefined;
  const { chain, indexOf } = build;
  const cache = new Map<string, number | null>();
  return (positionMm, radiusMm, elementId) => {
    const key = `${positionMm}|${radiusMm}|${elementId ?? ""}`;
    const hit = cache.get(key);
    if (hit !== undefined) return hit;
    const index = elementId === undefined ? undefined : indexOf.get(elementId);
    const value = elementId !== undefined && index === undefined ? null : chain.powerInsideMw(positionMm, radiusMm * M_PER_MM, index);
    cache.set(key, value);
    return value;
  };
}
