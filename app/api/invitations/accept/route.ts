import { getDb } from "@/db";
import { parseWith, publicRoute, readJson } from "@/lib/server/api";
import { acceptInput, acceptInvitation } from "@/lib/server/people";

// Public: the one-time token in the e-mailed link is the authority.
export const POST = publicRoute(async ({ request }) => acceptInvitation(getDb(), parseWith(acceptInput, await readJson(request), "The invitation")));
