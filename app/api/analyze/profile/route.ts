import { z } from "zod";
import { safeText } from "@/lib/validation/text";
import { benchDocumentSchema } from "@/lib/bench/schema";
import { MAX_PROFILE_POINTS, OpticsInputError, screenProfile } from "@/lib/optics";
import { AppError } from "@/lib/errors";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";

const profileInput = z.object({
  document: benchDocumentSchema,
  apertureId: safeText({ error: "apertureId must name an aperture" }).min(1, "apertureId must name an aperture"),
  points: z.number().int().min(2, "points must be at least 2").max(MAX_PROFILE_POINTS, `points must be at most ${MAX_PROFILE_POINTS}`).optional(),
});

/** The radial intensity on the aperture's screen, relative to the unobstructed on-axis intensity there. */
export const POST = apiRoute({ analysis: ["run"] }, async ({ request }) => {
  const input = parseWith(profileInput, await readJson(request), "The profile request");
  try {
    const profile = screenProfile(input.document, input.apertureId, { points: input.points });
    return { radiusMm: profile.radiusMm, relativeIntensity: profile.relativeIntensity, method: profile.method, shadowRadiusMm: profile.shadowRadiusMm };
  } catch (error) {
    if (error instanceof OpticsInputError) throw new AppError("bad-request", error.message, [{ path: "apertureId", message: error.message }]);
    throw error;
  }
});
