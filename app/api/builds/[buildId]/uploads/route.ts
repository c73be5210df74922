import { getDb } from "@/db";
import { AppError } from "@/lib/errors";
import { apiRoute, parseWith, readBodyLimited } from "@/lib/server/api";
import { assertUploadSize, UPLOAD_MAX_BYTES } from "@/lib/build/rules";
import { uploadKindInput } from "@/lib/api/contracts/builds";
import { addUpload } from "@/lib/server/build-uploads";
import { unsafeTextProblem } from "@/lib/validation/text";

// The form's own fields and boundaries around the file.
const FORM_OVERHEAD_BYTES = 64 * 1024;

// multipart/form-data with "file" and "kind". The size is checked before the body is read when the
// client declares it, and counted while it streams when it does not; the type is checked from the
// file's first bytes, never its name. The name is kept as given (up to 255 characters).
export const POST = apiRoute<{ buildId: string }>({ build: ["record"] }, async ({ request, actor, params }) => {
  const limit = UPLOAD_MAX_BYTES + FORM_OVERHEAD_BYTES;
  const declared = Number(request.headers.get("content-length") ?? "0");
  if (declared > limit) assertUploadSize(declared);
  const body = await readBodyLimited(request, limit, () => new AppError("payload-too-large", `The upload is larger than ${UPLOAD_MAX_BYTES / 1024 / 1024} MB; files may be at most ${UPLOAD_MAX_BYTES / 1024 / 1024} MB.`, [{ path: "file", message: "The file is too large" }]));
  let form: FormData;
  try {
    form = await new Response(body as BodyInit, { headers: { "content-type": request.headers.get("content-type") ?? "" } }).formData();
  } catch {
    throw new AppError("bad-request", "Send the file as a form upload (multipart/form-data) with the fields file and kind.");
  }
  const file = form.get("file");
  if (!(file instanceof File)) throw new AppError("bad-request", "Choose a file to upload.", [{ path: "file", message: "Choose a file" }]);
  assertUploadSize(file.size);
  const problem = unsafeTextProblem(file.name);
  if (problem) throw new AppError("bad-request", `The file's name ${problem}; rename the file and upload it again.`, [{ path: "file", message: `The file name ${problem}` }]);
  if (file.name.length > 255) throw new AppError("bad-request", "The file's name is longer than 255 characters; rename the file and upload it again.", [{ path: "file", message: "The file name must be at most 255 characters" }]);
  const kind = parseWith(uploadKindInput, form.get("kind") ?? undefined, "The upload");
  const bytes = Buffer.from(await file.arrayBuffer());
  return Response.json(await addUpload(getDb(), actor, params.buildId, { kind, fileName: file.name || "upload", bytes }), { status: 201 });
});
