import { getDb } from "@/db";
import { apiRoute } from "@/lib/server/api";
import { listAdminPeople, listPendingInvitations } from "@/lib/server/people";

export const GET = apiRoute({ user: ["list"] }, async ({ actor }) => {
  const [people, invitations] = await Promise.all([listAdminPeople(getDb(), actor), listPendingInvitations(getDb(), actor)]);
  return { people, invitations };
});
