// Real sizes (lean on purpose: one long release in this file). A 65,536-sample LFM goes
// draft → analysed → approved → released → downloaded, checked by Debian's unzip and coreutils' sha256sum;
// 262,144- and 4,194,304-sample ones are refused when saved (server/bundles/limits.ts); downloads answer Range and conditional requests; the
// server keeps answering /api/health while a long bundle builds (an ordering check, not a time).
import { execFileSync } from "node:child_process";
import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { MAX_UPLOAD_BYTES } from "../../shared/coefficients/parse";
import { longLfm } from "./analysis-helpers";
import { bundleOf, download, releasedDesign, unzipToTemp } from "./bundles-helpers";
import { projectId } from "./designs-helpers";
import { expectError, signedIn, useApiTestDatabase } from "./helpers";

const t = useApiTestDatabase();

/** The bundle's own checksums pass `sha256sum -c`, and its manifest names the table length. */
function verifyBundle(zip: Buffer, samples: number) {
  const u = unzipToTemp(zip);
  try {
    execFileSync("sha256sum", ["-c", "--strict", "--quiet", "SHA256SUMS"], { cwd: u.dir });
    const manifest = JSON.parse(u.read("manifest.json").toString("utf8")) as {
      tables: { role: string; length: number }[];
    };
    expect(manifest.tables.map((x) => [x.role, x.length])).toEqual([
      ["tx", samples],
      ["rx", samples],
    ]);
    // The expected golden output is the full convolution of the stimulus with the rx table.
    const expected = u.read("golden/scenario/expected.txt").toString("utf8").trimEnd().split("\n");
    const stimulus = u.read("golden/scenario/stimulus.txt").toString("utf8").trimEnd().split("\n");
    expect(expected.length).toBe(stimulus.length + samples - 1);
  } finally {
    u.cleanup();
  }
}

describe("releases of long pulses", () => {
  it("65,536 samples: released, downloaded whole, by range and conditionally", async () => {
    const { author, release } = await releasedDesign(t, longLfm(65_536, false));
    const res = await bundleOf(author, release.id);
    expect(res.status).toBe(200);
    expect(createHash("sha256").update(res.body).digest("hex")).toBe(release.bundleSha256);
    expect(res.headers["accept-ranges"]).toBe("bytes");
    verifyBundle(res.body, 65_536);

    const etag = res.headers.etag as string;
    expect(etag).toBe(`"${release.bundleSha256}"`);
    const again = await author.get(`/api/releases/${release.id}/bundle`).set("If-None-Match", etag);
    expect(again.status).toBe(304);

    const size = res.body.length;
    const part = await download(
      author.get(`/api/releases/${release.id}/bundle`).set("Range", "bytes=100-1123"),
    );
    expect(part.status).toBe(206);
    expect(part.headers["content-range"]).toBe(`bytes 100-1123/${size}`);
    expect(part.body.equals(res.body.subarray(100, 1124))).toBe(true);
    const tail = await download(author.get(`/api/releases/${release.id}/bundle`).set("Range", "bytes=-10"));
    expect(tail.body.equals(res.body.subarray(size - 10))).toBe(true);
    // If-Range with another ETag: the whole body, not the range.
    const stale = await download(
      author
        .get(`/api/releases/${release.id}/bundle`)
        .set("Range", "bytes=0-9")
        .set("If-Range", '"not-this-one"'),
    );
    expect([stale.status, stale.body.length]).toEqual([200, size]);
    const outside = await author.get(`/api/releases/${release.id}/bundle`).set("Range", `bytes=${size}-`);
    expect(outside.status).toBe(416);
    expect(outside.headers["content-range"]).toBe(`bytes */${size}`);
  }, 600_000);

  it("262,144 samples: refused when saved (longer than a release can carry yet)", async () => {
    const author = await signedIn(t.app, "author");
    const res = await author
      .post(`/api/projects/${await projectId(t.app, "coastwatch-s")}/designs`)
      .send({ name: "quarter mega-sample", content: longLfm(262_144, false) });
    const err = expectError(res, 400, "validation_failed");
    expect((err.details as { message: string }[])[0]!.message).toMatch(
      /The tx table would have 262,144 samples; a release can carry tables of at most 65,536 samples/,
    );
  }, 300_000);

  it("4,194,304 samples: refused when saved, saying what a release can carry", async () => {
    const author = await signedIn(t.app, "author");
    const res = await author
      .post(`/api/projects/${await projectId(t.app, "coastwatch-s")}/designs`)
      .send({ name: "four mega-samples", content: longLfm(4_194_304, false) });
    const err = expectError(res, 400, "validation_failed");
    const details = err.details as { path: string[]; message: string }[];
    expect(details[0]!.path).toEqual(["content", "tx"]);
    expect(details[0]!.message).toMatch(
      /The tx table would have 4,194,304 samples; a release can carry tables of at most 65,536 samples \(each exported file is limited to 96 MiB\)/,
    );
  }, 300_000);
});

describe("uploads that used to freeze the server", () => {
  it("a 32 MiB single-line file is refused, naming the line limit", async () => {
    const author = await signedIn(t.app, "author");
    const pid = await projectId(t.app, "coastwatch-s");
    const res = await author
      .post(`/api/projects/${pid}/uploads`)
      .attach("file", Buffer.alloc(MAX_UPLOAD_BYTES, "1"), "one-line.txt");
    const err = expectError(res, 400, "validation_failed");
    expect(err.message).toMatch(/one-line\.txt: line 1, column 1: the line is longer than 1,024 characters/);
  }, 300_000);

  it("a decimal-comma file is refused with a hint instead of being read as I,Q columns", async () => {
    const author = await signedIn(t.app, "author");
    const pid = await projectId(t.app, "coastwatch-s");
    const res = await author
      .post(`/api/projects/${pid}/uploads`)
      .attach("file", Buffer.from("0,5\n0,25\n-0,125\n"), "komma.txt");
    const err = expectError(res, 400, "validation_failed");
    expect(err.message).toMatch(/line 1, column 1: "0,5" looks like a number with a decimal comma/);
  });
});
