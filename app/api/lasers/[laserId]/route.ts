import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { laserUpdateInput } from "@/lib/api/contracts/register";
import { getLaser, updateLaser } from "@/lib/server/register";

export const GET = apiRoute<{ laserId: string }>({ register: ["read"] }, async ({ actor, params }) => getLaser(getDb(), actor, params.laserId));

/** The whole entry with the version it was edited from; a stale version answers 409. */
export const PUT = apiRoute<{ laserId: string }>({ register: ["manage"] }, async ({ request, actor, params }) => {
  const input = parseWith(laserUpdateInput, await readJson(request), "The laser");
  return updateLaser(getDb(), actor, params.laserId, input);
});
