import { z } from "zod";
import { getDb } from "@/db";
import { analyzeRequestSchema } from "@/lib/api/analysis-contracts";
import { analyzeBench, ChainPrefixCache, fieldPowerProbe } from "@/lib/optics";
import { assessBench, type BenchSafetyAssessment, type TableSafetyAssessment } from "@/lib/safety";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { AppError } from "@/lib/errors";
import { findLabStandard } from "@/lib/server/lab-standard";

const query = z.object({ labId: z.uuid({ error: "labId must be a lab id" }).optional() });

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
 * version 2 (a table: paths, open beams, one entry per laser). With `?labId=`, every hazard figure follows the safety
 * standard that lab chose (lab.safety_standard; a lab's choice is not secret); without it, the engine's default.
 */
export const POST = apiRoute({ analysis: ["run"] }, async ({ request }) => {
  const { labId } = parseWith(query, { labId: new URL(request.url).searchParams.get("labId") ?? undefined }, "The analysis query");
  const document = parseWith(analyzeRequestSchema, await readJson(request), "The bench document");
  const standard = labId ? await findLabStandard(getDb(), labId) : undefined;
  if (standard === null) throw new AppError("bad-request", "labId names no lab: the hazard figures follow the standard of the bench's own lab.", [{ path: "labId", message: "No such lab" }]);
  const options = standard ? { standard } : {};
  if (document.version === 2) {
    const analysis = analyzeBench(document);
    let safety: TableSafetyAssessment | undefined;
    try {
      safety = assessBench(document, analysis, options);
    } catch (error) {
      console.warn("[benchwarden] table safety assessment skipped", error);
    }
    return safety ? { analysis, safety: tableWithoutRepeats(safety) } : { analysis };
  }
  const chainCache = new ChainPrefixCache();
  const analysis = analyzeBench(document, { chainCache });
  let safety: BenchSafetyAssessment | undefined;
  try {
    safety = assessBench(document, { elements: analysis.elements, enclosedPowerMw: fieldPowerProbe(document, { chainCache }) }, options);
  } catch (error) {
    // The optics answer stands on its own; a bench the safety engine cannot assess gets no safety block.
    console.warn("[benchwarden] safety assessment skipped", error);
  }
  return safety ? { analysis, safety: withoutRepeats(safety) } : { analysis };
});
