import { NextResponse } from "next/server";
import { getDb } from "@/db";
import { AppError } from "@/lib/errors";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { makeRevisionInput } from "@/lib/api/contracts/benches";
import { makeRevision } from "@/lib/server/drafts";

/** Make a revision: freeze the working draft and start the next one; 409 with the server's draft when based on a stale one. */
export const POST = apiRoute<{ benchId: string }>({ bench: ["edit"] }, async ({ request, actor, params }) => {
  const input = parseWith(makeRevisionInput, await readJson(request), "The revision request");
  const result = await makeRevision(getDb(), actor, params.benchId, input);
  if (!result.ok) {
    const { revisionNumber, version } = result.current;
    throw new AppError("conflict", `The bench changed after you opened it (now revision ${revisionNumber}, version ${version}); no revision was made.`, [], { current: result.current });
  }
  return NextResponse.json({ draft: result.draft, frozen: result.frozen }, { status: 201 });
});
