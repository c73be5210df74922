import { describe, expect, it } from "vitest";
import { deskQueryFromParams, deskQueryKeepingGoodFilters } from "@/lib/server/desk-queries";

describe("the desk page's address with a filter it cannot read", () => {
  it("keeps the good filters and names the bad one by its name in the address", () => {
    const raw = new URLSearchParams({ class: "5", state: "approved", from: "2026-01-01", q: "iris" });
    const { query, dropped } = deskQueryKeepingGoodFilters(deskQueryFromParams(raw));
    expect(dropped).toHaveLength(1);
    expect(dropped[0].field).toBe("class");
    expect(dropped[0].message).toMatch(/class must be one of/);
    expect(query).toMatchObject({ state: "approved", from: "2026-01-01", q: "iris", hazardClass: undefined });
  });

  it("drops every bad filter, each named once, and an end date before the start", () => {
    const raw = new URLSearchParams({ expiring: "soon", lab: "not-a-lab", from: "2026-05-01", to: "2026-01-01", state: "approved" });
    const { query, dropped } = deskQueryKeepingGoodFilters(deskQueryFromParams(raw));
    expect(dropped.map((d) => d.field).sort()).toEqual(["expiring", "lab", "to"]);
    expect(query).toMatchObject({ state: "approved", from: "2026-05-01", to: undefined, lab: undefined, expiringDays: undefined });
  });

  it("reads the builds filter and drops a value it does not know, by name", () => {
    expect(deskQueryKeepingGoodFilters(deskQueryFromParams(new URLSearchParams({ builds: "mismatch" }))).query.builds).toBe("mismatch");
    const { query, dropped } = deskQueryKeepingGoodFilters(deskQueryFromParams(new URLSearchParams({ builds: "some", state: "approved" })));
    expect(dropped.map((d) => d.field)).toEqual(["builds"]);
    expect(dropped[0].message).toMatch(/builds must be mismatch/);
    expect(query).toMatchObject({ state: "approved", builds: undefined });
  });

  it("drops nothing from a good address", () => {
    const { dropped, query } = deskQueryKeepingGoodFilters(deskQueryFromParams(new URLSearchParams({ state: "approved", page: "2" })));
    expect(dropped).toEqual([]);
    expect(query.page).toBe(2);
  });
});
