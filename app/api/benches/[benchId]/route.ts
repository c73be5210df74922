import { getDb } from "@/db";
import { apiRoute } from "@/lib/server/api";
import { getBench } from "@/lib/server/benches";

export const GET = apiRoute<{ benchId: string }>({ bench: ["read"] }, async ({ actor, params }) => getBench(getDb(), actor, params.benchId));
