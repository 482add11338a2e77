// Analysis jobs over HTTP: request → queue → worker thread → stored report, checked against the DSP core's
// `analyze` called here on the same input (no second implementation); reuse by content hash; failures with
// their reason; membership (404) and roles (403); the printable HTML and its header.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { analyze, type AnalysisReport } from "../../shared/dsp/analysis";
import { toAnalysisSpec } from "../../shared/analysis-spec";
import { AnalysisResponseSchema, ReportDocumentSchema } from "../../shared/schemas/analyses";
import { RevisionDetailSchema } from "../../shared/schemas/designs";
import type { AnalysisWorker } from "../../server/jobs/worker";
import { db as printDb } from "../../server/reports/format";
import { METRIC_LABELS } from "../../server/reports/metrics";
import { newDesign, pollAnalysis, taylorLfm, testWorker } from "./analysis-helpers";
import { countRows, tableValues } from "./designs-helpers";
import { expectError, failOnConsoleError, signedIn, type Agent } from "./helpers";
import { useApiTestDatabase } from "./helpers";

const t = useApiTestDatabase();
failOnConsoleError();

let worker: AnalysisWorker;
beforeAll(async () => {
  worker = await testWorker(t.database);
});
afterAll(async () => {
  await worker?.stop(5000);
});

const jobCount = async () =>
  (
    await t.database.pool.query<{ n: number }>(
      "select count(*)::int as n from pgboss.job where name = 'analysis'",
    )
  ).rows[0]!.n;

/** The report the DSP core computes for the revision's stored content and tables. */
async function expectedReport(agent: Agent, revisionId: number): Promise<AnalysisReport> {
  const detail = RevisionDetailSchema.parse((await agent.get(`/api/revisions/${revisionId}`)).body);
  const tables = [];
  for (const table of detail.tables)
    tables.push({ role: table.role, ...(await tableValues(agent, revisionId, table.id)) });
  // Through JSON, as the report is stored (jsonb) and served.
  return JSON.parse(JSON.stringify(analyze(toAnalysisSpec(detail.content, tables)))) as AnalysisReport;
}

describe("an analysis runs as a job and stores the DSP core's report", () => {
  let author: Agent;
  let revisionId: number;
  let expected: AnalysisReport;

  beforeAll(async () => {
    author = await signedIn(t.app, "author");
    revisionId = (await newDesign(t, author, taylorLfm)).revision.id;
    expected = await expectedReport(author, revisionId);
  });

  it("POST answers 202 queued; GET follows it to done with exactly analyze()'s numbers", async () => {
    expect((await author.get(`/api/revisions/${revisionId}/analysis`)).body).toEqual({ analysis: null });
    const res = await author.post(`/api/revisions/${revisionId}/analysis`);
    expect(res.status, JSON.stringify(res.body)).toBe(202);
    const queued = AnalysisResponseSchema.parse(res.body).analysis!;
    expect(queued.state).toMatch(/^(queued|running|done)$/);
    const done = (await pollAnalysis(author, revisionId, (a) => a?.state === "done"))!;
    expect(done.contentHash).toBe(queued.contentHash);
    expect(done.progress).toBe(1);
    expect(done.error).toBeNull();
    expect(done.softwareVersion).toBe("test-worker");
    expect(done.durationMs).toBeGreaterThan(0);
    expect(done.report).toEqual(expected);
    // docs/analysis.md worked example 1 (computed by the DSP core, not by this test): PSL −34.24 dB.
    expect(expected.fixed.pslDb).toBeCloseTo(-34.24, 2);
  });

  it("a second request for the same content reuses the stored report: no second row, no second job", async () => {
    const rows = await countRows(t.database.pool, "analysis_reports");
    const jobs = await jobCount();
    const again = await author.post(`/api/revisions/${revisionId}/analysis`);
    expect(again.status).toBe(202);
    expect(AnalysisResponseSchema.parse(again.body).analysis!.state).toBe("done");
    // Submitting fixes the same hash; r2 copies r1's content and tables, so it reuses the report too.
    expect((await author.post(`/api/revisions/${revisionId}/submit`)).status).toBe(200);
    const detail = RevisionDetailSchema.parse((await author.get(`/api/revisions/${revisionId}`)).body);
    const r2 = await author.post(`/api/designs/${detail.design.id}/revisions`);
    expect(r2.status, JSON.stringify(r2.body)).toBe(201);
    const r2Id = (r2.body as { revision: { id: number } }).revision.id;
    const reused = await author.post(`/api/revisions/${r2Id}/analysis`);
    expect(AnalysisResponseSchema.parse(reused.body).analysis).toMatchObject({
      state: "done",
      report: expected,
    });
    expect(await countRows(t.database.pool, "analysis_reports")).toBe(rows);
    expect(await jobCount()).toBe(jobs);
    expect(jobs).toBe(1);
  });

  it("report.json carries the header and the stored report", async () => {
    const res = await author.get(`/api/revisions/${revisionId}/report.json`);
    expect(res.status).toBe(200);
    const doc = ReportDocumentSchema.parse(res.body);
    const detail = RevisionDetailSchema.parse((await author.get(`/api/revisions/${revisionId}`)).body);
    expect(doc.header).toMatchObject({
      project: detail.project.name,
      design: detail.design.name,
      revision: "r1",
      softwareVersion: "test-worker",
    });
    expect(doc.header.contentHash).toMatch(/^[0-9a-f]{64}$/);
    expect(res.body.report).toEqual(expected);
  });

  it("report.html is self-contained and shows the header, every metric and analyze()'s figures", async () => {
    const res = await author.get(`/api/revisions/${revisionId}/report.html`);
    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toMatch(/^text\/html/);
    const html = res.text;
    const doc = ReportDocumentSchema.parse(
      (await author.get(`/api/revisions/${revisionId}/report.json`)).body,
    );
    for (const v of Object.values(doc.header)) expect(html).toContain(v);
    for (const key of Object.keys(expected.fixed)) {
      expect(html).toContain(key);
      expect(html).toContain(METRIC_LABELS[key]!.replace(/&/g, "&amp;").replace(/\|/g, "|"));
    }
    for (const key of ["pslDb", "islrDb", "mismatchLossDb"])
      expect(html).toContain(printDb(expected.fixed[key]));
    expect(html).toContain(`W = ${expected.sweep!.smallestPassingWordLength}`);
    expect(html).toMatch(/white noise/);
    expect(html).toContain(`U = ${expected.interpolation}`);
    expect(html).toContain("5 kHz");
    // No external assets: nothing with a src or href, no scripts.
    expect(html).not.toMatch(/<script|\ssrc=|\shref=|@import|url\(http/i);
    expect((html.match(/<svg /g) ?? []).length).toBeGreaterThanOrEqual(6);
  });
});

describe("failures and access", () => {
  it("a computation the DSP refuses fails with its reason, and a new request queues it again", async () => {
    const author = await signedIn(t.app, "author");
    const { revision } = await newDesign(t, author, taylorLfm);
    // Injected: a draft whose stored content the DSP's spec schema refuses (interpolation 99 > 16).
    await t.database.pool.query(
      `update revisions set content = jsonb_set(content, '{interpolation}', '99') where id = $1`,
      [revision.id],
    );
    expect((await author.post(`/api/revisions/${revision.id}/analysis`)).status).toBe(202);
    const failed = (await pollAnalysis(author, revision.id, (a) => a?.state === "failed"))!;
    expect(failed.error).toMatch(/^The analysis spec is not valid: interpolation: /);
    expect(failed.report).toBeNull();
    expectError(await author.get(`/api/revisions/${revision.id}/report.html`), 404, "not_found");
    const again = await author.post(`/api/revisions/${revision.id}/analysis`);
    expect(AnalysisResponseSchema.parse(again.body).analysis).toMatchObject({ state: "queued", error: null });
    await pollAnalysis(author, revision.id, (a) => a?.state === "failed");
  });

  it("a row left running by a job pg-boss gave up on is queued again by the next request", async () => {
    const author = await signedIn(t.app, "author");
    const { revision } = await newDesign(t, author, { ...taylorLfm, sweep: undefined });
    expect((await author.post(`/api/revisions/${revision.id}/analysis`)).status).toBe(202);
    const done = (await pollAnalysis(author, revision.id, (a) => a?.state === "done"))!;
    // Injected: the row says running but pg-boss holds no live job (as after retries exhausted by expiry).
    await t.database.pool.query(
      "update analysis_reports set state = 'running', report = null, progress = 0.4 where content_hash = $1",
      [done.contentHash],
    );
    const again = await author.post(`/api/revisions/${revision.id}/analysis`);
    expect(AnalysisResponseSchema.parse(again.body).analysis).toMatchObject({ state: "queued", progress: 0 });
    const redone = (await pollAnalysis(author, revision.id, (a) => a?.state === "done"))!;
    expect(redone.report).toEqual(done.report);
  });

  it("non-members get 404 on every analysis route; firmware gets 403 on POST; signed-out 401", async () => {
    const author = await signedIn(t.app, "author");
    // The reviewer is not a member of harbour-lidar-trials (demo seed).
    const { revision } = await newDesign(t, author, taylorLfm, "harbour-lidar-trials");
    const reviewer = await signedIn(t.app, "reviewer");
    expectError(await reviewer.post(`/api/revisions/${revision.id}/analysis`), 404, "not_found");
    expectError(await reviewer.get(`/api/revisions/${revision.id}/analysis`), 404, "not_found");
    expectError(await reviewer.get(`/api/revisions/${revision.id}/report.json`), 404, "not_found");
    expectError(await reviewer.get(`/api/revisions/${revision.id}/report.html`), 404, "not_found");
    const mine = (await newDesign(t, author, taylorLfm)).revision.id;
    const firmware = await signedIn(t.app, "firmware");
    expectError(await firmware.post(`/api/revisions/${mine}/analysis`), 403, "forbidden");
    expect((await firmware.get(`/api/revisions/${mine}/analysis`)).status).toBe(200);
    const { default: request } = await import("supertest");
    expectError(await request(t.app).get(`/api/revisions/${mine}/analysis`), 401, "unauthenticated");
    expectError(await author.get(`/api/revisions/0/analysis`), 400, "validation_failed");
  });
});
