import { benchDocumentSchema } from "@/lib/bench/schema";
import { analyzeBench, fieldPowerProbe } from "@/lib/optics";
import { assessBench } from "@/lib/safety";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";

type BenchSafety = ReturnType<typeof assessBench>;

/**
 * The bench-level safety result repeats the laser's own cautions, limitations and closing sentence
 * inside `laser`, and its list of limitations is fixed data the browser has in lib/safety; both are
 * left out of the answer the editor asks for after every change (about a third of its size).
 */
function withoutRepeats(safety: BenchSafety) {
  const { cautions: _cautions, limitations: _laserLimitations, finalSay: _finalSay, ...laser } = safety.laser;
  const { limitations: _limitations, ...rest } = safety;
  return { ...rest, laser };
}

/** The optics (and, when it can be assessed, the laser safety) of a bench document. Pure computation, no database. */
export const POST = apiRoute({ analysis: ["run"] }, async ({ request }) => {
  const document = parseWith(benchDocumentSchema, await readJson(request), "The bench document");
  const analysis = analyzeBench(document);
  let safety: BenchSafety | undefined;
  try {
    safety = assessBench(document, { elements: analysis.elements, enclosedPowerMw: fieldPowerProbe(document) });
  } catch (error) {
    // The optics answer stands on its own; a bench the safety engine cannot assess gets no safety block.
    console.warn("[benchwarden] safety assessment skipped", error);
  }
  return safety ? { analysis, safety: withoutRepeats(safety) } : { analysis };
});
