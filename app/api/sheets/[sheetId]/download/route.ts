import { getDb } from "@/db";
import { apiRoute } from "@/lib/server/api";
import { downloadSheet } from "@/lib/server/build-sheets";

// The build sheet PDF; every download is an audited export.
export const GET = apiRoute<{ sheetId: string }>({ bench: ["read"] }, async ({ actor, params }) => {
  const { bytes, fileName } = await downloadSheet(getDb(), actor, params.sheetId);
  return new Response(new Uint8Array(bytes), {
    headers: {
      "content-type": "application/pdf",
      "content-length": String(bytes.length),
      "content-disposition": `attachment; filename="${fileName}"`,
      "cache-control": "private, no-store",
      "x-content-type-options": "nosniff",
    },
  });
});
