// Who may do what: the one permissions table (better-auth access control). Every route handler,
// server action and data function asks lib/server/authorize.ts, which reads this table.
import { createAccessControl } from "better-auth/plugins/access";
import { defaultStatements } from "better-auth/plugins/admin/access";

export const statements = {
  ...defaultStatements,
  bench: ["read", "create", "edit", "submit"],
  review: ["read", "decide", "comment"],
  build: ["read", "record"],
  register: ["read", "manage"],
  audit: ["read", "export"],
  lab: ["read", "manage"],
  mail: ["read"],
  analysis: ["run"],
  eyewear: ["read", "manage"],
  standard: ["set"],
} as const;

export const ac = createAccessControl(statements);

export const ROLES = ["researcher", "officer", "technician", "auditor", "admin"] as const;
export type RoleName = (typeof ROLES)[number];

export const ROLE_LABELS: Record<RoleName, string> = {
  researcher: "Researcher",
  officer: "Laser safety officer",
  technician: "Technician",
  auditor: "Auditor",
  admin: "Administrator",
};

export const roles = {
  researcher: ac.newRole({
    bench: ["read", "create", "edit", "submit"],
    review: ["read", "comment"],
    register: ["read"],
    lab: ["read"],
    analysis: ["run"],
    eyewear: ["read"],
  }),
  officer: ac.newRole({
    bench: ["read"],
    review: ["read", "decide", "comment"],
    register: ["read", "manage"],
    audit: ["read"],
    lab: ["read"],
    analysis: ["run"],
    eyewear: ["read", "manage"],
    standard: ["set"],
  }),
  technician: ac.newRole({
    bench: ["read"],
    build: ["read", "record"],
    register: ["read"],
    lab: ["read"],
    analysis: ["run"],
    eyewear: ["read"],
  }),
  auditor: ac.newRole({
    bench: ["read"],
    review: ["read"],
    build: ["read"],
    register: ["read"],
    audit: ["read", "export"],
    lab: ["read"],
    eyewear: ["read"],
  }),
  // Only what Benchwarden's own audited admin routes ask for (people list, invitations, roles,
  // deactivation with its sessions). The library's own admin endpoints (impersonation, passwords,
  // creating or removing users, sessions of others) are closed to everyone in lib/auth/endpoints.ts.
  admin: ac.newRole({
    user: ["list", "create", "set-role", "ban"],
    session: ["revoke"],
    lab: ["read", "manage"],
    mail: ["read"],
    standard: ["set"],
  }),
};

export type Permission = { [K in keyof typeof statements]?: (typeof statements)[K][number][] };

/** Roles whose holders see every lab's benches; the others see only the labs they belong to. */
export const ALL_LABS_ROLES: readonly RoleName[] = ["officer", "auditor"];

export function parseRoles(value: string | null | undefined): RoleName[] {
  return (value ?? "")
    .split(",")
    .map((r) => r.trim())
    .filter((r): r is RoleName => (ROLES as readonly string[]).includes(r));
}

/** True when any of the roles grants every action asked for. */
export function rolesAllow(userRoles: readonly RoleName[], permission: Permission): boolean {
  return userRoles.some((r) => roles[r].authorize(permission as never).success);
}
