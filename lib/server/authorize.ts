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

// Lab memberships change rarely (an admin's action); keeping them for a few seconds per process
// saves a query on every request. Admin changes call forgetMemberships() at once.
const MEMBERSHIP_TTL_MS = 10_000;
// On globalThis so that every route bundle of the server process shares one cache.
const globalForMemberships = globalThis as unknown as { benchwardenMemberships?: Map<string, { labIds: string[]; at: number }> };
const membershipCache = (globalForMemberships.benchwardenMemberships ??= new Map());

async function labIdsOf(userId: string): Promise<string[]> {
  const cached = membershipCache.get(userId);
  if (cached && Date.now() - cached.at < MEMBERSHIP_TTL_MS) return cached.labIds;
  const rows = await getDb().select({ labId: labMember.labId }).from(labMember).where(eq(labMember.userId, userId));
  const labIds = rows.map((m) => m.labId);
  membershipCache.set(userId, { labIds, at: Date.now() });
  return labIds;
}

/** Drops cached lab memberships (all, or one person's) after they change. */
export function forgetMemberships(userId?: string): void {
  if (userId) membershipCache.delete(userId);
  else membershipCache.clear();
}

export async function actorFromHeaders(requestHeaders: Headers): Promise<Actor | null> {
  const result = await getAuth().api.getSession({ headers: requestHeaders });
  if (!result) return null;
  const { user } = result;
  const userRoles = parseRoles((user as { role?: string | null }).role);
  const labIds = await labIdsOf(user.id);
  const forwarded = requestHeaders.get("x-forwarded-for");
  return {
    userId: user.id,
    name: user.name,
    email: user.email,
    roles: userRoles,
    labIds,
    allLabs: userRoles.some((r) => ALL_LABS_ROLES.includes(r)),
    ipAddress: forwarded ? forwarded.split(",")[0].trim() : null,
  };
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
