import { finderRequestSchema } from "@/lib/api/analysis-contracts";
import { AppError } from "@/lib/errors";
import { findScreenPositions, OpticsInputError, solveApertureDiameter, solveAperturePosition } from "@/lib/optics";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";

/** Where to put the screen for a bright or dark centre, or which aperture gives a wanted zone count. */
export const POST = apiRoute({ analysis: ["run"] }, async ({ request }) => {
  const input = parseWith(finderRequestSchema, await readJson(request), "The finder request");
  try {
    switch (input.goal) {
      case "screen-positions":
        return findScreenPositions(input.document, input.apertureId, { fromMm: input.fromMm, toMm: input.toMm, maxResults: input.maxResults });
      case "aperture-diameter":
        return solveApertureDiameter(input.document, input.apertureId, input.zones, { screenPositionMm: input.screenPositionMm });
      case "aperture-position":
        return solveAperturePosition(input.document, input.apertureId, input.zones, { screenPositionMm: input.screenPositionMm, fromMm: input.fromMm, toMm: input.toMm });
    }
  } catch (error) {
    if (error instanceof OpticsInputError) throw new AppError("bad-request", error.message, [{ path: "apertureId", message: error.message }]);
    throw error;
  }
});
