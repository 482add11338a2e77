/**
 * Load benchmark (`npm run bench -- --load`, or `node --import tsx scripts/bench-load.ts` alone): a throwaway
 * PostgreSQL cluster with the demo seeded (released designs included), the real server (`server/index.ts`), and
 * autocannon on the same machine driving it over loopback (so the load generator shares the cores):
 *  1. GET /api/releases as a signed-in firmware engineer at a fixed 400 requests/s over 20 connections for 30 s
 *     (after a 5 s warm-up): latency p50/p99/max, errors, non-2xx answers. Goal: p99 < 50 ms, no errors.
 *  2. The same route as fast as it goes (20 connections, 15 s): the headroom above the fixed rate.
 *  3. Bundle downloads (GET /api/releases/:id/bundle) over 10 connections for 15 s: MB/s. Goal ≥ 150 MB/s.
 * Every run is bounded in time and sends traffic to 127.0.0.1 only. Writes its section of docs/benchmarks.md
 * (between bench-load markers).
 */
import autocannon from "autocannon";
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { once } from "node:events";
import { readFileSync, writeFileSync } from "node:fs";
import { createServer } from "node:net";
import { cpus } from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const RATE = Number(process.env.BENCH_LOAD_RATE ?? 400);
const SECONDS = Number(process.env.BENCH_LOAD_SECONDS ?? 30);

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.on("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const a = srv.address();
      srv.close(() => resolve(typeof a === "object" && a ? a.port : 0));
    });
  });
}

function pg(command: string, port: number) {
  return spawnSync("bash", [path.join(ROOT, "scripts", "pg.sh"), command], {
    cwd: ROOT,
    env: { ...process.env, PGMODE: "test", PGPORT: String(port) },
    encoding: "utf8",
    stdio: ["ignore", "pipe", "inherit"],
  });
}

const sh = (cmd: string) => {
  const r = spawnSync("bash", ["-c", cmd], { encoding: "utf8" });
  return r.status === 0 ? r.stdout.trim() : "?";
};

/** CPU seconds (user + system) used so far by a process, from /proc/<pid>/stat; NaN where unreadable. */
function cpuSeconds(pid: number): number {
  try {
    const fields = readFileSync(`/proc/${pid}/stat`, "utf8").split(") ")[1]!.split(" ");
    return (Number(fields[11]) + Number(fields[12])) / 100; // utime, stime in clock ticks (USER_HZ = 100)
  } catch {
    return NaN;
  }
}

/** The cluster's processes (postmaster and its children), for their CPU time. */
function clusterPids(port: number): number[] {
  const postmaster = Number(
    sh(`ss -ltnpH 'sport = :${port}' | grep -o 'pid=[0-9]*' | head -1 | cut -d= -f2`),
  );
  if (!postmaster) return [];
  return [postmaster, ...sh(`pgrep -P ${postmaster}`).split("\n").map(Number).filter(Boolean)];
}
const clusterCpu = (port: number) => clusterPids(port).reduce((a, p) => a + (cpuSeconds(p) || 0), 0);

/** One autocannon run, bounded by `duration` seconds. */
function cannon(opts: autocannon.Options): Promise<autocannon.Result> {
  return new Promise((resolve, reject) => {
    autocannon(opts, (err, result) => (err ? reject(err) : resolve(result)));
  });
}

async function main(): Promise<void> {
  const pgPort = await freePort();
  const started = pg("start", pgPort);
  const url = /DATABASE_URL=(\S+)/.exec(started.stdout ?? "")?.[1];
  if (started.status !== 0 || !url)
    throw new Error("could not start a PostgreSQL cluster for the load bench");
  let server: ChildProcess | undefined;
  try {
    const env = {
      ...process.env,
      DATABASE_URL: url,
      NODE_ENV: "development",
      SESSION_SECRET: "bench-only-secret-0123456789",
      LOG_LEVEL: "warn",
      MAIL_SINK_PORT: "0",
    };
    const seeded = spawnSync(process.execPath, ["--import", "tsx", "server/db/seed-cli.ts", "--migrate"], {
      cwd: ROOT,
      env,
      encoding: "utf8",
    });
    if (seeded.status !== 0) throw new Error(`seed failed: ${seeded.stderr}`);
    const port = await freePort();
    const base = `http://127.0.0.1:${port}`;
    // BENCH_CPU_PROF=dir writes a V8 CPU profile of the server there (for finding where a request's time goes).
    const prof = process.env.BENCH_CPU_PROF
      ? ["--cpu-prof", `--cpu-prof-dir=${process.env.BENCH_CPU_PROF}`]
      : [];
    server = spawn(process.execPath, [...prof, "--import", "tsx", "server/index.ts"], {
      cwd: ROOT,
      env: { ...env, PORT: String(port) },
      stdio: ["ignore", "inherit", "inherit", "ipc"],
    });
    await new Promise<void>((resolve, reject) => {
      server!.once("message", () => resolve());
      server!.once("exit", (code) => reject(new Error(`the server exited with ${code}`)));
    });

    const signIn = await fetch(`${base}/api/auth/sign-in`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ username: "firmware", password: "tapwright-firmware" }),
    });
    if (signIn.status !== 200) throw new Error(`sign-in failed: ${signIn.status}`);
    const cookie = signIn.headers.get("set-cookie")!.split(";")[0]!;
    const headers = { cookie };
    const list = (await (await fetch(`${base}/api/releases`, { headers })).json()) as {
      releases: { id: number; bundleSize: number; designName: string; version: string }[];
    };
    const biggest = [...list.releases].sort((a, b) => b.bundleSize - a.bundleSize)[0];
    if (!biggest) throw new Error("the demo has no release");
    const listBytes = (await (await fetch(`${base}/api/releases`, { headers })).arrayBuffer()).byteLength;

    const releasesUrl = `${base}/api/releases`;
    console.log(`load: warm-up, then GET /api/releases at ${RATE} req/s for ${SECONDS} s...`);
    await cannon({ url: releasesUrl, headers, connections: 20, overallRate: RATE, duration: 5 });
    const cpu0 = { node: cpuSeconds(server.pid!), pg: clusterCpu(pgPort) };
    const fixed = await cannon({
      url: releasesUrl,
      headers,
      connections: 20,
      overallRate: RATE,
      duration: SECONDS,
    });
    const perRequest = {
      node: ((cpuSeconds(server.pid!) - cpu0.node) * 1000) / fixed.requests.total,
      pg: ((clusterCpu(pgPort) - cpu0.pg) * 1000) / fixed.requests.total,
    };
    console.log("load: GET /api/releases flat out for 15 s...");
    const flat = await cannon({ url: releasesUrl, headers, connections: 20, duration: 15 });
    console.log("load: bundle downloads over 10 connections for 15 s...");
    const bundleUrl = `${base}/api/releases/${biggest.id}/bundle`;
    const dl = await cannon({ url: bundleUrl, headers, connections: 10, duration: 15 });

    const errors = (r: autocannon.Result) => r.errors + r.timeouts + r.non2xx;
    const lat = (r: autocannon.Result) => `${r.latency.p50} / ${r.latency.p99} / ${r.latency.max} ms`;
    const mbps = dl.throughput.average / 1e6;
    const machine = `${sh("nproc")} CPUs (nproc), ${/model name\s*:\s*(.*)/.exec(sh("cat /proc/cpuinfo"))?.[1] ?? cpus()[0]?.model ?? "?"}, Node ${process.version}, load average ${sh("cut -d' ' -f1-3 /proc/loadavg")}`;
    const verdict = (ok: boolean) => (ok ? "meets the goal" : "**misses the goal**");
    const fixedOk = fixed.latency.p99 < 50 && errors(fixed) === 0;
    const rows = [
      `| GET /api/releases at ${RATE} req/s, 20 connections, ${SECONDS} s (${fixed.requests.total} requests, ${(fixed.requests.total / SECONDS).toFixed(0)} req/s achieved): p50 / p99 / max | ${lat(fixed)}; ${errors(fixed)} errors or non-2xx — ${verdict(fixedOk)} (p99 < 50 ms, no errors) |`,
      `| CPU per GET /api/releases in that run: server process / PostgreSQL processes | ${perRequest.node.toFixed(2)} / ${perRequest.pg.toFixed(2)} ms (${RATE} req/s needs ${((RATE * (perRequest.node + perRequest.pg)) / 1000).toFixed(2)} cores) |`,
      `| GET /api/releases flat out, 20 connections, 15 s | ${flat.requests.average.toFixed(0)} req/s; p50 / p99 ${flat.latency.p50} / ${flat.latency.p99} ms; ${errors(flat)} errors or non-2xx |`,
      `| bundle downloads (${biggest.designName} ${biggest.version}, ${(biggest.bundleSize / 1024).toFixed(0)} KiB), 10 connections, 15 s | ${mbps.toFixed(1)} MB/s (${dl.requests.average.toFixed(0)} downloads/s; p99 ${dl.latency.p99} ms; ${errors(dl)} errors) — ${verdict(mbps >= 150)} (≥ 150 MB/s) |`,
    ];
    const section = [
      "<!-- bench-load:start -->",
      "## Load (scripts/bench-load.ts, `npm run bench -- --load`)",
      "",
      "The real server (`server/index.ts`, `LOG_LEVEL=warn`, in-process worker idle) on a throwaway PostgreSQL cluster",
      "with the demo seeded, driven by autocannon on the same machine over loopback, signed in as the demo firmware",
      `engineer (the list answers ${list.releases.length} releases, ${listBytes} bytes of JSON, uncompressed: autocannon sends no Accept-Encoding).`,
      "",
      `Last run: ${machine}.`,
      "",
      "| case | result |",
      "| --- | --- |",
      ...rows,
      "<!-- bench-load:end -->",
      "",
    ].join("\n");
    console.log(section);
    const docPath = path.join(ROOT, "docs", "benchmarks.md");
    let doc = "";
    try {
      doc = readFileSync(docPath, "utf8");
    } catch {
      doc = "# Benchmarks\n\n";
    }
    const start = doc.indexOf("<!-- bench-load:start -->");
    const end = doc.indexOf("<!-- bench-load:end -->");
    if (start >= 0 && end > start)
      doc =
        doc.slice(0, start) + section + doc.slice(end + "<!-- bench-load:end -->".length).replace(/^\n/, "");
    else {
      // Above the DSP results marker: scripts/bench.ts rewrites everything after its marker.
      const marker = doc.indexOf("<!-- bench:results -->");
      doc = marker >= 0 ? `${doc.slice(0, marker)}${section}\n${doc.slice(marker)}` : `${doc}\n${section}`;
    }
    writeFileSync(docPath, doc);
    // The repository is prettier-formatted (markdown tables aligned); keep the generated page so.
    spawnSync(
      process.execPath,
      [path.join(ROOT, "node_modules", "prettier", "bin", "prettier.cjs"), "--write", docPath],
      {
        stdio: "ignore",
      },
    );
  } finally {
    if (server && server.exitCode === null) {
      server.kill("SIGTERM");
      const timer = setTimeout(() => server?.kill("SIGKILL"), 35_000);
      await once(server, "exit");
      clearTimeout(timer);
    }
    pg("destroy", pgPort);
  }
}

await main();
