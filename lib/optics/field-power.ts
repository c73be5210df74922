// The propagated field's power inside a centred circle, for the safety engine's irradiance behind a clipping aperture.
// Source: the field chain (chain.ts: Collins, JOSA 60, 1168 (1970)); the bench document contract revision 2 (E from the propagated field).
import type { BenchDocument } from "@/lib/bench/schema";
import { buildChain, type AnalyzeOptions, type ChainBuild } from "./analyze";
import { traceBench } from "./propagate";

const M_PER_MM = 1e-3;

/** (positionMm, radiusMm, elementId?) → mW inside the circle, or null where the plain Gaussian holds. */
export type FieldPowerProbe = (positionMm: number, radiusMm: number, elementId?: string) => number | null;

/**
 * A probe for lib/safety's assessBench (BenchBeam.enclosedPowerMw), or undefined when nothing on the bench clips
 * the beam. With elementId, the light arriving at that element (clipping edges before it in beam order).
 */
/**
 * `boundWithin` (e.g. 0.005): where the edges upstream cut so little that a rigorous upper bound on the enclosed power
 * (the unclipped Gaussian's plus the power the edges removed, see FieldChain.powerInsideMw) lies within that share of
 * the Gaussian's amplitude, the bound is given instead of the integral — never less cautious, and far cheaper.
 */
export function fieldPowerProbe(doc: BenchDocument, options: AnalyzeOptions & { boundWithin?: number } = {}): FieldPowerProbe | undefined {
  // with the cache analyzeBench used for the same document, the chain is not built a second time
  return probeOfChain(buildChain(traceBench(doc), options.chainCache ? { prefixCache: options.chainCache } : {}), options);
}

/** The same probe from a chain already built (analyzeBench hands its own out through AnalyzeOptions.onChain). */
export function probeOfChain(build: ChainBuild | null, options: { boundWithin?: number } = {}): FieldPowerProbe | undefined {
  if (build === null || !build.chain.clipsAnything) return undefined;
  const { chain, indexOf } = build;
  const cache = new Map<string, number | null>();
  return (positionMm, radiusMm, elementId) => {
    const key = `${positionMm}|${radiusMm}|${elementId ?? ""}`;
    const hit = cache.get(key);
    if (hit !== undefined) return hit;
    const index = elementId === undefined ? undefined : indexOf.get(elementId);
    const value = elementId !== undefined && index === undefined ? null : chain.powerInsideMw(positionMm, radiusMm * M_PER_MM, index, options.boundWithin === undefined ? {} : { boundWithin: options.boundWithin });
    cache.set(key, value);
    return value;
  };
}
