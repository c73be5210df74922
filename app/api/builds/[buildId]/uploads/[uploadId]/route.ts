import { getDb } from "@/db";
import { apiRoute, contentDisposition } from "@/lib/server/api";
import { readUpload } from "@/lib/server/build-uploads";

// One stored upload, served with the type its content was checked to be.
export const GET = apiRoute<{ buildId: string; uploadId: string }>({ build: ["read"] }, async ({ actor, params }) => {
  const file = await readUpload(getDb(), actor, params.buildId, params.uploadId);
  const inline = file.contentType.startsWith("image/");
  return new Response(new Uint8Array(file.bytes), {
    headers: {
      "content-type": file.contentType,
      "content-length": String(file.bytes.length),
      "content-disposition": contentDisposition(inline ? "inline" : "attachment", file.fileName),
      "cache-control": "private, max-age=3600",
      etag: `"${file.sha256}"`,
    },
  });
});
