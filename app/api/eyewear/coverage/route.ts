import { z } from "zod";
import { getDb } from "@/db";
import { apiRoute, parseWith } from "@/lib/server/api";
import { revisionEyewear } from "@/lib/server/eyewear";

const query = z.object({ revisionId: z.uuid({ error: "revisionId must be a revision id" }) });

/** Per line of a revision's lasers: the OD needed, and which of the lab's eyewear covers it (or that none does). */
export const GET = apiRoute({ eyewear: ["read"] }, async ({ request, actor }) => {
  const url = new URL(request.url);
  const { revisionId } = parseWith(query, { revisionId: url.searchParams.get("revisionId") ?? undefined }, "The coverage query");
  return revisionEyewear(getDb(), actor, revisionId);
});
