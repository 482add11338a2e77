import { describe, expect, it } from "vitest";
import { z } from "zod";
import { ChangePasswordSchema } from "../../../shared/schemas/auth";
import { HttpError, errorBody, parseInput } from "../../../server/http/errors";

describe("HttpError", () => {
  it.each([
    ["validation_failed", 400],
    ["unauthenticated", 401],
    ["forbidden", 403],
    ["not_found", 404],
    ["conflict", 409],
    ["rate_limited", 429],
    ["internal", 500],
  ] as const)("maps %s to HTTP %i (RFC 9110, section 15)", (code, status) => {
    expect(new HttpError(code, "x").status).toBe(status);
  });
});

describe("parseInput", () => {
  it("returns the parsed value", () => {
    expect(parseInput(z.object({ n: z.coerce.number() }), { n: "4" })).toEqual({ n: 4 });
  });

  it("throws validation_failed with one {path, message} per issue, nested paths kept", () => {
    try {
      parseInput(z.object({ a: z.object({ b: z.array(z.string()) }) }), { a: { b: ["ok", 3] } });
      expect.unreachable();
    } catch (err) {
      expect(err).toBeInstanceOf(HttpError);
      const e = err as HttpError;
      expect(e.code).toBe("validation_failed");
      expect(e.details).toEqual([{ path: ["a", "b", 1], message: expect.any(String) }]);
    }
  });

  it("reports refinements on the field they name", () => {
    expect(() =>
      parseInput(ChangePasswordSchema, {
        currentPassword: "same-password-1",
        newPassword: "same-password-1",
      }),
    ).toThrow(
      expect.objectContaining({
        details: [{ path: ["newPassword"], message: "must differ from the current password" }],
      }),
    );
  });
});

describe("errorBody", () => {
  it("omits details when there are none", () => {
    expect(errorBody("not_found", "No such project")).toEqual({
      error: { code: "not_found", message: "No such project" },
    });
    expect(errorBody("validation_failed", "bad", [])).toEqual({
      error: { code: "validation_failed", message: "bad", details: [] },
    });
  });
});
