// The permissions table: what each role may do, as lib/server/authorize.ts enforces it.
import { describe, expect, it } from "vitest";
import { parseRoles, rolesAllow, type RoleName } from "@/lib/auth/permissions";
import { backoffSeconds } from "@/lib/mail/worker";

const can = (role: RoleName, permission: Parameters<typeof rolesAllow>[1]) => rolesAllow([role], permission);

describe("roles", () => {
  it("only officers decide reviews", () => {
    expect(can("officer", { review: ["decide"] })).toBe(true);
    for (const r of ["researcher", "technician", "auditor", "admin"] as const) expect(can(r, { review: ["decide"] })).toBe(false);
  });
  it("auditors read and export but never write", () => {
    expect(can("auditor", { audit: ["read", "export"] })).toBe(true);
    expect(can("auditor", { bench: ["edit"] })).toBe(false);
    expect(can("auditor", { register: ["manage"] })).toBe(false);
    expect(can("auditor", { build: ["record"] })).toBe(false);
  });
  it("only admins manage people and labs", () => {
    expect(can("admin", { user: ["create", "list"], lab: ["manage"] })).toBe(true);
    for (const r of ["researcher", "officer", "technician", "auditor"] as const) expect(can(r, { user: ["list"] })).toBe(false);
  });
  it("a person holding two roles gets what either grants", () => {
    expect(rolesAllow(["researcher", "officer"], { review: ["decide"] })).toBe(true);
    expect(rolesAllow(["researcher", "officer"], { bench: ["create"] })).toBe(true);
  });
  it("parses the stored role list and drops unknown names", () => {
    expect(parseRoles("researcher, officer,wizard")).toEqual(["researcher", "officer"]);
    expect(parseRoles(null)).toEqual([]);
  });
});

describe("outbox backoff", () => {
  it("doubles from 15 s and stops at one hour", () => {
    expect([1, 2, 3, 4].map(backoffSeconds)).toEqual([15, 30, 60, 120]);
    expect(backoffSeconds(20)).toBe(3600);
  });
});
