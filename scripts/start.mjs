#!/usr/bin/env node
// npm start (and npm run dev with --dev): install dependencies when needed, start the local PostgreSQL
// cluster in .pg/ unless DATABASE_URL is set, migrate and seed the demo, build the client when it is
// stale, serve the app on one URL, and on Ctrl-C stop the server and then the database. A server that
// crashes after it was up is restarted (the database keeps running); one that cannot start ends it all.
// --no-lifecycle seeds the demo designs as drafts only (on a fresh database).
// Node built-ins only: this runs before node_modules exists.
import { spawn, spawnSync } from "node:child_process";
import { randomBytes } from "node:crypto";
import {
  chmodSync,
  existsSync,
  mkdirSync,
  readFileSync,
  readdirSync,
  statSync,
  writeFileSync,
} from "node:fs";
import path from "node:path";
import { createServer } from "node:net";
import { fileURLToPath } from "node:url";

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const DEV = process.argv.includes("--dev");
const NO_LIFECYCLE = process.argv.includes("--no-lifecycle");
const t0 = Date.now();
const say = (msg) => process.stdout.write(`tapwright: ${msg}\n`);
const fail = (msg) => {
  process.stderr.write(`tapwright: ${msg}\n`);
  process.exit(1);
};

function mtime(p) {
  try {
    return statSync(p).mtimeMs;
  } catch {
    return 0;
  }
}

/** Newest modification time of a file or of any file below a folder. */
function newest(p) {
  let st;
  try {
    st = statSync(p);
  } catch {
    return 0;
  }
  if (!st.isDirectory()) return st.mtimeMs;
  let best = st.mtimeMs;
  for (const entry of readdirSync(p)) best = Math.max(best, newest(path.join(p, entry)));
  return best;
}

/** Resolve when host:port can be listened on; reject naming the port and its use otherwise. */
function checkPortFree(port, host, what) {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.once("error", (err) =>
      reject(
        new Error(
          err.code === "EADDRINUSE"
            ? `${what} port ${host}:${port} is in use by another program (another Tapwright?): set ${what === "web" ? "PORT" : "API_PORT"} to a free one`
            : `${what} port ${host}:${port}: ${err.message}`,
        ),
      ),
    );
    srv.listen(Number(port), host, () => srv.close(() => resolve()));
  });
}

function run(cmd, args, opts = {}) {
  const r = spawnSync(cmd, args, { cwd: ROOT, stdio: "inherit", ...opts });
  if (r.error) fail(`${cmd} failed to run: ${r.error.message}`);
  return r;
}

// 1. Dependencies: missing, or older than the lock file.
const lock = path.join(ROOT, "package-lock.json");
const installed = path.join(ROOT, "node_modules", ".package-lock.json");
if (!existsSync(installed) || mtime(installed) < mtime(lock)) {
  say("installing dependencies (npm ci)...");
  if (run("npm", ["ci", "--no-audit", "--no-fund"]).status !== 0) fail("npm ci failed");
}

// Ports: the web port (PORT; under --dev, Vite's) and, under --dev, the API behind Vite's proxy (API_PORT, default
// the next port up). Checked before anything starts, so a taken port fails within a second, naming itself.
const host = process.env.HOST ?? "127.0.0.1";
const webPort = process.env.PORT ?? (DEV ? "5173" : "3000");
const apiPort = process.env.API_PORT ?? (process.env.PORT ? String(Number(webPort) + 1) : "3001");
try {
  await checkPortFree(webPort, host, "web");
  if (DEV) await checkPortFree(apiPort, "127.0.0.1", "API");
} catch (err) {
  fail(`cannot start: ${err.message}`);
}

// 2. Database: DATABASE_URL set means "use that server"; otherwise the project's own cluster in .pg/.
let databaseUrl = process.env.DATABASE_URL;
let ownCluster = false;
const pgEnv = { ...process.env, PGMODE: "dev" };
if (!databaseUrl) {
  const pgPort = process.env.PGPORT ?? "54329";
  say(
    `starting PostgreSQL on 127.0.0.1:${pgPort} (scripts/pg.sh, data in ${process.env.PGBASE ?? (pgPort === "54329" ? ".pg/" : `.pg/port-${pgPort}/`)})...`,
  );
  const r = spawnSync("bash", [path.join(ROOT, "scripts", "pg.sh"), "start"], {
    cwd: ROOT,
    env: pgEnv,
    encoding: "utf8",
    stdio: ["ignore", "pipe", "inherit"],
  });
  databaseUrl = /DATABASE_URL=(\S+)/.exec(r.stdout ?? "")?.[1];
  if (r.status !== 0 || !databaseUrl)
    fail("PostgreSQL did not start (see the message above), or set DATABASE_URL");
  ownCluster = true;
}

function stopCluster() {
  if (!ownCluster) return;
  ownCluster = false;
  spawnSync("bash", [path.join(ROOT, "scripts", "pg.sh"), "stop"], {
    cwd: ROOT,
    env: pgEnv,
    stdio: "inherit",
  });
  say("PostgreSQL stopped.");
}

// 3. A session secret kept across restarts, so sign-ins survive them.
const secretFile = path.join(ROOT, ".pg", "session-secret");
if (!existsSync(secretFile)) {
  mkdirSync(path.dirname(secretFile), { recursive: true });
  writeFileSync(secretFile, randomBytes(32).toString("hex"), { mode: 0o600 });
}
chmodSync(secretFile, 0o600);
const sessionSecret = process.env.SESSION_SECRET ?? readFileSync(secretFile, "utf8").trim();

// 4. Migrations and the demo data (idempotent).
const baseEnv = { ...process.env, DATABASE_URL: databaseUrl, SESSION_SECRET: sessionSecret };
say("applying migrations and seeding the demo...");
const seedArgs = ["--import", "tsx", "server/db/seed-cli.ts", "--migrate"];
if (NO_LIFECYCLE) seedArgs.push("--no-lifecycle");
if (run(process.execPath, seedArgs, { env: baseEnv }).status !== 0) {
  stopCluster();
  fail("migration or seeding failed");
}

let child;
let stopping = false;
function shutdown(signal) {
  if (stopping) return;
  stopping = true;
  if (child && child.exitCode === null && child.signalCode === null) {
    child.once("exit", () => finish(0));
    child.kill(signal === "SIGINT" ? "SIGINT" : "SIGTERM");
    // A child that hangs must not keep the database running forever.
    setTimeout(() => child.kill("SIGKILL"), 10_000).unref();
  } else finish(0);
}
function finish(code) {
  stopCluster();
  process.exit(code);
}
for (const sig of ["SIGINT", "SIGTERM", "SIGHUP"]) process.on(sig, () => shutdown(sig));

function printAccounts(url) {
  const elapsed = ((Date.now() - t0) / 1000).toFixed(1);
  process.stdout.write(
    [
      "",
      `  Tapwright is running at  ${url}   (ready in ${elapsed} s)`,
      "",
      "  Demo accounts, for development only (user name / password):",
      "    admin     / tapwright-admin       Noor Vance, admin",
      "    author    / tapwright-author      Ilse Marrow, author",
      "    reviewer  / tapwright-reviewer    Tomas Quill, reviewer",
      "    firmware  / tapwright-firmware    Priya Lund, firmware",
      "",
      "  Press Ctrl-C to stop the server and the database.",
      "",
    ].join("\n") + "\n",
  );
}

/** Poll /api/health until the server answers (or give up after a minute). */
async function waitForHealth(base) {
  for (let i = 0; i < 240; i += 1) {
    if (child.exitCode !== null) return false;
    try {
      const res = await fetch(`${base}/api/health`);
      if (res.ok) return true;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  return false;
}

if (DEV) {
  // 5a. Development: Vite with hot reload on the web port, the API in watch mode behind its proxy.
  const bin = path.join(ROOT, "node_modules", ".bin", "concurrently");
  child = spawn(
    bin,
    [
      "-k",
      "-n",
      "web,api",
      `vite --host ${host} --port ${webPort} --strictPort`,
      "tsx watch server/index.ts",
    ],
    {
      cwd: ROOT,
      stdio: "inherit",
      env: { ...baseEnv, PORT: apiPort, TAPWRIGHT_API_PORT: apiPort, NODE_ENV: "development" },
    },
  );
  child.on("exit", (code) => {
    if (!stopping) finish(code ?? 1);
  });
  if (await waitForHealth(`http://127.0.0.1:${apiPort}`)) {
    say(`Vite serves the client with hot reload; the API runs on :${apiPort} behind it`);
    printAccounts(`http://${host === "0.0.0.0" ? "127.0.0.1" : host}:${webPort}`);
  }
} else {
  // 5b. The built client, rebuilt when any source is newer than the last build.
  const distIndex = path.join(ROOT, "dist", "client", "index.html");
  const sources = ["src", "shared", "index.html", "vite.config.ts", "tailwind.config.ts", "public"].map((p) =>
    newest(path.join(ROOT, p)),
  );
  const stale = () => !existsSync(distIndex) || Math.max(...sources) > mtime(distIndex);
  if (stale()) {
    say("building the client (vite build)...");
    const vite = path.join(ROOT, "node_modules", "vite", "bin", "vite.js");
    let built = false;
    // A second instance starting in the same folder may find Vite's build lock held: wait for that build.
    for (let attempt = 0; attempt < 3 && !built; attempt += 1) {
      if (attempt > 0) {
        say("another build of this folder is running; waiting for it...");
        for (let i = 0; i < 60 && stale(); i += 1) await new Promise((r) => setTimeout(r, 1000));
        if (!stale()) break;
      }
      built = run(process.execPath, [vite, "build", "--logLevel", "warn"], { env: baseEnv }).status === 0;
    }
    if (!built && stale()) {
      stopCluster();
      fail("the client build failed");
    }
  }

  // 6. The server, supervised: it tells us over IPC once it listens (a health check could be answered by
  // another program on the port). A crash after that restarts it; a failure to start ends everything.
  const shownHost = host === "0.0.0.0" ? "127.0.0.1" : host;
  const serverEnv = {
    ...baseEnv,
    PORT: webPort,
    HOST: host,
    NODE_ENV: process.env.NODE_ENV ?? "production",
    LOG_LEVEL: process.env.LOG_LEVEL ?? "warn",
    CLIENT_DIST: process.env.CLIENT_DIST ?? "dist/client",
    // A local run keeps mail on this host (the sink) unless a real SMTP server is configured.
    ...(process.env.SMTP_HOST ? {} : { MAIL_SINK: process.env.MAIL_SINK ?? "on" }),
  };
  const crashes = [];
  let everReady = false;
  const startServer = () => {
    let ready = false;
    child = spawn(process.execPath, ["--import", "tsx", "server/index.ts"], {
      cwd: ROOT,
      stdio: ["inherit", "inherit", "inherit", "ipc"],
      env: serverEnv,
    });
    child.on("message", (m) => {
      if (!m || m.type !== "listening" || ready) return;
      ready = true;
      if (!everReady) printAccounts(`http://${shownHost}:${webPort}`);
      else say(`the server is running again at http://${shownHost}:${webPort}`);
      everReady = true;
    });
    child.on("exit", (code, signal) => {
      if (stopping) return;
      const how = signal ? `signal ${signal}` : `exit code ${code}`;
      if (!ready) {
        process.stderr.write(`tapwright: the server could not start (${how}); the reason is above\n`);
        finish(code || 1);
        return;
      }
      const now = Date.now();
      crashes.push(now);
      while (crashes.length > 0 && crashes[0] < now - 60_000) crashes.shift();
      if (crashes.length >= 5) {
        process.stderr.write(`tapwright: the server crashed 5 times within a minute (${how}); giving up\n`);
        finish(code || 1);
        return;
      }
      process.stderr.write(
        `tapwright: the server stopped (${how}); restarting it in 1 s (the database keeps running)\n`,
      );
      setTimeout(() => {
        if (!stopping) startServer();
      }, 1000);
    });
  };
  startServer();
}
