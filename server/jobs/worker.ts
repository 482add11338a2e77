/**
 * An analysis worker: pg-boss consumers (one per thread) over a pool of worker threads. `npm start` runs
 * one in-process; `npm run worker` runs one alone; any number may share one DATABASE_URL.
 */
import type PgBoss from "pg-boss";
import type { Logger } from "pino";
import type { Database } from "../db/client";
import { runAnalysisJob } from "./analysis-job";
import type { JobsConfig } from "./config";
import { ANALYSIS_QUEUE, bossOver, ensureAnalysisQueue, type AnalysisJobData } from "./queue";
import { AnalysisThreadPool } from "./thread-pool";

/** A running worker. */
export interface AnalysisWorker {
  boss: PgBoss;
  /** Stop taking jobs, let the running ones finish (pg-boss graceful stop), then end the threads. */
  stop(timeoutMs?: number): Promise<void>;
}

/** Options of startAnalysisWorker. */
export interface AnalysisWorkerOptions {
  database: Database;
  config: JobsConfig;
  softwareVersion: string;
  logger: Logger;
}

/** Start consuming the analysis queue. */
export async function startAnalysisWorker(opts: AnalysisWorkerOptions): Promise<AnalysisWorker> {
  const { config, logger } = opts;
  const boss = bossOver(opts.database.pool, {
    supervise: true,
    schedule: false,
    migrate: true,
    maintenanceIntervalSeconds: config.ANALYSIS_MAINTENANCE_SECONDS,
  });
  boss.on("error", (err) => logger.error({ err }, "analysis queue error"));
  await boss.start();
  await ensureAnalysisQueue(boss, config);
  const threads = new AnalysisThreadPool(config.ANALYSIS_THREADS);
  const deps = { db: opts.database.db, threads, softwareVersion: opts.softwareVersion, logger };
  // pg-boss 10 has no local concurrency option: one consumer per thread, each taking one job at a time.
  for (let i = 0; i < config.ANALYSIS_THREADS; i++) {
    await boss.work<AnalysisJobData>(
      ANALYSIS_QUEUE,
      { batchSize: 1, includeMetadata: true, pollingIntervalSeconds: config.ANALYSIS_POLL_SECONDS },
      async ([job]) => {
        if (!job) return;
        await runAnalysisJob(deps, job.data, { retryCount: job.retryCount, retryLimit: job.retryLimit });
      },
    );
  }
  logger.info(`analysis worker: ${config.ANALYSIS_THREADS} thread(s) on queue "${ANALYSIS_QUEUE}"`);
  let stopping: Promise<void> | undefined;
  return {
    boss,
    stop(timeoutMs = 30_000) {
      stopping ??= (async () => {
        // wait: true (the default) resolves only after running handlers finished or the timeout passed.
        await boss.stop({ graceful: true, close: false, timeout: timeoutMs });
        await threads.close();
      })();
      return stopping;
    },
  };
}
