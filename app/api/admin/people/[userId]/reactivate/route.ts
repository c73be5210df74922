import { getDb } from "@/db";
import { apiRoute } from "@/lib/server/api";
import { reactivatePerson } from "@/lib/server/people";

export const POST = apiRoute<{ userId: string }>({ user: ["ban"] }, async ({ actor, params }) => reactivatePerson(getDb(), actor, params.userId));
