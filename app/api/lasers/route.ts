import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { laserInput } from "@/lib/api/contracts/register";
import { createLaser, laserListQuery, listLasers } from "@/lib/server/register";

/** The register, or one lab's lasers (?labId=) for the editor's laser picker; ?status=in-service narrows it. */
export const GET = apiRoute({ register: ["read"] }, async ({ request, actor }) => {
  const url = new URL(request.url);
  const query = parseWith(laserListQuery, { labId: url.searchParams.get("labId") ?? undefined, status: url.searchParams.get("status") ?? undefined }, "The register query");
  return { lasers: await listLasers(getDb(), actor, query) };
});

export const POST = apiRoute({ register: ["manage"] }, async ({ request, actor }) => {
  const input = parseWith(laserInput, await readJson(request), "The laser");
  return Response.json(await createLaser(getDb(), actor, input), { status: 201 });
});
