import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { eyewearUpdateInput } from "@/lib/api/contracts/eyewear";
import { deleteEyewear, getEyewear, updateEyewear } from "@/lib/server/eyewear";

export const GET = apiRoute<{ itemId: string }>({ eyewear: ["read"] }, async ({ actor, params }) => getEyewear(getDb(), actor, params.itemId));

/** The whole item with the version it was edited from; a stale version answers 409. */
export const PUT = apiRoute<{ itemId: string }>({ eyewear: ["manage"] }, async ({ request, actor, params }) => {
  const input = parseWith(eyewearUpdateInput, await readJson(request), "The eyewear item");
  return updateEyewear(getDb(), actor, params.itemId, input);
});

export const DELETE = apiRoute<{ itemId: string }>({ eyewear: ["manage"] }, async ({ actor, params }) => deleteEyewear(getDb(), actor, params.itemId));
