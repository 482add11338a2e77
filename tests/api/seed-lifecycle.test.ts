// The demo life cycle seed (server/db/seed-lifecycle.ts) on a template-seeded database: the states and versions
// the README promises, bundles whose SHA-256 (node:crypto, not the app's code path) matches their bytes, a
// second run that changes no row count, the reviewer's queue and the firmware release diff over HTTP.
import { createHash } from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import type { AnalysisReport } from "../../shared/dsp/analysis";
import { ReleaseDiffSchema } from "../../shared/schemas/release-diff";
import { QueueItemSchema } from "../../shared/schemas/reviews";
import { DEMO_LIFECYCLE_PLAN, DEMO_LFM_R2_RX_BITS, seedDemoLifecycle } from "../../server/db/seed-lifecycle";
import { DEMO_DESIGNS } from "../../server/db/seed-designs";
import { expectStatus } from "./lifecycle-helpers";
import { signedIn, useApiTestDatabase } from "./helpers";

const t = useApiTestDatabase();
const q = <T extends Record<string, unknown>>(sql: string, params: unknown[] = []) =>
  t.database.pool.query<T>(sql, params).then((r) => r.rows);
const [LFM, BARKER, NLFM, FIR] = DEMO_DESIGNS.map((d) => d.name) as [string, string, string, string];

/** Every revision of the demo project: design name, number, state, release version (or null). */
const revisionRows = () =>
  q<{ design: string; number: number; state: string; version: string | null }>(
    `select d.name as design, r.number, r.state, rel.version
       from revisions r join designs d on d.id = r.design_id join projects p on p.id = d.project_id
       left join releases rel on rel.revision_id = r.id
      where p.slug = 'coastwatch-s'`,
  ).then((rows) => rows.sort(byDesignThenNumber));

/** Sorted in JS, so the database's collation plays no part. */
function byDesignThenNumber(
  a: { design: string; number: number },
  b: { design: string; number: number },
): number {
  return a.design === b.design ? a.number - b.number : a.design < b.design ? -1 : 1;
}

const counts = async () =>
  Object.fromEntries(
    await Promise.all(
      ["revisions", "releases", "analysis_reports", "reviews", "coefficient_tables"].map(async (table) => {
        const [row] = await q<{ n: number }>(`select count(*)::int as n from ${table}`);
        return [table, row!.n] as const;
      }),
    ),
  );

beforeAll(async () => {
  await seedDemoLifecycle(t.database.db, "test-seed");
}, 120_000);

describe("seedDemoLifecycle", () => {
  it("leaves each demo design where the plan says", async () => {
    expect(await revisionRows()).toEqual(
      [
        { design: FIR, number: 1, state: "released", version: "1.0.0" },
        { design: LFM, number: 1, state: "released", version: "1.0.0" },
        { design: LFM, number: 2, state: "released", version: "1.1.0" },
        { design: NLFM, number: 1, state: "draft", version: null },
        { design: BARKER, number: 1, state: "in_review", version: null },
      ].sort(byDesignThenNumber),
    );
    // Every revision, the draft included, has a finished report for its content.
    const [missing] = await q<{ n: number }>(
      `select count(*)::int as n from revisions r
        where not exists (select 1 from analysis_reports a where a.revision_id = r.id and a.state = 'done')`,
    );
    expect(missing!.n).toBe(0);
    // Approvals by the reviewer (not the submitter), with the plan's comment.
    const approvals = await q<{ comment: string; reviewer: string; submitter: string }>(
      `select v.comment, ru.username as reviewer, su.username as submitter from reviews v
         join revisions r on r.id = v.revision_id join users ru on ru.id = v.reviewer_id join users su on su.id = r.submitted_by
        where v.decision = 'approved'`,
    );
    expect(approvals).toHaveLength(3);
    for (const a of approvals)
      expect([a.reviewer, a.submitter, a.comment.length > 0]).toEqual(["reviewer", "author", true]);
  });

  it("stores bundles whose SHA-256 and size match their bytes, also as downloaded", async () => {
    const rows = await q<{ id: number; bundle: Buffer; bundle_sha256: string; bundle_size: number }>(
      "select id, bundle, bundle_sha256, bundle_size from releases order by id",
    );
    expect(rows).toHaveLength(3);
    const firmware = await signedIn(t.app, "firmware");
    for (const r of rows) {
      const sha = createHash("sha256").update(r.bundle).digest("hex");
      expect(sha).toBe(r.bundle_sha256);
      expect(r.bundle.byteLength).toBe(r.bundle_size);
      const res = await firmware
        .get(`/api/releases/${r.id}/bundle`)
        .buffer(true)
        .parse((resp, done) => {
          const chunks: Buffer[] = [];
          resp.on("data", (c: Buffer) => chunks.push(c));
          resp.on("end", () => done(null, Buffer.concat(chunks)));
        });
      expectStatus(res, 200, `bundle ${r.id}`);
      expect(
        createHash("sha256")
          .update(res.body as Buffer)
          .digest("hex"),
      ).toBe(r.bundle_sha256);
    }
  });

  it("r2 of the long pulse narrows the receive table by two bits: about 12 dB less coefficient SQNR", async () => {
    const reports = await q<{ number: number; report: AnalysisReport }>(
      `select r.number, a.report from revisions r join designs d on d.id = r.design_id
         join analysis_reports a on a.content_hash = r.content_hash where d.name = $1 order by r.number`,
      [LFM],
    );
    const rx = reports.map((r) => r.report.tables.find((x) => x.role === "rx")!);
    expect(rx.map((x) => x.fixedPoint.wordLength)).toEqual([16, DEMO_LFM_R2_RX_BITS]);
    // Uniform quantization noise: SQNR rises 20·log10(2) = 6.02 dB per bit (Widrow & Kollár, "Quantization
    // Noise", 2008; chapter from memory), so two bits are 12.04 dB; measured 11.88 dB for these tables.
    const drop = rx[0]!.coefficientSqnrDb! - rx[1]!.coefficientSqnrDb!;
    expect(Math.abs(drop - 40 * Math.log10(2))).toBeLessThan(0.5);
  });

  it("puts the Barker-13 revision in the reviewer's queue", async () => {
    const reviewer = await signedIn(t.app, "reviewer");
    const res = await reviewer.get("/api/reviews/queue");
    expectStatus(res, 200, "queue");
    const items = QueueItemSchema.array().parse((res.body as { items: unknown }).items);
    expect(items.map((i) => [i.designName, i.revisionNumber, i.canDecide])).toEqual([[BARKER, 1, true]]);
  });

  it("gives the firmware release page a diff: rx word length 16 → 14 between 1.0.0 and 1.1.0", async () => {
    const ids = await q<{ id: number; version: string }>(
      "select rel.id, rel.version from releases rel join designs d on d.id = rel.design_id where d.name = $1 order by rel.id",
      [LFM],
    );
    const firmware = await signedIn(t.app, "firmware");
    const res = await firmware.get(`/api/releases/${ids[1]!.id}/diff?against=${ids[0]!.id}`);
    expectStatus(res, 200, "diff");
    const diff = ReleaseDiffSchema.parse((res.body as { diff: unknown }).diff);
    expect(diff.sameContent).toBe(false);
    expect(diff.spec).toContainEqual({ table: "rx", field: "wordLength", from: 16, to: DEMO_LFM_R2_RX_BITS });
    expect(diff.spec.some((s) => s.table === "tx")).toBe(false);
  });

  it("changes nothing when run again (a warm npm start)", async () => {
    const before = await counts();
    const rowsBefore = await revisionRows();
    await seedDemoLifecycle(t.database.db, "test-seed");
    expect(await counts()).toEqual(before);
    expect(await revisionRows()).toEqual(rowsBefore);
    expect(before.revisions).toBe(DEMO_LIFECYCLE_PLAN.length);
  });
});
