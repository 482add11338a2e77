import request from "supertest";
import { describe, expect, it } from "vitest";
import { sql } from "drizzle-orm";
import { PreviewResultSchema, TemplateDetailSchema, TemplateListSchema } from "../../shared/exports/schemas";
import { expectError, signedIn, useApiTestDatabase } from "./helpers";

const t = useApiTestDatabase();

const GOOD = "{% for tap in taps %}{{ tap.i | hex }}\n{% endfor %}";

describe("GET /api/templates", () => {
  it("lists the six built-ins (name, extension, version) for an author", async () => {
    const author = await signedIn(t.app, "author");
    const res = await author.get("/api/templates");
    expect(res.status).toBe(200);
    const { templates } = TemplateListSchema.parse(res.body);
    const builtins = templates.filter((x) => x.builtin);
    expect(builtins.map((x) => [x.id, x.extension, x.version])).toEqual(
      expect.arrayContaining([
        ["readmemh", "hex", 2],
        ["csv", "csv", 1],
        ["c-header", "h", 1],
        ["vhdl-package", "vhd", 1],
        ["json", "json", 1],
        ["binary", "bin", 1],
      ]),
    );
  });

  it("refuses a firmware engineer (403) and anyone signed out (401)", async () => {
    const firmware = await signedIn(t.app, "firmware");
    expectError(await firmware.get("/api/templates"), 403, "forbidden");
    expectError(await request(t.app).get("/api/templates"), 401, "unauthenticated");
  });

  it("returns a built-in's body and 404 for an unknown id", async () => {
    const admin = await t.admin();
    const res = await admin.get("/api/templates/readmemh");
    expect(res.status).toBe(200);
    const { template } = TemplateDetailSchema.parse(res.body);
    expect(template.body).toContain("tap.i_hex");
    expectError(await admin.get("/api/templates/no-such"), 404, "not_found");
    expectError(await admin.get("/api/templates/9999"), 404, "not_found");
  });
});

describe("POST and PATCH /api/templates", () => {
  it("creates a custom template at v1 and bumps the version on each change", async () => {
    const admin = await t.admin();
    const created = await admin
      .post("/api/templates")
      .send({ name: "Hex words, plain", description: "no header", extension: "mem", body: GOOD });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const c = TemplateDetailSchema.parse(created.body).template;
    expect(c).toMatchObject({ builtin: false, version: 1, extension: "mem", body: GOOD });

    const v2 = await admin.patch(`/api/templates/${c.id}`).send({ body: `// words\n${GOOD}`, version: 1 });
    expect(v2.status, JSON.stringify(v2.body)).toBe(200);
    expect(TemplateDetailSchema.parse(v2.body).template.version).toBe(2);
    const v3 = await admin.patch(`/api/templates/${c.id}`).send({ description: "one word per line" });
    expect(TemplateDetailSchema.parse(v3.body).template.version).toBe(3);
    // A save that changes nothing keeps the version.
    const same = await admin.patch(`/api/templates/${c.id}`).send({ description: "one word per line" });
    expect(TemplateDetailSchema.parse(same.body).template.version).toBe(3);

    const versions = await t.database.db.execute(
      sql`select version, body from export_template_versions where template_id = ${Number(c.id)} order by version`,
    );
    expect(versions.rows.map((r) => r.version)).toEqual([1, 2, 3]);
    const audit = await t.database.db.execute(
      sql`select action from audit_events where subject_type = 'export-template' and subject_id = ${c.id} order by id`,
    );
    expect(audit.rows.map((r) => r.action)).toEqual([
      "template.create",
      "template.update",
      "template.update",
    ]);

    const list = TemplateListSchema.parse((await admin.get("/api/templates")).body).templates;
    expect(list.find((x) => x.id === c.id)).toMatchObject({ name: "Hex words, plain", version: 3 });
  });

  it("answers 409 for a stale version, a taken name or a built-in's name", async () => {
    const admin = await t.admin();
    const a = TemplateDetailSchema.parse(
      (await admin.post("/api/templates").send({ name: "Stale check", extension: "txt", body: GOOD })).body,
    ).template;
    await admin.patch(`/api/templates/${a.id}`).send({ body: `x\n${GOOD}` });
    const err = expectError(
      await admin.patch(`/api/templates/${a.id}`).send({ body: GOOD, version: 1 }),
      409,
      "conflict",
    );
    expect(err.message).toContain("v2");
    expectError(
      await admin.post("/api/templates").send({ name: "Stale check", extension: "txt", body: GOOD }),
      409,
      "conflict",
    );
    expectError(
      await admin.post("/api/templates").send({ name: "STALE CHECK", extension: "txt", body: GOOD }),
      409,
      "conflict",
    );
    expectError(
      await admin
        .post("/api/templates")
        .send({ name: "CSV with exact decimals", extension: "csv", body: GOOD }),
      409,
      "conflict",
    );
  });

  it("refuses a template that does not render, naming the line and column", async () => {
    const admin = await t.admin();
    const res = await admin.post("/api/templates").send({
      name: "Broken",
      extension: "txt",
      body: "header\n{% for tap in taps %}\n  {{ tap.i | nope }}\n{% endfor %}",
    });
    const err = expectError(res, 400, "validation_failed");
    expect(err.message).toMatch(/line 3, column 3/);
    expect(err.details).toEqual([expect.objectContaining({ path: ["body"], line: 3, column: 3 })]);
    const unknownVar = await admin
      .post("/api/templates")
      .send({ name: "Broken", extension: "txt", body: "ok\n{{ nothing }}" });
    expect(expectError(unknownVar, 400, "validation_failed").message).toMatch(
      /line 2.*undefined variable: nothing/,
    );
    const include = await admin
      .post("/api/templates")
      .send({ name: "Broken", extension: "txt", body: "{% include 'x' %}" });
    expect(expectError(include, 400, "validation_failed").message).toMatch(/include tag is not available/);
  });

  it("validates fields and keeps built-ins read-only", async () => {
    const admin = await t.admin();
    expectError(
      await admin.post("/api/templates").send({ name: "", extension: ".TXT", body: "" }),
      400,
      "validation_failed",
    );
    expectError(
      await admin
        .post("/api/templates")
        .send({ name: "Big", extension: "txt", body: "x".repeat(64 * 1024 + 1) }),
      400,
      "validation_failed",
    );
    expectError(await admin.patch("/api/templates/csv").send({ body: GOOD }), 403, "forbidden");
    expectError(await admin.patch("/api/templates/12345").send({ body: GOOD }), 404, "not_found");
    expectError(await admin.patch("/api/templates/1").send({}), 400, "validation_failed");
  });

  it("lets only admins write: an author gets 403", async () => {
    const author = await signedIn(t.app, "author");
    expectError(
      await author.post("/api/templates").send({ name: "Mine", extension: "txt", body: GOOD }),
      403,
      "forbidden",
    );
    expectError(await author.post("/api/templates/preview").send({ body: GOOD }), 403, "forbidden");
  });
});

describe("POST /api/templates/preview", () => {
  it("renders on the complex sample by default and on the real one on request", async () => {
    const admin = await t.admin();
    const complex = PreviewResultSchema.parse(
      (await admin.post("/api/templates/preview").send({ body: GOOD })).body,
    );
    expect(complex.ok && complex.text.trim().split("\n").length).toBe(16);
    const real = PreviewResultSchema.parse(
      (await admin.post("/api/templates/preview").send({ body: GOOD, sample: "real" })).body,
    );
    // The real sample holds −2048 at W = 12: FFF… words per REFERENCES.md (IEEE 1364 §17.2.9).
    expect(real.ok && real.text.split("\n")).toContain("800");
  });

  it("answers a bad template with the error, line and column (200, ok: false)", async () => {
    const admin = await t.admin();
    const res = await admin.post("/api/templates/preview").send({ body: "a\nb\n{% if %}" });
    expect(res.status).toBe(200);
    const r = PreviewResultSchema.parse(res.body);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.line).toBe(3);
  });

  it("stops a runaway template by its time/memory limits", async () => {
    const admin = await t.admin();
    const r = PreviewResultSchema.parse(
      (
        await admin
          .post("/api/templates/preview")
          .send({ body: "{% for a in (1..100000000) %}{{ a }}{% endfor %}" })
      ).body,
    );
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.message).toMatch(/limit/);
  });

  it("is rate-limited per user: 120 a minute, then 429", async () => {
    const admin = await t.admin();
    const statuses: number[] = [];
    for (let k = 0; k < 125; k++)
      statuses.push((await admin.post("/api/templates/preview").send({ body: "x" })).status);
    // Earlier tests in this file used a few of the 120; the limit must bite before 125.
    expect(statuses.filter((s) => s === 429).length).toBeGreaterThan(0);
    expect(statuses.slice(0, 110).every((s) => s === 200)).toBe(true);
    expectError(await admin.post("/api/templates/preview").send({ body: "x" }), 429, "rate_limited");
  });
});
