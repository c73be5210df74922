// The client address rule (X-Forwarded-For only behind configured proxies) and the RFC 6266 header.
import { describe, expect, it } from "vitest";
import { clientAddress, PEER_ADDRESS_HEADER } from "@/lib/auth/client-address";
import { findUnsafeText, unsafeTextProblem } from "@/lib/validation/text";

const h = (o: Record<string, string>) => new Headers(o);

describe("clientAddress", () => {
  it("without a trusted proxy: the socket's peer, never the header", () => {
    expect(clientAddress(h({ "x-forwarded-for": "203.0.113.9", [PEER_ADDRESS_HEADER]: "127.0.0.1" }), 0)).toBe("127.0.0.1");
    expect(clientAddress(h({ [PEER_ADDRESS_HEADER]: "::ffff:10.1.2.3" }), 0)).toBe("10.1.2.3");
    expect(clientAddress(h({ "x-forwarded-for": "203.0.113.9" }), 0)).toBeNull();
  });
  it("with n trusted proxies: the n-th entry from the right", () => {
    const headers = h({ "x-forwarded-for": "1.1.1.1, 203.0.113.9, 10.0.0.2", [PEER_ADDRESS_HEADER]: "10.0.0.3" });
    expect(clientAddress(headers, 1)).toBe("10.0.0.2");
    expect(clientAddress(headers, 2)).toBe("203.0.113.9");
    // Fewer hops than proxies: the left-most there is.
    expect(clientAddress(headers, 5)).toBe("1.1.1.1");
    // No header at all: the peer.
    expect(clientAddress(h({ [PEER_ADDRESS_HEADER]: "10.0.0.3" }), 1)).toBe("10.0.0.3");
  });
});

describe("text that cannot be stored", () => {
  it("NUL and lone surrogates (Unicode 15 §3.9), but not a proper pair", () => {
    expect(unsafeTextProblem("a\u0000")).toMatch(/NUL/);
    expect(unsafeTextProblem("\ud83d")).toMatch(/surrogate/);
    expect(unsafeTextProblem("\ude00x")).toMatch(/surrogate/);
    expect(unsafeTextProblem("\ud83d\ude00")).toBeNull();
    expect(findUnsafeText({ a: { b: ["ok", "x\u0000"] } })).toEqual([{ path: "a.b.1", message: expect.stringMatching(/NUL/) }]);
  });
});
