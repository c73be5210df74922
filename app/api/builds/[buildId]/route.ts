import { getDb } from "@/db";
import { apiRoute } from "@/lib/server/api";
import { getBuild } from "@/lib/server/builds";

export const GET = apiRoute<{ buildId: string }>({ build: ["read"] }, async ({ actor, params }) => ({ build: await getBuild(getDb(), actor, params.buildId) }));
