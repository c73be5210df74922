import { analyzeRequestSchema } from "@/lib/api/analysis-contracts";
import { analyzeBench, fieldPowerProbe } from "@/lib/optics";
import { assessBench, type BenchSafetyAssessment, type TableSafetyAssessment } from "@/lib/safety";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";

/**
 * The bench-level safety result repeats the laser's own cautions, limitations and closing sentence
 * inside `laser`, and its list of limitations is fixed data the browser has in lib/safety; both are
 * left out of the answer the editor asks for after every change (about a third of its size).
 */
function withoutRepeats(safety: BenchSafetyAssessment) {
  const { cautions: _cautions, limitations: _laserLimitations, finalSay: _finalSay, ...laser } = safety.laser;
  const { limitations: _limitations, ...rest } = safety;
  return { ...rest, laser };
}

/** The table's answer without the fixed list of limitations (the browser has it in lib/safety). */
function tableWithoutRepeats(safety: TableSafetyAssessment) {
  const { limitations: _limitations, ...rest } = safety;
  return rest;
}

/**
 * The optics (and, when it can be assessed, the laser safety) of a bench document, version 1 (a rail) or
 * version 2 (a table: paths, open beams, one entry per laser). Pure computation, no database.
 */
export const POST = apiRoute({ analysis: ["run"] }, async ({ request }) => {
  const document = parseWith(analyzeRequestSchema, await readJson(request), "The bench document");
  if (document.version === 2) {
    const analysis = analyzeBench(document);
    let safety: TableSafetyAssessment | undefined;
    try {
      safety = assessBench(document, analysis);
    } catch (error) {
      console.warn("[benchwarden] table safety assessment skipped", error);
    }
    return safety ? { analysis, safety: tableWithoutRepeats(safety) } : { analysis };
  }
  const analysis = analyzeBench(document);
  let safety: BenchSafetyAssessment | undefined;
  try {
    safety = assessBench(document, { elements: analysis.elements, enclosedPowerMw: fieldPowerProbe(document) });
  } catch (error) {
    // The optics answer stands on its own; a bench the safety engine cannot assess gets no safety block.
    console.warn("[benchwarden] safety assessment skipped", error);
  }
  return safety ? { analysis, safety: withoutRepeats(safety) } : { analysis };
});
