import { getDb } from "@/db";
import { AppError } from "@/lib/errors";
import { apiRoute, parseWith } from "@/lib/server/api";
import { assertUploadSize, UPLOAD_MAX_BYTES } from "@/lib/build/rules";
import { uploadKindInput } from "@/lib/api/contracts/builds";
import { addUpload } from "@/lib/server/build-uploads";

// multipart/form-data with "file" and "kind". The size is checked before the body is read when the
// client declares it; the type is checked from the file's first bytes, never its name.
export const POST = apiRoute<{ buildId: string }>({ build: ["record"] }, async ({ request, actor, params }) => {
  const declared = Number(request.headers.get("content-length") ?? "0");
  if (declared > UPLOAD_MAX_BYTES + 64 * 1024) assertUploadSize(declared);
  let form: FormData;
  try {
    form = await request.formData();
  } catch {
    throw new AppError("bad-request", "Send the file as a form upload (multipart/form-data) with the fields file and kind.");
  }
  const file = form.get("file");
  if (!(file instanceof File)) throw new AppError("bad-request", "Choose a file to upload.", [{ path: "file", message: "Choose a file" }]);
  assertUploadSize(file.size);
  const kind = parseWith(uploadKindInput, form.get("kind") ?? undefined, "The upload");
  const bytes = Buffer.from(await file.arrayBuffer());
  return Response.json(await addUpload(getDb(), actor, params.buildId, { kind, fileName: file.name || "upload", bytes }), { status: 201 });
});
