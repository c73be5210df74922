// People and labs: users with their roles and labs, invitations by e-mail, lab records.
// Admins manage; everyone else reads only what their role allows. Authorization is checked here.
import "server-only";
import { createHash, randomBytes, randomUUID } from "node:crypto";
import { hashPassword } from "better-auth/crypto";
import { and, asc, eq, gt, isNull } from "drizzle-orm";
import { z } from "zod";
import { safeText } from "@/lib/validation/text";
import type { Database } from "@/db";
import { account, invitation, lab, labMember, user } from "@/db/schema";
import { parseRoles, ROLE_LABELS, ROLES, type RoleName } from "@/lib/auth/permissions";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { enqueueMail } from "@/lib/mail/outbox";
import { invitationMail } from "@/lib/mail/templates";
import { recordAudit } from "./audit";
import { authorize, type Actor } from "./authorize";

export type PersonSummary = { id: string; name: string; email: string; roles: RoleName[]; labs: string[]; active: boolean };

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

export const createLabInput = z.object({
  name: safeText({ error: "Give the lab a name" }).trim().min(2, "The lab name must be at least 2 characters").max(120, "The lab name must be at most 120 characters"),
  room: safeText().trim().max(120, "The room must be at most 120 characters").optional(),
});

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

export const inviteInput = z.object({
  email: z.email({ error: "Enter a valid e-mail address" }).transform((e) => e.toLowerCase()),
  name: safeText({ error: "Enter the person's name" }).trim().min(2, "Enter the person's name").max(120, "The name must be at most 120 characters"),
  roles: z.array(z.enum(ROLES, { error: `Each role must be one of: ${ROLES.join(", ")}` })).min(1, "Choose at least one role"),
  labIds: z.array(z.uuid({ error: "Each lab must be a lab id" })).default([]),
});

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

export const acceptInput = z.object({
  token: safeText({ error: "The invitation link is incomplete" }).min(10, "The invitation link is incomplete"),
  password: safeText({ error: "Choose a password" }).min(10, "The password must be at least 10 characters long").max(128, "The password must be at most 128 characters long"),
});

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
