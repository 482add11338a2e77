import { existsSync } from "node:fs";
import { createServer, type Server } from "node:http";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { createApp } from "./app";
import { openDatabase, runMigrations } from "./db/client";
import { env } from "./env";
import { createLogger } from "./http/logging";
import { applyServerTimeouts } from "./http/timeouts";
import { jobsConfig } from "./jobs/config";
import { startAnalysisWorker } from "./jobs/worker";
import { startMail } from "./mail/runtime";

// Start-up: read the environment, migrate, listen; stop cleanly on SIGINT/SIGTERM. Any start-up failure (a busy
// port, an unreachable database) ends the process at once with one line naming what failed.

/** Print why the server cannot start (to stderr, whatever the log level) and exit. */
function startFailed(what: string, err: unknown): never {
  const e = err as NodeJS.ErrnoException;
  const detail =
    e?.code === "EADDRINUSE"
      ? "the port is in use by another program (another Tapwright?): set PORT to a free one"
      : e?.code === "EACCES"
        ? "permission denied (ports below 1024 need privileges)"
        : e instanceof Error
          ? e.message
          : String(err);
  process.stderr.write(`tapwright: cannot start: ${what}: ${detail}\n`);
  process.exit(1);
}

let config: ReturnType<typeof env>;
try {
  config = env();
} catch (err) {
  startFailed("the environment", err);
}
// Credentials (Authorization, cookies, passwords, any tw_ token secret) never reach the log.
const logger = createLogger(config.NODE_ENV === "test" ? "warn" : config.LOG_LEVEL);

// Production serves the built client: without it every page would be a 404, so refuse instead.
if (config.NODE_ENV === "production") {
  const indexHtml = path.resolve(
    fileURLToPath(new URL("..", import.meta.url)),
    config.CLIENT_DIST,
    "index.html",
  );
  if (!existsSync(indexHtml))
    startFailed(
      `the built client (${config.CLIENT_DIST}/index.html)`,
      new Error("missing: run `npm run build` first"),
    );
}

const database = openDatabase(config.DATABASE_URL);
const dbWhere = (() => {
  try {
    const u = new URL(config.DATABASE_URL);
    return `${u.hostname}:${u.port || "5432"}`;
  } catch {
    return "DATABASE_URL";
  }
})();
await runMigrations(database.db).catch((err: unknown) =>
  startFailed(`database at ${dbWhere} (migrations)`, err),
);
const { app, close } = createApp({
  database,
  sessionSecret: config.SESSION_SECRET,
  production: config.NODE_ENV === "production",
  version: config.TAPWRIGHT_VERSION,
  clientDist: config.CLIENT_DIST,
  logger,
  publicOrigins: [new URL(config.PUBLIC_URL).origin],
});

// The web port first: a busy port fails here, before the mail sink and the worker start.
const server: Server = createServer(app);
await new Promise<void>((resolve) => {
  server.once("error", (err) => startFailed(`web port ${config.HOST}:${config.PORT}`, err));
  server.listen(config.PORT, config.HOST, () => resolve());
});
server.removeAllListeners("error");
applyServerTimeouts(server);
server.on("error", (err) => logger.error({ err }, "http server error"));
{
  const address = server.address();
  const port = typeof address === "object" && address ? address.port : config.PORT;
  logger.info(`Tapwright API listening on http://${config.HOST}:${port}`);
}

// Mail: the loopback SMTP sink (development/tests) and the outbox dispatcher.
const mail = await startMail(config, database.db, logger).catch((err: unknown) =>
  startFailed(`mail sink port 127.0.0.1:${config.MAIL_SINK_PORT ?? 2525}`, err),
);

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
      }).catch((err: unknown) => startFailed(`analysis worker (database at ${dbWhere})`, err));

// Started: scripts/start.mjs waits for this rather than for a health check another program on the port could answer.
process.send?.({ type: "listening", port: config.PORT });

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
      .then(async () => {
        // A handler can outlive its socket (closed above): let its queries finish (up to 5 s) before the pool ends.
        const busy = () =>
          database.pool.waitingCount > 0 || database.pool.idleCount < database.pool.totalCount;
        for (let i = 0; i < 50 && busy(); i += 1) await new Promise((r) => setTimeout(r, 100));
      })
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
