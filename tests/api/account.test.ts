import request from "supertest";
import { describe, expect, it } from "vitest";
import { expectError, signedIn, useApiTestDatabase } from "./helpers";

const t = useApiTestDatabase();

describe("POST /api/account/password", () => {
  it("refuses a wrong current password with a field error on currentPassword", async () => {
    const agent = await signedIn(t.app, "author");
    const res = await agent
      .post("/api/account/password")
      .send({ currentPassword: "not-it-at-all", newPassword: "a-new-long-password" });
    const err = expectError(res, 400, "validation_failed");
    expect(err.details).toEqual([{ path: ["currentPassword"], message: expect.any(String) }]);
  });

  it("refuses a new password shorter than 12 characters, naming the field", async () => {
    const agent = await signedIn(t.app, "author");
    const res = await agent
      .post("/api/account/password")
      .send({ currentPassword: "tapwright-author", newPassword: "short" });
    const err = expectError(res, 400, "validation_failed");
    expect(err.details).toEqual([{ path: ["newPassword"], message: "at least 12 characters" }]);
  });

  it("refuses a new password equal to the current one", async () => {
    const agent = await signedIn(t.app, "author");
    const res = await agent
      .post("/api/account/password")
      .send({ currentPassword: "tapwright-author", newPassword: "tapwright-author" });
    const err = expectError(res, 400, "validation_failed");
    expect((err.details as { path: string[] }[])[0]!.path).toEqual(["newPassword"]);
  });

  it("changes the password: the new one signs in, the old one no longer does", async () => {
    const agent = await signedIn(t.app, "firmware");
    const res = await agent
      .post("/api/account/password")
      .send({ currentPassword: "tapwright-firmware", newPassword: "firmware-changed-42" });
    expect(res.status).toBe(204);
    const old = await request(t.app)
      .post("/api/auth/sign-in")
      .send({ username: "firmware", password: "tapwright-firmware" });
    expectError(old, 401, "unauthenticated");
    await signedIn(t.app, "firmware", "firmware-changed-42");
    // The session that changed the password stays signed in.
    expect((await agent.get("/api/auth/me")).status).toBe(200);
  });

  it("stores a bcrypt hash of cost 12, never the password", async () => {
    const { rows } = await t.database.pool.query<{ password_hash: string }>(
      "select password_hash from users where username = 'author'",
    );
    // Modular crypt format "$2b$12$" + 53 characters (Provos and Mazières, "A Future-Adaptable Password Scheme", 1999).
    expect(rows[0]!.password_hash).toMatch(/^\$2[aby]\$12\$[./A-Za-z0-9]{53}$/);
  });
});
