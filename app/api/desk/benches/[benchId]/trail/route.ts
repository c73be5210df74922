import { getDb } from "@/db";
import { apiRoute } from "@/lib/server/api";
import { getBenchTrail } from "@/lib/server/desk";

export const GET = apiRoute<{ benchId: string }>({ audit: ["read"] }, async ({ actor, params }) => getBenchTrail(getDb(), actor, params.benchId));
