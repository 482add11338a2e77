// Release bundles checked with tools we did not write: Debian's unzip and coreutils' sha256sum -c, ajv for the
// manifest's JSON Schema (draft 2020-12), node:crypto for every digest, and an independent BigInt direct
// convolution for the golden vectors.
import Ajv2020 from "ajv/dist/2020";
import addFormats from "ajv-formats";
import { execFileSync } from "node:child_process";
import { createHash } from "node:crypto";
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import request from "supertest";
import { beforeAll, describe, expect, it } from "vitest";
import type { Release } from "../../shared/schemas/releases";
import { buildReleaseBundle } from "../../server/bundles/build";
import { expectError, useApiTestDatabase, type Agent } from "./helpers";
import { addUser, barker13, signedIn } from "./lifecycle-helpers";
import { bundleOf, decimationFir, releasedDesign, unzipToTemp } from "./bundles-helpers";

const t = useApiTestDatabase();
const sha256 = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");

type Manifest = {
  schemaVersion: string;
  files: { path: string; size: number; sha256: string }[];
  tables: {
    role: string;
    fixedPoint: { wordLength: number };
    datapath: {
      inputBits: number;
      accumulatorBits: number;
      outputBits: number;
      outputShift: number;
      outputRounding: string;
      outputOverflow: string;
    } | null;
    exports: { template: string; path: string }[];
  }[];
  golden: {
    filterTable: string;
    sets: {
      name: string;
      stimulus: { text: string; hex: string; length: number; bits: number };
      expected: { text: string; hex: string; length: number; bits: number };
      maxAbsAccumulator: string;
      accumulatorBound: string;
      overflowCount: number;
    }[];
  };
  approvals: { reviewer: { username: string } }[];
  transmitCaution: string | null;
  templates: { id: string; version: number }[];
};

type Datapath = NonNullable<Manifest["tables"][number]["datapath"]>;

function walk(dir: string, base = ""): string[] {
  return readdirSync(path.join(dir, base)).flatMap((f) => {
    const rel = base ? `${base}/${f}` : f;
    return statSync(path.join(dir, rel)).isDirectory() ? walk(dir, rel) : [rel];
  });
}

/** "<I> <Q>" lines → BigInt pairs. */
function pairs(text: string): { re: bigint[]; im: bigint[] } {
  const re: bigint[] = [];
  const im: bigint[] = [];
  for (const line of text.split("\n")) {
    if (line === "" || line.startsWith("#")) continue;
    const m = /^(-?\d+) (-?\d+)$/.exec(line);
    if (!m) throw new Error(`bad golden line ${JSON.stringify(line)}`);
    re.push(BigInt(m[1]!));
    im.push(BigInt(m[2]!));
  }
  return { re, im };
}

/** floor(a / 2^s) and the rounding modes of DESIGN.md, written here from the definitions (IEEE 754-2019 §4.3 names). */
function roundShift(a: bigint, s: number, mode: string): bigint {
  if (s === 0) return a;
  const d = 1n << BigInt(s);
  const q = a >= 0n ? a / d : -((-a + d - 1n) / d); // floor division
  const r = a - q * d; // 0 ≤ r < d
  if (mode === "floor" || r === 0n) return q;
  if (mode === "toward-zero") return a < 0n ? q + 1n : q;
  const twice = 2n * r;
  if (twice > d) return q + 1n;
  if (twice < d) return q;
  if (mode === "nearest-away") return a < 0n ? q : q + 1n;
  return q % 2n === 0n ? q : q + 1n;
}

/**
 * Independent bit-true model: y[n] = Σ h[k]·x[n−k] over the full convolution, BigInt throughout, the sum
 * wrapped to a two's-complement accumulatorBits register; also the largest |sum| met.
 */
function expectedOutput(x: { re: bigint[]; im: bigint[] }, h: { re: bigint[]; im: bigint[] }, dp: Datapath) {
  const { outputShift, outputBits, outputRounding: rounding, outputOverflow: overflow } = dp;
  let maxAbs = 0n;
  const acc = (v: bigint) => {
    const m = v < 0n ? -v : v;
    if (m > maxAbs) maxAbs = m;
    return BigInt.asIntN(dp.accumulatorBits, v);
  };
  const max = (1n << BigInt(outputBits - 1)) - 1n;
  const min = -max - 1n;
  const fit = (v: bigint) =>
    v > max || v < min ? (overflow === "saturate" ? (v > max ? max : min) : BigInt.asIntN(outputBits, v)) : v;
  const ny = x.re.length + h.re.length - 1;
  const re: bigint[] = [];
  const im: bigint[] = [];
  for (let n = 0; n < ny; n++) {
    let ar = 0n;
    let ai = 0n;
    for (let k = 0; k < h.re.length; k++) {
      const i = n - k;
      if (i < 0 || i >= x.re.length) continue;
      ar += h.re[k]! * x.re[i]! - h.im[k]! * x.im[i]!;
      ai += h.re[k]! * x.im[i]! + h.im[k]! * x.re[i]!;
    }
    re.push(fit(roundShift(acc(ar), outputShift, rounding)));
    im.push(fit(roundShift(acc(ai), outputShift, rounding)));
  }
  return { re, im, maxAbs };
}

describe("release bundles", () => {
  let firmware: Agent;
  let waveform: { release: Release; author: Agent };
  let filter: { release: Release; author: Agent };
  let zip: Buffer;

  beforeAll(async () => {
    firmware = await signedIn(t.app, "firmware");
    waveform = await releasedDesign(t, barker13);
    filter = await releasedDesign(t, decimationFir);
    const res = await bundleOf(firmware, waveform.release.id);
    expect(res.status, res.body.toString()).toBe(200);
    zip = res.body;
  });

  it("serves the stored zip with its SHA-256 (node:crypto) in the release JSON and the headers; two downloads are byte-identical", async () => {
    const again = await bundleOf(waveform.author, waveform.release.id);
    expect(again.status).toBe(200);
    expect(Buffer.compare(again.body, zip)).toBe(0);
    expect(sha256(zip)).toBe(waveform.release.bundleSha256);
    expect(zip.byteLength).toBe(waveform.release.bundleSize);
    expect(again.headers["content-type"]).toBe("application/zip");
    expect(again.headers["x-bundle-sha256"]).toBe(sha256(zip));
    expect(again.headers["repr-digest"]).toBe(
      `sha-256=:${createHash("sha256").update(zip).digest("base64")}:`,
    );
    expect(again.headers["content-disposition"]).toMatch(
      /^attachment; filename="coastwatch-s-.+-1\.0\.0\.zip"$/,
    );
    // Audited: two downloads, by two people.
    const audit = await t.database.pool.query(
      "select actor_kind, details->>'sha256' as sha from audit_events where action = 'release.download' and subject_id = $1",
      [String(waveform.release.id)],
    );
    expect(audit.rows).toEqual([
      { actor_kind: "user", sha: sha256(zip) },
      { actor_kind: "user", sha: sha256(zip) },
    ]);
  });

  it("is deterministic: rebuilding from the same release input gives the stored bytes exactly", async () => {
    const r = waveform.release;
    const rebuilt = await buildReleaseBundle(t.database.db, {
      revisionId: r.revisionId,
      version: r.version,
      notes: r.notes,
      releasedBy: r.releasedBy.id,
      releasedAt: new Date(r.releasedAt),
    });
    expect(rebuilt.sha256).toBe(r.bundleSha256);
    expect(Buffer.compare(rebuilt.zip, zip)).toBe(0);
  });

  it("unzips with Debian's unzip and every checksum passes coreutils' sha256sum -c; SHA256SUMS lists every other file, sorted", () => {
    const u = unzipToTemp(zip);
    try {
      const out = execFileSync("sha256sum", ["-c", "--strict", "SHA256SUMS"], {
        cwd: u.dir,
        encoding: "utf8",
      });
      const files = walk(u.dir).sort();
      const listed = u
        .read("SHA256SUMS")
        .toString("utf8")
        .trimEnd()
        .split("\n")
        .map((l) => l.slice(66));
      expect(listed).toEqual(files.filter((f) => f !== "SHA256SUMS"));
      expect(out.trimEnd().split("\n")).toEqual(listed.map((f) => `${f}: OK`));
      for (const need of [
        "README.txt",
        "manifest.json",
        "manifest.schema.json",
        "golden/sets.json",
        "golden/scenario/stimulus.txt",
        "golden/scenario/expected.txt",
        "golden/worst-case/expected.hex",
        "hdl/tw_tb.v",
        "hdl/tw_fir.v",
        "hdl/tw_tb.vhd",
        "hdl/tw_fir.vhd",
        "report/report.html",
        "report/report.json",
      ])
        expect(files).toContain(need);
      // Every built-in template once per table: 5 Liquid templates + binary, tables tx and rx.
      expect(files.filter((f) => f.startsWith("tables/rx/"))).toHaveLength(6);
      expect(files.filter((f) => f.startsWith("tables/tx/"))).toHaveLength(6);
    } finally {
      u.cleanup();
    }
  });

  it("stores every entry sorted, with one fixed timestamp (the release time in UTC, even seconds) and no directory entries", () => {
    const file = path.join(mkdtempSync(path.join(tmpdir(), "tapwright-zipinfo-")), "bundle.zip");
    writeFileSync(file, zip);
    try {
      // Info-ZIP's zipinfo mode: -1 names only; -T decimal times yyyymmdd.hhmmss.
      const names = execFileSync("unzip", ["-Z1", file], { encoding: "utf8" }).trimEnd().split("\n");
      expect(names).toEqual([...names].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0)));
      expect(names.filter((n) => n.endsWith("/"))).toEqual([]);
      const times = new Set(
        execFileSync("unzip", ["-Z", "-T", file], { encoding: "utf8", env: { ...process.env, TZ: "UTC" } })
          .split("\n")
          .flatMap((l) => /\s(\d{8}\.\d{6})\s/.exec(l)?.[1] ?? []),
      );
      const at = new Date(Math.floor(Date.parse(waveform.release.releasedAt) / 2000) * 2000).toISOString();
      const want = `${at.slice(0, 4)}${at.slice(5, 7)}${at.slice(8, 10)}.${at.slice(11, 13)}${at.slice(14, 16)}${at.slice(17, 19)}`;
      expect([...times]).toEqual([want]);
    } finally {
      rmSync(path.dirname(file), { recursive: true, force: true });
    }
  });

  it("the manifest validates against its own JSON Schema (ajv, draft 2020-12) and agrees with the files", () => {
    const u = unzipToTemp(zip);
    try {
      const schemaBytes = u.read("manifest.schema.json");
      expect(
        Buffer.compare(
          schemaBytes,
          readFileSync(path.join(process.cwd(), "docs/schemas/manifest.schema.json")),
        ),
      ).toBe(0);
      const ajv = new Ajv2020({ allErrors: true, strict: true });
      addFormats(ajv);
      const validate = ajv.compile(JSON.parse(schemaBytes.toString("utf8")));
      const manifest = JSON.parse(u.read("manifest.json").toString("utf8")) as Manifest;
      expect(validate(manifest), JSON.stringify(validate.errors)).toBe(true);
      expect(manifest.schemaVersion).toBe("2.0");
      for (const f of manifest.files) {
        const bytes = u.read(f.path);
        expect({ path: f.path, size: bytes.byteLength, sha256: sha256(bytes) }).toEqual(f);
      }
      expect(manifest.files.map((f) => f.path)).toEqual(
        walk(u.dir)
          .filter((f) => f !== "manifest.json" && f !== "SHA256SUMS")
          .sort(),
      );
      expect(manifest.approvals.map((a) => a.reviewer.username)).toEqual(["reviewer"]);
      expect(manifest.templates.map((x) => x.id).sort()).toEqual(
        ["binary", "c-header", "csv", "json", "readmemh", "vhdl-package"].sort(),
      );
      // A waveform carries the transmit caution (DESIGN.md "Cautions"), in the manifest and the readme.
      expect(manifest.transmitCaution).toMatch(/dummy load/);
      expect(u.read("README.txt").toString("utf8")).toMatch(/CAUTION[\s\S]*dummy load/);
      // The release JSON's file list is the manifest's.
      expect(waveform.release.files).toEqual(manifest.files);
      // Nothing but the schema validates: a manifest missing a field is refused.
      const { files: _files, ...broken } = manifest;
      expect(validate(broken)).toBe(false);
    } finally {
      u.cleanup();
    }
  });

  for (const which of ["waveform", "filter"] as const) {
    it(`every vector set's expected output (${which}) equals an independent BigInt direct convolution of its stimulus read back from the zip; the worst case reaches the bound`, async () => {
      const rel = which === "waveform" ? waveform : filter;
      const res = await bundleOf(firmware, rel.release.id);
      const u = unzipToTemp(res.body);
      try {
        const manifest = JSON.parse(u.read("manifest.json").toString("utf8")) as Manifest;
        const table = manifest.tables.find((x) => x.role === manifest.golden.filterTable)!;
        expect(table.role).toBe(which === "waveform" ? "rx" : "fir");
        const dp = table.datapath!;
        expect(dp.outputBits).toBe(16); // the default
        expect(manifest.tables.filter((x) => x.datapath !== null)).toHaveLength(1);
        const jsonExport = table.exports.find((e) => e.template === "json")!;
        const taps = (
          JSON.parse(u.read(jsonExport.path).toString("utf8")) as { taps: { i: number; q: number }[] }
        ).taps;
        const h = { re: taps.map((x) => BigInt(x.i)), im: taps.map((x) => BigInt(x.q)) };
        // Worst case written out here from the definition: each term c·x is largest at x = 2^(B−1)−1 for
        // c > 0 and −2^(B−1) for c < 0 (and the mirror for the most negative sum).
        const top = 1n << BigInt(dp.inputBits - 1);
        const extreme = (terms: bigint[]) => {
          const p = terms.filter((c) => c > 0n).reduce((a, c) => a + c, 0n);
          const n = terms.filter((c) => c < 0n).reduce((a, c) => a - c, 0n);
          const hi = (top - 1n) * p + top * n;
          const lo = top * p + (top - 1n) * n;
          return hi > lo ? hi : lo;
        };
        const boundI = extreme([...h.re, ...h.im.map((v) => -v)]);
        const boundQ = extreme([...h.re, ...h.im]);
        const bound = boundI > boundQ ? boundI : boundQ;
        expect(manifest.golden.sets.map((x) => x.name)).toEqual([
          "scenario",
          "impulse",
          "worst-case",
          "rounding",
          "random-full-scale",
        ]);
        for (const set of manifest.golden.sets) {
          expect(set.stimulus.text).toBe(`golden/${set.name}/stimulus.txt`);
          expect(set.expected.hex).toBe(`golden/${set.name}/expected.hex`);
          const x = pairs(u.read(set.stimulus.text).toString("utf8"));
          const y = pairs(u.read(set.expected.text).toString("utf8"));
          expect(x.re).toHaveLength(set.stimulus.length);
          for (const v of [...x.re, ...x.im]) expect(v >= -top && v < top).toBe(true);
          const want = expectedOutput(x, h, dp);
          expect(y.re.length).toBe(x.re.length + h.re.length - 1);
          expect(y.re, set.name).toEqual(want.re);
          expect(y.im, set.name).toEqual(want.im);
          expect(set.maxAbsAccumulator).toBe(want.maxAbs.toString());
          expect(set.accumulatorBound).toBe(bound.toString());
          // The worst-case set reaches the bound exactly; nothing exceeds it.
          if (set.name === "worst-case") expect(want.maxAbs).toBe(bound);
          expect(want.maxAbs <= bound).toBe(true);
          // The hex copies hold the same words (two's complement, ⌈bits/4⌉ digits).
          for (const [file, bits, v] of [
            [set.expected.hex, set.expected.bits, y],
            [set.stimulus.hex, set.stimulus.bits, x],
          ] as const) {
            const hex = u.read(file).toString("utf8").trimEnd().split("\n");
            hex.forEach((line, n) => {
              const [a, b] = line.split(" ").map((w) => BigInt.asIntN(bits, BigInt(`0x${w}`)));
              expect([a, b]).toEqual([v.re[n], v.im[n]]);
            });
          }
        }
        const scenarioOut = pairs(u.read("golden/scenario/expected.txt").toString("utf8"));
        expect(scenarioOut.re.some((v) => v !== 0n)).toBe(true);
        if (which === "filter") expect(manifest.transmitCaution).toBeNull();
      } finally {
        u.cleanup();
      }
    });
  }

  it("a corrupted stored bundle is refused loudly (500 bundle_corrupt), not served, and audited", async () => {
    const victim = await releasedDesign(t, barker13, "2.0.0");
    // The release trigger refuses UPDATE; as the table owner the test switches it off for one statement.
    const client = await t.database.pool.connect();
    try {
      await client.query("alter table releases disable trigger user");
      await client.query(
        "update releases set bundle = overlay(bundle placing '\\x00'::bytea from 200 for 1) where id = $1",
        [victim.release.id],
      );
      await client.query("alter table releases enable trigger user");
    } finally {
      client.release();
    }
    const res = await firmware.get(`/api/releases/${victim.release.id}/bundle`);
    const err = expectError(res, 500, "bundle_corrupt" as never);
    expect(err.message).toMatch(/does not match/);
    const audit = await t.database.pool.query(
      "select actor_kind, details->>'storedSha256' as stored from audit_events where action = 'release.bundle-corrupt' and subject_id = $1",
      [String(victim.release.id)],
    );
    expect(audit.rows).toEqual([{ actor_kind: "user", stored: victim.release.bundleSha256 }]);
    const served = await t.database.pool.query(
      "select count(*)::int as n from audit_events where action = 'release.download' and subject_id = $1",
      [String(victim.release.id)],
    );
    expect(served.rows[0].n).toBe(0);
  });

  it("answers 401 without a session or token, 404 to non-members and for unknown releases", async () => {
    expectError(
      await request(t.app).get(`/api/releases/${waveform.release.id}/bundle`),
      401,
      "unauthenticated",
    );
    const outsider = await signedIn(
      t.app,
      (await addUser(t.database, "outsider-bs", ["firmware"], [])) && "outsider-bs",
    );
    expectError(await outsider.get(`/api/releases/${waveform.release.id}/bundle`), 404, "not_found");
    expectError(await firmware.get("/api/releases/999999/bundle"), 404, "not_found");
  });
});
