// People and administration: labs, invitations and accepting them, the people list, roles, deactivating
// and reactivating accounts (better-auth admin plugin's ban columns; sessions revoked) and lab membership.
// History and signatures are never touched; each change is audited with the admin who made it.
import "server-only";
import { createHash, randomBytes, randomUUID } from "node:crypto";
import { hashPassword } from "better-auth/crypto";
import { and, asc, eq, gt, isNull, sql } from "drizzle-orm";
import { z } from "zod";
import { type Database, type DbOrTx } from "@/db";
import { account, invitation, lab, labMember, user, session } from "@/db/schema";
import { parseRoles, ROLE_LABELS, ROLES, type RoleName } from "@/lib/auth/permissions";
import { env } from "@/lib/env";
import { AppError, notFound } from "@/lib/errors";
import { enqueueMail } from "@/lib/mail/outbox";
import { invitationMail } from "@/lib/mail/templates";
import { acceptInput, createLabInput, deactivateInput, inviteInput, memberInput, rolesInput, type AdminLab, type AdminPerson, type PendingInvitation, type PersonSummary } from "@/lib/api/contracts/people";
import { recordAudit } from "./audit";
import { authorize, type Actor } from "./authorize";

export { acceptInput, createLabInput, deactivateInput, inviteInput, memberInput, rolesInput, type AdminLab, type AdminPerson, type PendingInvitation, type PersonSummary };

/** Users without secrets: never the password hash or session tokens. */
export async function listPeople(db: Database, actor: Actor): Promise<PersonSummary[]> {
  authorize(actor, { user: ["list"] });
  const rows = await db
    .select({ id: user.id, name: user.name, email: user.email, role: user.role, banned: user.banned, labName: lab.name })
    .from(user)
    .leftJoin(labMember, eq(labMember.userId, user.id))
    .leftJoin(lab, eq(lab.id, labMember.labId))
    .orderBy(asc(user.name));
  const people = new Map<string, PersonSummary>();
  for (const r of rows) {
    const p = people.get(r.id) ?? { id: r.id, name: r.name, email: r.email, roles: parseRoles(r.role), labs: [], active: !r.banned };
    if (r.labName) p.labs.push(r.labName);
    people.set(r.id, p);
  }
  return [...people.values()];
}

export async function listLabs(db: Database, actor: Actor) {
  authorize(actor, { lab: ["read"] });
  const rows = await db.select({ id: lab.id, name: lab.name, room: lab.room }).from(lab).orderBy(asc(lab.name));
  return rows;
}

export async function createLab(db: Database, actor: Actor, input: z.infer<typeof createLabInput>) {
  authorize(actor, { lab: ["manage"] });
  return db.transaction(async (tx) => {
    const [existing] = await tx.select({ id: lab.id }).from(lab).where(eq(lab.name, input.name));
    if (existing) throw new AppError("conflict", `A lab named "${input.name}" already exists.`);
    const [row] = await tx.insert(lab).values({ name: input.name, room: input.room || null }).returning({ id: lab.id, name: lab.name, room: lab.room });
    await recordAudit(tx, actor, { action: "lab-created", detail: { labId: row.id, name: row.name } });
    return row;
  });
}

const hashToken = (token: string) => createHash("sha256").update(token).digest("hex");
const INVITATION_DAYS = 7;

/** Records the invitation and its e-mail in one transaction; the link carries a one-time token. */
export async function invitePerson(db: Database, actor: Actor, input: z.infer<typeof inviteInput>): Promise<{ id: string }> {
  authorize(actor, { user: ["create"] });
  const token = randomBytes(24).toString("base64url");
  return db.transaction(async (tx) => {
    const [taken] = await tx.select({ id: user.id }).from(user).where(eq(user.email, input.email));
    if (taken) throw new AppError("conflict", `${input.email} already has an account.`, [{ path: "email", message: "This address already has an account" }]);
    for (const labId of input.labIds) {
      const [found] = await tx.select({ id: lab.id }).from(lab).where(eq(lab.id, labId));
      if (!found) throw new AppError("bad-request", "One of the chosen labs does not exist.", [{ path: "labIds", message: "Unknown lab" }]);
    }
    const [row] = await tx
      .insert(invitation)
      .values({
        email: input.email,
        name: input.name,
        roles: input.roles.join(","),
        labIds: input.labIds,
        tokenHash: hashToken(token),
        invitedBy: actor.userId,
        expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000),
      })
      .returning({ id: invitation.id });
    await enqueueMail(
      tx,
      invitationMail({
        to: input.email,
        name: input.name,
        invitedBy: actor.name,
        roles: input.roles.map((r) => ROLE_LABELS[r]).join(" and "),
        url: `${env().APP_URL}/accept-invitation?token=${token}`,
      }),
    );
    await recordAudit(tx, actor, { action: "person-invited", detail: { email: input.email, roles: input.roles } });
    return row;
  });
}

/** Turns a valid invitation into an account with its roles and labs. The token is the authority. */
export async function acceptInvitation(db: Database, input: z.infer<typeof acceptInput>): Promise<{ email: string }> {
  const passwordHash = await hashPassword(input.password);
  return db.transaction(async (tx) => {
    const [inv] = await tx
      .select()
      .from(invitation)
      .where(and(eq(invitation.tokenHash, hashToken(input.token)), isNull(invitation.acceptedAt), gt(invitation.expiresAt, new Date())))
      .for("update");
    if (!inv) throw new AppError("not-found", "This invitation has expired or was already used. Ask your administrator for a new one.");
    const id = randomUUID();
    await tx.insert(user).values({ id, name: inv.name, email: inv.email, emailVerified: true, role: inv.roles });
    await tx.insert(account).values({ id: randomUUID(), accountId: id, providerId: "credential", userId: id, password: passwordHash });
    for (const labId of inv.labIds) await tx.insert(labMember).values({ labId, userId: id });
    await tx.update(invitation).set({ acceptedAt: new Date() }).where(eq(invitation.id, inv.id));
    await recordAudit(tx, { userId: id, roleText: inv.roles }, { action: "invitation-accepted", detail: { email: inv.email } });
    return { email: inv.email };
  });
}

// ── Administration ─────────────────────────────────────────────────────────────────────────────

async function loadUser(db: DbOrTx, userId: string) {
  const [row] = await db.select({ id: user.id, name: user.name, email: user.email, role: user.role, banned: user.banned }).from(user).where(eq(user.id, userId));
  if (!row) throw notFound("The person");
  return row;
}

/** Active administrators other than the given user; an institution must keep at least one. */
async function otherActiveAdmins(db: DbOrTx, userId: string): Promise<number> {
  const rows = await db.select({ id: user.id, role: user.role, banned: user.banned }).from(user).where(sql`${user.role} like '%admin%'`);
  return rows.filter((r) => r.id !== userId && !r.banned && parseRoles(r.role).includes("admin")).length;
}

export async function listAdminPeople(db: Database, actor: Actor): Promise<AdminPerson[]> {
  authorize(actor, { user: ["list"] });
  const [people, memberships] = await Promise.all([
    db.select({ id: user.id, name: user.name, email: user.email, role: user.role, banned: user.banned, banReason: user.banReason, createdAt: user.createdAt }).from(user).orderBy(asc(user.name)),
    db.select({ userId: labMember.userId, labId: labMember.labId }).from(labMember),
  ]);
  const labsOf = new Map<string, string[]>();
  for (const m of memberships) labsOf.set(m.userId, [...(labsOf.get(m.userId) ?? []), m.labId]);
  return people.map((p) => ({
    id: p.id,
    name: p.name,
    email: p.email,
    roles: parseRoles(p.role),
    labIds: labsOf.get(p.id) ?? [],
    active: !p.banned,
    banReason: p.banned ? p.banReason : null,
    createdAt: p.createdAt.toISOString(),
  }));
}

export async function listPendingInvitations(db: Database, actor: Actor): Promise<PendingInvitation[]> {
  authorize(actor, { user: ["list"] });
  const rows = await db
    .select({ id: invitation.id, email: invitation.email, name: invitation.name, roles: invitation.roles, expiresAt: invitation.expiresAt })
    .from(invitation)
    .where(and(isNull(invitation.acceptedAt), gt(invitation.expiresAt, new Date())))
    .orderBy(asc(invitation.expiresAt));
  return rows.map((r) => ({ ...r, roles: parseRoles(r.roles), expiresAt: r.expiresAt.toISOString() }));
}

/** Replaces a person's roles; takes effect on their next request (the cached caller is dropped). */
export async function setRoles(db: Database, actor: Actor, userId: string, input: z.infer<typeof rolesInput>): Promise<AdminPerson["roles"]> {
  authorize(actor, { user: ["set-role"] });
  const roles = [...new Set(input.roles)].sort((a, b) => ROLES.indexOf(a) - ROLES.indexOf(b));
  return db.transaction(async (tx) => {
    const target = await loadUser(tx, userId);
    const before = parseRoles(target.role);
    if (before.includes("admin") && !roles.includes("admin")) {
      if (userId === actor.userId) throw new AppError("conflict", "You cannot take the administrator role from yourself; ask another administrator.");
      if ((await otherActiveAdmins(tx, userId)) === 0) throw new AppError("conflict", `${target.name} is the only active administrator; give someone else the role first.`);
    }
    await tx.update(user).set({ role: roles.join(","), updatedAt: new Date() }).where(eq(user.id, userId));
    await recordAudit(tx, actor, {
      action: "person-roles-changed",
      detail: { userId, email: target.email, from: before, to: roles },
    });
    return roles;
  });
}

/**
 * Deactivates an account: better-auth's admin plugin refuses a banned user at sign-in, and the
 * person's sessions are revoked at once. Their benches, comments and signatures stay as they are.
 */
export async function deactivatePerson(db: Database, actor: Actor, userId: string, input: z.infer<typeof deactivateInput>): Promise<{ active: false; sessionsRevoked: number }> {
  authorize(actor, { user: ["ban"], session: ["revoke"] });
  if (userId === actor.userId) throw new AppError("conflict", "You cannot deactivate your own account.");
  return db.transaction(async (tx) => {
    const target = await loadUser(tx, userId);
    if (target.banned) throw new AppError("conflict", `${target.name}'s account is already deactivated.`);
    if (parseRoles(target.role).includes("admin") && (await otherActiveAdmins(tx, userId)) === 0) {
      throw new AppError("conflict", `${target.name} is the only active administrator and cannot be deactivated.`);
    }
    const reason = input.reason || "Deactivated by an administrator";
    await tx.update(user).set({ banned: true, banReason: reason, banExpires: null, updatedAt: new Date() }).where(eq(user.id, userId));
    const revoked = await tx.delete(session).where(eq(session.userId, userId)).returning({ id: session.id });
    await recordAudit(tx, actor, {
      action: "person-deactivated",
      detail: { userId, email: target.email, reason, sessionsRevoked: revoked.length },
    });
    return { active: false as const, sessionsRevoked: revoked.length };
  });
}

export async function reactivatePerson(db: Database, actor: Actor, userId: string): Promise<{ active: true }> {
  authorize(actor, { user: ["ban"] });
  return db.transaction(async (tx) => {
    const target = await loadUser(tx, userId);
    if (!target.banned) throw new AppError("conflict", `${target.name}'s account is already active.`);
    await tx.update(user).set({ banned: false, banReason: null, banExpires: null, updatedAt: new Date() }).where(eq(user.id, userId));
    await recordAudit(tx, actor, { action: "person-reactivated", detail: { userId, email: target.email } });
    return { active: true as const };
  });
}

// ── Labs and their members ────────────────────────────────────────────────────────────────────
export async function listLabsWithMembers(db: Database, actor: Actor): Promise<AdminLab[]> {
  authorize(actor, { lab: ["manage"] });
  const [labs, members] = await Promise.all([
    db.select({ id: lab.id, name: lab.name, room: lab.room }).from(lab).orderBy(asc(lab.name)),
    db
      .select({ labId: labMember.labId, id: user.id, name: user.name, role: user.role, banned: user.banned })
      .from(labMember)
      .innerJoin(user, eq(user.id, labMember.userId))
      .orderBy(asc(user.name)),
  ]);
  return labs.map((l) => ({
    ...l,
    members: members.filter((m) => m.labId === l.id).map((m) => ({ id: m.id, name: m.name, roles: parseRoles(m.role), active: !m.banned })),
  }));
}

async function loadLab(db: DbOrTx, labId: string) {
  if (!z.uuid().safeParse(labId).success) throw notFound("The lab");
  const [row] = await db.select({ id: lab.id, name: lab.name }).from(lab).where(eq(lab.id, labId));
  if (!row) throw notFound("The lab");
  return row;
}

export async function addLabMember(db: Database, actor: Actor, labId: string, input: z.infer<typeof memberInput>): Promise<{ labId: string; userId: string }> {
  authorize(actor, { lab: ["manage"] });
  const result = await db.transaction(async (tx) => {
    const l = await loadLab(tx, labId);
    const target = await loadUser(tx, input.userId);
    const inserted = await tx.insert(labMember).values({ labId, userId: target.id }).onConflictDoNothing().returning({ labId: labMember.labId });
    if (inserted.length === 0) throw new AppError("conflict", `${target.name} is already a member of ${l.name}.`);
    await recordAudit(tx, actor, { action: "lab-member-added", detail: { labId, labName: l.name, userId: target.id, email: target.email } });
    return { labId, userId: target.id };
  });
  return result;
}

export async function removeLabMember(db: Database, actor: Actor, labId: string, userId: string): Promise<{ removed: true }> {
  authorize(actor, { lab: ["manage"] });
  const result = await db.transaction(async (tx) => {
    const l = await loadLab(tx, labId);
    const target = await loadUser(tx, userId);
    const removed = await tx.delete(labMember).where(and(eq(labMember.labId, labId), eq(labMember.userId, userId))).returning({ userId: labMember.userId });
    if (removed.length === 0) throw new AppError("not-found", `${target.name} is not a member of ${l.name}.`);
    await recordAudit(tx, actor, { action: "lab-member-removed", detail: { labId, labName: l.name, userId, email: target.email } });
    return { removed: true as const };
  });
  return result;
}

export const roleWords = (roles: RoleName[]) => roles.map((r) => ROLE_LABELS[r]).join(", ");
