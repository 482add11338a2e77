// Uploads: every supported format is stored byte for byte with its SHA-256 (checked with node:crypto) and
// parsed to the values written here by hand; every bad file is refused with its line, column and reason, and
// leaves no row behind.
import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { RevisionDetailSchema, UploadSchema } from "../../shared/schemas/designs";
import { Q15, binary, countRows, expectSameBits, projectId, tableValues } from "./designs-helpers";
import { expectError, failOnConsoleError, signedIn, useApiTestDatabase } from "./helpers";

const t = useApiTestDatabase();
failOnConsoleError();

type Agent = Awaited<ReturnType<typeof signedIn>>;
const sha256 = (b: Buffer) => createHash("sha256").update(b).digest("hex");
const BOM = Buffer.from([0xef, 0xbb, 0xbf]);

async function upload(agent: Agent, fileName: string, bytes: Buffer, slug = "coastwatch-s") {
  const pid = await projectId(t.app, slug);
  return agent
    .post(`/api/projects/${pid}/uploads`)
    .attach("file", bytes, { filename: fileName, contentType: "text/plain" });
}

// [file name, bytes, format, complex, re, im]
const GOOD: [string, Buffer, string, boolean, number[], number[]][] = [
  [
    "one-column.txt",
    Buffer.from("# tx taps\n0.5\n-0.25\n1e-3\n"),
    "text",
    false,
    [0.5, -0.25, 0.001],
    [0, 0, 0],
  ],
  [
    "two-columns.txt",
    Buffer.from("0.5 0.25\n-1 0\n0 -0.125\n"),
    "text",
    true,
    [0.5, -1, 0],
    [0.25, 0, -0.125],
  ],
  ["with-header.csv", Buffer.from("i,q\n1,2\n3,4\n"), "csv", true, [1, 3], [2, 4]],
  ["no-header.csv", Buffer.from("1,2\n3,4\n"), "csv", true, [1, 3], [2, 4]],
  [
    "index-and-header.csv",
    Buffer.from("n,re,im\n0,0.5,-0.5\n1,0.25,0.75\n"),
    "csv",
    true,
    [0.5, 0.25],
    [-0.5, 0.75],
  ],
  ["iq.tsv", Buffer.from("re\tim\n0.5\t-0.5\n0.25\t0.75\n"), "tsv", true, [0.5, 0.25], [-0.5, 0.75]],
  [
    "complex.txt",
    Buffer.from("0.5+0.25j\n-1-2i\n(3+0j)\n"),
    "complex-text",
    true,
    [0.5, -1, 3],
    [0.25, -2, 0],
  ],
  ["array.json", Buffer.from("[0.5, -0.5, 0.25]"), "json", false, [0.5, -0.5, 0.25], [0, 0, 0]],
  ["pairs.json", Buffer.from("[[1, 2], [3, 4]]"), "json", true, [1, 3], [2, 4]],
  ["objects.json", Buffer.from('[{"re": 1, "im": 2}, {"re": 3, "im": 4}]'), "json", true, [1, 3], [2, 4]],
  ["re-im.json", Buffer.from('{"re": [1, 3], "im": [2, 4]}'), "json", true, [1, 3], [2, 4]],
  ["crlf.txt", Buffer.from("0.5\r\n-0.5\r\n0.25\r\n"), "text", false, [0.5, -0.5, 0.25], [0, 0, 0]],
  ["bom.csv", Buffer.concat([BOM, Buffer.from("i,q\r\n1,2\r\n3,4\r\n")]), "csv", true, [1, 3], [2, 4]],
];

describe("uploads of every supported format", () => {
  it.each(GOOD)("%s is kept byte for byte and parsed", async (fileName, bytes, format, complex, re, im) => {
    const author = await signedIn(t.app, "author");
    const res = await upload(author, fileName, bytes);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const u = UploadSchema.parse(res.body.upload);
    expect(u).toMatchObject({
      fileName,
      format,
      complex,
      count: re.length,
      sizeBytes: bytes.length,
      sha256: sha256(bytes),
    });
    expect((await author.get(`/api/uploads/${u.id}`)).body.upload).toEqual(u);

    const raw = await author
      .get(`/api/uploads/${u.id}/raw`)
      .buffer(true)
      .parse(binary as never);
    expect(raw.status).toBe(200);
    expect(Buffer.compare(raw.body as Buffer, bytes)).toBe(0);
    expect(raw.headers["x-content-sha256"]).toBe(sha256(bytes));

    // Use it as a filter's taps: the stored table holds exactly the file's values.
    const pid = await projectId(t.app, "coastwatch-s");
    const fir = {
      kind: "upload",
      uploadId: u.id,
      sampleRateHz: 1e6,
      passbands: [[0, 1e5]],
      stopbands: [[2e5, 5e5]],
    };
    const created = await author
      .post(`/api/projects/${pid}/designs`)
      .send({ name: `taps from ${fileName}`, content: { kind: "filter", fir, fixedPoint: { fir: Q15 } } });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const detail = RevisionDetailSchema.parse(
      (await author.get(`/api/revisions/${created.body.revision.id}`)).body,
    );
    expect(detail.uploads).toEqual([u]);
    expect(detail.tables[0]).toMatchObject({ role: "fir", complex, length: re.length });
    expect(detail.tables[0]!.source).toMatchObject({ kind: "upload", uploadId: u.id, sha256: sha256(bytes) });
    const v = await tableValues(author, detail.revision.id, detail.tables[0]!.id);
    expectSameBits(v.re, re, "re");
    expectSameBits(v.im, im, "im");
  });

  it("makes a waveform's tx from an upload, and rx its matched filter", async () => {
    const author = await signedIn(t.app, "author");
    const bytes = Buffer.from("1 0\n0 1\n-1 0.5\n");
    const u = UploadSchema.parse((await upload(author, "pulse.txt", bytes)).body.upload);
    const pid = await projectId(t.app, "coastwatch-s");
    const tx = { kind: "upload", uploadId: u.id, sampleRateHz: 2e6 };
    const res = await author
      .post(`/api/projects/${pid}/designs`)
      .send({ name: "Uploaded pulse", content: { kind: "waveform", tx, fixedPoint: { tx: Q15, rx: Q15 } } });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const detail = RevisionDetailSchema.parse(
      (await author.get(`/api/revisions/${res.body.revision.id}`)).body,
    );
    const [txT, rxT] = detail.tables;
    const rx = await tableValues(author, detail.revision.id, rxT!.id);
    // conj(s[N−1−n]) written out by hand for s = [1, j, −1+0.5j].
    expectSameBits(rx.re, [-1, 0, 1], "rx.re");
    expectSameBits(rx.im, [-0.5, -1, 0], "rx.im");
    expect(txT!.sampleRateHz).toBe(2e6);
  });

  it("refuses an upload from another project, with the content path", async () => {
    const author = await signedIn(t.app, "author");
    const u = UploadSchema.parse(
      (await upload(author, "elsewhere.txt", Buffer.from("1\n"), "harbour-lidar-trials")).body.upload,
    );
    const pid = await projectId(t.app, "coastwatch-s");
    const tx = { kind: "upload", uploadId: u.id, sampleRateHz: 1e6 };
    const res = await author
      .post(`/api/projects/${pid}/designs`)
      .send({ name: "Borrowed", content: { kind: "waveform", tx, fixedPoint: { tx: Q15, rx: Q15 } } });
    expect(expectError(res, 400, "validation_failed").details).toEqual([
      { path: ["content", "tx", "uploadId"], message: `no upload ${u.id} in this project` },
    ]);
  });
});

// [file name, bytes, message, line, column]
const BAD: [string, Buffer, string, number, number][] = [
  [
    "not-a-number.txt",
    Buffer.from("1.0\n2.x\n"),
    'not-a-number.txt: line 2, column 1: expected a number, found "2.x"',
    2,
    1,
  ],
  [
    "nan.txt",
    Buffer.from("1\nNaN\n"),
    'nan.txt: line 2, column 1: "NaN" is not allowed: values must be finite numbers',
    2,
    1,
  ],
  [
    "inf.txt",
    Buffer.from("1\n-Inf\n"),
    'inf.txt: line 2, column 1: "-Inf" is not allowed: values must be finite numbers',
    2,
    1,
  ],
  [
    "ragged.csv",
    Buffer.from("1,2\n3\n"),
    "ragged.csv: line 2, column 2: expected 2 columns as on line 1, found 1",
    2,
    2,
  ],
  ["empty.txt", Buffer.alloc(0), "empty.txt: the file has no values (only blank or comment lines)", 0, 0],
  [
    "comments-only.txt",
    Buffer.from("# nothing\n"),
    "comments-only.txt: the file has no values (only blank or comment lines)",
    0,
    0,
  ],
  [
    "too-many.txt",
    Buffer.from("0\n".repeat(4_194_305)),
    "too-many.txt: line 4194305, column 1: more than 4,194,304 values (the limit)",
    4_194_305,
    1,
  ],
];

describe("bad files", () => {
  it.each(BAD)(
    "%s → 400 with line and column, nothing stored",
    async (fileName, bytes, message, line, column) => {
      const author = await signedIn(t.app, "author");
      const before = await countRows(t.database.pool, "uploads");
      const err = expectError(await upload(author, fileName, bytes), 400, "validation_failed");
      expect(err.message).toBe(message);
      expect(err.details).toEqual({ line, column });
      expect(await countRows(t.database.pool, "uploads")).toBe(before);
    },
  );

  it("a file over 32 MiB → 413, nothing stored", async () => {
    const author = await signedIn(t.app, "author");
    const before = await countRows(t.database.pool, "uploads");
    const big = Buffer.alloc(32 * 1024 * 1024 + 1, "0\n");
    const err = expectError(await upload(author, "huge.txt", big), 413, "bad_request");
    expect(err.message).toBe("The file is larger than 32 MiB (33554432 bytes), the limit");
    expect(await countRows(t.database.pool, "uploads")).toBe(before);
  });

  it("a request without a file → 400", async () => {
    const author = await signedIn(t.app, "author");
    const pid = await projectId(t.app, "coastwatch-s");
    const err = expectError(
      await author.post(`/api/projects/${pid}/uploads`).field("note", "x"),
      400,
      "bad_request",
    );
    expect(err.message).toMatch(/field named file/);
  });
});

describe("who may upload and read uploads", () => {
  it.each(["firmware", "reviewer"])("%s gets 403", async (role) => {
    const agent = await signedIn(t.app, role);
    expectError(await upload(agent, "x.txt", Buffer.from("1\n")), 403, "forbidden");
  });

  it("a user outside the project gets 404 on upload, description and bytes", async () => {
    const author = await signedIn(t.app, "author");
    const u = UploadSchema.parse(
      (await upload(author, "lidar.txt", Buffer.from("1\n"), "harbour-lidar-trials")).body.upload,
    );
    const firmware = await signedIn(t.app, "firmware");
    expectError(await firmware.get(`/api/uploads/${u.id}`), 404, "not_found");
    expectError(await firmware.get(`/api/uploads/${u.id}/raw`), 404, "not_found");
    // An author who is not a member: the admin takes the author out of the project.
    const admin = await signedIn(t.app, "admin");
    const pid = await projectId(t.app, "harbour-lidar-trials");
    const members = (await admin.get(`/api/projects/${pid}`)).body.members as {
      id: number;
      username: string;
    }[];
    const keep = members.filter((m) => m.username !== "author").map((m) => m.id);
    expect((await admin.put(`/api/projects/${pid}/members`).send({ userIds: keep })).status).toBe(200);
    expectError(await upload(author, "x.txt", Buffer.from("1\n"), "harbour-lidar-trials"), 404, "not_found");
    expectError(await author.get(`/api/uploads/${u.id}`), 404, "not_found");
    expectError(await author.get(`/api/uploads/${u.id}/raw`), 404, "not_found");
  });

  it("refuses UPDATE and DELETE of an upload at the database", async () => {
    const author = await signedIn(t.app, "author");
    const u = UploadSchema.parse((await upload(author, "fixed.txt", Buffer.from("1\n"))).body.upload);
    await expect(
      t.database.pool.query("update uploads set file_name = 'x' where id = $1", [u.id]),
    ).rejects.toThrow(/cannot be changed or deleted/);
    await expect(t.database.pool.query("delete from uploads where id = $1", [u.id])).rejects.toThrow(
      /cannot be changed or deleted/,
    );
  });
});
