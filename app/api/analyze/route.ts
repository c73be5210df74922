import { benchDocumentSchema } from "@/lib/bench/schema";
import { analyzeBench } from "@/lib/optics";
import { assessBench } from "@/lib/safety";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";

/** The optics (and, when it can be assessed, the laser safety) of a bench document. Pure computation, no database. */
export const POST = apiRoute({ analysis: ["run"] }, async ({ request }) => {
  const document = parseWith(benchDocumentSchema, await readJson(request), "The bench document");
  const analysis = analyzeBench(document);
  let safety: ReturnType<typeof assessBench> | undefined;
  try {
    safety = assessBench(document, analysis);
  } catch (error) {
    // The optics answer stands on its own; a bench the safety engine cannot assess gets no safety block.
    console.warn("[benchwarden] safety assessment skipped", error);
  }
  return safety ? { analysis, safety } : { analysis };
});
