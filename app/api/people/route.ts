import { getDb } from "@/db";
import { apiRoute } from "@/lib/server/api";
import { listPeople } from "@/lib/server/people";

export const GET = apiRoute({ user: ["list"] }, async ({ actor }) => ({ people: await listPeople(getDb(), actor) }));
