import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { addLabMember, memberInput } from "@/lib/server/people";

export const POST = apiRoute<{ labId: string }>({ lab: ["manage"] }, async ({ request, actor, params }) => {
  const input = parseWith(memberInput, await readJson(request), "The new member");
  return Response.json(await addLabMember(getDb(), actor, params.labId, input), { status: 201 });
});
