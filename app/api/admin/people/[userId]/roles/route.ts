import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { rolesInput, setRoles } from "@/lib/server/people";

export const PUT = apiRoute<{ userId: string }>({ user: ["set-role"] }, async ({ request, actor, params }) => {
  const input = parseWith(rolesInput, await readJson(request), "The roles");
  return { roles: await setRoles(getDb(), actor, params.userId, input) };
});
