import { getDb } from "@/db";
import { apiRoute } from "@/lib/server/api";
import { removeLabMember } from "@/lib/server/people";

export const DELETE = apiRoute<{ labId: string; userId: string }>({ lab: ["manage"] }, async ({ actor, params }) => removeLabMember(getDb(), actor, params.labId, params.userId));
