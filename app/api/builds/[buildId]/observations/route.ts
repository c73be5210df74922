import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { observationInput } from "@/lib/api/contracts/builds";
import { addObservation } from "@/lib/server/builds";

// What was seen, compared with the prediction; a mismatch is flagged and e-mailed to the bench's author.
export const POST = apiRoute<{ buildId: string }>({ build: ["record"] }, async ({ request, actor, params }) => {
  const input = parseWith(observationInput, await readJson(request), "The observation");
  return Response.json(await addObservation(getDb(), actor, params.buildId, input), { status: 201 });
});
