// A worker process killed mid-job (SIGKILL: no cleanup at all) leaves its job active; pg-boss's expiry hands
// it to the next worker process, which completes it. Both workers are `npm run worker`'s entry as child processes.
import { spawn, type ChildProcess } from "node:child_process";
import { once } from "node:events";
import { fileURLToPath } from "node:url";
import { afterAll, expect, it } from "vitest";
import { bossOver, ensureAnalysisQueue } from "../../server/jobs/queue";
import { longLfm, newDesign, pollAnalysis } from "./analysis-helpers";
import { failOnConsoleError, signedIn, useApiTestDatabase } from "./helpers";

const t = useApiTestDatabase();
failOnConsoleError();
const ROOT = fileURLToPath(new URL("../..", import.meta.url));
const children: ChildProcess[] = [];

function startWorker(): ChildProcess {
  const child = spawn(process.execPath, ["--import", "tsx", "server/jobs/worker-main.ts"], {
    cwd: ROOT,
    env: {
      ...process.env,
      DATABASE_URL: t.url,
      NODE_ENV: "test",
      LOG_LEVEL: "warn",
      ANALYSIS_POLL_SECONDS: "0.5",
      ANALYSIS_MAINTENANCE_SECONDS: "1",
    },
    stdio: ["ignore", "pipe", "pipe"],
  });
  children.push(child);
  return child;
}

afterAll(async () => {
  for (const c of children) if (c.exitCode === null && c.signalCode === null) c.kill("SIGKILL");
});

it("a job whose worker was SIGKILLed mid-analysis is retried by another worker and completes", async () => {
  // The queue is created here first, with a short expiry, so the lost job comes back within the test.
  const boss = bossOver(t.database.pool, { supervise: false, schedule: false, migrate: true });
  await boss.start();
  await ensureAnalysisQueue(boss, { ANALYSIS_EXPIRE_SECONDS: 20, ANALYSIS_RETRY_LIMIT: 2 });
  await boss.stop({ graceful: false, close: false });

  const author = await signedIn(t.app, "author");
  const { revision } = await newDesign(t, author, longLfm(65_536));
  expect((await author.post(`/api/revisions/${revision.id}/analysis`)).status).toBe(202);

  const first = startWorker();
  const running = await pollAnalysis(
    author,
    revision.id,
    (a) => a?.state === "running" && a.progress > 0,
    60_000,
  );
  expect(running!.state).toBe("running");
  first.kill("SIGKILL");
  await once(first, "exit");
  const job = await t.database.pool.query<{ state: string }>(
    "select state from pgboss.job where name = 'analysis'",
  );
  expect(job.rows.map((r) => r.state)).toEqual(["active"]);

  const second = startWorker();
  const done = await pollAnalysis(
    author,
    revision.id,
    (a) => a?.state === "done" || a?.state === "failed",
    100_000,
  );
  expect(done!.state, done!.error ?? "").toBe("done");
  expect(done!.report!.tables.map((x) => x.role)).toEqual(["tx", "rx"]);
  const row = await t.database.pool.query<{ attempts: number }>("select attempts from analysis_reports");
  expect(row.rows[0]!.attempts).toBe(2);
  const after = await t.database.pool.query<{ state: string; retry_count: number }>(
    "select state, retry_count from pgboss.job where name = 'analysis'",
  );
  expect(after.rows).toEqual([{ state: "completed", retry_count: 1 }]);

  // SIGTERM stops the worker cleanly (pg-boss graceful stop), exit code 0.
  second.kill("SIGTERM");
  const [code] = (await once(second, "exit")) as [number | null];
  expect(code).toBe(0);
}, 180_000);
