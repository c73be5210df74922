import { getDb } from "@/db";
import { apiRoute } from "@/lib/server/api";
import { getReview } from "@/lib/server/review-screen";

// One revision's review: state, decision, comments, diff against the last sign-off, and what the caller may do.
export const GET = apiRoute<{ revisionId: string }>({ bench: ["read"] }, async ({ actor, params }) => getReview(getDb(), actor, params.revisionId));
