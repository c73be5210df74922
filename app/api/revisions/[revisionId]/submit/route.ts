import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { submitInput } from "@/lib/api/contracts/reviews";
import { submitRevision } from "@/lib/server/reviews";

export const POST = apiRoute<{ revisionId: string }>({ bench: ["submit"] }, async ({ request, actor, params }) => {
  const input = parseWith(submitInput, await readJson(request), "The submission");
  return submitRevision(getDb(), actor, params.revisionId, input);
});
