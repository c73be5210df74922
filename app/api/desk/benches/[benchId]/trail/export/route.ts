import { getDb } from "@/db";
import { apiRoute } from "@/lib/server/api";
import { exportTrailCsv } from "@/lib/server/desk";

export const GET = apiRoute<{ benchId: string }>({ audit: ["export"] }, async ({ actor, params }) => {
  const { filename, stream } = await exportTrailCsv(getDb(), actor, params.benchId);
  return new Response(stream, { headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="${filename}"`, "cache-control": "no-store" } });
});
