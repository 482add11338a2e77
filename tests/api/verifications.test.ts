// Verification runs through the API. The "RTL" is tests/api/fixtures/fir-model.c, a separate FIR in C
// (128-bit integers) compiled here with gcc and fed the bundle's own CSV coefficients and stimulus; its
// output is uploaded. Where a broken copy should fail, Debian's `cmp` names the first differing line of
// its output against the bundle's expected.txt, independently of the server's comparator.
import { execFileSync, spawnSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { CreatedTokenSchema } from "../../shared/schemas/tokens";
import { ReleaseResponseSchema } from "../../shared/schemas/releases";
import {
  ReleaseSummarySchema,
  VerificationListSchema,
  VerificationResponseSchema,
} from "../../shared/schemas/verifications";
import { bundleOf, releasedDesign, unzipToTemp } from "./bundles-helpers";
import { expectError, useApiTestDatabase, type Agent } from "./helpers";
import { addUser, signedIn } from "./lifecycle-helpers";
import request from "supertest";

const t = useApiTestDatabase();

let work: string;
let model: string;
let releaseId: number;
let firmware: Agent;
let author: Agent;
let bundle: ReturnType<typeof unzipToTemp>;
/** The receive table's datapath as the manifest states it (bundle format 2.0). */
let golden: { outputShift: number; rounding: string; overflow: string; expected: { bits: number } };
let csvPath: string;

const q = async <T>(sql: string, params: unknown[] = []) =>
  (await t.database.pool.query(sql, params)).rows as T[];

/** Run the C model with extra flags; its stdout is the simulation output. */
function simulate(...flags: string[]): Buffer {
  return execFileSync(
    model,
    [
      csvPath,
      path.join(bundle.dir, "golden/scenario/stimulus.txt"),
      String(golden.outputShift),
      String(golden.expected.bits),
      golden.rounding,
      golden.overflow,
      ...flags,
    ],
    { maxBuffer: 64 * 1024 * 1024 },
  );
}

function upload(agent: Agent, bytes: Buffer, fileName: string, fields: Record<string, string> = {}) {
  let req = agent.post(`/api/releases/${releaseId}/verifications`);
  for (const [k, v] of Object.entries({ vectorSet: "scenario", ...fields })) req = req.field(k, v);
  return req.attach("file", bytes, fileName);
}

const runCount = async () =>
  Number((await q<{ n: string }>("select count(*) as n from verification_runs"))[0]!.n);

beforeAll(async () => {
  work = mkdtempSync(path.join(tmpdir(), "tapwright-verify-"));
  model = path.join(work, "fir-model");
  execFileSync("gcc", [
    "-O2",
    "-Wall",
    "-Werror",
    "-o",
    model,
    path.resolve("tests/api/fixtures/fir-model.c"),
  ]);
  const r = await releasedDesign(t);
  releaseId = r.release.id;
  author = r.author;
  firmware = await signedIn(t.app, "firmware");
  const zip = await bundleOf(firmware, releaseId);
  bundle = unzipToTemp(zip.body);
  const manifest = JSON.parse(bundle.read("manifest.json").toString("utf8")) as {
    tables: {
      role: string;
      exports: { template: string; path: string }[];
      datapath: {
        outputShift: number;
        outputRounding: string;
        outputOverflow: string;
        outputBits: number;
      } | null;
    }[];
  };
  const rx = manifest.tables.find((x) => x.role === "rx")!;
  const dp = rx.datapath!;
  golden = {
    outputShift: dp.outputShift,
    rounding: dp.outputRounding,
    overflow: dp.outputOverflow,
    expected: { bits: dp.outputBits },
  };
  csvPath = path.join(bundle.dir, rx.exports.find((e) => e.template === "csv")!.path);
});

afterAll(() => {
  bundle?.cleanup();
  if (work) rmSync(work, { recursive: true, force: true });
});

describe("verification runs", () => {
  it("passes the separately written C FIR through the upload, bit-exact, and keeps the bytes and their SHA-256", async () => {
    const out = simulate();
    const res = await upload(firmware, out, "sim_scenario.txt", {
      simulator: "gcc model",
      rtlRevision: "a1b2c3",
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const v = VerificationResponseSchema.parse(res.body).verification;
    const expectedLines = bundle
      .read("golden/scenario/expected.txt")
      .toString("utf8")
      .trim()
      .split("\n").length;
    expect(v).toMatchObject({
      vectorSet: "scenario",
      verdict: "pass",
      compared: expectedLines,
      mismatches: 0,
      firstMismatch: null,
      latencySamples: 0,
      maxAbsErrorLsb: 0,
      simulator: "gcc model",
      rtlRevision: "a1b2c3",
      releaseWithdrawn: false,
      format: "text",
    });
    const stored = await q<{ sha: string; size: number }>(
      "select encode(sha256(upload), 'hex') as sha, length(upload) as size from verification_runs where id = $1",
      [v.id],
    );
    // PostgreSQL's sha256() over the stored bytes agrees with what the answer reports.
    expect(stored[0]).toEqual({ sha: v.uploadSha256, size: out.byteLength });
    const raw = await firmware
      .get(`/api/releases/${releaseId}/verifications/${v.id}/upload`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on("data", (c: Buffer) => chunks.push(c));
        r.on("end", () => cb(null, Buffer.concat(chunks)));
      });
    expect(Buffer.compare(raw.body as Buffer, out)).toBe(0);
  });

  it("passes the set's own expected.txt and the same output as $readmemh hex with 7 samples of pipeline fill", async () => {
    const own = await upload(firmware, bundle.read("golden/scenario/expected.txt"), "expected.txt");
    expect(VerificationResponseSchema.parse(own.body).verification.verdict).toBe("pass");
    const hex = await upload(firmware, simulate("--hex", "--latency", "7"), "sim_scenario.hex");
    expect(hex.status, JSON.stringify(hex.body)).toBe(201);
    expect(VerificationResponseSchema.parse(hex.body).verification).toMatchObject({
      verdict: "pass",
      format: "hex",
      latencySamples: 7,
      latencySource: "searched",
    });
    const ownHex = await upload(firmware, bundle.read("golden/scenario/expected.hex"), "expected.hex", {
      latency: "0",
    });
    expect(VerificationResponseSchema.parse(ownHex.body).verification).toMatchObject({
      verdict: "pass",
      latencySource: "declared",
    });
  });

  it("fails the copy with reversed taps at the first differing sample, as cmp finds it", async () => {
    const broken = simulate("--reverse");
    const brokenPath = path.join(work, "broken.txt");
    const expectedPath = path.join(work, "expected-with-header.txt");
    writeFileSync(brokenPath, broken);
    // Same header line as the model writes, so cmp's line numbers count samples from 2.
    writeFileSync(
      expectedPath,
      Buffer.concat([
        Buffer.from(`# fir-model output, ${golden.expected.bits}-bit I Q\n`),
        bundle.read("golden/scenario/expected.txt"),
      ]),
    );
    const cmp = spawnSync("cmp", [expectedPath, brokenPath], { encoding: "utf8" });
    const line = Number(/line (\d+)/.exec(cmp.stdout)?.[1]);
    expect(line).toBeGreaterThan(1);
    const index = line - 2;
    const expectedLine = bundle.read("golden/scenario/expected.txt").toString("utf8").split("\n")[index]!;
    const brokenLine = broken.toString("utf8").split("\n")[index + 1]!;
    const [er, ei] = expectedLine.split(" ").map(Number);
    const [gr, gi] = brokenLine.split(" ").map(Number);

    const res = await upload(firmware, broken, "sim_reversed.txt", { latency: "0" });
    expect(res.status).toBe(201);
    const v = VerificationResponseSchema.parse(res.body).verification;
    expect(v.verdict).toBe("fail");
    expect(v.firstMismatch).toEqual({ index, expected: { re: er, im: ei }, got: { re: gr, im: gi } });
    expect(v.mismatches).toBeGreaterThan(0);
    expect(v.maxAbsErrorLsb).toBeGreaterThan(0);
    expect(v.errorEnvelope.maxAbsLsb.some((e) => e > 0)).toBe(true);
  });

  it("audits each run and mails the author and the approving reviewer", async () => {
    const audit = await q<{ summary: string; details: { verdict: string } }>(
      "select summary, details from audit_events where action = 'verification.create' and subject_id = $1 order by id",
      [String(releaseId)],
    );
    expect(audit.length).toBe(await runCount());
    expect(audit.at(-1)!.details.verdict).toBe("fail");
    const mail = await q<{ to_addresses: string[]; subject: string; text: string }>(
      "select to_addresses, subject, text from mail_outbox where template = 'verified' order by id desc limit 1",
    );
    expect(mail[0]!.to_addresses).toEqual([
      "ilse.marrow@coastwatch.example",
      "tomas.quill@coastwatch.example",
    ]);
    expect(mail[0]!.subject).toMatch(/Verification FAIL: .* 1\.0\.0 \(scenario\)/);
    expect(mail[0]!.text).toMatch(/First mismatch: sample \d+: expected/);
  });

  it.each([
    ["a letter in Q", "1 2\n3 4\n5 x\n", "out.txt", 3, 3],
    ["a missing Q", "1 2\n3\n", "out.txt", 2, 2],
    ["a comma", "1,2\n", "out.txt", 1, 2],
    ["a value beyond the 16-bit output", "1 2\n65536 0\n", "out.txt", 2, 1],
    ["no samples at all", "# nothing\n", "out.txt", 1, 1],
    ["an x from the simulator", "0001 0002\n000X 0000\n", "out.hex", 2, 4],
    ["an odd number of hex words", "0001 0002\n0003\n", "out.hex", 2, 1],
    ["a hex word too wide", "00001 0000\n", "out.hex", 1, 1],
  ])("refuses %s with its line and column, storing nothing", async (_what, text, name, line, column) => {
    const before = await runCount();
    const res = await upload(firmware, Buffer.from(text), name);
    const err = expectError(res, 400, "validation_failed");
    expect(err.message).toMatch(new RegExp(`^${name.replace(".", "\\.")}, line ${line}, column ${column}: `));
    expect(err.details).toEqual([expect.objectContaining({ path: ["file"], line, column })]);
    expect(await runCount()).toBe(before);
  });

  it("refuses an unknown vector set, a missing file and a bad latency", async () => {
    const before = await runCount();
    const set = expectError(
      await upload(firmware, simulate(), "x.txt", { vectorSet: "no-such-set" }),
      400,
      "validation_failed",
    );
    expect(set.message).toMatch(/no vector set "no-such-set"; it has scenario/);
    const none = await firmware
      .post(`/api/releases/${releaseId}/verifications`)
      .field("vectorSet", "scenario");
    expectError(none, 400, "validation_failed");
    const lat = expectError(
      await upload(firmware, simulate(), "x.txt", { latency: "-1" }),
      400,
      "validation_failed",
    );
    expect(JSON.stringify(lat.details)).toMatch(/latency/);
    expect(await runCount()).toBe(before);
  });

  it("lets firmware and admins post, members read, and hides the release from non-members", async () => {
    expectError(await upload(author, simulate(), "x.txt"), 403, "forbidden");
    const list = await author.get(`/api/releases/${releaseId}/verifications`);
    expect(list.status).toBe(200);
    const runs = VerificationListSchema.parse(list.body).verifications;
    expect(runs.length).toBe(await runCount());
    // Newest first.
    expect(runs[0]!.verdict).toBe("fail");
    await addUser(t.database, "outsider-fw", ["firmware"], []);
    const outsider = await signedIn(t.app, "outsider-fw");
    expectError(await upload(outsider, simulate(), "x.txt"), 404, "not_found");
    expectError(await outsider.get(`/api/releases/${releaseId}/verifications`), 404, "not_found");
    const admin = await t.admin();
    expect((await upload(admin, simulate(), "x.txt")).status).toBe(201);
  });

  it("shows the latest verdict and the passed sets on the release JSON, and the summary of the manifest", async () => {
    const rel = ReleaseResponseSchema.parse((await firmware.get(`/api/releases/${releaseId}`)).body).release;
    expect(rel.verification).toMatchObject({
      latest: { verdict: "pass", vectorSet: "scenario" },
      passedSets: ["scenario"],
      sets: ["scenario", "impulse", "worst-case", "rounding", "random-full-scale"],
    });
    const s = ReleaseSummarySchema.parse(
      (await firmware.get(`/api/releases/${releaseId}/summary`)).body.summary,
    );
    expect(s.vectorSets.map((v) => [v.name, v.expected.text])).toEqual(
      ["scenario", "impulse", "worst-case", "rounding", "random-full-scale"].map((n) => [
        n,
        `golden/${n}/expected.txt`,
      ]),
    );
    expect(s.tables.map((x) => [x.role, x.wordLength, x.fractionLength, x.signed])).toEqual([
      ["tx", 16, 15, true],
      ["rx", 16, 15, true],
    ]);
    // The complete file list: the manifest's plus manifest.json and SHA256SUMS, as unzip found them.
    expect(s.files.map((f) => f.path)).toEqual(
      execFileSync("find", [".", "-type", "f"], { cwd: bundle.dir, encoding: "utf8" })
        .trim()
        .split("\n")
        .map((p) => p.slice(2))
        .sort((a, b) => (a < b ? -1 : a > b ? 1 : 0)),
    );
    const sums = s.files.find((f) => f.path === "SHA256SUMS")!;
    expect(sums.sha256).toBe(
      execFileSync("sha256sum", ["SHA256SUMS"], { cwd: bundle.dir, encoding: "utf8" }).split(" ")[0],
    );
    expect(s.approvals).toEqual([
      expect.objectContaining({ reviewer: "Tomas Quill", comment: "Meets the limits." }),
    ]);
  });

  it("takes runs from a verify-scope token but nothing else; a read token may not post", async () => {
    const mint = async (scope: string) =>
      CreatedTokenSchema.parse((await firmware.post("/api/tokens").send({ name: `ci ${scope}`, scope })).body)
        .secret;
    const verify = await mint("verify");
    const read = await mint("read");
    const post = (secret: string) =>
      request(t.app)
        .post(`/api/releases/${releaseId}/verifications`)
        .set("Authorization", `Bearer ${secret}`)
        .field("vectorSet", "scenario")
        .attach("file", simulate(), "ci.txt");
    const ok = await post(verify);
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
    expect(
      (
        await q<{ token_id: number | null }>(
          "select token_id from verification_runs order by id desc limit 1",
        )
      )[0]!.token_id,
    ).not.toBeNull();
    expectError(await post(read), 403, "forbidden");
    const withdraw = await request(t.app)
      .post(`/api/releases/${releaseId}/withdraw`)
      .set("Authorization", `Bearer ${verify}`)
      .send({ reason: "x" });
    expect(expectError(withdraw, 403, "forbidden").message).toMatch(/verify scope/);
  });

  it("accepts a run on a withdrawn release, flagged, and refuses to change or delete any run", async () => {
    expect(
      (await author.post(`/api/releases/${releaseId}/withdraw`).send({ reason: "Wrong scale." })).status,
    ).toBe(200);
    const res = await upload(firmware, simulate(), "late.txt");
    expect(res.status).toBe(201);
    expect(VerificationResponseSchema.parse(res.body).verification.releaseWithdrawn).toBe(true);
    await expect(q("update verification_runs set verdict = 'pass' where verdict = 'fail'")).rejects.toThrow(
      /append-only/,
    );
    await expect(q("delete from verification_runs")).rejects.toThrow(/append-only/);
    await expect(q("truncate verification_runs")).rejects.toThrow(/append-only/);
  });
});
