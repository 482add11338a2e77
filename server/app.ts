import compression from "compression";
import connectPgSimple from "connect-pg-simple";
import express, { type Express } from "express";
import session from "express-session";
import helmet from "helmet";
import { existsSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import pino, { type Logger } from "pino";
import { bearerAuth } from "./auth/bearer";
import { requirePasswordChanged } from "./auth/guards";
import { createPassport, forgetSessionUsers } from "./auth/passport";
import type { Database } from "./db/client";
import { apiNotFound, errorHandler } from "./http/errors";
import { requestLogger } from "./http/logging";
import { refuseNulInBody, refuseNulInUrl } from "./http/nul";
import { sameOriginOnly } from "./http/same-origin";
import { accountRoutes } from "./routes/account";
import { adminUserRoutes } from "./routes/admin-users";
import { analysisRoutes } from "./routes/analyses";
import { auditCsvRoutes, auditRoutes } from "./routes/audit";
import { mailboxRoutes } from "./routes/mailbox";
import { auditRequestContext } from "./services/audit";
import { authRoutes } from "./routes/auth";
import type { RouteContext } from "./routes/context";
import { healthRoutes } from "./routes/health";
import { homeRoutes } from "./routes/home";
import { projectRoutes } from "./routes/projects";
import { designRoutes, projectDesignRoutes } from "./routes/designs";
import { projectReleaseDownloadRoutes, releaseDownloadRoutes } from "./routes/downloads";
import { designReleaseRoutes, releaseRoutes } from "./routes/releases";
import { releaseDiffRoutes } from "./routes/releases-diff";
import { reviewQueueRoutes, revisionReviewRoutes } from "./routes/reviews";
import { revisionRoutes } from "./routes/revisions";
import { templateRoutes } from "./routes/templates";
import { tokenRoutes } from "./routes/tokens";
import { projectUploadRoutes, uploadRoutes } from "./routes/uploads";
import { verificationRoutes } from "./routes/verifications";

/** The session cookie's name (shared with the client's tests). */
export const SESSION_COOKIE = "tapwright.sid";

// Used only outside production when no secret is configured; npm start always writes a real one.
const DEVELOPMENT_SECRET = "tapwright-development-only-session-secret";

/** Everything the app needs from outside; tests build two apps over one database. */
export interface AppDeps {
  database: Database;
  sessionSecret?: string;
  production?: boolean;
  version: string;
  /** Built client folder served with SPA fallback when it exists; relative paths are from the project root. */
  clientDist?: string;
  logger?: Logger;
  /** Express "trust proxy" setting, for deployments behind a TLS-terminating proxy. */
  trustProxy?: boolean | number | string;
  signInLimitPerMinute?: number;
  /**
   * Origins besides the request's own host that may send state-changing requests (the PUBLIC_URL behind a
   * proxy that rewrites Host), e.g. "https://tapwright.example.internal".
   */
  publicOrigins?: string[];
  /** Minutes between deletions of expired session rows; false turns pruning off (tests). */
  pruneSessionsMinutes?: number | false;
}

/** An app plus what must be closed with it. */
export interface CreatedApp {
  app: Express;
  /** Stop background timers owned by the app (the session pruner). Does not close the pool. */
  close(): void;
}

const PROJECT_ROOT = fileURLToPath(new URL("..", import.meta.url));

/** Build the Express app: middleware in the order of STYLE.md #9, API routes, static client. */
export function createApp(deps: AppDeps): CreatedApp {
  const { database } = deps;
  const production = deps.production ?? false;
  const secret = deps.sessionSecret ?? (production ? undefined : DEVELOPMENT_SECRET);
  if (!secret) throw new Error("A session secret is required in production");
  const logger = deps.logger ?? pino({ level: "silent" });

  const app = express();
  app.disable("x-powered-by");
  if (deps.trustProxy !== undefined) app.set("trust proxy", deps.trustProxy);

  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          baseUri: ["'self'"],
          connectSrc: ["'self'"],
          fontSrc: ["'self'", "data:"],
          formAction: ["'self'"],
          frameAncestors: ["'none'"],
          imgSrc: ["'self'", "data:", "blob:"],
          objectSrc: ["'none'"],
          scriptSrc: ["'self'"],
          scriptSrcAttr: ["'none'"],
          // The code editor (Monaco) injects <style> elements at run time.
          styleSrc: ["'self'", "'unsafe-inline'"],
          // Vite-built workers load from 'self'; blob: covers workers created from generated code.
          workerSrc: ["'self'", "blob:"],
        },
      },
    }),
  );
  app.use(compression());
  app.use(requestLogger(logger));
  // Before anything reads a body: a state-changing request from another origin changes nothing (CSRF).
  app.use(
    sameOriginOnly({
      sessionCookie: SESSION_COOKIE,
      allowedOrigins: deps.publicOrigins ?? [],
    }),
  );
  app.use(refuseNulInUrl);
  app.use(express.json({ limit: "2mb" }));
  app.use(refuseNulInBody);

  const PgStore = connectPgSimple(session);
  const store = new PgStore({
    pool: database.pool,
    tableName: "session",
    pruneSessionInterval:
      deps.pruneSessionsMinutes === false ? false : (deps.pruneSessionsMinutes ?? 15) * 60,
    errorLog: (...args: unknown[]) => logger.error({ args }, "session store error"),
  });
  // Rolling sessions would rewrite the session row on every request (a write per GET); renew a session's expiry
  // in the table at most once a minute. The cookie is still renewed on every answer; the row lags by ≤ 60 s of 8 h.
  const touch = store.touch.bind(store);
  const touchedAt = new Map<string, number>();
  store.touch = (sid, sess, cb) => {
    const now = Date.now();
    const last = touchedAt.get(sid);
    if (last !== undefined && now - last < 60_000) return cb?.();
    if (touchedAt.size >= 10_000) touchedAt.clear();
    touchedAt.set(sid, now);
    touch(sid, sess, cb);
  };
  app.use(
    session({
      name: SESSION_COOKIE,
      secret,
      store,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: {
        httpOnly: true,
        // Strict: no other site's page, link or form ever carries the session (the origin check covers same-site).
        sameSite: "strict",
        secure: production ? "auto" : false,
        maxAge: 8 * 60 * 60 * 1000, // a working day; rolling renews it on each request
        path: "/",
      },
    }),
  );
  const passport = createPassport(database.db);
  app.use((req, res, next) => {
    if (req.method !== "GET" && req.method !== "HEAD" && req.method !== "OPTIONS")
      res.once("finish", forgetSessionUsers).once("close", forgetSessionUsers);
    next();
  });
  app.use(passport.initialize());
  app.use(passport.session());
  app.use(auditRequestContext);

  const ctx: RouteContext = {
    db: database.db,
    passport,
    version: deps.version,
    signInLimitPerMinute: deps.signInLimitPerMinute ?? 10,
    // Three people behind one office address may each mistype their way to the per-name limit.
    signInLimitPerAddressPerMinute: 3 * (deps.signInLimitPerMinute ?? 10),
  };
  const api = express.Router();
  // Bearer tokens act as their owner (read scope: GET/HEAD only); a bad token is 401 before any route.
  api.use(bearerAuth(ctx.db));
  api.use(requirePasswordChanged);
  api.use("/health", healthRoutes(ctx));
  api.use("/auth", authRoutes(ctx));
  api.use("/account", accountRoutes(ctx));
  api.use("/projects", projectRoutes(ctx));
  api.use("/projects/:slug/designs/:designName/releases", projectReleaseDownloadRoutes(ctx));
  api.use("/projects/:projectId/designs", projectDesignRoutes(ctx));
  api.use("/projects/:projectId/uploads", projectUploadRoutes(ctx));
  api.use("/designs", designRoutes(ctx));
  api.use("/designs", designReleaseRoutes(ctx));
  // Before the authoring routes: submit goes through the lifecycle table (issue 6).
  api.use("/revisions", revisionReviewRoutes(ctx));
  api.use("/revisions", revisionRoutes(ctx));
  api.use("/reviews", reviewQueueRoutes(ctx));
  api.use("/releases", releaseRoutes(ctx));
  api.use("/releases", releaseDownloadRoutes(ctx));
  api.use("/releases", releaseDiffRoutes(ctx));
  api.use("/releases", verificationRoutes(ctx));
  api.use("/revisions", analysisRoutes(ctx));
  api.use("/uploads", uploadRoutes(ctx));
  api.use("/templates", templateRoutes(ctx));
  api.use("/tokens", tokenRoutes(ctx));
  api.use("/admin/users", adminUserRoutes(ctx));
  api.use("/admin/audit.csv", auditCsvRoutes(ctx));
  api.use("/admin/audit", auditRoutes(ctx));
  api.use("/admin/mailbox", mailboxRoutes(ctx));
  api.use("/home", homeRoutes(ctx));
  api.use(apiNotFound);
  app.use("/api", api);

  const dist = deps.clientDist ? path.resolve(PROJECT_ROOT, deps.clientDist) : undefined;
  const indexHtml = dist ? path.join(dist, "index.html") : undefined;
  if (dist && indexHtml && existsSync(indexHtml)) {
    // Vite puts content-hashed files under assets/: cache them for a year; index.html never.
    app.use(
      "/assets",
      express.static(path.join(dist, "assets"), { immutable: true, maxAge: "1y", fallthrough: false }),
    );
    app.use(express.static(dist, { index: false, maxAge: 0 }));
    app.get("/{*splat}", (_req, res) => {
      res.setHeader("Cache-Control", "no-cache");
      res.sendFile(indexHtml);
    });
  }

  app.use(errorHandler);
  return { app, close: () => store.close() };
}
