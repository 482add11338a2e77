/**
 * Settings of the analysis queue and its workers, validated once. They belong beside server/env.ts's
 * schema; kept here until the foundation's env schema takes them, so this is the only other reader of process.env.
 */
import { z } from "zod";

const JobsEnvSchema = z.object({
  /** `off` stops `npm start` from running the in-process worker (run `npm run worker` elsewhere). */
  ANALYSIS_WORKER: z.enum(["on", "off"]).default("on"),
  /** Worker threads per worker process, i.e. analyses computed at once. */
  ANALYSIS_THREADS: z.coerce.number().int().min(1).max(64).default(1),
  /** A job active longer than this is taken as lost (worker killed) and retried. */
  ANALYSIS_EXPIRE_SECONDS: z.coerce.number().int().min(1).max(86_400).default(900),
  /** Retries after a lost or crashed attempt. */
  ANALYSIS_RETRY_LIMIT: z.coerce.number().int().min(0).max(10).default(2),
  /** How often a worker looks for expired jobs (pg-boss maintenance). */
  ANALYSIS_MAINTENANCE_SECONDS: z.coerce.number().int().min(1).max(3600).default(30),
  /** How often an idle worker polls for new jobs. */
  ANALYSIS_POLL_SECONDS: z.coerce.number().min(0.5).max(60).default(1),
});

/** Validated analysis-queue settings. */
export type JobsConfig = z.infer<typeof JobsEnvSchema>;

/** Parse the queue settings from an environment object; throws naming each bad variable. */
export function parseJobsConfig(source: NodeJS.ProcessEnv): JobsConfig {
  const r = JobsEnvSchema.safeParse(source);
  if (!r.success) {
    const lines = r.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`).join("\n");
    throw new Error(`Invalid analysis queue environment:\n${lines}`);
  }
  return r.data;
}

let cached: JobsConfig | undefined;
/** The process's queue settings, read on first use. */
export function jobsConfig(): JobsConfig {
  cached ??= parseJobsConfig(process.env);
  return cached;
}
