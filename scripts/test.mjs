#!/usr/bin/env node
// npm test: every vitest project against a throwaway PostgreSQL cluster on loopback, started here and
// destroyed afterwards (also on Ctrl-C). Node built-ins only. Never touches the `npm start` cluster in .pg/.
// Extra arguments go to vitest: `npm test -- tests/api/auth.test.ts`.
import { spawn, spawnSync } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, rmSync } from "node:fs";
import { createServer } from "node:net";
import path from "node:path";
import { fileURLToPath } from "node:url";

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const RESULTS = path.join(ROOT, "test-results", "vitest.json");

/** Ask the kernel for a free loopback port. */
function freePort() {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.unref();
    srv.on("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const { port } = srv.address();
      srv.close(() => resolve(port));
    });
  });
}

function pg(command, port) {
  return spawnSync("bash", [path.join(ROOT, "scripts", "pg.sh"), command], {
    cwd: ROOT,
    env: { ...process.env, PGMODE: "test", PGPORT: String(port) },
    encoding: "utf8",
    stdio: ["ignore", "pipe", "inherit"],
  });
}

function summary() {
  try {
    const r = JSON.parse(readFileSync(RESULTS, "utf8"));
    return { passed: r.numPassedTests ?? 0, failed: r.numFailedTests ?? 0, ok: true };
  } catch {
    return { passed: 0, failed: 0, ok: false };
  }
}

const port = Number(process.env.TAPWRIGHT_TEST_PGPORT) || (await freePort());
let destroyed = false;
function destroy() {
  if (destroyed) return;
  destroyed = true;
  pg("destroy", port);
}

const started = pg("start", port);
const url = /DATABASE_URL=(\S+)/.exec(started.stdout ?? "")?.[1];
if (started.status !== 0 || !url) {
  process.stderr.write(`Could not start the test PostgreSQL cluster on port ${port}.\n`);
  destroy();
  process.stdout.write("0 passed, 0 failed\n");
  process.exit(1);
}

rmSync(RESULTS, { force: true });
mkdirSync(path.dirname(RESULTS), { recursive: true });
const vitestBin = path.join(ROOT, "node_modules", "vitest", "vitest.mjs");
const args = [
  existsSync(vitestBin) ? vitestBin : "vitest",
  "run",
  "--reporter=default",
  "--reporter=json",
  `--outputFile=${path.relative(ROOT, RESULTS)}`,
  ...process.argv.slice(2),
];
const child = spawn(process.execPath, args, {
  cwd: ROOT,
  stdio: "inherit",
  env: { ...process.env, DATABASE_URL: url, TAPWRIGHT_TEST_PGPORT: String(port) },
});

// Ctrl-C reaches vitest through the terminal's process group; when only we are signalled, pass it on.
let interrupted = false;
for (const sig of ["SIGINT", "SIGTERM", "SIGHUP"]) {
  process.on(sig, () => {
    interrupted = true;
    if (child.exitCode === null) child.kill(sig);
  });
}

child.on("exit", (code, signal) => {
  destroy();
  const s = summary();
  process.stdout.write(`${s.passed} passed, ${s.failed} failed\n`);
  let status = code ?? (signal || interrupted ? 130 : 1);
  if (status === 0 && (!s.ok || s.failed > 0)) status = 1;
  process.exit(status);
});
