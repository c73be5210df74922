import { getDb } from "@/db";
import { apiRoute } from "@/lib/server/api";
import { signOffBuild } from "@/lib/server/builds";

export const POST = apiRoute<{ buildId: string }>({ build: ["record"] }, async ({ actor, params }) => ({ build: await signOffBuild(getDb(), actor, params.buildId) }));
