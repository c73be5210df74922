import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { withdrawInput } from "@/lib/api/contracts/reviews";
import { withdrawRevision } from "@/lib/server/reviews";

export const POST = apiRoute<{ revisionId: string }>({ bench: ["submit"] }, async ({ request, actor, params }) => {
  parseWith(withdrawInput, await readJson(request), "The withdrawal");
  return withdrawRevision(getDb(), actor, params.revisionId);
});
