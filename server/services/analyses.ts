/**
 * Analysis reports keyed by project and content hash: request (enqueue once), status, the stored report with
 * its header, and the row updates the worker makes. Same content in the same project → the stored report is
 * reused; another project with the same content gets a row (state, times) of its own, so a report never tells
 * one project what another holds.
 */
import { and, asc, eq, inArray, sql } from "drizzle-orm";
import { toAnalysisSpec } from "../../shared/analysis-spec";
import { analyze, type AnalysisReport } from "../../shared/dsp/analysis";
import type { AnalysisStatus, ReportHeader } from "../../shared/schemas/analyses";
import type { RevisionContent } from "../../shared/schemas/designs";
import type { Db } from "../db/client";
import { analysisReports, coefficientTables, designs, revisions } from "../db/schema";
import { HttpError } from "../http/errors";
import { contentHash } from "./content-hash";
import type { Viewer } from "./projects";
import { decodeValues } from "./materialize";
import { getRevision } from "./revisions";

type Row = typeof analysisReports.$inferSelect;

/** The API's view of a row; the report only once done. */
export function toStatus(row: Row): AnalysisStatus {
  return {
    contentHash: row.contentHash,
    state: row.state,
    progress: row.progress,
    stage: row.stage,
    error: row.error,
    queuedAt: row.queuedAt.toISOString(),
    startedAt: row.startedAt?.toISOString() ?? null,
    finishedAt: row.finishedAt?.toISOString() ?? null,
    durationMs: row.durationMs,
    softwareVersion: row.softwareVersion,
    report: row.state === "done" ? (row.report as AnalysisStatus["report"]) : null,
  };
}

/** The revision's content hash: fixed once submitted; for a draft computed now from content + tables. */
export async function currentContentHash(db: Db, revisionId: number): Promise<string> {
  const [rev] = await db
    .select({ content: revisions.content, hash: revisions.contentHash })
    .from(revisions)
    .where(eq(revisions.id, revisionId));
  if (!rev) throw new HttpError("not_found", "No such revision");
  if (rev.hash) return rev.hash;
  const tables = await db
    .select({
      role: coefficientTables.role,
      position: coefficientTables.position,
      sampleRateHz: coefficientTables.sampleRateHz,
      complex: coefficientTables.complex,
      valuesSha256: coefficientTables.valuesSha256,
    })
    .from(coefficientTables)
    .where(eq(coefficientTables.revisionId, revisionId));
  return contentHash(rev.content, tables);
}

async function rowByHash(db: Db, projectId: number, hash: string): Promise<Row | undefined> {
  const [row] = await db
    .select()
    .from(analysisReports)
    .where(and(eq(analysisReports.projectId, projectId), eq(analysisReports.contentHash, hash)));
  return row;
}

/** The project a revision belongs to. */
async function projectOfRevision(db: Db, revisionId: number): Promise<number | undefined> {
  const [row] = await db
    .select({ projectId: designs.projectId })
    .from(revisions)
    .innerJoin(designs, eq(designs.id, revisions.designId))
    .where(eq(revisions.id, revisionId));
  return row?.projectId;
}

/** The queue as the service needs it (server/jobs/queue.ts). */
export interface AnalysisQueue {
  send(data: { contentHash: string; revisionId: number }): Promise<unknown>;
  /** Whether pg-boss still holds a waiting or active job for the hash. */
  isLive(contentHash: string): Promise<boolean>;
}

/**
 * POST /api/revisions/:id/analysis: enqueue the analysis of the revision's current content unless it is
 * already queued, running or done; a failed one is queued again.
 */
export async function requestAnalysis(
  db: Db,
  viewer: Viewer,
  revisionId: number,
  queue: AnalysisQueue,
): Promise<AnalysisStatus> {
  const { project } = await getRevision(db, viewer, revisionId); // membership: non-members get 404
  const hash = await currentContentHash(db, revisionId);
  const [inserted] = await db
    .insert(analysisReports)
    .values({ projectId: project.id, contentHash: hash, revisionId })
    .onConflictDoNothing({ target: [analysisReports.projectId, analysisReports.contentHash] })
    .returning();
  let row = inserted ?? (await rowByHash(db, project.id, hash));
  if (!row) throw new Error(`analysis row for ${hash} vanished`);
  // A row left queued or running by a job pg-boss gave up on (every attempt's worker lost): queue it again.
  const stale = (row.state === "queued" || row.state === "running") && !(await queue.isLive(hash));
  if (row.state === "failed" || stale) {
    const [requeued] = await db
      .update(analysisReports)
      .set({
        state: "queued",
        progress: 0,
        stage: null,
        error: null,
        queuedAt: new Date(),
        startedAt: null,
        finishedAt: null,
        durationMs: null,
      })
      .where(and(eq(analysisReports.id, row.id), eq(analysisReports.state, row.state)))
      .returning();
    row = requeued ?? row;
  }
  // Queued (new, re-queued, or a send that failed before): send; pg-boss collapses a duplicate waiting job.
  if (row.state === "queued") await queue.send({ contentHash: hash, revisionId });
  return toStatus(row);
}

/** GET /api/revisions/:id/analysis: the analysis of the revision's current content, or null. */
export async function getAnalysis(
  db: Db,
  viewer: Viewer,
  revisionId: number,
): Promise<AnalysisStatus | null> {
  const { project } = await getRevision(db, viewer, revisionId);
  const row = await rowByHash(db, project.id, await currentContentHash(db, revisionId));
  return row ? toStatus(row) : null;
}

/** The stored report of the revision's current content with its header (404 until one is done). */
export async function getReportDocument(
  db: Db,
  viewer: Viewer,
  revisionId: number,
): Promise<{ header: ReportHeader; report: AnalysisReport }> {
  const detail = await getRevision(db, viewer, revisionId);
  const hash = await currentContentHash(db, revisionId);
  const row = await rowByHash(db, detail.project.id, hash);
  if (!row || row.state !== "done" || !row.report || !row.finishedAt)
    throw new HttpError(
      "not_found",
      "This revision's content has no finished analysis yet: run the analysis first",
    );
  return {
    header: {
      project: detail.project.name,
      design: detail.design.name,
      revision: `r${detail.revision.number}`,
      contentHash: hash,
      // The finish time, not the download time, so the same report renders to the same bytes.
      generatedAt: row.finishedAt.toISOString(),
      softwareVersion: row.softwareVersion ?? "unknown",
    },
    report: row.report as AnalysisReport,
  };
}

/** What the worker needs of a revision: content, tables with their stored values, and the hash now. */
export async function loadRevisionForJob(db: Db, revisionId: number) {
  const [rev] = await db
    .select({ content: revisions.content })
    .from(revisions)
    .where(eq(revisions.id, revisionId));
  if (!rev) return undefined;
  const tables = await db
    .select()
    .from(coefficientTables)
    .where(eq(coefficientTables.revisionId, revisionId))
    .orderBy(asc(coefficientTables.position));
  return { content: rev.content as RevisionContent, tables, hash: contentHash(rev.content, tables) };
}

/** Worker: claim a row (any state but done); returns false when a report is already stored. */
export async function markRunning(db: Db, hash: string): Promise<boolean> {
  const rows = await db
    .update(analysisReports)
    .set({
      state: "running",
      progress: 0,
      stage: "load",
      error: null,
      startedAt: new Date(),
      finishedAt: null,
      attempts: sql`${analysisReports.attempts} + 1`,
    })
    .where(
      and(
        eq(analysisReports.contentHash, hash),
        inArray(analysisReports.state, ["queued", "running", "failed"]),
      ),
    )
    .returning({ id: analysisReports.id });
  // One row per project holding this content: the job computes once for all that are waiting.
  return rows.length > 0;
}

/** Worker: progress of a running analysis. */
export async function markProgress(db: Db, hash: string, progress: number, stage: string): Promise<void> {
  await db
    .update(analysisReports)
    .set({ progress: Math.min(1, Math.max(0, progress)), stage })
    .where(and(eq(analysisReports.contentHash, hash), eq(analysisReports.state, "running")));
}

/** Worker: store the finished report. */
export async function markDone(
  db: Db,
  hash: string,
  report: AnalysisReport,
  softwareVersion: string,
  startedMs: number,
): Promise<void> {
  await db
    .update(analysisReports)
    .set({
      state: "done",
      progress: 1,
      stage: "done",
      report,
      reportVersion: report.version,
      softwareVersion,
      finishedAt: new Date(),
      durationMs: Math.round(performance.now() - startedMs),
    })
    // A project's finished report keeps its own times.
    .where(and(eq(analysisReports.contentHash, hash), sql`${analysisReports.state} <> 'done'`));
}

/** Worker: record why an analysis failed (never overwrites a stored report). */
export async function markFailed(
  db: Db,
  hash: string,
  reason: string,
  softwareVersion: string,
): Promise<void> {
  await db
    .update(analysisReports)
    .set({ state: "failed", error: reason, stage: null, finishedAt: new Date(), softwareVersion })
    .where(and(eq(analysisReports.contentHash, hash), sql`${analysisReports.state} <> 'done'`));
}

/**
 * Analyse a revision's current content on this thread and store the report (no queue); returns the hash.
 * For the demo seed and the API tests, whose revisions are small: the server's routes still use the queue.
 */
export async function analyseInProcess(db: Db, revisionId: number, softwareVersion: string): Promise<string> {
  const input = await loadRevisionForJob(db, revisionId);
  if (!input) throw new Error(`no revision ${revisionId}`);
  const projectId = await projectOfRevision(db, revisionId);
  if (projectId === undefined) throw new Error(`no revision ${revisionId}`);
  await db
    .insert(analysisReports)
    .values({ projectId, contentHash: input.hash, revisionId })
    .onConflictDoNothing();
  // markRunning refuses a hash that is already done, so a second call stores nothing new.
  if (await markRunning(db, input.hash)) {
    const started = performance.now();
    const spec = toAnalysisSpec(
      input.content,
      input.tables.map((t) => ({ role: t.role, ...decodeValues(t.values) })),
    );
    await markDone(db, input.hash, analyze(spec), softwareVersion, started);
  }
  return input.hash;
}
