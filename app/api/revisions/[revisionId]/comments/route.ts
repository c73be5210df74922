import { getDb } from "@/db";
import { apiRoute, parseWith, readJson } from "@/lib/server/api";
import { commentInput } from "@/lib/api/contracts/reviews";
import { addComment, listComments } from "@/lib/server/review-comments";

export const GET = apiRoute<{ revisionId: string }>({ review: ["read"] }, async ({ actor, params }) => ({
  threads: await listComments(getDb(), actor, params.revisionId),
}));

export const POST = apiRoute<{ revisionId: string }>({ review: ["comment"] }, async ({ request, actor, params }) => {
  const input = parseWith(commentInput, await readJson(request), "The comment");
  return Response.json(await addComment(getDb(), actor, params.revisionId, input), { status: 201 });
});
