import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { photoReadingInput } from "@/lib/api/contracts/builds";
import { readBuildPhoto } from "@/lib/server/photo-readings";

// Reads an uploaded photo of the screen against the revision's prediction: { uploadId, apertureId }. A new reading
// answers 201 (a mismatch is flagged and e-mailed like a typed one; a photo with no readable pattern is kept with the
// sentence saying why); the same photo read again answers 200 with the reading already kept.
export const POST = apiRoute<{ buildId: string }>({ build: ["record"] }, async ({ request, actor, params }) => {
  const input = parseWith(photoReadingInput, await readJson(request), "The photo reading");
  const result = await readBuildPhoto(getDb(), actor, params.buildId, input);
  return Response.json(result, { status: result.created ? 201 : 200 });
});
