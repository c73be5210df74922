// The people contract is shared: a form checks its body in the browser with the schema the route uses, and a
// problem comes back as the same ApiError (status, field name, sentence) the server would answer with.
import { describe, expect, it } from "vitest";
import { ApiError, checkBeforeSending, fieldError } from "@/lib/api/client";
import { createLabInput, inviteInput, rolesInput } from "@/lib/api/contracts/people";

describe("checking a form's body before it is sent", () => {
  it("names the field and its problem in the words of the shared schema", () => {
    let caught: unknown = null;
    try {
      checkBeforeSending(inviteInput, { email: "not an address", name: "Odile Farrant", roles: ["researcher"], labIds: [] });
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(ApiError);
    expect((caught as ApiError).status).toBe(400);
    expect(fieldError(caught, "email")).toBe("Enter a valid e-mail address");
    expect(fieldError(caught, "name")).toBeUndefined();
  });

  it("returns the body as the schema reads it when it is good", () => {
    expect(checkBeforeSending(inviteInput, { email: "Odile.Farrant@Example.org", name: " Odile Farrant ", roles: ["officer"] })).toEqual({
      email: "odile.farrant@example.org",
      name: "Odile Farrant",
      roles: ["officer"],
      labIds: [],
    });
  });

  it("refuses a lab name too short and an empty role list with the server's sentences", () => {
    expect(() => checkBeforeSending(createLabInput, { name: "L" })).toThrow("The lab name must be at least 2 characters");
    expect(() => checkBeforeSending(rolesInput, { roles: [] })).toThrow("Choose at least one role");
  });
});
