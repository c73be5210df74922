// The one authorization helper. Route handlers, server actions, pages and data functions all
// get the caller as an Actor here and check permissions against lib/auth/permissions.ts.
import "server-only";
import { eq } from "drizzle-orm";
import { headers } from "next/headers";
import { cache } from "react";
import { getDb } from "@/db";
import { labMember } from "@/db/schema";
import { getAuth } from "@/lib/auth/auth";
import { clientAddress } from "@/lib/auth/client-address";
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

// Nothing about the caller is kept between requests: every request reads the session and the
// memberships from PostgreSQL, so a sign-out, a revoked session, a deactivation or a role change
// takes effect at once on every server. Within one page render, React's cache() shares the answer
// between the layout and the page.

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
  const actor = await resolveActor(requestHeaders);
  if (!actor) return null;
  return { ...actor, ipAddress: clientAddress(requestHeaders) };
}

/** The caller of the page being rendered (once per render, shared by layout and page). */
export const currentActor = cache(async (): Promise<Actor | null> => actorFromHeaders(await headers()));

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
