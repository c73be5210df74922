import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { deactivateInput, deactivatePerson } from "@/lib/server/people";

export const POST = apiRoute<{ userId: string }>({ user: ["ban"] }, async ({ request, actor, params }) => {
  const input = parseWith(deactivateInput, await readJson(request), "The deactivation");
  return deactivatePerson(getDb(), actor, params.userId, input);
});
