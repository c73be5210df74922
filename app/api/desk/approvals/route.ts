import { getDb } from "@/db";
import { apiRoute } from "@/lib/server/api";
import { assertDeskQuery, deskQueryFromParams, listApprovals } from "@/lib/server/desk";

/** One page of sign-offs: ?page, pageSize, sort, dir, lab, class, state, officer, from, to, expiring (days), q, builds (mismatch). */
export const GET = apiRoute({ audit: ["read"] }, async ({ request, actor }) => {
  const query = assertDeskQuery(deskQueryFromParams(new URL(request.url).searchParams));
  return listApprovals(getDb(), actor, query);
});
