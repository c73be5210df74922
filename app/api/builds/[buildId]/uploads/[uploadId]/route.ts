import { getDb } from "@/db";
import { apiRoute } from "@/lib/server/api";
import { readUpload } from "@/lib/server/build-uploads";

// One stored upload, served with the type its content was checked to be.
export const GET = apiRoute<{ buildId: string; uploadId: string }>({ build: ["read"] }, async ({ actor, params }) => {
  const file = await readUpload(getDb(), actor, params.buildId, params.uploadId);
  const inline = file.contentType.startsWith("image/");
  return new Response(new Uint8Array(file.bytes), {
    headers: {
      "content-type": file.contentType,
      "content-length": String(file.bytes.length),
      "content-disposition": `${inline ? "inline" : "attachment"}; filename="${file.fileName.replace(/["\\]/g, "_")}"`,
      "cache-control": "private, max-age=3600",
      "x-content-type-options": "nosniff",
      "content-security-policy": "default-src 'none'",
      etag: `"${file.sha256}"`,
    },
  });
});
