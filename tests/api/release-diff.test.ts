// Release diff over HTTP and as pure functions: spec fields that changed, the largest coefficient change in
// LSB per table (checked against the exact decimals of the two bundles' CSV files, read with decimal.js and
// unzipped by Debian's unzip), and the report figures side by side (checked against the bundles' report.json).
import Decimal from "decimal.js";
import { beforeAll, describe, expect, it } from "vitest";
import { ReleaseDiffSchema, type ReleaseDiff } from "../../shared/schemas/release-diff";
import { ReleaseResponseSchema, type Release } from "../../shared/schemas/releases";
import { quantize } from "../../shared/dsp/quantize";
import type { FixedPointSpec } from "../../shared/dsp/types";
import { tableChange } from "../../server/services/release-diff";
import { bundleOf, releasedDesign, unzipToTemp } from "./bundles-helpers";
import { addUser, barker13, expectStatus, finishAnalysis } from "./lifecycle-helpers";
import { expectError, signedIn, useApiTestDatabase, type Agent } from "./helpers";

const t = useApiTestDatabase();

const spec = (
  wordLength: number,
  fractionLength: number,
  extra: Partial<FixedPointSpec> = {},
): FixedPointSpec => ({
  wordLength,
  fractionLength,
  signed: true,
  scaling: "as-given",
  rounding: "nearest-even",
  overflow: "saturate",
  ...extra,
});
const signal = (re: number[], im = re.map(() => 0)) => ({
  re: Float64Array.from(re),
  im: Float64Array.from(im),
});

describe("tableChange (pure)", () => {
  it("same format: the largest |code difference|, I and Q counted separately", () => {
    // as-given at F = 3: codes are x·8 exactly (hand-computed): [8, −4, 2] vs [8, −1, 2], Q [0, 3, 0] vs [0, 3, 1].
    const a = quantize(signal([1, -0.5, 0.25], [0, 0.375, 0]), spec(8, 3));
    const b = quantize(signal([1, -0.125, 0.25], [0, 0.375, 0.125]), spec(8, 3));
    expect(tableChange("rx", a, b)).toEqual({
      table: "rx",
      lengthFrom: 3,
      lengthTo: 3,
      changedWords: 2,
      maxChangeLsb: 3,
      atIndex: 1,
    });
  });

  it("a wider fraction: the old words are rescaled into the new LSB before comparing", () => {
    // 0.75 at F = 2 is code 3; at F = 5 code 24; 0.75·2^5 − 24 = 0, so no change. 0.3 rounds to 1 at F = 2
    // (0.25) and to 10 at F = 5 (0.3125): |10 − 1·2^3| = 2 LSB of F = 5 (hand-computed).
    const a = quantize(signal([0.75, 0.3]), spec(8, 2));
    const b = quantize(signal([0.75, 0.3]), spec(8, 5));
    expect(tableChange("fir", a, b)).toMatchObject({ changedWords: 1, maxChangeLsb: 2, atIndex: 1 });
  });

  it("a table on one side only has no figures", () => {
    const a = quantize(signal([0.5]), spec(8, 3));
    expect(tableChange("tx", a, undefined)).toEqual({
      table: "tx",
      lengthFrom: 1,
      lengthTo: null,
      changedWords: null,
      maxChangeLsb: null,
      atIndex: null,
    });
  });
});

describe("GET /api/releases/:id/diff", () => {
  let author: Agent;
  let firmware: Agent;
  let first: Release;
  let second: Release;
  let diff: ReleaseDiff;

  beforeAll(async () => {
    // 1.0.0: Barker-13, Q1.15 both ways. 1.1.0: the receive table narrowed to Q1.11.
    const r = await releasedDesign(t, barker13, "1.0.0");
    author = r.author;
    first = r.release;
    firmware = await signedIn(t.app, "firmware");
    const r2 = await author.post(`/api/designs/${r.designId}/revisions`);
    expectStatus(r2, 201, "new revision");
    const r2Id = (r2.body as { revision: { id: number } }).revision.id;
    const content = {
      ...barker13,
      fixedPoint: { tx: { wordLength: 16, fractionLength: 15 }, rx: { wordLength: 12, fractionLength: 11 } },
    };
    expectStatus(await author.patch(`/api/revisions/${r2Id}`).send({ content }), 200, "edit");
    await finishAnalysis(t.database, r2Id);
    expectStatus(await author.post(`/api/revisions/${r2Id}/submit`), 200, "submit");
    expectStatus(
      await r.reviewer.post(`/api/revisions/${r2Id}/decision`).send({ decision: "approved" }),
      201,
      "approve",
    );
    const rel = await author
      .post(`/api/revisions/${r2Id}/release`)
      .send({ version: "1.1.0", notes: "Receive words narrowed to 12 bits." });
    expectStatus(rel, 201, "release 1.1.0");
    second = ReleaseResponseSchema.parse(rel.body).release;
    const res = await firmware.get(`/api/releases/${second.id}/diff?against=${first.id}`);
    expectStatus(res, 200, "diff");
    diff = ReleaseDiffSchema.parse((res.body as { diff: unknown }).diff);
  }, 120_000);

  it("names both sides and lists exactly the rx spec fields and gain that changed", () => {
    expect(diff.from).toMatchObject({
      id: first.id,
      version: "1.0.0",
      revisionNumber: 1,
      contentHash: first.contentHash,
    });
    expect(diff.to).toMatchObject({
      id: second.id,
      version: "1.1.0",
      revisionNumber: 2,
      contentHash: second.contentHash,
    });
    expect(diff.sameContent).toBe(false);
    expect(diff.kind).toBe("waveform");
    // Full-scale gain maps the peak 1 to the largest code: (2^(W−1) − 1)/2^(W−1) at F = W − 1 (derived).
    expect(diff.spec).toEqual([
      { table: "rx", field: "wordLength", from: 16, to: 12 },
      { table: "rx", field: "fractionLength", from: 15, to: 11 },
      { table: "rx", field: "gain", from: 32767 / 32768, to: 2047 / 2048 },
    ]);
  });

  it("max coefficient change: 0.9375 LSB on rx, 0 on tx — equal to the bundles' exact decimals", () => {
    // Derived: every Barker tap is ±1, so ±(1 − 2^−15) becomes ±(1 − 2^−11); the difference 2^−11 − 2^−15 is
    // 1 − 2^−4 = 0.9375 LSB of Q1.11, on all 13 taps (real table: Q words are 0 on both sides).
    const rx = diff.tables.find((x) => x.table === "rx");
    const tx = diff.tables.find((x) => x.table === "tx");
    expect(rx).toEqual({
      table: "rx",
      lengthFrom: 13,
      lengthTo: 13,
      changedWords: 13,
      maxChangeLsb: 0.9375,
      atIndex: 0,
    });
    expect(tx).toEqual({
      table: "tx",
      lengthFrom: 13,
      lengthTo: 13,
      changedWords: 0,
      maxChangeLsb: 0,
      atIndex: null,
    });
  });

  it("the LSB figures agree with the released CSV files, recomputed with exact decimals", async () => {
    const [a, b] = await Promise.all([bundleOf(firmware, first.id), bundleOf(firmware, second.id)]);
    const ua = unzipToTemp(a.body);
    const ub = unzipToTemp(b.body);
    try {
      for (const role of ["tx", "rx"]) {
        const rows = (u: typeof ua) => {
          // The manifest names each table's rendered files by template id.
          const manifest = JSON.parse(u.read("manifest.json").toString("utf8")) as {
            tables: { role: string; exports: { template: string; path: string }[] }[];
          };
          const file = manifest.tables
            .find((x) => x.role === role)!
            .exports.find((e) => e.template === "csv")!.path;
          const csv = u.read(file).toString("utf8").trim().split("\n").slice(1);
          // Complex-capable header: index,i_code,i_exact,i_float,q_code,q_exact,q_float, or index,code,exact,float.
          return csv.map((line) => {
            const c = line.split(",");
            return c.length >= 7 ? [new Decimal(c[2]!), new Decimal(c[5]!)] : [new Decimal(c[2]!)];
          });
        };
        const ra = rows(ua);
        const rb = rows(ub);
        const fTo = role === "rx" ? 11 : 15;
        let max = new Decimal(0);
        ra.forEach((wa, i) =>
          wa.forEach(
            (v, k) => (max = Decimal.max(max, rb[i]![k]!.minus(v).abs().times(new Decimal(2).pow(fTo)))),
          ),
        );
        expect(diff.tables.find((x) => x.table === role)!.maxChangeLsb, role).toBe(max.toNumber());
      }
    } finally {
      ua.cleanup();
      ub.cleanup();
    }
  });

  it("metric changes match the two bundles' report.json, and Barker-13 PSL is 20·log10(1/13)", async () => {
    const [a, b] = await Promise.all([bundleOf(firmware, first.id), bundleOf(firmware, second.id)]);
    const ua = unzipToTemp(a.body);
    const ub = unzipToTemp(b.body);
    try {
      type Doc = { report: { float: Record<string, number | null>; fixed: Record<string, number | null> } };
      const ra = (JSON.parse(ua.read("report/report.json").toString("utf8")) as Doc).report;
      const rb = (JSON.parse(ub.read("report/report.json").toString("utf8")) as Doc).report;
      const psl = diff.metrics.find((m) => m.key === "pslDb")!;
      expect(psl.from).toEqual({ float: ra.float.pslDb, fixed: ra.fixed.pslDb });
      expect(psl.to).toEqual({ float: rb.float.pslDb, fixed: rb.fixed.pslDb });
      expect(psl.deltaFixed).toBe(rb.fixed.pslDb! - ra.fixed.pslDb!);
      // Richards, Fundamentals of Radar Signal Processing, 2nd ed., 2014, Table 4.1: Barker-13 PSL −22.28 dB.
      expect(psl.to.float).toBeCloseTo(20 * Math.log10(1 / 13), 9);
      expect(psl.to.float).toBeCloseTo(-22.28, 2);
      for (const m of diff.metrics.filter((x) => !x.key.startsWith("coefficientSqnrDb.")))
        expect(m.from.fixed, m.key).toBe(ra.fixed[m.key] ?? null);
      expect(diff.metrics.some((m) => m.key === "coefficientSqnrDb.rx")).toBe(true);
    } finally {
      ua.cleanup();
      ub.cleanup();
    }
  });

  it("against itself: same content, no changes", async () => {
    const res = await firmware.get(`/api/releases/${second.id}/diff?against=${second.id}`);
    expectStatus(res, 200);
    const d = ReleaseDiffSchema.parse((res.body as { diff: unknown }).diff);
    expect(d.sameContent).toBe(true);
    expect(d.spec).toEqual([]);
    expect(d.tables.every((x) => x.maxChangeLsb === 0 && x.changedWords === 0)).toBe(true);
    expect(d.metrics.every((m) => m.deltaFixed === 0 || m.deltaFixed === null)).toBe(true);
  });

  it("refuses other designs (400), strangers (404), a bad id (400) and no session (401)", async () => {
    const other = await releasedDesign(t, barker13, "1.0.0");
    const err = expectError(
      await firmware.get(`/api/releases/${second.id}/diff?against=${other.release.id}`),
      400,
      "bad_request",
    );
    expect(err.details).toMatchObject({ reason: "different_design" });
    await addUser(t.database, "diff-outsider", ["firmware"], ["harbour-lidar-trials"]);
    const outsider = await signedIn(t.app, "diff-outsider");
    expectError(await outsider.get(`/api/releases/${second.id}/diff?against=${first.id}`), 404, "not_found");
    expectError(await firmware.get(`/api/releases/${second.id}/diff?against=x`), 400, "validation_failed");
    expectError(await firmware.get(`/api/releases/${second.id}/diff`), 400, "validation_failed");
    const anonymous = await (
      await import("supertest")
    )
      .default(t.app)
      .get(`/api/releases/${second.id}/diff?against=${first.id}`);
    expect(anonymous.status).toBe(401);
  }, 60_000);
});
