/**
 * API benchmark (`npm run bench`, after the DSP cases): a throwaway PostgreSQL cluster, the real server
 * (`server/index.ts`, in-process analysis worker), and over HTTP
 *  1. the time from POST /api/revisions/:id/analysis to a finished report for the 65,536-sample demo-sized
 *     design (complex LFM, Taylor receive, U = 8, sweep W = 6…24), median of 3 distinct contents;
 *  2. the p50/p99/max latency of a plain GET (/api/health, then /api/projects) while four analyses run.
 * Writes its own section of docs/benchmarks.md (between bench-api markers, above the DSP results).
 */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { once } from "node:events";
import { readFileSync, writeFileSync } from "node:fs";
import { createServer } from "node:net";
import { cpus } from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const THREADS = Number(process.env.BENCH_ANALYSIS_THREADS ?? 2);

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

/** Content of the demo-sized design; `bandwidthHz` varies so each run has its own content hash. */
function demoContent(bandwidthHz: number) {
  return {
    kind: "waveform",
    tx: { kind: "lfm", bandwidthHz, pulseWidthS: 65_536 / 12.5e6, sampleRateHz: 12.5e6 },
    rx: { window: { kind: "taylor", nbar: 5, sidelobeDb: -35 } },
    fixedPoint: { tx: { wordLength: 14, fractionLength: 13 }, rx: { wordLength: 12, fractionLength: 11 } },
    limits: { pslDbMax: -34, islrDbMax: -25, coefficientSqnrDbMin: 50 },
    sweep: { minBits: 6, maxBits: 24 },
  };
}

class Client {
  cookie = "";
  constructor(readonly base: string) {}
  // eslint-disable-next-line @typescript-eslint/no-explicit-any -- a bench script reads a few known fields
  async req(method: string, url: string, body?: unknown): Promise<{ status: number; json: any }> {
    const res = await fetch(this.base + url, {
      method,
      headers: { "content-type": "application/json", ...(this.cookie ? { cookie: this.cookie } : {}) },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    const set = res.headers.get("set-cookie");
    if (set) this.cookie = set.split(";")[0]!;
    const text = await res.text();
    return { status: res.status, json: text ? JSON.parse(text) : null };
  }
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const quantile = (sorted: number[], q: number) =>
  sorted[Math.min(sorted.length - 1, Math.ceil(q * sorted.length) - 1)]!;

async function main(): Promise<void> {
  const pgPort = await freePort();
  const started = pg("start", pgPort);
  const url = /DATABASE_URL=(\S+)/.exec(started.stdout ?? "")?.[1];
  if (started.status !== 0 || !url) throw new Error("could not start a PostgreSQL cluster for the API bench");
  let server: ChildProcess | undefined;
  try {
    const env = {
      ...process.env,
      DATABASE_URL: url,
      NODE_ENV: "development",
      SESSION_SECRET: "bench-only-secret-0123456789",
      LOG_LEVEL: "warn",
    };
    const seeded = spawnSync(process.execPath, ["--import", "tsx", "server/db/seed-cli.ts", "--migrate"], {
      cwd: ROOT,
      env,
      encoding: "utf8",
    });
    if (seeded.status !== 0) throw new Error(`seed failed: ${seeded.stderr}`);
    const port = await freePort();
    server = spawn(process.execPath, ["--import", "tsx", "server/index.ts"], {
      cwd: ROOT,
      env: { ...env, PORT: String(port), ANALYSIS_THREADS: String(THREADS), ANALYSIS_POLL_SECONDS: "0.5" },
      stdio: ["ignore", "inherit", "inherit"],
    });
    const c = new Client(`http://127.0.0.1:${port}`);
    for (let i = 0; ; i++) {
      if (i > 300) throw new Error("the server did not start");
      try {
        if ((await fetch(`${c.base}/api/health`)).ok) break;
      } catch {
        /* not listening yet */
      }
      await sleep(100);
    }
    const signIn = await c.req("POST", "/api/auth/sign-in", {
      username: "author",
      password: "tapwright-author",
    });
    if (signIn.status !== 200) throw new Error(`sign-in failed: ${JSON.stringify(signIn.json)}`);
    const projects = (await c.req("GET", "/api/projects")).json.projects as { id: number; slug: string }[];
    const pid = projects.find((p) => p.slug === "coastwatch-s")!.id;
    let n = 0;
    const design = async () => {
      const r = await c.req("POST", `/api/projects/${pid}/designs`, {
        name: `bench ${++n}`,
        content: demoContent(10e6 - n * 1e3),
      });
      if (r.status !== 201) throw new Error(`design: ${JSON.stringify(r.json)}`);
      return r.json.revision.id as number;
    };
    const state = async (id: number) =>
      (await c.req("GET", `/api/revisions/${id}/analysis`)).json.analysis?.state as string | undefined;

    // 1. POST → done, one at a time.
    const times: number[] = [];
    for (let run = 0; run < 3; run++) {
      const id = await design();
      const t0 = performance.now();
      await c.req("POST", `/api/revisions/${id}/analysis`);
      for (;;) {
        const s = await state(id);
        if (s === "done") break;
        if (s === "failed") throw new Error("analysis failed");
        await sleep(20);
      }
      times.push(performance.now() - t0);
    }
    times.sort((a, b) => a - b);

    // 2. GET latency idle (baseline), then while four analyses run.
    const idle: number[] = [];
    for (let i = 0; i < 100; i++) {
      const s = performance.now();
      await (await fetch(`${c.base}/api/health`)).arrayBuffer();
      idle.push(performance.now() - s);
      await sleep(10);
    }
    idle.sort((a, b) => a - b);
    const ids = [await design(), await design(), await design(), await design()];
    for (const id of ids) await c.req("POST", `/api/revisions/${id}/analysis`);
    const lat: Record<string, number[]> = { "/api/health": [], "/api/projects": [] };
    const t0 = performance.now();
    let pending = ids.length;
    let polls = 0;
    while (pending > 0) {
      for (const p of Object.keys(lat)) {
        const s = performance.now();
        const r = await fetch(c.base + p, { headers: { cookie: c.cookie } });
        await r.arrayBuffer();
        lat[p]!.push(performance.now() - s);
      }
      await sleep(10);
      if (++polls % 20 === 0)
        pending = (await Promise.all(ids.map(state))).filter((s) => s !== "done" && s !== "failed").length;
    }
    const window = performance.now() - t0;

    const sh = (cmd: string) => {
      const r = spawnSync("bash", ["-c", cmd], { encoding: "utf8" });
      return r.status === 0 ? r.stdout.trim() : "?";
    };
    const model = /model name\s*:\s*(.*)/.exec(sh("cat /proc/cpuinfo"))?.[1] ?? cpus()[0]?.model ?? "?";
    const machine = `${sh("nproc")} CPUs (nproc), ${model}, Node ${process.version}, load average ${sh("cut -d' ' -f1-3 /proc/loadavg")}, ANALYSIS_THREADS=${THREADS}`;
    const rows = [
      `| POST → finished report, 65,536-sample demo design (analysis + sweep W = 6…24), median of 3 | ${times[1]!.toFixed(0)} ms (runs: ${times.map((x) => x.toFixed(0)).join(", ")}) |`,
      `| GET /api/health, idle baseline (100 requests): p50 / p99 / max | ${quantile(idle, 0.5).toFixed(1)} / ${quantile(idle, 0.99).toFixed(1)} / ${idle[idle.length - 1]!.toFixed(1)} ms |`,
      ...Object.entries(lat).map(([p, v]) => {
        const s = [...v].sort((a, b) => a - b);
        return `| GET ${p} while 4 analyses run (${s.length} requests over ${(window / 1000).toFixed(1)} s): p50 / p99 / max | ${quantile(s, 0.5).toFixed(1)} / ${quantile(s, 0.99).toFixed(1)} / ${s[s.length - 1]!.toFixed(1)} ms |`;
      }),
    ];
    const section = [
      "<!-- bench-api:start -->",
      "## API and analysis queue (scripts/bench-api.ts)",
      "",
      "The real server (`server/index.ts`, in-process worker) on a throwaway PostgreSQL cluster, driven over HTTP.",
      "Target: p99 of a plain GET under 50 ms while four analyses run.",
      "",
      `Last run: ${machine}.`,
      "",
      "| case | result |",
      "| --- | ---: |",
      ...rows,
      "<!-- bench-api:end -->",
      "",
    ].join("\n");
    console.log(section);
    const docUrl = path.join(ROOT, "docs", "benchmarks.md");
    let doc = "";
    try {
      doc = readFileSync(docUrl, "utf8");
    } catch {
      doc = "# Benchmarks\n\n";
    }
    const start = doc.indexOf("<!-- bench-api:start -->");
    const end = doc.indexOf("<!-- bench-api:end -->");
    if (start >= 0 && end > start)
      doc =
        doc.slice(0, start) + section + doc.slice(end + "<!-- bench-api:end -->".length).replace(/^\n/, "");
    else {
      // Above the DSP results marker: scripts/bench.ts rewrites everything after its marker.
      const marker = doc.indexOf("<!-- bench:results -->");
      doc = marker >= 0 ? `${doc.slice(0, marker)}${section}\n${doc.slice(marker)}` : `${doc}\n${section}`;
    }
    writeFileSync(docUrl, doc);
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
