import type { Server } from "node:http";
import { createApp } from "./app";
import { openDatabase, runMigrations } from "./db/client";
import { env } from "./env";
import { createLogger } from "./http/logging";
import { applyServerTimeouts } from "./http/timeouts";
import { jobsConfig } from "./jobs/config";
import { startAnalysisWorker } from "./jobs/worker";
import { startMail } from "./mail/runtime";

// Start-up: read the environment, migrate, listen; stop cleanly on SIGINT/SIGTERM.
const config = env();
// Credentials (Authorization, cookies, passwords, any tw_ token secret) never reach the log.
const logger = createLogger(config.NODE_ENV === "test" ? "warn" : config.LOG_LEVEL);
const database = openDatabase(config.DATABASE_URL);

await runMigrations(database.db);
const { app, close } = createApp({
  database,
  sessionSecret: config.SESSION_SECRET,
  production: config.NODE_ENV === "production",
  version: config.TAPWRIGHT_VERSION,
  clientDist: config.CLIENT_DIST,
  logger,
  publicOrigins: [new URL(config.PUBLIC_URL).origin],
});

// Mail: the loopback SMTP sink (development/tests) and the outbox dispatcher (issue 6).
const mail = await startMail(config, database.db, logger);

// Analysis worker in this process (the single-machine default); ANALYSIS_WORKER=off leaves the queue to
// `npm run worker` processes on this or other machines.
const jobs = jobsConfig();
const analysisWorker =
  jobs.ANALYSIS_WORKER === "off"
    ? undefined
    : await startAnalysisWorker({
        database,
        config: jobs,
        softwareVersion: config.TAPWRIGHT_VERSION,
        logger,
      });

const server: Server = app.listen(config.PORT, config.HOST, () => {
  const address = server.address();
  const port = typeof address === "object" && address ? address.port : config.PORT;
  logger.info(`Tapwright API listening on http://${config.HOST}:${port}`);
});
applyServerTimeouts(server);

let stopping = false;
function shutdown(signal: string): void {
  if (stopping) return;
  stopping = true;
  logger.info(`${signal}: shutting down`);
  // Stop taking analysis jobs now; running ones finish (or time out) before the pool closes.
  const workerStopped = analysisWorker?.stop().catch(() => undefined);
  // Give open requests a moment, then drop idle keep-alive sockets so close() can finish.
  const force = setTimeout(() => server.closeAllConnections(), 5000);
  force.unref();
  server.close(() => {
    close();
    mail
      .stop()
      .catch(() => undefined)
      .then(() => workerStopped)
      .then(() => database.pool.end())
      .then(
        () => process.exit(0),
        () => process.exit(1),
      );
  });
  server.closeIdleConnections();
}
process.on("SIGINT", () => shutdown("SIGINT"));
process.on("SIGTERM", () => shutdown("SIGTERM"));
