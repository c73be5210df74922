import { z } from "zod";
import { safeText } from "@/lib/validation/text";
import { anyBenchDocumentSchema } from "@/lib/bench/schema-v2";
import { analyzeBench, MAX_PROFILE_POINTS, OpticsInputError, screenProfile } from "@/lib/optics";
import { tableScreenProfile } from "@/lib/optics/table-profile";
import { AppError } from "@/lib/errors";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";

const profileInput = z.object({
  document: anyBenchDocumentSchema,
  apertureId: safeText({ error: "apertureId must name an aperture" }).min(1, "apertureId must name an aperture"),
  /** A table only: which beam through the aperture, and which screen it reaches (an aperture before a split has several). */
  pathId: safeText().min(1).max(64).optional(),
  screenId: safeText().min(1).max(64).optional(),
  points: z.number().int().min(2, "points must be at least 2").max(MAX_PROFILE_POINTS, `points must be at most ${MAX_PROFILE_POINTS}`).optional(),
});

/** The radial intensity on the aperture's screen, relative to the unobstructed on-axis intensity there (a rail, or a table's path). */
export const POST = apiRoute({ analysis: ["run"] }, async ({ request }) => {
  const input = parseWith(profileInput, await readJson(request), "The profile request");
  try {
    if (input.document.version === 2) {
      const table = tableScreenProfile(input.document, analyzeBench(input.document), input.apertureId, { points: input.points, pathId: input.pathId, screenId: input.screenId });
      return { radiusMm: table.radiusMm, relativeIntensity: table.relativeIntensity, method: table.method, shadowRadiusMm: table.shadowRadiusMm, pathId: table.pathId, screenId: table.screenId };
    }
    const profile = screenProfile(input.document, input.apertureId, { points: input.points });
    return { radiusMm: profile.radiusMm, relativeIntensity: profile.relativeIntensity, method: profile.method, shadowRadiusMm: profile.shadowRadiusMm };
  } catch (error) {
    if (error instanceof OpticsInputError) throw new AppError("bad-request", error.message, [{ path: "apertureId", message: error.message }]);
    throw error;
  }
});
