// API tokens: shown once, stored as SHA-256 only (checked with node:crypto), read scope can download but not
// change anything, revoked or unknown tokens are 401, last use and each use are recorded.
import { createHash } from "node:crypto";
import request from "supertest";
import { beforeAll, describe, expect, it } from "vitest";
import { CreatedTokenSchema, TokenListSchema } from "../../shared/schemas/tokens";
import { expectError, useApiTestDatabase, type Agent } from "./helpers";
import { signedIn } from "./lifecycle-helpers";
import { download, releasedDesign } from "./bundles-helpers";

const t = useApiTestDatabase();

describe("API tokens", () => {
  let firmware: Agent;
  let releaseId: number;
  let bundleSha256: string;

  beforeAll(async () => {
    firmware = await signedIn(t.app, "firmware");
    const r = await releasedDesign(t);
    releaseId = r.release.id;
    bundleSha256 = r.release.bundleSha256!;
  });

  async function mint(agent: Agent, body: object = { name: "bench CI" }) {
    const res = await agent.post("/api/tokens").send(body);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.headers["cache-control"]).toBe("no-store");
    return CreatedTokenSchema.parse(res.body);
  }

  it("shows the secret once, stores only its SHA-256, and defaults to read scope", async () => {
    const { token, secret } = await mint(firmware);
    expect(secret).toMatch(/^tw_[A-Za-z0-9_-]{43}$/);
    expect(token.scope).toBe("read");
    expect(token.prefix).toBe(secret.slice(0, 8));
    const row = await t.database.pool.query("select * from api_tokens where id = $1", [token.id]);
    expect(row.rows[0].token_hash).toBe(createHash("sha256").update(secret).digest("hex"));
    // The secret appears in no column of the row.
    expect(JSON.stringify(row.rows[0])).not.toContain(secret.slice(8));
    const list = TokenListSchema.parse((await firmware.get("/api/tokens")).body);
    expect(list.tokens.map((x) => x.id)).toContain(token.id);
    expect(JSON.stringify(list)).not.toContain(secret.slice(8));
    // Audited without the secret.
    const audit = await t.database.pool.query(
      "select details::text as d from audit_events where action = 'token.create' and subject_id = $1",
      [String(token.id)],
    );
    expect(audit.rows).toHaveLength(1);
    expect(audit.rows[0].d).not.toContain(secret.slice(8));
  });

  it("a read token downloads the bundle (same bytes), records its last use, and audits the use and the download as a token", async () => {
    const { token, secret } = await mint(firmware);
    expect(token.lastUsedAt).toBeNull();
    const before = Date.now();
    const res = await download(
      request(t.app).get(`/api/releases/${releaseId}/bundle`).set("Authorization", `Bearer ${secret}`),
    );
    expect(res.status).toBe(200);
    expect(createHash("sha256").update(res.body).digest("hex")).toBe(bundleSha256);
    const row = await t.database.pool.query("select last_used_at from api_tokens where id = $1", [token.id]);
    expect((row.rows[0].last_used_at as Date).getTime()).toBeGreaterThanOrEqual(before - 1000);
    const audit = await t.database.pool.query(
      "select action, actor_kind from audit_events where actor_kind = 'token' and (subject_id = $1 or subject_id = $2) order by id",
      [String(token.id), String(releaseId)],
    );
    expect(audit.rows).toEqual([
      { action: "token.use", actor_kind: "token" },
      { action: "release.download", actor_kind: "token" },
    ]);
  });

  it("a read token can read release JSON and cannot change anything (403), and nothing changes", async () => {
    const { secret } = await mint(firmware);
    const bearer = (r: request.Test) => r.set("Authorization", `Bearer ${secret}`);
    expect((await bearer(request(t.app).get(`/api/releases/${releaseId}`))).status).toBe(200);
    // Even the author's read token cannot withdraw (the author role could, with a session).
    const author = await signedIn(t.app, "author");
    const authorToken = await mint(author, { name: "author read" });
    const w = await request(t.app)
      .post(`/api/releases/${releaseId}/withdraw`)
      .set("Authorization", `Bearer ${authorToken.secret}`)
      .send({ reason: "test" });
    expectError(w, 403, "forbidden");
    const still = await t.database.pool.query("select withdrawn_at from releases where id = $1", [releaseId]);
    expect(still.rows[0].withdrawn_at).toBeNull();
    for (const [method, url] of [
      ["post", "/api/tokens"],
      ["patch", "/api/account/password"],
      ["delete", `/api/releases/${releaseId}`],
      ["put", "/api/templates/1"],
    ] as const)
      expectError(await bearer(request(t.app)[method](url).send({})), 403, "forbidden");
  });

  it("tokens cannot manage tokens, even read-write ones (a person must sign in)", async () => {
    const { secret } = await mint(firmware, { name: "rw", scope: "read-write" });
    expectError(
      await request(t.app).get("/api/tokens").set("Authorization", `Bearer ${secret}`),
      403,
      "forbidden",
    );
    expectError(
      await request(t.app).post("/api/tokens").set("Authorization", `Bearer ${secret}`).send({ name: "x" }),
      403,
      "forbidden",
    );
  });

  it("a revoked token is refused with 401; revoking twice is 409; others cannot revoke it (404); admins can", async () => {
    const { token, secret } = await mint(firmware);
    const reviewer = await signedIn(t.app, "reviewer");
    expectError(await reviewer.post(`/api/tokens/${token.id}/revoke`), 404, "not_found");
    const r = await firmware.post(`/api/tokens/${token.id}/revoke`);
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    expect(r.body.token.revokedAt).not.toBeNull();
    expectError(await firmware.post(`/api/tokens/${token.id}/revoke`), 409, "conflict");
    const res = await request(t.app)
      .get(`/api/releases/${releaseId}/bundle`)
      .set("Authorization", `Bearer ${secret}`);
    expectError(res, 401, "unauthenticated");
    const other = await mint(firmware);
    const admin = await t.admin();
    expect((await admin.post(`/api/tokens/${other.token.id}/revoke`)).status).toBe(200);
    const all = TokenListSchema.parse((await admin.get("/api/tokens?all=1")).body);
    expect(all.tokens.find((x) => x.id === other.token.id)?.revokedAt).not.toBeNull();
    expectError(await firmware.get("/api/tokens?all=1"), 403, "forbidden");
  });

  it("unknown, malformed and non-bearer credentials are 401, never a silent fall-back", async () => {
    for (const header of [`Bearer tw_${"A".repeat(43)}`, "Bearer nonsense", "Basic Zm9vOmJhcg==", "Bearer"])
      expectError(
        await firmware.get(`/api/releases/${releaseId}`).set("Authorization", header),
        401,
        "unauthenticated",
      );
  });

  it("validates the token name and scope (400 naming the field)", async () => {
    const res = await firmware.post("/api/tokens").send({ name: " ", scope: "admin" });
    const err = expectError(res, 400, "validation_failed");
    const paths = (err.details as { path: string[] }[]).map((d) => d.path.join("."));
    expect(paths).toEqual(expect.arrayContaining(["name", "scope"]));
  });
});
