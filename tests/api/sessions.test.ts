import request from "supertest";
import { describe, expect, it } from "vitest";
import { buildApp, expectError, sessionCookie, signedIn, useApiTestDatabase } from "./helpers";
import { openDatabase } from "../../server/db/client";

const t = useApiTestDatabase();

async function userId(username: string): Promise<number> {
  const admin = await t.admin();
  const res = await admin.get("/api/admin/users");
  const u = (res.body.users as { id: number; username: string }[]).find((x) => x.username === username);
  if (!u) throw new Error(`no user ${username}`);
  return u.id;
}

describe("sessions live in PostgreSQL", () => {
  it("survive a server restart: a cookie from one app works on a second app over the same database", async () => {
    const first = buildApp(t.database);
    const res = await request(first.app)
      .post("/api/auth/sign-in")
      .send({ username: "author", password: "tapwright-author" });
    expect(res.status).toBe(200);
    const cookie = sessionCookie(res).split(";")[0]!;
    first.close();

    // A new pool and a new app: nothing shared in memory with the first one.
    const pool2 = openDatabase(t.url, 2);
    const second = buildApp(pool2);
    try {
      const me = await request(second.app).get("/api/auth/me").set("Cookie", cookie);
      expect(me.status).toBe(200);
      expect(me.body.user.username).toBe("author");
    } finally {
      second.close();
      await pool2.pool.end();
    }
  });

  it("store one row per signed-in session, keyed to the user", async () => {
    const id = await userId("firmware");
    await signedIn(t.app, "firmware");
    const { rows } = await t.database.pool.query<{ n: number }>(
      "select count(*)::int as n from session where user_id = $1",
      [id],
    );
    expect(rows[0]!.n).toBeGreaterThanOrEqual(1);
  });
});

describe("deactivating a user", () => {
  it("ends their existing sessions at once and refuses their next sign-in with 403", async () => {
    const reviewer = await signedIn(t.app, "reviewer");
    expect((await reviewer.get("/api/home")).status).toBe(200);
    const id = await userId("reviewer");

    const admin = await t.admin();
    const patched = await admin.patch(`/api/admin/users/${id}`).send({ active: false });
    expect(patched.status).toBe(200);
    expect(patched.body.user.active).toBe(false);

    const { rows } = await t.database.pool.query<{ n: number }>(
      "select count(*)::int as n from session where user_id = $1",
      [id],
    );
    expect(rows[0]!.n).toBe(0);
    expectError(await reviewer.get("/api/home"), 401, "unauthenticated");

    const again = await request(t.app)
      .post("/api/auth/sign-in")
      .send({ username: "reviewer", password: "tapwright-reviewer" });
    expect(expectError(again, 403, "forbidden").message).toBe("This account is deactivated");

    // A wrong password for a deactivated user still gets the generic answer (no account probing).
    const wrong = await request(t.app)
      .post("/api/auth/sign-in")
      .send({ username: "reviewer", password: "wrong-password" });
    expectError(wrong, 401, "unauthenticated");

    // Reactivated, they can sign in again.
    expect((await admin.patch(`/api/admin/users/${id}`).send({ active: true })).status).toBe(200);
    await signedIn(t.app, "reviewer");
  });

  it("leaves other users' sessions alone", async () => {
    const author = await signedIn(t.app, "author");
    const id = await userId("firmware");
    const admin = await t.admin();
    expect((await admin.patch(`/api/admin/users/${id}`).send({ active: false })).status).toBe(200);
    expect((await author.get("/api/home")).status).toBe(200);
    expect((await admin.get("/api/home")).status).toBe(200);
    await admin.patch(`/api/admin/users/${id}`).send({ active: true });
  });
});
