import { getDb } from "@/db";
import { apiRoute } from "@/lib/server/api";
import { getInbox } from "@/lib/server/inbox";

// What waits for the signed-in person; the header polls it. Each section checks its own permission in lib.
export const GET = apiRoute(null, async ({ actor }) => getInbox(getDb(), actor));
