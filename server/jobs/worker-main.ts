/**
 * `npm run worker`: an analysis worker alone, against DATABASE_URL (this machine or another). It does not
 * migrate: the web process (`npm start`) owns migrations. Stops cleanly on SIGINT/SIGTERM.
 */
import pino from "pino";
import { openDatabase } from "../db/client";
import { env } from "../env";
import { jobsConfig } from "./config";
import { startAnalysisWorker } from "./worker";

const config = env();
const jobs = jobsConfig();
const logger = pino({ level: config.NODE_ENV === "test" ? "warn" : config.LOG_LEVEL });
const database = openDatabase(config.DATABASE_URL, Math.max(4, jobs.ANALYSIS_THREADS + 3));
const worker = await startAnalysisWorker({
  database,
  config: jobs,
  softwareVersion: config.TAPWRIGHT_VERSION,
  logger,
});

let stopping = false;
async function shutdown(signal: string): Promise<void> {
  if (stopping) return;
  stopping = true;
  logger.info(`${signal}: stopping the analysis worker`);
  try {
    await worker.stop();
    await database.pool.end();
    process.exit(0);
  } catch (err) {
    logger.error({ err }, "the analysis worker did not stop cleanly");
    process.exit(1);
  }
}
process.on("SIGINT", () => void shutdown("SIGINT"));
process.on("SIGTERM", () => void shutdown("SIGTERM"));
