/**
 * One analysis job: claim the row, build the spec from the revision's content and tables, run `analyze`
 * in a worker thread, stream progress to the row (throttled), store the report. Idempotent: a hash that is
 * already done is skipped. A refused spec fails the row at once; lost threads or database errors are
 * rethrown so pg-boss retries, and the row fails with the reason on the last attempt.
 */
import type { Logger } from "pino";
import { toAnalysisSpec } from "../../shared/analysis-spec";
import type { Db } from "../db/client";
import { decodeValues } from "../services/materialize";
import { loadRevisionForJob, markDone, markFailed, markProgress, markRunning } from "../services/analyses";
import type { AnalysisJobData } from "./queue";
import { AnalysisRejected, type AnalysisThreadPool } from "./thread-pool";
import { describeAnalysisError } from "./thread-protocol";

/** What the handler needs. */
export interface AnalysisJobDeps {
  db: Db;
  threads: AnalysisThreadPool;
  softwareVersion: string;
  logger: Logger;
  /** Minimum time between progress writes to the row. */
  progressIntervalMs?: number;
}

/** Where the job is in pg-boss's retry count. */
export interface AttemptInfo {
  retryCount: number;
  retryLimit: number;
}

/** Run one job; resolves when the row is done or failed for good, rejects to ask pg-boss for a retry. */
export async function runAnalysisJob(
  deps: AnalysisJobDeps,
  data: AnalysisJobData,
  attempt: AttemptInfo,
): Promise<void> {
  const { db, logger } = deps;
  const hash = data.contentHash;
  if (!(await markRunning(db, hash))) {
    logger.info({ hash }, "analysis already done (or no row): nothing to do");
    return;
  }
  const started = performance.now();
  const fail = (reason: string) => markFailed(db, hash, reason, deps.softwareVersion);
  try {
    const input = await loadRevisionForJob(db, data.revisionId);
    if (!input) return await fail(`Revision ${data.revisionId} no longer exists`);
    if (input.hash !== hash)
      return await fail("The draft changed after this analysis was requested: request the analysis again");
    let spec: unknown;
    try {
      spec = toAnalysisSpec(
        input.content,
        input.tables.map((t) => ({ role: t.role, ...decodeValues(t.values) })),
      );
    } catch (e) {
      return await fail(describeAnalysisError(e));
    }

    // Progress: one write at a time, at most every interval, none after the end.
    const interval = deps.progressIntervalMs ?? 250;
    let last = 0;
    let writing: Promise<void> = Promise.resolve();
    let finished = false;
    const onProgress = (fraction: number, stage: string) => {
      const now = performance.now();
      if (finished || now - last < interval) return;
      last = now;
      writing = writing
        .then(() => (finished ? undefined : markProgress(db, hash, fraction, stage)))
        .catch(() => undefined);
    };
    try {
      const report = await deps.threads.run(spec, onProgress);
      finished = true;
      await writing;
      await markDone(db, hash, report, deps.softwareVersion, started);
      logger.info({ hash, ms: Math.round(performance.now() - started) }, "analysis done");
    } finally {
      finished = true;
      await writing;
    }
  } catch (e) {
    if (e instanceof AnalysisRejected) return await fail(e.message);
    const reason = `The analysis could not finish: ${describeAnalysisError(e)}`;
    logger.warn({ hash, err: e, attempt: attempt.retryCount }, "analysis attempt failed");
    if (attempt.retryCount >= attempt.retryLimit) await fail(reason).catch(() => undefined);
    throw e;
  }
}
