// The request fields every error log line carries: a request id (the proxy's when it is sane, else a new one) and the actor.
import { describe, expect, it } from "vitest";
import { requestFields, requestIdOf } from "@/lib/log";

describe("request ids and fields for the log", () => {
  it("keeps a sane x-request-id and makes a new one otherwise", () => {
    expect(requestIdOf(new Request("http://x/api/a", { headers: { "x-request-id": "proxy-1234abcd" } }))).toBe("proxy-1234abcd");
    const made = requestIdOf(new Request("http://x/api/a", { headers: { "x-request-id": "bad id; drop table" } }));
    expect(made).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(requestIdOf(new Request("http://x/api/a"))).not.toBe(made);
  });
  it("names the method, the path without its query, and the actor", () => {
    const request = new Request("http://x/api/builds/1?token=secret", { method: "POST" });
    expect(requestFields(request, "r1", { userId: "u1", roles: ["technician", "auditor"] })).toEqual({
      requestId: "r1",
      method: "POST",
      path: "/api/builds/1",
      actorId: "u1",
      actorRoles: "technician,auditor",
    });
    expect(requestFields(request, "r2").actorId).toBeNull();
  });
});
