import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { decisionInput } from "@/lib/api/contracts/reviews";
import { decideRevision } from "@/lib/server/reviews";

export const POST = apiRoute<{ revisionId: string }>({ review: ["decide"] }, async ({ request, actor, params }) => {
  const input = parseWith(decisionInput, await readJson(request), "The decision");
  return Response.json(await decideRevision(getDb(), actor, params.revisionId, input), { status: 201 });
});
