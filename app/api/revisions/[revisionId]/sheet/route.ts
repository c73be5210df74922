import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { sheetRequestInput } from "@/lib/api/contracts/sheets";
import { getSheetStatus, requestSheet } from "@/lib/server/build-sheets";

// POST asks for the revision's build sheet (202 with the job, or the ready one reused); GET reports the job.
export const POST = apiRoute<{ revisionId: string }>({ bench: ["read"] }, async ({ request, actor, params }) => {
  const text = request.headers.get("content-length") === "0" ? {} : await readJson(request).catch(() => ({}));
  const input = parseWith(sheetRequestInput, text, "The sheet request");
  // The print route needs a session: the job prints it with the requester's own cookie (kept in memory only).
  const result = await requestSheet(getDb(), actor, params.revisionId, input, request.headers.get("cookie") ?? "");
  return Response.json(result, { status: result.sheet.state === "ready" ? 200 : 202 });
});

export const GET = apiRoute<{ revisionId: string }>({ bench: ["read"] }, async ({ request, actor, params }) => {
  const paper = parseWith(sheetRequestInput, { paper: new URL(request.url).searchParams.get("paper") ?? undefined }, "The sheet query").paper;
  return { sheet: await getSheetStatus(getDb(), actor, params.revisionId, paper) };
});
