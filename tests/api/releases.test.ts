// Releases over HTTP: only what was approved can be released; versions are unique per design and never
// reused, even after a withdrawal; a withdrawn release stays readable with its reason; "latest" skips it;
// suggested versions follow SemVer 2.0.0 §6–8; the database refuses to change or delete a release.
import { beforeAll, describe, expect, it } from "vitest";
import { NextVersionsSchema, ReleaseListSchema, ReleaseResponseSchema } from "../../shared/schemas/releases";
import { nextVersions } from "../../server/services/releases";
import { addUser, expectStatus, finishAnalysis, revisionIn } from "./lifecycle-helpers";
import { expectError, signedIn, useApiTestDatabase, type Agent } from "./helpers";

const t = useApiTestDatabase();
let author: Agent;
let reviewer: Agent;
let firmware: Agent;
let outsider: Agent;

beforeAll(async () => {
  await addUser(t.database, "outsider", ["author", "firmware"], ["harbour-lidar-trials"]);
  author = await signedIn(t.app, "author");
  reviewer = await signedIn(t.app, "reviewer");
  firmware = await signedIn(t.app, "firmware");
  outsider = await signedIn(t.app, "outsider");
}, 60_000);

const cast = () => ({ submitter: author, reviewer });
const q = <T extends Record<string, unknown>>(sql: string, params: unknown[] = []) =>
  t.database.pool.query<T>(sql, params).then((r) => r.rows);

describe("only what was approved is released", () => {
  it("refuses (409) when the approval names other content than the revision's", async () => {
    const { revisionId } = await revisionIn(t, cast(), "in_review");
    // An approval for different content, written past the API (the API can never produce one).
    const reviewerId = (await q<{ id: number }>("select id from users where username = 'reviewer'"))[0]!.id;
    await q(
      "insert into reviews (revision_id, content_hash, report_hash, decision, comment, reviewer_id) values ($1, $2, $3, 'approved', '', $4)",
      [revisionId, "0".repeat(64), "0".repeat(64), reviewerId],
    );
    await q("update revisions set state = 'approved' where id = $1", [revisionId]);
    const err = expectError(
      await author.post(`/api/revisions/${revisionId}/release`).send({ version: "1.0.0", notes: "x" }),
      409,
      "conflict",
    );
    expect(err.details).toMatchObject({ reason: "not_what_was_approved" });
    expect(await q("select id from releases where revision_id = $1", [revisionId])).toHaveLength(0);
  });

  it("refuses (409) the edited draft that follows an approved revision, and leaves no release", async () => {
    const { designId, revisionId } = await revisionIn(t, cast(), "approved");
    const r2 = await author.post(`/api/designs/${designId}/revisions`);
    expectStatus(r2, 201);
    const r2Id = (r2.body as { revision: { id: number } }).revision.id;
    const content = (await author.get(`/api/revisions/${r2Id}`)).body.content;
    expectStatus(
      await author.patch(`/api/revisions/${r2Id}`).send({
        content: {
          ...content,
          fixedPoint: {
            tx: { wordLength: 12, fractionLength: 11 },
            rx: { wordLength: 12, fractionLength: 11 },
          },
        },
      }),
      200,
    );
    await finishAnalysis(t.database, r2Id);
    expectError(
      await author.post(`/api/revisions/${r2Id}/release`).send({ version: "1.0.0", notes: "x" }),
      409,
      "conflict",
    );
    expect(await q("select id from releases where design_id = $1", [designId])).toHaveLength(0);
    // The approved r1 itself still releases.
    expectStatus(
      await author.post(`/api/revisions/${revisionId}/release`).send({ version: "1.0.0", notes: "x" }),
      201,
    );
  });
});

describe("versions, withdrawal and reading", () => {
  let designId: number;
  let first: number;
  beforeAll(async () => {
    const r1 = await revisionIn(t, cast(), "released", "1.0.0");
    designId = r1.designId;
    first = r1.releaseId!;
  });

  it("the release JSON names the bundle, its files and the transmit caution flag; audit and mail to firmware", async () => {
    const res = await firmware.get(`/api/releases/${first}`);
    expectStatus(res, 200);
    const r = ReleaseResponseSchema.parse(res.body).release;
    expect(r).toMatchObject({
      version: "1.0.0",
      designId,
      revisionNumber: 1,
      projectSlug: "coastwatch-s",
      transmit: true,
      withdrawn: null,
    });
    expect(r.bundleSha256).toMatch(/^[0-9a-f]{64}$/);
    expect(r.files.length).toBeGreaterThan(0);
    const stored = await q<{ sha: string; size: number }>(
      "select encode(sha256(bundle), 'hex') as sha, length(bundle) as size from releases where id = $1",
      [first],
    );
    // PostgreSQL's own sha256() over the stored bytes, independent of the app's hashing.
    expect(stored[0]).toEqual({ sha: r.bundleSha256, size: r.bundleSize });
    expect(
      await q("select id from audit_events where action = 'release.create' and subject_id = $1", [
        String(first),
      ]),
    ).toHaveLength(1);
    const mail = await q<{ to_addresses: string[] }>(
      "select to_addresses from mail_outbox where template = 'released' order by id desc limit 1",
    );
    expect(mail[0]!.to_addresses).toEqual(["priya.lund@coastwatch.example"]);
    expectError(await outsider.get(`/api/releases/${first}`), 404, "not_found");
  });

  it("suggests the next versions from the highest used", async () => {
    const res = await author.get(`/api/designs/${designId}/next-versions`);
    expect(NextVersionsSchema.parse(res.body)).toEqual({
      highest: "1.0.0",
      patch: "1.0.1",
      minor: "1.1.0",
      major: "2.0.0",
    });
  });

  it("withdraw needs a reason and the right role; a withdrawn release stays readable with its reason", async () => {
    expectError(
      await author.post(`/api/releases/${first}/withdraw`).send({ reason: "" }),
      400,
      "validation_failed",
    );
    expectError(
      await firmware.post(`/api/releases/${first}/withdraw`).send({ reason: "no" }),
      403,
      "forbidden",
    );
    expectStatus(
      await author.post(`/api/releases/${first}/withdraw`).send({ reason: "Rx scale off by 6 dB." }),
      200,
    );
    expectError(
      await author.post(`/api/releases/${first}/withdraw`).send({ reason: "again" }),
      409,
      "conflict",
    );
    const r = ReleaseResponseSchema.parse((await firmware.get(`/api/releases/${first}`)).body).release;
    expect(r.withdrawn).toMatchObject({
      reason: "Rx scale off by 6 dB.",
      by: { displayName: "Ilse Marrow" },
    });
    const list = ReleaseListSchema.parse(
      (await firmware.get(`/api/releases?status=withdrawn&design=${designId}`)).body,
    ).releases;
    expect(list.map((x) => x.id)).toEqual([first]);
    expect(
      ReleaseListSchema.parse((await firmware.get(`/api/releases?status=active&design=${designId}`)).body)
        .releases,
    ).toEqual([]);
    expect(
      await q("select id from audit_events where action = 'release.withdraw' and subject_id = $1", [
        String(first),
      ]),
    ).toHaveLength(1);
    const mail = await q<{ to_addresses: string[]; text: string }>(
      "select to_addresses, text from mail_outbox where template = 'withdrawn' order by id desc limit 1",
    );
    expect(mail[0]!.to_addresses).toEqual(["priya.lund@coastwatch.example"]);
    expect(mail[0]!.text).toContain("Rx scale off by 6 dB.");
  });

  it("never reuses a version, even a withdrawn one; the next release takes the next number", async () => {
    const r2 = await author.post(`/api/designs/${designId}/revisions`);
    expectStatus(r2, 201);
    const id = (r2.body as { revision: { id: number } }).revision.id;
    await finishAnalysis(t.database, id);
    expectStatus(await author.post(`/api/revisions/${id}/submit`), 200);
    expectStatus(await reviewer.post(`/api/revisions/${id}/decision`).send({ decision: "approved" }), 201);
    const reused = expectError(
      await author.post(`/api/revisions/${id}/release`).send({ version: "1.0.0", notes: "again" }),
      409,
      "conflict",
    );
    expect(reused.details).toMatchObject({ reason: "version_used" });
    expectError(
      await author.post(`/api/revisions/${id}/release`).send({ version: "01.0.1", notes: "x" }),
      400,
      "validation_failed",
    );
    const ok = await author
      .post(`/api/revisions/${id}/release`)
      .send({ version: "1.0.1", notes: "Rx scale fixed." });
    expectStatus(ok, 201);
    const list = ReleaseListSchema.parse(
      (await author.get(`/api/designs/${designId}/releases`)).body,
    ).releases;
    expect(list.map((x) => [x.version, x.withdrawn !== null])).toEqual([
      ["1.0.1", false],
      ["1.0.0", true],
    ]);
    const next = NextVersionsSchema.parse((await author.get(`/api/designs/${designId}/next-versions`)).body);
    expect(next.highest).toBe("1.0.1");
  });

  it("the review page of a later revision shows the previous release's figures", async () => {
    const r3 = await author.post(`/api/designs/${designId}/revisions`);
    const id = (r3.body as { revision: { id: number } }).revision.id;
    const page = (await author.get(`/api/revisions/${id}/review`)).body as {
      previousRelease: { version: string; report: { pass: boolean } | null };
    };
    expect(page.previousRelease.version).toBe("1.0.1");
    expect(page.previousRelease.report).not.toBeNull();
  });

  it("home: firmware sees the newest releases that are not withdrawn; the author sees the withdrawn one too", async () => {
    const fw = (await firmware.get("/api/home")).body as {
      work: { newestReleases: { version: string; withdrawn: boolean }[] };
    };
    expect(fw.work.newestReleases.some((r) => r.withdrawn)).toBe(false);
    expect(fw.work.newestReleases.map((r) => r.version)).toContain("1.0.1");
    const au = (await author.get("/api/home")).body as {
      work: { lastReleases: { withdrawn: boolean }[]; myDrafts: unknown[] };
    };
    expect(au.work.lastReleases.length).toBeGreaterThan(0);
    expect(au.work.myDrafts.length).toBeGreaterThan(0);
  });

  it("the database refuses to change or delete a release", async () => {
    await expect(q("update releases set notes = 'edited' where id = $1", [first])).rejects.toThrow(
      /withdrawn and cannot change/,
    );
    await expect(q("delete from releases where id = $1", [first])).rejects.toThrow(/cannot be deleted/);
    const active = (
      await q<{ id: number }>("select id from releases where design_id = $1 and withdrawn_at is null", [
        designId,
      ])
    )[0]!.id;
    await expect(q("update releases set bundle = '\\x00' where id = $1", [active])).rejects.toThrow(
      /immutable/,
    );
  });
});

describe("semantic version suggestions (SemVer 2.0.0 §6: patch; §7: minor resets patch; §8: major resets both)", () => {
  it.each([
    [null, "1.0.0", "1.0.0", "1.0.0"],
    ["1.0.0", "1.0.1", "1.1.0", "2.0.0"],
    ["2.9.17", "2.9.18", "2.10.0", "3.0.0"],
  ])("after %s", (highest, patch, minor, major) => {
    expect(nextVersions(highest)).toEqual({ highest, patch, minor, major });
  });
});
