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
const RESULTS = path.join(ROOT, "test-results", "summary.json");

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

/** The counts written by scripts/test-summary-reporter.mjs (failed tests, files, hooks, unhandled errors). */
function summary() {
  try {
    const r = JSON.parse(readFileSync(RESULTS, "utf8"));
    return { passed: r.passed ?? 0, failed: r.failed ?? 0, problems: r.problems ?? [], ok: true };
  } catch {
    return { passed: 0, failed: 0, problems: [], ok: false };
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
const url = /^DATABASE_URL=(\S+)/m.exec(started.stdout ?? "")?.[1];
// The cluster's superuser (trust auth on loopback): test databases are created and dropped as it, so a drop
// can end any backend in them, autovacuum workers included.
const adminUrl = /^ADMIN_DATABASE_URL=(\S+)/m.exec(started.stdout ?? "")?.[1];
if (started.status !== 0 || !url) {
  process.stderr.write(`Could not start the test PostgreSQL cluster on port ${port}.\n`);
  destroy();
  process.stdout.write("0 passed, 1 failed\n");
  process.exit(1);
}

rmSync(RESULTS, { force: true });
mkdirSync(path.dirname(RESULTS), { recursive: true });
const vitestBin = path.join(ROOT, "node_modules", "vitest", "vitest.mjs");
const args = [
  existsSync(vitestBin) ? vitestBin : "vitest",
  "run",
  "--reporter=default",
  `--reporter=${path.join(ROOT, "scripts", "test-summary-reporter.mjs")}`,
  ...process.argv.slice(2),
];
const child = spawn(process.execPath, args, {
  cwd: ROOT,
  stdio: "inherit",
  env: {
    ...process.env,
    DATABASE_URL: url,
    TAPWRIGHT_TEST_PGPORT: String(port),
    TAPWRIGHT_TEST_SUMMARY: RESULTS,
    ...(adminUrl ? { TAPWRIGHT_TEST_ADMIN_URL: adminUrl } : {}),
  },
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
  let status = code ?? (signal || interrupted ? 130 : 1);
  if (status === 0 && (!s.ok || s.failed > 0)) status = 1;
  let failed = s.failed;
  const notes = s.problems.map((p) => `  ${p}`);
  if (!s.ok) notes.push("  vitest wrote no summary (a global setup failed, or it was stopped): see above");
  // The closing line never says 0 failed on a red run: whatever made the exit code non-zero counts once.
  if (status !== 0 && failed === 0) {
    failed = 1;
    notes.push(`  vitest exited with status ${status} without a failed test: counted as one failure`);
  }
  if (notes.length > 0) process.stdout.write(`\nFailures outside tests:\n${notes.join("\n")}\n`);
  process.stdout.write(`${s.passed} passed, ${failed} failed\n`);
  process.exit(status);
});
