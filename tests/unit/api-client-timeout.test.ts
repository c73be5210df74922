// A save whose request never answers must not leave the editor "saving" for ever: after its timeout apiFetch
// answers as for a server that cannot be reached (status 0), so the change is kept and sent again.
import { createServer, type Server } from "node:http";
import type { AddressInfo } from "node:net";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ApiError, apiFetch } from "@/lib/api/client";

let server: Server;
let url = "";

beforeAll(async () => {
  server = createServer(() => {
    // never answers
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/never`;
});
afterAll(async () => {
  server.closeAllConnections();
  await new Promise<void>((resolve) => server.close(() => resolve()));
});

describe("a request that never answers", () => {
  it("ends after its timeout as 'cannot be reached', with the caller's sentence", async () => {
    const started = Date.now();
    const failure = await apiFetch(url, { method: "PUT", body: "{}", timeoutMs: 300, offlineMessage: "Kept here; saved when the server answers." }).catch((e: unknown) => e);
    expect(failure).toBeInstanceOf(ApiError);
    expect((failure as ApiError).status).toBe(0);
    expect((failure as ApiError).message).toBe("Kept here; saved when the server answers.");
    expect(Date.now() - started).toBeGreaterThanOrEqual(250);
  });

  it("is still aborted by the caller's own signal as an abort, not as offline", async () => {
    const controller = new AbortController();
    setTimeout(() => controller.abort(), 100);
    const failure = await apiFetch(url, { signal: controller.signal }).catch((e: unknown) => e);
    expect(failure).toBeInstanceOf(DOMException);
    expect((failure as DOMException).name).toBe("AbortError");
  });
});
