import request from "supertest";
import { describe, expect, it } from "vitest";
import { SessionUserSchema } from "../../shared/schemas/auth";
import { buildApp, expectError, sessionCookie, signedIn, useApiTestDatabase } from "./helpers";

const t = useApiTestDatabase();

const BAD = "User name or password is incorrect";

describe("POST /api/auth/sign-in", () => {
  it("signs a demo user in and sets an HttpOnly, SameSite=Strict session cookie", async () => {
    const res = await request(t.app)
      .post("/api/auth/sign-in")
      .send({ username: "author", password: "tapwright-author" });
    expect(res.status).toBe(200);
    const user = SessionUserSchema.parse(res.body.user);
    expect(user).toMatchObject({
      username: "author",
      displayName: "Ilse Marrow",
      roles: ["author"],
      mustChangePassword: false,
    });
    expect(res.body.user).not.toHaveProperty("passwordHash");
    const cookie = sessionCookie(res);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Strict/i);
  });

  it("accepts the user name in another case and with spaces", async () => {
    const res = await request(t.app)
      .post("/api/auth/sign-in")
      .send({ username: "  Reviewer ", password: "tapwright-reviewer" });
    expect(res.status).toBe(200);
    expect(res.body.user.username).toBe("reviewer");
  });

  it("refuses a wrong password and an unknown user with the same answer", async () => {
    const wrong = await request(t.app)
      .post("/api/auth/sign-in")
      .send({ username: "author", password: "not-the-password" });
    const unknown = await request(t.app)
      .post("/api/auth/sign-in")
      .send({ username: "nobody-here", password: "not-the-password" });
    expect(expectError(wrong, 401, "unauthenticated").message).toBe(BAD);
    expect(expectError(unknown, 401, "unauthenticated").message).toBe(BAD);
    expect(unknown.body).toEqual(wrong.body);
    expect(wrong.headers["set-cookie"]).toBeUndefined();
  });

  it("spends about the same time on an unknown user as on a wrong password (a dummy bcrypt compare)", async () => {
    const time = async (username: string) => {
      const t0 = performance.now();
      await request(t.app).post("/api/auth/sign-in").send({ username, password: "not-the-password" });
      return performance.now() - t0;
    };
    await time("nobody-here"); // the first call also builds the dummy hash
    const wrong: number[] = [];
    const unknown: number[] = [];
    for (let i = 0; i < 3; i += 1) {
      wrong.push(await time("author"));
      unknown.push(await time("nobody-here"));
    }
    const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[1]!;
    // Both pay one cost-12 bcrypt compare (hundreds of ms); without the dummy, unknown would take ~1 ms.
    expect(median(unknown)).toBeGreaterThan(0.5 * median(wrong));
    expect(median(unknown)).toBeLessThan(2 * median(wrong));
  });

  it("answers validation_failed with the field paths for an empty form", async () => {
    const err = expectError(
      await request(t.app).post("/api/auth/sign-in").send({ username: "", password: "" }),
      400,
      "validation_failed",
    );
    const paths = (err.details as { path: unknown[] }[]).map((d) => d.path.join("."));
    expect(paths.sort()).toEqual(["password", "username"]);
  });

  it("rate-limits repeated attempts for one user name from one address (429)", async () => {
    const db = t.database;
    const limited = buildApp(db, 3);
    try {
      for (let i = 0; i < 3; i += 1) {
        const r = await request(limited.app)
          .post("/api/auth/sign-in")
          .send({ username: "firmware", password: "wrong-password" });
        expect(r.status).toBe(401);
      }
      const blocked = await request(limited.app)
        .post("/api/auth/sign-in")
        .send({ username: "firmware", password: "tapwright-firmware" });
      expectError(blocked, 429, "rate_limited");
      // Another user name from the same address is still allowed.
      const other = await request(limited.app)
        .post("/api/auth/sign-in")
        .send({ username: "reviewer", password: "tapwright-reviewer" });
      expect(other.status).toBe(200);
    } finally {
      limited.close();
    }
  });
});

describe("session routes", () => {
  it("GET /api/auth/me answers 401 without a session and the user with one", async () => {
    expectError(await request(t.app).get("/api/auth/me"), 401, "unauthenticated");
    const agent = await signedIn(t.app, "firmware");
    const me = await agent.get("/api/auth/me");
    expect(me.status).toBe(200);
    expect(me.body.user).toMatchObject({
      username: "firmware",
      displayName: "Priya Lund",
      roles: ["firmware"],
    });
  });

  it("answers 401 on every protected route without a session", async () => {
    const routes: [string, string][] = [
      ["get", "/api/home"],
      ["get", "/api/projects"],
      ["get", "/api/projects/1"],
      ["get", "/api/admin/users"],
      ["post", "/api/account/password"],
    ];
    for (const [method, path] of routes) {
      const res = await (method === "get" ? request(t.app).get(path) : request(t.app).post(path).send({}));
      expectError(res, 401, "unauthenticated");
    }
  });

  it("sign-out answers 204 and the cookie no longer works", async () => {
    const agent = await signedIn(t.app, "reviewer");
    const out = await agent.post("/api/auth/sign-out");
    expect(out.status).toBe(204);
    expectError(await agent.get("/api/auth/me"), 401, "unauthenticated");
  });

  it("records the time of the last sign-in", async () => {
    const before = Date.now();
    await signedIn(t.app, "reviewer");
    const admin = await t.admin();
    const list = await admin.get("/api/admin/users");
    const reviewer = (list.body.users as { username: string; lastSignInAt: string | null }[]).find(
      (u) => u.username === "reviewer",
    );
    expect(Date.parse(reviewer?.lastSignInAt ?? "")).toBeGreaterThanOrEqual(before - 1000);
  });
});
