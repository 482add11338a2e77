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

describe("errorHandler while the database is down", () => {
  it("answers 503 service_unavailable with a clear message and Retry-After, for a real refused connection", async () => {
    const { default: express } = await import("express");
    const { default: request } = await import("supertest");
    const { default: pg } = await import("pg");
    const { errorHandler, isDatabaseUnavailable } = await import("../../../server/http/errors");
    // Port 1 on the loopback: nothing listens there, so pg fails as it does when PostgreSQL is stopped.
    const pool = new pg.Pool({ connectionString: "postgres://nobody:x@127.0.0.1:1/none", max: 1 });
    const app = express();
    app.get("/x", async () => {
      await pool.query("select 1");
    });
    app.use(errorHandler);
    const res = await request(app).get("/x");
    await pool.end();
    expect(res.status).toBe(503);
    expect(res.headers["retry-after"]).toBe("10");
    expect(res.body.error.code).toBe("service_unavailable");
    expect(res.body.error.message).toMatch(/database is not reachable/);
    expect(isDatabaseUnavailable(new Error("syntax error at or near"))).toBe(false);
    expect(isDatabaseUnavailable({ code: "57P01" })).toBe(true);
    expect(isDatabaseUnavailable({ code: "23505" })).toBe(false);
  });
});
