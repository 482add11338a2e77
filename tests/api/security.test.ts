// Security hardening, table-driven: each table row is one probe a reviewer ran against a fresh instance.
// CSRF (Origin / Sec-Fetch-Site / session cookie), secrets in logs, separation of duties by authorship,
// forced password change, sessions ended by a password change, password policy, sign-in back-off, names,
// NUL, UTF-8 upload names, socket timeouts, no clock in templates, audit parameters and strict queries.
import { connect } from "node:net";
import type { AddressInfo } from "node:net";
import { Writable } from "node:stream";
import request from "supertest";
import { describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import { createLogger } from "../../server/http/logging";
import { applyServerTimeouts, SERVER_TIMEOUTS } from "../../server/http/timeouts";
import { renderTemplate } from "../../server/exports/engine";
import { BACKOFF } from "../../server/auth/backoff";
import { PASSWORD_MAX_BYTES } from "../../shared/schemas/auth";
import { CreatedDesignSchema } from "../../shared/schemas/designs";
import {
  browserAgent,
  buildApp,
  expectError,
  sessionCookie,
  signedIn,
  TEST_SECRET,
  useApiTestDatabase,
  type Agent,
} from "./helpers";
import { addUser, barker13, expectStatus, finishAnalysis } from "./lifecycle-helpers";

const t = useApiTestDatabase();

let projectId: number | undefined;
async function coastwatch(): Promise<number> {
  if (projectId === undefined) {
    const { rows } = await t.database.pool.query<{ id: number }>(
      "select id from projects where slug = 'coastwatch-s'",
    );
    projectId = rows[0]!.id;
  }
  return projectId;
}

let seq = 0;
const uniqueName = (what: string) => `${what} ${process.pid}-${++seq}`;

/** The bare "tapwright.sid=…" pair of a signed-in author, for requests that set every header by hand. */
let authorCookie: Promise<string> | undefined;
function authorSession(): Promise<string> {
  authorCookie ??= request(t.app)
    .post("/api/auth/sign-in")
    .send({ username: "author", password: "tapwright-author" })
    .then((res) => sessionCookie(res).split(";")[0]!);
  return authorCookie;
}

describe("CSRF: a state-changing request must come from the app's own origin", () => {
  type Probe = {
    name: string;
    headers: Record<string, string>;
    cookie: boolean;
    body: "json" | "text-plain" | "multipart";
    status: number;
    code?: string;
  };
  const probes: Probe[] = [
    {
      name: "cross-origin JSON POST with the session cookie is refused",
      headers: { Origin: "http://evil.example", "Sec-Fetch-Site": "cross-site" },
      cookie: true,
      body: "json",
      status: 403,
      code: "cross_site",
    },
    {
      name: "a curl-style POST naming another Origin (no Sec-Fetch-Site) is refused",
      headers: { Origin: "http://evil.example" },
      cookie: true,
      body: "json",
      status: 403,
      code: "cross_site",
    },
    {
      name: "a page on another port of the same host (same-site) is refused",
      headers: { Origin: "http://127.0.0.1:9", "Sec-Fetch-Site": "same-site" },
      cookie: true,
      body: "json",
      status: 403,
      code: "cross_site",
    },
    {
      name: "a no-cors text/plain form from another origin is refused",
      headers: { Origin: "http://127.0.0.1:9", "Sec-Fetch-Site": "same-site" },
      cookie: true,
      body: "text-plain",
      status: 403,
      code: "cross_site",
    },
    {
      name: "a cross-site multipart upload is refused",
      headers: { Origin: "http://evil.example", "Sec-Fetch-Site": "cross-site" },
      cookie: true,
      body: "multipart",
      status: 403,
      code: "cross_site",
    },
    {
      name: "the session cookie with neither Origin nor Sec-Fetch-Site is refused",
      headers: {},
      cookie: true,
      body: "json",
      status: 403,
      code: "cross_site",
    },
    {
      name: "same-origin by Sec-Fetch-Site is allowed",
      headers: { "Sec-Fetch-Site": "same-origin" },
      cookie: true,
      body: "json",
      status: 201,
    },
    {
      name: "same-origin by Origin = the Host it was sent to is allowed",
      headers: { Host: "tapwright.test", Origin: "http://tapwright.test" },
      cookie: true,
      body: "json",
      status: 201,
    },
    {
      name: "same-origin multipart upload is allowed",
      headers: { Origin: "http://tapwright.test", Host: "tapwright.test", "Sec-Fetch-Site": "same-origin" },
      cookie: true,
      body: "multipart",
      status: 201,
    },
  ];

  it.each(probes)("$name", async (p) => {
    const pid = await coastwatch();
    const cookie = await authorSession();
    const path = p.body === "multipart" ? `/api/projects/${pid}/uploads` : `/api/projects/${pid}/designs`;
    let req = request(t.app).post(path);
    for (const [k, v] of Object.entries(p.headers)) req = req.set(k, v);
    if (p.cookie) req = req.set("Cookie", cookie);
    const design = { name: uniqueName("csrf probe"), content: barker13 };
    const res =
      p.body === "json"
        ? await req.send(design)
        : p.body === "text-plain"
          ? await req.set("Content-Type", "text/plain").send(JSON.stringify(design))
          : await req.attach("file", Buffer.from("0.5\n0.25\n"), "probe.txt");
    if (p.code) expectError(res, p.status, p.code as "cross_site");
    else expectStatus(res, p.status, p.name);
  });

  it("a bearer token works from a script with no Origin, and even with a foreign one (no page can set it)", async () => {
    const author = await signedIn(t.app, "author");
    const made = await author.post("/api/tokens").send({ name: "csrf probe", scope: "read-write" });
    expectStatus(made, 201);
    const secret = made.body.secret as string;
    const pid = await coastwatch();
    for (const origin of [undefined, "http://evil.example"]) {
      let req = request(t.app).post(`/api/projects/${pid}/designs`).set("Authorization", `Bearer ${secret}`);
      if (origin) req = req.set("Origin", origin);
      expectStatus(
        await req.send({ name: uniqueName("bearer"), content: barker13 }),
        201,
        `origin ${origin}`,
      );
    }
  });

  it("a script signing in (no cookie, no Origin) is allowed; GET is never checked", async () => {
    const res = await request(t.app)
      .post("/api/auth/sign-in")
      .send({ username: "firmware", password: "tapwright-firmware" });
    expect(res.status).toBe(200);
    const cookie = sessionCookie(res);
    expect(cookie).toMatch(/SameSite=Strict/i);
    const me = await request(t.app)
      .get("/api/auth/me")
      .set("Cookie", cookie.split(";")[0]!)
      .set("Origin", "http://evil.example");
    expect(me.status).toBe(200);
  });
});

describe("logs: lean lines, no credentials", () => {
  function capturingApp() {
    const lines: string[] = [];
    const sink = new Writable({
      write(chunk: Buffer, _enc, done) {
        lines.push(...chunk.toString("utf8").split("\n").filter(Boolean));
        done();
      },
    });
    const built = createApp({
      database: t.database,
      sessionSecret: TEST_SECRET,
      version: "test",
      pruneSessionsMinutes: false,
      logger: createLogger("info", sink),
    });
    return { built, lines };
  }

  const secret = `tw_${"A1b2C3d4E5".repeat(4)}xyz`;
  const probes = [
    {
      name: "a bad bearer token (401)",
      send: (app: ReturnType<typeof capturingApp>["built"]["app"]) =>
        request(app).get("/api/projects").set("Authorization", `Bearer ${secret}`),
      status: 401,
    },
    {
      name: "a token in the query string of an unknown route (404)",
      send: (app: ReturnType<typeof capturingApp>["built"]["app"]) =>
        request(app).get(`/api/no-such-route?token=${secret}`).set("Cookie", "tapwright.sid=s%3Aabc.def"),
      status: 404,
    },
  ];

  it.each(probes)("$name: redacted, at info, no header dump", async (p) => {
    const { built, lines } = capturingApp();
    try {
      const res = await p.send(built.app);
      expect(res.status).toBe(p.status);
      const line = lines.find((l) => l.includes('"statusCode"'));
      expect(line, lines.join("\n")).toBeDefined();
      expect(line).not.toContain(secret);
      expect(line).not.toMatch(/tw_[A-Za-z0-9_-]{10,}/);
      expect(line).not.toMatch(/authorization|cookie|content-security-policy/i);
      const parsed = JSON.parse(line!) as { level: number; res: { statusCode: number } };
      expect(parsed.level).toBe(30); // pino's info
      expect(parsed.res.statusCode).toBe(p.status);
      expect(line!.length).toBeLessThan(400);
    } finally {
      built.close();
    }
  });

  it("a token secret inside any logged message is replaced too", () => {
    const lines: string[] = [];
    const logger = createLogger(
      "info",
      new Writable({
        write(chunk: Buffer, _e, done) {
          lines.push(chunk.toString("utf8"));
          done();
        },
      }),
    );
    logger.warn({ headers: { authorization: `Bearer ${secret}` }, note: `saw ${secret}` }, `token ${secret}`);
    expect(lines.join("")).not.toContain(secret);
    expect(lines.join("")).toContain("[redacted]");
  });
});

describe("separation of duties by authorship", () => {
  let dualSeq = 0;
  async function dual(): Promise<{ agent: Agent; id: number }> {
    const name = `dual${process.pid}x${++dualSeq}`;
    const { id } = await addUser(t.database, name, ["author", "reviewer"], ["coastwatch-s"]);
    return { agent: await signedIn(t.app, name), id };
  }

  type Case = { name: string; setup: "created" | "edited" | "uploaded" | "started-from"; status: number };
  const cases: Case[] = [
    { name: "the author who created the draft", setup: "created", status: 403 },
    { name: "an author who edited the draft someone else created", setup: "edited", status: 403 },
    { name: "the uploader of the file the content uses", setup: "uploaded", status: 403 },
    { name: "the author of the revision this one was started from", setup: "started-from", status: 403 },
  ];

  it.each(cases)("$name cannot approve, although someone else submitted it", async (c) => {
    const { agent: writer } = await dual();
    const author = await signedIn(t.app, "author");
    const pid = await coastwatch();
    let revisionId: number;
    if (c.setup === "uploaded") {
      const up = await writer
        .post(`/api/projects/${pid}/uploads`)
        .attach("file", Buffer.from("1\n-1\n1\n1\n"), "code.txt");
      expectStatus(up, 201, "upload");
      const content = {
        ...barker13,
        tx: { kind: "upload", uploadId: up.body.upload.id, sampleRateHz: 1e6 },
      };
      const made = await author
        .post(`/api/projects/${pid}/designs`)
        .send({ name: uniqueName("sod"), content });
      expectStatus(made, 201, "create with upload");
      revisionId = CreatedDesignSchema.parse(made.body).revision.id;
    } else {
      const creator = c.setup === "created" || c.setup === "started-from" ? writer : author;
      const made = await creator
        .post(`/api/projects/${pid}/designs`)
        .send({ name: uniqueName("sod"), content: barker13 });
      expectStatus(made, 201, "create");
      const created = CreatedDesignSchema.parse(made.body);
      revisionId = created.revision.id;
      if (c.setup === "edited")
        expectStatus(
          await writer
            .patch(`/api/revisions/${revisionId}`)
            .send({ content: { ...barker13, interpolation: 2 } }),
          200,
          "edit",
        );
      if (c.setup === "started-from") {
        // r1 released by the regular cast, then the demo author starts r2 from it.
        const reviewer = await signedIn(t.app, "reviewer");
        await finishAnalysis(t.database, revisionId);
        expectStatus(await author.post(`/api/revisions/${revisionId}/submit`), 200, "submit r1");
        expectStatus(
          await reviewer.post(`/api/revisions/${revisionId}/decision`).send({ decision: "approved" }),
          201,
          "approve r1",
        );
        expectStatus(
          await author.post(`/api/revisions/${revisionId}/release`).send({ version: "1.0.0", notes: "r1" }),
          201,
          "release r1",
        );
        const r2 = await author.post(`/api/designs/${created.design.id}/revisions`).send({});
        expectStatus(r2, 201, "start r2");
        revisionId = (r2.body.revision as { id: number }).id;
      }
    }
    await finishAnalysis(t.database, revisionId);
    expectStatus(await author.post(`/api/revisions/${revisionId}/submit`), 200, "submit by another author");
    const res = await writer.post(`/api/revisions/${revisionId}/decision`).send({ decision: "approved" });
    const err = expectError(res, c.status, "forbidden");
    expect(err.details).toMatchObject({ reason: "content_author" });
    const queue = await writer.get("/api/reviews/queue");
    const item = (queue.body.items as { revisionId: number; canDecide: boolean }[]).find(
      (i) => i.revisionId === revisionId,
    );
    expect(item?.canDecide).toBe(false);
    // A reviewer who wrote nothing of it may approve.
    const reviewer = await signedIn(t.app, "reviewer");
    expectStatus(
      await reviewer.post(`/api/revisions/${revisionId}/decision`).send({ decision: "approved" }),
      201,
      "independent reviewer",
    );
  });
});

describe("accounts: forced change, sessions, policy, back-off, roles", () => {
  async function newUserWithTemporary(username: string) {
    const admin = await t.admin();
    const res = await admin.post("/api/admin/users").send({
      username,
      displayName: `Test ${username}`,
      email: `${username}@coastwatch.example`,
      roles: ["author"],
      temporaryPassword: "temporary-Pass-123",
    });
    expectStatus(res, 201, "create user");
    return res.body.user.id as number;
  }

  const blocked: [string, string][] = [
    ["get", "/api/home"],
    ["get", "/api/projects"],
    ["post", "/api/tokens"],
    ["get", "/api/releases"],
  ];

  it("a temporary password allows only its change, sign-out and who-am-I; then everything", async () => {
    await newUserWithTemporary("forced-change");
    const agent = await signedIn(t.app, "forced-change", "temporary-Pass-123");
    for (const [method, path] of blocked) {
      const res = method === "get" ? await agent.get(path) : await agent.post(path).send({ name: "x" });
      expectError(res, 403, "password_change_required");
    }
    expect((await agent.get("/api/auth/me")).body.user.mustChangePassword).toBe(true);
    expectStatus(
      await agent
        .post("/api/account/password")
        .send({ currentPassword: "temporary-Pass-123", newPassword: "my-own-password-42" }),
      204,
    );
    expectStatus(await agent.get("/api/home"), 200);
  });

  it("a password change ends the other sessions (and, when asked, the API tokens), keeping this one", async () => {
    await addUser(t.database, "sessions-end", ["author"], ["coastwatch-s"]);
    const here = await signedIn(t.app, "sessions-end");
    const elsewhere = await signedIn(t.app, "sessions-end");
    const token = await here.post("/api/tokens").send({ name: "ci", scope: "read" });
    expectStatus(token, 201);
    expectStatus(
      await here.post("/api/account/password").send({
        currentPassword: "tapwright-sessions-end",
        newPassword: "a-brand-new-secret-7",
        revokeTokens: true,
      }),
      204,
    );
    expectError(await elsewhere.get("/api/auth/me"), 401, "unauthenticated");
    expectStatus(await here.get("/api/auth/me"), 200);
    expectError(
      await request(t.app)
        .get("/api/projects")
        .set("Authorization", `Bearer ${token.body.secret as string}`),
      401,
      "unauthenticated",
    );
  });

  const policy: { name: string; password: (username: string) => string; message: RegExp }[] = [
    { name: "11 characters", password: () => "abcdefghijk", message: /at least 12 characters/ },
    { name: "one character repeated", password: () => "aaaaaaaaaaaaaa", message: /5 different characters/ },
    { name: "the user name", password: (u) => u.toUpperCase(), message: /not be your user name/ },
    {
      name: "73 bytes (bcrypt would ignore the end)",
      password: () => `${"a1b2c3".repeat(12)}X`,
      message: new RegExp(`at most ${PASSWORD_MAX_BYTES} bytes`),
    },
    {
      name: "72 ASCII letters + 8 more",
      password: () => `${"abcdef".repeat(12)}XXXXXXXX`,
      message: /at most 72 bytes/,
    },
    {
      name: "40 two-byte letters (80 bytes)",
      password: () => "äöüßéèêëïî".repeat(4),
      message: /at most 72 bytes/,
    },
  ];

  it.each(policy)("the policy refuses a password that is $name", async (p) => {
    const username = `policy-user-${process.pid}-${policy.indexOf(p)}`;
    await addUser(t.database, username, ["author"], []);
    const agent = await signedIn(t.app, username);
    const res = await agent
      .post("/api/account/password")
      .send({ currentPassword: `tapwright-${username}`, newPassword: p.password(username) });
    const err = expectError(res, 400, "validation_failed");
    const issue = (err.details as { path: string[]; message: string }[])[0]!;
    expect(issue.path).toEqual(["newPassword"]);
    expect(issue.message).toMatch(p.message);
  });

  it("an admin's chosen temporary password follows the policy too", async () => {
    const admin = await t.admin();
    const res = await admin.post("/api/admin/users").send({
      username: "shortpass",
      displayName: "Short",
      email: "short@coastwatch.example",
      roles: ["author"],
      temporaryPassword: "short-pw",
    });
    expectError(res, 400, "validation_failed");
  });

  it(`locks a user name for a while after ${BACKOFF.freeFailures} failures, from any address`, async () => {
    await addUser(t.database, "backoff-target", ["author"], []);
    for (let i = 0; i < BACKOFF.freeFailures; i += 1)
      expectError(
        await request(t.app)
          .post("/api/auth/sign-in")
          .send({ username: "backoff-target", password: `wrong-${i}` }),
        401,
        "unauthenticated",
      );
    // The right password is refused while the lock lasts, with a Retry-After.
    const locked = await request(t.app)
      .post("/api/auth/sign-in")
      .send({ username: "Backoff-Target", password: "tapwright-backoff-target" });
    expectError(locked, 429, "rate_limited");
    expect(Number(locked.headers["retry-after"])).toBeGreaterThan(0);
    // Other accounts are untouched.
    await addUser(t.database, "backoff-other", ["author"], []);
    await signedIn(t.app, "backoff-other");
  });

  it("limits one address over many user names (password spraying)", async () => {
    const limited = buildApp(t.database, 1); // 1 per name per minute → 3 per address
    try {
      const names = ["spray-a", "spray-b", "spray-c", "spray-d"];
      for (const n of names) await addUser(t.database, n, ["author"], []);
      const statuses: number[] = [];
      for (const n of names)
        statuses.push(
          (
            await request(limited.app)
              .post("/api/auth/sign-in")
              .send({ username: n, password: "Winter2026!!" })
          ).status,
        );
      expect(statuses).toEqual([401, 401, 401, 429]);
    } finally {
      limited.close();
    }
  });

  it("an admin cannot grant themself a role", async () => {
    const admin = await t.admin();
    const me = (await admin.get("/api/auth/me")).body.user as { id: number; roles: string[] };
    for (const roles of [
      ["admin", "reviewer"],
      ["admin", "author", "reviewer"],
    ]) {
      const err = expectError(
        await admin.patch(`/api/admin/users/${me.id}`).send({ roles }),
        403,
        "forbidden",
      );
      expect(err.details).toMatchObject({ reason: "self_grant" });
    }
    expect((await admin.get("/api/auth/me")).body.user.roles).toEqual(me.roles);
  });
});

describe("analysis reports are scoped to their project", () => {
  it("the same content in another project has no report until that project asks, and then only its own", async () => {
    const author = await signedIn(t.app, "author");
    const { rows } = await t.database.pool.query<{ id: number; slug: string }>(
      "select id, slug from projects where slug in ('coastwatch-s', 'harbour-lidar-trials')",
    );
    const pid = (slug: string) => rows.find((r) => r.slug === slug)!.id;
    // A limit no other test uses, so this content is nowhere else.
    const content = { ...barker13, limits: { pslDbMax: -21.123 } };
    const first = await author
      .post(`/api/projects/${pid("coastwatch-s")}/designs`)
      .send({ name: uniqueName("scoped"), content });
    expectStatus(first, 201);
    const r1 = CreatedDesignSchema.parse(first.body).revision.id;
    await finishAnalysis(t.database, r1);
    const done = (await author.get(`/api/revisions/${r1}/analysis`)).body.analysis as {
      state: string;
      queuedAt: string;
    };
    expect(done.state).toBe("done");

    const second = await author
      .post(`/api/projects/${pid("harbour-lidar-trials")}/designs`)
      .send({ name: uniqueName("scoped"), content });
    expectStatus(second, 201);
    const r2 = CreatedDesignSchema.parse(second.body).revision.id;
    expect((await author.get(`/api/revisions/${r2}/analysis`)).body.analysis).toBeNull();
    expectError(await author.get(`/api/revisions/${r2}/report.json`), 404, "not_found");
    const asked = await author.post(`/api/revisions/${r2}/analysis`);
    expectStatus(asked, 202);
    const own = asked.body.analysis as { state: string; queuedAt: string };
    expect(own.state).toBe("queued");
    expect(own.queuedAt).not.toBe(done.queuedAt);
  });
});

describe("names: normalised, no invisible characters, unique in any case", () => {
  const base = `Dual design ${process.pid}`;
  const designCases: { name: string; input: string; status: number; stored?: string }[] = [
    { name: "the first is created", input: base, status: 201, stored: base },
    { name: "another case is the same name", input: base.toLowerCase(), status: 409 },
    { name: "a no-break space is a space", input: base.replace(" ", "\u00a0"), status: 409 },
    { name: "runs of spaces and padding collapse", input: `  ${base.replace(" ", "   ")} `, status: 409 },
    { name: "a zero-width-only name is refused", input: "\u200b\u200b", status: 400 },
    { name: "a right-to-left override is refused", input: `Barker \u202e31`, status: 400 },
    { name: "a newline is refused", input: "two\nlines", status: 400 },
    { name: "a tab is refused", input: "tab\there", status: 400 },
    {
      name: "NFC: e + combining acute is stored as é",
      input: `Cafe\u0301 ${process.pid}`,
      status: 201,
      stored: `Café ${process.pid}`,
    },
  ];

  it.each(designCases)("design: $name", async (c) => {
    const author = await signedIn(t.app, "author");
    const res = await author
      .post(`/api/projects/${await coastwatch()}/designs`)
      .send({ name: c.input, content: barker13 });
    expect(res.status, JSON.stringify(res.body)).toBe(c.status);
    if (c.stored) expect(res.body.design.name).toBe(c.stored);
  });

  it("project names are unique in any case and spacing", async () => {
    const admin = await t.admin();
    const first = await admin.post("/api/projects").send({ slug: "harbour-radar", name: "Harbour Radar" });
    expectStatus(first, 201);
    const err = expectError(
      await admin.post("/api/projects").send({ slug: "harbour-radar-2", name: "harbour\u00a0 RADAR" }),
      400,
      "validation_failed",
    );
    expect(err.details).toEqual([{ path: ["name"], message: expect.stringMatching(/any case/) }]);
  });
});

describe("NUL characters answer 400, never 500", () => {
  const probes: {
    name: string;
    send: (a: Agent, pid: number) => Promise<request.Response>;
    code?: "bad_request";
  }[] = [
    {
      name: "in a design name",
      send: (a, pid) =>
        a.post(`/api/projects/${pid}/designs`).send({ name: "nul\u0000name", content: barker13 }),
    },
    {
      name: "in a JSON key",
      send: (a, pid) =>
        a.post(`/api/projects/${pid}/designs`).send({ ["name\u0000"]: "x", name: "ok", content: barker13 }),
    },
    { name: "in a URL path", send: (a) => a.get("/api/projects/coast%00watch/designs/x/releases/latest") },
    { name: "in a query parameter", send: (a) => a.get("/api/releases?project=coast%00") },
    {
      name: "in an upload file name",
      send: (a, pid) =>
        a.post(`/api/projects/${pid}/uploads`).attach("file", Buffer.from("0.5\n"), "a\u0000b.txt"),
      // A raw NUL in a part header: busboy refuses the body itself.
      code: "bad_request",
    },
  ];
  it.each(probes)("$name", async (p) => {
    const author = await signedIn(t.app, "author");
    expectError(await p.send(author, await coastwatch()), 400, p.code ?? "validation_failed");
  });
});

describe("uploads keep UTF-8 file names", () => {
  it.each(["Kälte-Filter µs.txt", "雷达-Barker.txt", "Ελληνικά.csv"])("%s", async (fileName) => {
    const author = await signedIn(t.app, "author");
    const res = await author
      .post(`/api/projects/${await coastwatch()}/uploads`)
      .attach("file", Buffer.from("0.5\n-0.25\n"), fileName);
    expectStatus(res, 201);
    expect(res.body.upload.fileName).toBe(fileName);
  });
});

describe("socket time limits", () => {
  it("the defaults are far below Node's 300 s", () => {
    expect(SERVER_TIMEOUTS.requestMs).toBeLessThanOrEqual(60_000);
    expect(SERVER_TIMEOUTS.headersMs).toBeLessThanOrEqual(SERVER_TIMEOUTS.requestMs);
  });

  it.each([
    {
      name: "a declared 1 GB body with a few bytes sent",
      raw: 'POST /api/auth/sign-in HTTP/1.1\r\nHost: x\r\nContent-Type: application/json\r\nContent-Length: 1000000000\r\n\r\n{"u',
    },
    { name: "headers that never end", raw: "GET /api/health HTTP/1.1\r\nHost: x\r\nX-Slow: " },
  ])("$name: 408 and the socket closes", async ({ raw }) => {
    const built = buildApp(t.database);
    const server = applyServerTimeouts(built.app.listen(0, "127.0.0.1"), {
      headersMs: 300,
      requestMs: 600,
      checkEveryMs: 100,
    });
    try {
      await new Promise<void>((r) => server.once("listening", () => r()));
      const { port } = server.address() as AddressInfo;
      const answer = await new Promise<string>((resolve, reject) => {
        let got = "";
        const socket = connect(port, "127.0.0.1", () => socket.write(raw));
        socket.on("data", (d) => (got += d.toString("latin1")));
        socket.on("close", () => resolve(got));
        socket.on("error", reject);
      });
      expect(answer).toMatch(/^HTTP\/1\.1 408/);
    } finally {
      server.closeAllConnections();
      await new Promise((r) => server.close(r));
      built.close();
    }
  });
});

describe("export templates do not read the clock", () => {
  it.each([
    '{{ "now" | date: "%Y" }}',
    "{{ 'today' | date: '%Y-%m-%d' }}",
    '{{ "now" | date_to_xmlschema }}',
    '{{ "Now" | date_to_string }}',
  ])("%s is refused", async (body) => {
    await expect(renderTemplate(body, {})).rejects.toThrow(/cannot read the clock/);
  });

  it("a given instant formats in UTC whatever the server's zone", async () => {
    expect(await renderTemplate('{{ "2024-01-02T23:30:00Z" | date: "%Y-%m-%d %H:%M" }}', {})).toBe(
      "2024-01-02 23:30",
    );
  });

  it("the admin's template preview refuses it with its line", async () => {
    const admin = await t.admin();
    const res = await admin
      .post("/api/templates/preview")
      .send({ body: '// generated {{ "now" | date: "%Y" }}\n' });
    expectStatus(res, 200);
    expect(res.body).toMatchObject({ ok: false, error: { line: 1 } });
    expect(res.body.error.message).toMatch(/cannot read the clock/);
  });
});

describe("query parameters: the documented names, unknown ones refused", () => {
  it("the audit trail filters by `project` and `user`", async () => {
    const admin = await t.admin();
    const pid = await coastwatch();
    const res = await admin.get(`/api/admin/audit?project=${pid}&limit=200`);
    expectStatus(res, 200);
    const events = res.body.events as { projectId: number | null }[];
    expect(events.length).toBeGreaterThan(0);
    expect(events.every((e) => e.projectId === pid)).toBe(true);
  });

  const unknown = [
    "/api/admin/audit?projectId=1",
    "/api/admin/audit?userId=1",
    "/api/admin/audit?colour=blue",
    "/api/admin/audit.csv?bogus=1",
    "/api/releases?bogus=1",
    "/api/tokens?bogus=1",
    "/api/admin/mailbox?bogus=1",
    "/api/releases/1/diff?against=2&bogus=1",
  ];
  it.each(unknown)("%s answers 400", async (path) => {
    const admin = await t.admin();
    const err = expectError(await admin.get(path), 400, "validation_failed");
    expect(JSON.stringify(err.details)).toMatch(/bogus|projectId|userId|colour/);
  });
});

describe("browser agent helper", () => {
  it("sends Sec-Fetch-Site: same-origin on every request", async () => {
    const agent = browserAgent(t.app);
    const res = await agent
      .post("/api/auth/sign-in")
      .send({ username: "firmware", password: "tapwright-firmware" });
    expect(res.status).toBe(200);
    expectStatus(await agent.post("/api/auth/sign-out"), 204);
  });
});
