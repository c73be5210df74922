import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { createLab, createLabInput, listLabs } from "@/lib/server/people";

export const GET = apiRoute({ lab: ["read"] }, async ({ actor }) => ({ labs: await listLabs(getDb(), actor) }));

export const POST = apiRoute({ lab: ["manage"] }, async ({ request, actor }) => {
  const input = parseWith(createLabInput, await readJson(request), "The new lab");
  return Response.json(await createLab(getDb(), actor, input), { status: 201 });
});
