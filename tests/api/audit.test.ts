import request from "supertest";
import { describe, expect, it } from "vitest";
import { AuditPageSchema, type AuditEvent } from "../../shared/schemas/audit";
import { recordAudit } from "../../server/services/audit";
import { expectError, signedIn, useApiTestDatabase } from "./helpers";

const t = useApiTestDatabase();

async function events(query: string): Promise<AuditEvent[]> {
  const admin = await t.admin();
  const res = await admin.get(`/api/admin/audit?${query}`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return AuditPageSchema.parse(res.body).events;
}

async function userId(username: string): Promise<number> {
  const r = await t.database.pool.query<{ id: number }>("select id from users where username = $1", [
    username,
  ]);
  const id = r.rows[0]?.id;
  if (id === undefined) throw new Error(`no user ${username}`);
  return id;
}

/**
 * RFC 4180 §2 parser written for this test only (quoted fields, doubled quotes, CRLF records), so the
 * export is checked against the RFC's grammar rather than against the code that wrote it.
 */
function parseCsv(text: string): string[][] {
  const records: string[][] = [];
  let field = "";
  let record: string[] = [];
  let i = 0;
  let quoted = false;
  while (i < text.length) {
    const c = text[i]!;
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') {
        field += '"';
        i += 2;
        continue;
      }
      if (c === '"') quoted = false;
      else field += c;
      i += 1;
      continue;
    }
    if (c === '"') quoted = true;
    else if (c === ",") {
      record.push(field);
      field = "";
    } else if (c === "\r" && text[i + 1] === "\n") {
      record.push(field);
      records.push(record);
      record = [];
      field = "";
      i += 1;
    } else field += c;
    i += 1;
  }
  if (field !== "" || record.length > 0) throw new Error("the last record is not CRLF-terminated");
  return records;
}

describe("audit rows for sign-in and user changes", () => {
  it("records a successful sign-in with the user and address, and a refused one with the name tried", async () => {
    await signedIn(t.app, "reviewer");
    const bad = await request(t.app)
      .post("/api/auth/sign-in")
      .send({ username: "reviewer", password: "not-it-at-all" });
    expectError(bad, 401, "unauthenticated");
    const reviewerId = await userId("reviewer");

    const ok = await events("action=auth.sign-in");
    const mine = ok.filter((e) => e.actorUserId === reviewerId);
    expect(mine).toHaveLength(1);
    expect(mine[0]).toMatchObject({
      actorKind: "user",
      actorUsername: "reviewer",
      subjectType: "user",
      subjectId: String(reviewerId),
      summary: "reviewer signed in",
    });
    expect(mine[0]?.ip).toMatch(/127\.0\.0\.1|::1/);

    const failed = await events("action=auth.sign-in-failed");
    expect(failed).toHaveLength(1);
    expect(failed[0]).toMatchObject({
      actorUserId: null,
      details: { username: "reviewer", reason: "bad_credentials" },
    });
  });

  it("records user create and role change / deactivation by the acting admin, in the same transaction", async () => {
    const admin = await t.admin();
    const adminId = await userId("admin");
    const created = await admin.post("/api/admin/users").send({
      username: "gale",
      displayName: "Gale Orrin",
      email: "gale.orrin@coastwatch.example",
      roles: ["author"],
    });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const id = (created.body as { user: { id: number } }).user.id;
    const patched = await admin
      .patch(`/api/admin/users/${id}`)
      .send({ roles: ["author", "reviewer"], active: false });
    expect(patched.status).toBe(200);

    const rows = await events(`action=user.&user=${adminId}`);
    const about = rows.filter((e) => e.subjectId === String(id));
    expect(about.map((e) => e.action)).toEqual(["user.update", "user.create"]);
    expect(about[0]?.summary).toBe("Updated user gale: roles author → author, reviewer; deactivated");
    expect(about[1]).toMatchObject({ details: { username: "gale", roles: ["author"] }, actorKind: "user" });

    // A refused change (duplicate user name) rolls back and leaves no audit row.
    const dup = await admin.post("/api/admin/users").send({
      username: "gale",
      displayName: "Someone Else",
      email: "x@coastwatch.example",
      roles: ["author"],
    });
    expectError(dup, 400, "validation_failed");
    expect((await events("action=user.create")).filter((e) => e.details.username === "gale")).toHaveLength(1);
  });

  it("records project creation and membership, with the project id for the project filter", async () => {
    const admin = await t.admin();
    const res = await admin
      .post("/api/projects")
      .send({ slug: "pier-radar", name: "Pier radar", description: "" });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const pid = (res.body as { project: { id: number } }).project.id;
    const members = await admin
      .put(`/api/projects/${pid}/members`)
      .send({ userIds: [await userId("author")] });
    expect(members.status).toBe(200);
    const rows = await events(`project=${pid}`);
    expect(rows.map((e) => e.action)).toEqual(["project.members", "project.create"]);
    expect(rows.every((e) => e.projectSlug === "pier-radar")).toBe(true);
  });
});

describe("the audit trail is append-only", () => {
  it("refuses UPDATE, DELETE and TRUNCATE in raw SQL", async () => {
    const id = await recordAudit(t.database.db, {
      actor: { kind: "system", userId: null },
      action: "test.append-only",
      summary: "a row to try to change",
    });
    const pool = t.database.pool;
    await expect(pool.query("update audit_events set summary = 'x' where id = $1", [id])).rejects.toThrow(
      /append-only: UPDATE/,
    );
    await expect(pool.query("delete from audit_events where id = $1", [id])).rejects.toThrow(
      /append-only: DELETE/,
    );
    await expect(pool.query("truncate audit_events")).rejects.toThrow(/append-only: TRUNCATE/);
    const still = await pool.query("select summary from audit_events where id = $1", [id]);
    expect(still.rows).toEqual([{ summary: "a row to try to change" }]);
  });

  it("has no route that changes rows", async () => {
    const admin = await t.admin();
    for (const res of [
      await admin.post("/api/admin/audit").send({}),
      await admin.patch("/api/admin/audit/1").send({}),
      await admin.delete("/api/admin/audit/1"),
      await admin.delete("/api/admin/audit"),
    ]) {
      expectError(res, 404, "not_found");
    }
  });

  it("rejects malformed action names before they reach the table", async () => {
    await expect(
      recordAudit(t.database.db, {
        actor: { kind: "system", userId: null },
        action: "Bad Action",
        summary: "x",
      }),
    ).rejects.toThrow(/area\.verb/);
  });
});

describe("filters, keyset pages and the CSV export", () => {
  it("pages newest first by id without gaps or repeats, with filters kept", async () => {
    const ids: number[] = [];
    for (let i = 0; i < 5; i += 1) {
      ids.push(
        await recordAudit(t.database.db, {
          actor: { kind: "system", userId: null },
          action: "test.page",
          summary: `row ${i}`,
        }),
      );
    }
    const admin = await t.admin();
    const seen: number[] = [];
    let before: number | null = null;
    for (let guard = 0; guard < 10; guard += 1) {
      const res = await admin.get(
        `/api/admin/audit?action=test.page&limit=2${before ? `&before=${before}` : ""}`,
      );
      const page = AuditPageSchema.parse(res.body);
      seen.push(...page.events.map((e) => e.id));
      before = page.nextBefore;
      if (before === null) break;
    }
    expect(seen).toEqual([...ids].reverse());
  });

  it("filters by time range (ISO 8601 with offset) and refuses a malformed one", async () => {
    const admin = await t.admin();
    const future = await admin.get(`/api/admin/audit?from=${encodeURIComponent("2999-01-01T00:00:00Z")}`);
    expect(AuditPageSchema.parse(future.body).events).toEqual([]);
    const past = await admin.get(`/api/admin/audit?to=${encodeURIComponent("2000-01-01T00:00:00+02:00")}`);
    expect(AuditPageSchema.parse(past.body).events).toEqual([]);
    expectError(await admin.get("/api/admin/audit?from=yesterday"), 400, "validation_failed");
    expectError(await admin.get("/api/admin/audit?action=DROP%20TABLE"), 400, "validation_failed");
  });

  it("quotes commas, quotes and line breaks per RFC 4180 and honours the filters", async () => {
    const tricky = 'Renamed "LP chirp, 10 MHz" to\r\nLP chirp; 50 µs';
    await recordAudit(t.database.db, {
      actor: { kind: "system", userId: null },
      action: "test.csv",
      summary: tricky,
      details: { note: 'a "b", c' },
    });
    const admin = await t.admin();
    const res = await admin
      .get("/api/admin/audit.csv?action=test.csv")
      .buffer(true)
      .parse((r, cb) => {
        let data = "";
        r.setEncoding("utf8");
        r.on("data", (c: string) => (data += c));
        r.on("end", () => cb(null, data));
      });
    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toMatch(/^text\/csv; charset=utf-8/);
    expect(res.headers["content-disposition"]).toMatch(/^attachment; filename="tapwright-audit-.*\.csv"$/);
    const text = res.body as string;
    // RFC 4180 §2 rules 6 and 7: the field is enclosed in quotes and each inner quote is doubled.
    expect(text).toContain(`,"Renamed ""LP chirp, 10 MHz"" to\r\nLP chirp; 50 µs",`);
    expect(text).toContain(`"{""note"":""a \\""b\\"", c""}"`);
    const rows = parseCsv(text);
    expect(rows[0]).toEqual([
      "id",
      "at",
      "actor_kind",
      "actor_user_id",
      "actor_username",
      "action",
      "project_id",
      "project_slug",
      "subject_type",
      "subject_id",
      "summary",
      "details",
      "ip",
    ]);
    expect(rows).toHaveLength(2);
    expect(rows[1]?.[5]).toBe("test.csv");
    expect(rows[1]?.[10]).toBe(tricky);
    expect(JSON.parse(rows[1]?.[11] ?? "")).toEqual({ note: 'a "b", c' });
  });
});

describe("access", () => {
  it("gives non-admins 403 and anonymous callers 401 on audit and mailbox routes", async () => {
    const author = await signedIn(t.app, "author");
    for (const path of [
      "/api/admin/audit",
      "/api/admin/audit.csv",
      "/api/admin/audit/actions",
      "/api/admin/mailbox",
      "/api/admin/mailbox/1",
    ]) {
      expectError(await author.get(path), 403, "forbidden");
      expectError(await request(t.app).get(path), 401, "unauthenticated");
    }
  });
});
