// Revisions: drafts edit, submitted revisions do not (API 409 and database trigger); new revisions copy the
// last; the content hash is the SHA-256 of the canonical text, recomputed here with node:crypto.
import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { CreatedDesignSchema, RevisionDetailSchema, UploadSchema } from "../../shared/schemas/designs";
import { Q15, countRows, projectId, tableValues } from "./designs-helpers";
import { finishAnalysis } from "./lifecycle-helpers";
import { expectError, failOnConsoleError, signedIn, useApiTestDatabase } from "./helpers";

const t = useApiTestDatabase();
failOnConsoleError();

type Agent = Awaited<ReturnType<typeof signedIn>>;
const barker = (length: number) => ({
  kind: "waveform",
  tx: { kind: "phase-code", code: { kind: "barker", length }, sampleRateHz: 1e6 },
  fixedPoint: { tx: Q15, rx: Q15 },
});

let n = 0;
async function newDesign(agent: Agent, content: Record<string, unknown> = barker(13)) {
  const pid = await projectId(t.app, "coastwatch-s");
  const res = await agent
    .post(`/api/projects/${pid}/designs`)
    .send({ name: `revision test ${++n}`, content });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return CreatedDesignSchema.parse(res.body);
}
const detail = async (agent: Agent, id: number) =>
  RevisionDetailSchema.parse((await agent.get(`/api/revisions/${id}`)).body);
async function submit(agent: Agent, id: number) {
  // Submitting needs a finished report for the current content (issue 6): run the real analysis in-process first.
  await finishAnalysis(t.database, id);
  const res = await agent.post(`/api/revisions/${id}/submit`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return RevisionDetailSchema.parse(res.body);
}

/** The canonical text written out independently: sorted keys, no spaces (RFC 8785-style). */
function canonical(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(canonical).join(",")}]`;
  if (v !== null && typeof v === "object")
    return `{${Object.keys(v)
      .sort()
      .map((k) => `${JSON.stringify(k)}:${canonical((v as Record<string, unknown>)[k])}`)
      .join(",")}}`;
  return JSON.stringify(v);
}

describe("editing a draft", () => {
  it("PATCH replaces the content and re-materializes the tables", async () => {
    const author = await signedIn(t.app, "author");
    const { revision } = await newDesign(author);
    const before = await detail(author, revision.id);
    expect(before.tables[0]!.length).toBe(13);
    const res = await author.patch(`/api/revisions/${revision.id}`).send({ content: barker(11) });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const after = RevisionDetailSchema.parse(res.body);
    expect(after.tables.map((x) => [x.role, x.length])).toEqual([
      ["tx", 11],
      ["rx", 11],
    ]);
    expect(after.content).toMatchObject({ tx: { code: { length: 11 } } });
  });

  it("refuses to change a design's kind, and bad content, with paths", async () => {
    const author = await signedIn(t.app, "author");
    const { revision } = await newDesign(author);
    const fir = {
      kind: "design",
      band: "lowpass",
      sampleRateHz: 1e6,
      cutoffHz: 1e5,
      transitionHz: 5e4,
      stopbandAttenuationDb: 50,
    };
    const kind = await author
      .patch(`/api/revisions/${revision.id}`)
      .send({ content: { kind: "filter", fir, fixedPoint: { fir: Q15 } } });
    expect(expectError(kind, 400, "validation_failed").details).toEqual([
      { path: ["content", "kind"], message: "this design is a waveform" },
    ]);
    const bad = await author.patch(`/api/revisions/${revision.id}`).send({
      content: { ...barker(13), fixedPoint: { tx: { wordLength: 40, fractionLength: 0 }, rx: Q15 } },
    });
    const paths = (expectError(bad, 400, "validation_failed").details as { path: unknown[] }[]).map((d) =>
      d.path.join("."),
    );
    expect(paths).toEqual(["content.fixedPoint.tx.wordLength"]);
  });

  it.each(["firmware", "reviewer"])("%s cannot edit, submit or start a revision (403)", async (role) => {
    const author = await signedIn(t.app, "author");
    const { design, revision } = await newDesign(author);
    const agent = await signedIn(t.app, role);
    expectError(
      await agent.patch(`/api/revisions/${revision.id}`).send({ content: barker(7) }),
      403,
      "forbidden",
    );
    expectError(await agent.post(`/api/revisions/${revision.id}/submit`), 403, "forbidden");
    expectError(await agent.post(`/api/designs/${design.id}/revisions`), 403, "forbidden");
    expect((await detail(agent, revision.id)).canEdit).toBe(false);
  });
});

describe("submission freezes a revision", () => {
  it("fixes the content hash (SHA-256 of the canonical content and tables) and moves to in_review", async () => {
    const author = await signedIn(t.app, "author");
    const { revision } = await newDesign(author);
    const draft = await detail(author, revision.id);
    const sub = await submit(author, revision.id);
    expect(sub.revision.state).toBe("in_review");
    expect(sub.revision.submittedAt).not.toBeNull();
    expect(sub.canEdit).toBe(false);
    const text = canonical({
      content: draft.content,
      tables: draft.tables.map((x) => ({
        role: x.role,
        sampleRateHz: x.sampleRateHz,
        complex: x.complex,
        valuesSha256: x.valuesSha256,
      })),
    });
    expect(sub.revision.contentHash).toBe(createHash("sha256").update(text).digest("hex"));
    // Each table's hash is the SHA-256 of its downloaded bytes.
    for (const table of draft.tables) {
      const v = await tableValues(author, revision.id, table.id);
      expect(table.valuesSha256).toBe(createHash("sha256").update(v.bytes).digest("hex"));
    }
  });

  it("refuses PATCH and a second submit with 409 naming the revision and its state", async () => {
    const author = await signedIn(t.app, "author");
    const { revision } = await newDesign(author);
    await submit(author, revision.id);
    const err = expectError(
      await author.patch(`/api/revisions/${revision.id}`).send({ content: barker(7) }),
      409,
      "conflict",
    );
    expect(err.message).toBe("r1 is in review and cannot change: start a new revision");
    expectError(await author.post(`/api/revisions/${revision.id}/submit`), 409, "conflict");
    expect((await detail(author, revision.id)).tables[0]!.length).toBe(13);
  });

  it("is backed by the database: raw SQL changes of a submitted revision or its tables throw", async () => {
    const author = await signedIn(t.app, "author");
    const { revision } = await newDesign(author);
    await submit(author, revision.id);
    const pool = t.database.pool;
    await expect(
      pool.query(`update revisions set content = '{}'::jsonb where id = $1`, [revision.id]),
    ).rejects.toThrow(/cannot change/);
    await expect(
      pool.query(`update revisions set content_hash = 'x' where id = $1`, [revision.id]),
    ).rejects.toThrow(/cannot change/);
    await expect(
      pool.query(`update revisions set state = 'draft' where id = $1`, [revision.id]),
    ).rejects.toThrow(/cannot change/);
    await expect(pool.query(`delete from revisions where id = $1`, [revision.id])).rejects.toThrow(
      /cannot be deleted/,
    );
    await expect(
      pool.query(`update coefficient_tables set values = '\\x00'::bytea where revision_id = $1`, [
        revision.id,
      ]),
    ).rejects.toThrow(/cannot change/);
    await expect(
      pool.query(`delete from coefficient_tables where revision_id = $1`, [revision.id]),
    ).rejects.toThrow(/cannot change/);
    // A draft's tables may change (that is how PATCH works).
    const draft = await newDesign(author);
    const r = await pool.query(`update coefficient_tables set position = position where revision_id = $1`, [
      draft.revision.id,
    ]);
    expect(r.rowCount).toBe(2);
  });
});

describe("new revisions", () => {
  it("copies the last revision's content and tables into r2, refuses a second draft (409 with its id)", async () => {
    const author = await signedIn(t.app, "author");
    const { design, revision } = await newDesign(author);
    const first = await submit(author, revision.id);
    const res = await author.post(`/api/designs/${design.id}/revisions`);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const r2 = await detail(author, res.body.revision.id);
    expect(r2.revision).toMatchObject({ number: 2, state: "draft", contentHash: null });
    expect(r2.content).toEqual(first.content);
    expect(r2.tables.map(({ id: _id, ...x }) => x)).toEqual(first.tables.map(({ id: _id, ...x }) => x));
    const again = expectError(await author.post(`/api/designs/${design.id}/revisions`), 409, "conflict");
    expect(again.details).toEqual({ revisionId: r2.revision.id });
    const designRes = (await author.get(`/api/designs/${design.id}`)).body as {
      revisions: { number: number }[];
      design: { latestRevision: { number: number } };
    };
    expect(designRes.revisions.map((x) => x.number)).toEqual([2, 1]);
    expect(designRes.design.latestRevision.number).toBe(2);
  });
});

describe("content hash", () => {
  it("is the same for the same content and changes when one table value changes", async () => {
    const author = await signedIn(t.app, "author");
    const pid = await projectId(t.app, "coastwatch-s");
    const up = async (text: string) =>
      UploadSchema.parse(
        (
          await author
            .post(`/api/projects/${pid}/uploads`)
            .attach("file", Buffer.from(text), { filename: "taps.txt" })
        ).body.upload,
      ).id;
    const a = await up("0.5\n0.25\n0.125\n");
    const b = await up("0.5\n0.25\n0.125\n"); // same bytes, another upload
    const c = await up("0.5\n0.25\n0.1250001\n"); // one value differs
    const filter = (uploadId: number) => ({
      kind: "filter",
      fir: { kind: "upload", uploadId, sampleRateHz: 1e6, passbands: [[0, 1e5]], stopbands: [[2e5, 5e5]] },
      fixedPoint: { fir: Q15 },
    });
    const hashOf = async (content: Record<string, unknown>) => {
      const { revision } = await newDesign(author, content);
      return (await submit(author, revision.id)).revision.contentHash!;
    };
    const h1 = await hashOf(filter(a));
    const h1again = await hashOf(filter(a));
    expect(h1again).toBe(h1);
    // Another upload id is another content (provenance is part of it), so the hash differs even for equal values.
    expect(await hashOf(filter(b))).not.toBe(h1);
    // A draft edited to use c: the table's SHA-256 changes, and so does the hash.
    const { revision } = await newDesign(author, filter(a));
    const before = await detail(author, revision.id);
    await author.patch(`/api/revisions/${revision.id}`).send({ content: filter(c) });
    const after = await detail(author, revision.id);
    expect(after.tables[0]!.valuesSha256).not.toBe(before.tables[0]!.valuesSha256);
    const h3 = (await submit(author, revision.id)).revision.contentHash!;
    expect(h3).not.toBe(h1);
    expect(h3).toMatch(/^[0-9a-f]{64}$/);
    expect(await countRows(t.database.pool, "revisions")).toBeGreaterThanOrEqual(4);
  });
});
