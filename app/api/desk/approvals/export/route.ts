import { getDb } from "@/db";
import { apiRoute } from "@/lib/server/api";
import { assertDeskQuery, deskQueryFromParams, exportApprovalsCsv } from "@/lib/server/desk";

/** The filtered sign-offs as CSV, streamed; same query parameters as the list. */
export const GET = apiRoute({ audit: ["export"] }, async ({ request, actor }) => {
  const query = assertDeskQuery(deskQueryFromParams(new URL(request.url).searchParams));
  const stream = await exportApprovalsCsv(getDb(), actor, query);
  const day = new Date().toISOString().slice(0, 10);
  return new Response(stream, {
    headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="sign-offs-${day}.csv"`, "cache-control": "no-store" },
  });
});
