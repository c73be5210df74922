import { NextResponse } from "next/server";
import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { makeRevision, makeRevisionInput } from "@/lib/server/drafts";

/** Make a revision: freeze the working draft and start the next one; 409 with the server's draft when based on a stale one. */
export const POST = apiRoute<{ benchId: string }>({ bench: ["edit"] }, async ({ request, actor, params }) => {
  const input = parseWith(makeRevisionInput, await readJson(request), "The revision request");
  const result = await makeRevision(getDb(), actor, params.benchId, input);
  if (!result.ok) {
    return NextResponse.json(
      {
        error: {
          code: "conflict",
          message: `The bench changed after you opened it (now revision ${result.current.revisionNumber}, version ${result.current.version}); no revision was made.`,
          fields: [],
        },
        current: result.current,
      },
      { status: 409 },
    );
  }
  return NextResponse.json({ draft: result.draft, frozen: result.frozen }, { status: 201 });
});
