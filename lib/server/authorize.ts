// The one authorization helper. Route handlers, server actions, pages and data functions all
// get the caller as an Actor here and check permissions against lib/auth/permissions.ts.
import "server-only";
import { eq } from "drizzle-orm";
import { headers } from "next/headers";
import { getDb } from "@/db";
import { labMember } from "@/db/schema";
import { getAuth } from "@/lib/auth/auth";
import { ALL_LABS_ROLES, parseRoles, rolesAllow, ROLE_LABELS, type Permission, type RoleName } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";

export type Actor = {
  userId: string;
  name: string;
  email: string;
  roles: RoleName[];
  /** Labs the actor belongs to. */
  labIds: string[];
  /** Officers and auditors see every lab. */
  allLabs: boolean;
  ipAddress: string | null;
};

// Resolving the caller costs a session lookup and a membership query. Both are kept for a few
// seconds per process, keyed by the session cookie, so a burst of requests (the editor analyses
// every change) does not hit the database each time. Admin changes to a person (roles,
// deactivation, labs) call forgetPerson() at once; a sign-out elsewhere is honoured within
// ACTOR_TTL_MS. On globalThis so that every route bundle of the server process shares one cache.
const ACTOR_TTL_MS = 5_000;
const MAX_CACHED_ACTORS = 5_000;
type CachedActor = { actor: Omit<Actor, "ipAddress">; at: number };
const globalForActors = globalThis as unknown as { benchwardenActors?: Map<string, CachedActor> };
const actorCache = (globalForActors.benchwardenActors ??= new Map());

function sessionKey(requestHeaders: Headers): string | null {
  const cookie = requestHeaders.get("cookie");
  const token = cookie?.match(/(?:^|;\s*)(?:__Secure-)?better-auth\.session_token=([^;]+)/)?.[1];
  return token ?? null;
}

/** Drops what is cached about a person (or everyone) after an admin changes them. */
export function forgetPerson(userId?: string): void {
  if (!userId) return actorCache.clear();
  for (const [key, entry] of actorCache) if (entry.actor.userId === userId) actorCache.delete(key);
}

/** Kept for callers that changed lab memberships. */
export const forgetMemberships = forgetPerson;

async function resolveActor(requestHeaders: Headers): Promise<Omit<Actor, "ipAddress"> | null> {
  const result = await getAuth().api.getSession({ headers: requestHeaders });
  if (!result) return null;
  const { user } = result;
  const userRoles = parseRoles((user as { role?: string | null }).role);
  const rows = await getDb().select({ labId: labMember.labId }).from(labMember).where(eq(labMember.userId, user.id));
  return {
    userId: user.id,
    name: user.name,
    email: user.email,
    roles: userRoles,
    labIds: rows.map((m) => m.labId),
    allLabs: userRoles.some((r) => ALL_LABS_ROLES.includes(r)),
  };
}

export async function actorFromHeaders(requestHeaders: Headers): Promise<Actor | null> {
  const key = sessionKey(requestHeaders);
  const now = Date.now();
  const cached = key ? actorCache.get(key) : undefined;
  let actor = cached && now - cached.at < ACTOR_TTL_MS ? cached.actor : null;
  if (!actor) {
    actor = await resolveActor(requestHeaders);
    if (key) {
      if (actor) {
        if (actorCache.size >= MAX_CACHED_ACTORS) actorCache.clear();
        actorCache.set(key, { actor, at: now });
      } else actorCache.delete(key);
    }
  }
  if (!actor) return null;
  const forwarded = requestHeaders.get("x-forwarded-for");
  return { ...actor, ipAddress: forwarded ? forwarded.split(",")[0].trim() : null };
}

export async function currentActor(): Promise<Actor | null> {
  return actorFromHeaders(await headers());
}

const ACTION_WORDS: Record<string, string> = {
  bench: "benches",
  review: "reviews",
  build: "build records",
  register: "the laser register",
  audit: "the audit trail",
  lab: "labs",
  mail: "the mail log",
  analysis: "the analysis",
  user: "user accounts",
  session: "sessions",
};

export function describePermission(permission: Permission): string {
  return Object.entries(permission)
    .map(([resource, actions]) => `${(actions ?? []).join("/")} ${ACTION_WORDS[resource] ?? resource}`)
    .join(", ");
}

/** Throws 403 unless one of the actor's roles grants the permission. */
export function authorize(actor: Actor, permission: Permission): void {
  if (rolesAllow(actor.roles, permission)) return;
  const held = actor.roles.map((r) => ROLE_LABELS[r]).join(", ") || "no role";
  throw new AppError("forbidden", `Your role (${held}) may not ${describePermission(permission)}.`);
}

/** Throws 403 unless the actor may see the given lab's work. */
export function authorizeLab(actor: Actor, labId: string): void {
  if (actor.allLabs || actor.labIds.includes(labId)) return;
  throw new AppError("forbidden", "This bench belongs to a lab you are not a member of.");
}

/** The signed-in actor with the permission, or a 401/403 AppError. */
export async function requireActor(permission?: Permission, requestHeaders?: Headers): Promise<Actor> {
  const actor = requestHeaders ? await actorFromHeaders(requestHeaders) : await currentActor();
  if (!actor) throw new AppError("unauthenticated", "Please sign in first.");
  if (permission) authorize(actor, permission);
  return actor;
}
