// The people contract: request bodies of the people, lab, invitation and administration routes (zod) and the
// shapes they answer with, imported by the route handlers, lib/server/people.ts and the admin forms alike (no
// server-only code here), so a form names a field's problem with the same words the server would.
import { z } from "zod";
import { ROLES, type RoleName } from "@/lib/auth/permissions";
import { safeText } from "@/lib/validation/text";

export type PersonSummary = { id: string; name: string; email: string; roles: RoleName[]; labs: string[]; active: boolean };

export const createLabInput = z.object({
  name: safeText({ error: "Give the lab a name" }).trim().min(2, "The lab name must be at least 2 characters").max(120, "The lab name must be at most 120 characters"),
  room: safeText().trim().max(120, "The room must be at most 120 characters").optional(),
});

export const inviteInput = z.object({
  email: z.email({ error: "Enter a valid e-mail address" }).transform((e) => e.toLowerCase()),
  name: safeText({ error: "Enter the person's name" }).trim().min(2, "Enter the person's name").max(120, "The name must be at most 120 characters"),
  roles: z.array(z.enum(ROLES, { error: `Each role must be one of: ${ROLES.join(", ")}` })).min(1, "Choose at least one role"),
  labIds: z.array(z.uuid({ error: "Each lab must be a lab id" })).default([]),
});

export const acceptInput = z.object({
  token: safeText({ error: "The invitation link is incomplete" }).min(10, "The invitation link is incomplete"),
  password: safeText({ error: "Choose a password" }).min(10, "The password must be at least 10 characters long").max(128, "The password must be at most 128 characters long"),
});

export const rolesInput = z.object({
  roles: z.array(z.enum(ROLES, { error: `Each role must be one of: ${ROLES.join(", ")}` })).min(1, "Choose at least one role").max(ROLES.length),
});

export const deactivateInput = z.object({ reason: safeText().trim().max(500, "The reason must be at most 500 characters").optional() });

export const memberInput = z.object({ userId: safeText({ error: "Choose a person" }).min(1, "Choose a person").max(64) });

export type AdminPerson = { id: string; name: string; email: string; roles: RoleName[]; labIds: string[]; active: boolean; banReason: string | null; createdAt: string };

export type AdminLab = { id: string; name: string; room: string | null; members: { id: string; name: string; roles: RoleName[]; active: boolean }[] };

export type PendingInvitation = { id: string; email: string; name: string; roles: RoleName[]; expiresAt: string };

export type CreateLabInput = z.input<typeof createLabInput>;
export type InviteInput = z.input<typeof inviteInput>;
export type AcceptInput = z.input<typeof acceptInput>;
