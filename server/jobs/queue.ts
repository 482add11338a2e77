/**
 * The analysis queue on PostgreSQL (pg-boss 10). Web processes only send; worker processes (and the
 * in-process worker of `npm start`) work. Both talk to the database through the app's own pg pool.
 */
import PgBoss from "pg-boss";
import type pg from "pg";
import type { Db } from "../db/client";
import { jobsConfig, type JobsConfig } from "./config";

/** The pg-boss queue name. */
export const ANALYSIS_QUEUE = "analysis";

/** What a job carries: the report's key and the revision whose content it was computed from. */
export interface AnalysisJobData {
  contentHash: string;
  revisionId: number;
}

/** pg-boss over an existing pool, so the queue shares connections (and the test database) with the app. */
export function bossOver(pool: pg.Pool, options: Omit<PgBoss.ConstructorOptions, "db"> = {}): PgBoss {
  return new PgBoss({
    ...options,
    db: { executeSql: (text, values) => pool.query(text, values) },
  });
}

/**
 * Create the queue if missing. `stately` keeps at most one waiting and one active job per singleton key
 * (the content hash), so duplicate sends collapse; retries and expiry make a killed worker's job run again.
 * The first creator's settings stay (pg-boss's create is ON CONFLICT DO NOTHING).
 */
export async function ensureAnalysisQueue(
  boss: PgBoss,
  config: Pick<JobsConfig, "ANALYSIS_EXPIRE_SECONDS" | "ANALYSIS_RETRY_LIMIT">,
): Promise<void> {
  await boss.createQueue(ANALYSIS_QUEUE, {
    name: ANALYSIS_QUEUE,
    policy: "stately",
    retryLimit: config.ANALYSIS_RETRY_LIMIT,
    retryDelay: 1,
    expireInSeconds: config.ANALYSIS_EXPIRE_SECONDS,
  });
}

/** The pg pool behind a Drizzle handle (drizzle's node-postgres driver keeps it as `$client`). */
export function poolOf(db: Db): pg.Pool {
  const client = (db as unknown as { $client?: pg.Pool }).$client;
  if (!client || typeof client.query !== "function") throw new Error("the Drizzle handle exposes no pg pool");
  return client;
}

const senders = new WeakMap<pg.Pool, Promise<PgBoss>>();

/** A send-only pg-boss for this pool (no supervision, no schedules), started once and reused. */
export function senderFor(db: Db): Promise<PgBoss> {
  const pool = poolOf(db);
  let boss = senders.get(pool);
  if (!boss) {
    boss = (async () => {
      const b = bossOver(pool, { supervise: false, schedule: false, migrate: true });
      b.on("error", () => undefined); // send failures reach the caller through send()'s promise
      await b.start();
      await ensureAnalysisQueue(b, jobsConfig());
      return b;
    })();
    boss.catch(() => senders.delete(pool)); // a failed start is retried by the next request
    senders.set(pool, boss);
  }
  return boss;
}

/** Enqueue one analysis; returns the job id, or null when an identical job is already waiting. */
export async function sendAnalysis(boss: PgBoss, data: AnalysisJobData): Promise<string | null> {
  return boss.send(ANALYSIS_QUEUE, { ...data }, { singletonKey: data.contentHash });
}

/**
 * Is a job for this hash still waiting, retrying or active? False when pg-boss gave up on it (retries
 * exhausted by expiry, e.g. workers killed each time) while the row still says queued or running.
 */
export async function hasLiveJob(db: Db, contentHash: string): Promise<boolean> {
  const r = await poolOf(db).query(
    "select 1 from pgboss.job where name = $1 and singleton_key = $2 and state in ('created', 'retry', 'active') limit 1",
    [ANALYSIS_QUEUE, contentHash],
  );
  return r.rows.length > 0;
}
