import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { createBenchInput } from "@/lib/api/contracts/benches";
import { createBench, listBenches } from "@/lib/server/benches";

export const GET = apiRoute({ bench: ["read"] }, async ({ actor }) => ({ benches: await listBenches(getDb(), actor) }));

export const POST = apiRoute({ bench: ["create"] }, async ({ request, actor }) => {
  const input = parseWith(createBenchInput, await readJson(request), "The new bench");
  return Response.json(await createBench(getDb(), actor, input), { status: 201 });
});
