// The outbox's Message-ID (lib/mail/worker.ts outboxMessageId): the same for a row on every attempt,
// different for two rows, in the form RFC 5322 §3.6.4 gives (msg-id = "<" id-left "@" id-right ">").
import { describe, expect, it } from "vitest";
import { outboxMessageId } from "@/lib/mail/worker";

describe("outboxMessageId", () => {
  const row = "3f2a9c1e-5b7d-4e8f-9a01-23456789abcd";
  it("is made from the row id and the sender's domain, and repeats for the same row", () => {
    expect(outboxMessageId(row, "Benchwarden <benchwarden@northmere.example.edu>")).toBe(`<outbox.${row}@northmere.example.edu>`);
    expect(outboxMessageId(row, "Benchwarden <benchwarden@northmere.example.edu>")).toBe(outboxMessageId(row, "Benchwarden <benchwarden@northmere.example.edu>"));
    expect(outboxMessageId(row, "benchwarden@optics.example.edu")).toBe(`<outbox.${row}@optics.example.edu>`);
  });
  it("differs between rows", () => {
    expect(outboxMessageId(row, "a@b.example")).not.toBe(outboxMessageId(row.replace("3f", "40"), "a@b.example"));
  });
  it("falls back to a reserved domain when the sender has none usable", () => {
    expect(outboxMessageId(row, "Benchwarden")).toBe(`<outbox.${row}@benchwarden.invalid>`);
    expect(outboxMessageId(row, "x@bad domain>")).toBe(`<outbox.${row}@benchwarden.invalid>`);
  });
});
