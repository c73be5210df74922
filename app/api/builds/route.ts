import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { startBuildInput } from "@/lib/api/contracts/builds";
import { listBuildable, startBuild } from "@/lib/server/builds";

// GET: the signed-off revisions of the caller's labs with their builds. POST: start a build of one.
export const GET = apiRoute({ build: ["read"] }, async ({ actor }) => ({ revisions: await listBuildable(getDb(), actor) }));

export const POST = apiRoute({ build: ["record"] }, async ({ request, actor }) => {
  const input = parseWith(startBuildInput, await readJson(request), "The build");
  const { build, created } = await startBuild(getDb(), actor, input);
  return Response.json({ build }, { status: created ? 201 : 200 });
});
