import request from "supertest";
import { describe, expect, it } from "vitest";
import { CreatedUserSchema, UserSchema } from "../../shared/schemas/users";
import { expectError, signedIn, useApiTestDatabase } from "./helpers";

const t = useApiTestDatabase();

const newUser = (username: string) => ({
  username,
  displayName: "Maren Holt",
  email: `${username}@coastwatch.example`,
  roles: ["author", "reviewer"],
});

describe("/api/admin/users", () => {
  it("answers 403 forbidden for a signed-in author, reviewer or firmware engineer", async () => {
    for (const name of ["author", "reviewer", "firmware"]) {
      const agent = await signedIn(t.app, name);
      expectError(await agent.get("/api/admin/users"), 403, "forbidden");
      expectError(await agent.post("/api/admin/users").send(newUser("someone")), 403, "forbidden");
    }
  });

  it("lists every user with roles for an admin", async () => {
    const admin = await t.admin();
    const res = await admin.get("/api/admin/users");
    expect(res.status).toBe(200);
    const users = UserSchema.array().parse(res.body.users);
    expect(users.map((u) => [u.username, u.roles.join(",")])).toEqual(
      expect.arrayContaining([
        ["admin", "admin"],
        ["author", "author"],
        ["reviewer", "reviewer"],
        ["firmware", "firmware"],
      ]),
    );
  });

  it("creates a user with a temporary password that works once returned, and must be changed", async () => {
    const admin = await t.admin();
    const res = await admin.post("/api/admin/users").send(newUser("mholt"));
    expect(res.status).toBe(201);
    const created = CreatedUserSchema.parse(res.body);
    expect(created.user).toMatchObject({
      username: "mholt",
      roles: ["author", "reviewer"],
      active: true,
      mustChangePassword: true,
    });
    expect(created.temporaryPassword).toMatch(/^[A-Za-z2-9]{16}$/);

    const signIn = await request(t.app)
      .post("/api/auth/sign-in")
      .send({ username: "mholt", password: created.temporaryPassword });
    expect(signIn.status).toBe(200);
    expect(signIn.body.user.mustChangePassword).toBe(true);

    // The list never shows the password again.
    const list = await admin.get("/api/admin/users");
    expect(JSON.stringify(list.body)).not.toContain(created.temporaryPassword);
  });

  it("uses a temporary password the admin chose", async () => {
    const admin = await t.admin();
    const res = await admin
      .post("/api/admin/users")
      .send({ ...newUser("chosen"), temporaryPassword: "chosen-by-admin-1" });
    expect(res.status).toBe(201);
    expect(res.body.temporaryPassword).toBe("chosen-by-admin-1");
    await signedIn(t.app, "chosen", "chosen-by-admin-1");
  });

  it("answers validation_failed with field paths for bad input and a taken user name", async () => {
    const admin = await t.admin();
    const bad = await admin
      .post("/api/admin/users")
      .send({ username: "A", displayName: "", email: "nope", roles: [] });
    const paths = (expectError(bad, 400, "validation_failed").details as { path: string[] }[]).map((d) =>
      d.path.join("."),
    );
    expect([...new Set(paths)].sort()).toEqual(["displayName", "email", "roles", "username"]);

    const taken = await admin.post("/api/admin/users").send(newUser("author"));
    expect(expectError(taken, 400, "validation_failed").details).toEqual([
      { path: ["username"], message: "this user name is taken" },
    ]);
  });

  it("updates roles and display name", async () => {
    const admin = await t.admin();
    const created = await admin.post("/api/admin/users").send(newUser("roles2"));
    const id = created.body.user.id as number;
    const res = await admin
      .patch(`/api/admin/users/${id}`)
      .send({ roles: ["firmware", "admin"], displayName: "Maren Holt-Berg" });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ roles: ["admin", "firmware"], displayName: "Maren Holt-Berg" });
  });

  it("refuses to let an admin deactivate or de-admin themself (409)", async () => {
    const admin = await t.admin();
    const me = (await admin.get("/api/auth/me")).body.user.id as number;
    expectError(await admin.patch(`/api/admin/users/${me}`).send({ active: false }), 409, "conflict");
    expectError(await admin.patch(`/api/admin/users/${me}`).send({ roles: ["author"] }), 409, "conflict");
    expect((await admin.get("/api/auth/me")).status).toBe(200);
  });

  it("answers 404 for an unknown user id and 400 for a non-numeric one or an empty change", async () => {
    const admin = await t.admin();
    expectError(await admin.patch("/api/admin/users/999999").send({ active: true }), 404, "not_found");
    const nan = expectError(
      await admin.patch("/api/admin/users/abc").send({ active: true }),
      400,
      "validation_failed",
    );
    expect((nan.details as { path: string[] }[])[0]!.path).toEqual(["id"]);
    expectError(await admin.patch("/api/admin/users/1").send({}), 400, "validation_failed");
  });
});
