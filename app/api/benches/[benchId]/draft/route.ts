import { getDb } from "@/db";
import { AppError } from "@/lib/errors";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { saveDraftInput } from "@/lib/api/contracts/benches";
import { getDraft, saveDraft } from "@/lib/server/drafts";

export const GET = apiRoute<{ benchId: string }>({ bench: ["read"] }, async ({ actor, params }) => ({ draft: await getDraft(getDb(), actor, params.benchId) }));

/** Save the working draft; 409 with the server's current draft when the edit was based on an older version. */
export const PUT = apiRoute<{ benchId: string }>({ bench: ["edit"] }, async ({ request, actor, params }) => {
  const input = parseWith(saveDraftInput, await readJson(request), "The draft");
  const result = await saveDraft(getDb(), actor, params.benchId, input);
  if (!result.ok) {
    const { revisionNumber, version } = result.current;
    throw new AppError("conflict", `Someone saved this bench after you opened it (now revision ${revisionNumber}, version ${version}). Nothing was overwritten.`, [], { current: result.current });
  }
  return { draft: result.draft, createdRevision: result.createdRevision };
});
