import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { invitePerson, inviteInput } from "@/lib/server/people";

export const POST = apiRoute({ user: ["create"] }, async ({ request, actor }) => {
  const input = parseWith(inviteInput, await readJson(request), "The invitation");
  return Response.json(await invitePerson(getDb(), actor, input), { status: 201 });
});
