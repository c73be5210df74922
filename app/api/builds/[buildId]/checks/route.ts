import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { checkInput } from "@/lib/api/contracts/builds";
import { updateCheck } from "@/lib/server/builds";

// One checklist item: ticked, the measured position (tolerance computed on the server), a note.
export const PATCH = apiRoute<{ buildId: string }>({ build: ["record"] }, async ({ request, actor, params }) => {
  const input = parseWith(checkInput, await readJson(request), "The checklist entry");
  return { build: await updateCheck(getDb(), actor, params.buildId, input) };
});
