/**
 * Size benchmark (`npm run bench -- --sizes`): a throwaway PostgreSQL cluster and the real server
 * (`server/index.ts`, in-process analysis worker), driven over HTTP. For complex LFMs of 65,536, 262,144
 * and 4,194,304 samples: create (the longest is refused when saved), analyse, submit, approve, release,
 * download; per size the release build time (POST …/release → 201), the server's peak RSS during it
 * (/proc/<pid>/status VmRSS, sampled every 20 ms) and GET /api/health p50 / p99 / max from a bounded probe
 * loop running meanwhile. Then the same probe during a 32 MiB single-line upload and a burst of 16 sign-ins.
 * Writes its own section of docs/benchmarks.md (between bench-sizes markers). Figures, never assertions.
 */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { once } from "node:events";
import { readFileSync, writeFileSync } from "node:fs";
import { createServer } from "node:net";
import { cpus } from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const SIZES = (process.env.BENCH_SIZES ?? "65536,262144,4194304").split(",").map(Number);

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

const lfm = (n: number) => ({
  kind: "waveform",
  tx: { kind: "lfm", bandwidthHz: 10e6, pulseWidthS: n / 12.5e6, sampleRateHz: 12.5e6 },
  rx: { window: { kind: "taylor", nbar: 5, sidelobeDb: -35 } },
  fixedPoint: { tx: { wordLength: 14, fractionLength: 13 }, rx: { wordLength: 12, fractionLength: 11 } },
  limits: { pslDbMax: -34, islrDbMax: -25, coefficientSqnrDbMin: 50 },
});

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
    let json: unknown = null;
    try {
      json = text ? JSON.parse(text) : null;
    } catch {
      json = text;
    }
    return { status: res.status, json };
  }
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const quantile = (sorted: number[], q: number) =>
  sorted.length ? sorted[Math.min(sorted.length - 1, Math.ceil(q * sorted.length) - 1)]! : NaN;

function rssMiB(pid: number): number {
  try {
    const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, "utf8"));
    return m ? Number(m[1]) / 1024 : NaN;
  } catch {
    return NaN;
  }
}

/** Run `work` while probing /api/health every 20 ms (at most 30,000 probes) and sampling the server's RSS. */
async function during<T>(base: string, pid: number, work: () => Promise<T>) {
  let done = false;
  const lat: number[] = [];
  let peak = rssMiB(pid);
  const rss = setInterval(() => (peak = Math.max(peak, rssMiB(pid))), 20);
  const probe = (async () => {
    for (let i = 0; i < 30_000 && !done; i++) {
      const s = performance.now();
      await (await fetch(`${base}/api/health`)).arrayBuffer();
      lat.push(performance.now() - s);
      await sleep(20);
    }
  })();
  const t0 = performance.now();
  const result = await work();
  const ms = performance.now() - t0;
  done = true;
  await probe;
  clearInterval(rss);
  lat.sort((a, b) => a - b);
  return { result, ms, peak, lat };
}

const fmtLat = (l: number[]) =>
  `${quantile(l, 0.5).toFixed(1)} / ${quantile(l, 0.99).toFixed(1)} / ${(l[l.length - 1] ?? NaN).toFixed(1)} ms (${l.length} probes)`;

async function main(): Promise<void> {
  const pgPort = await freePort();
  const started = pg("start", pgPort);
  const url = /DATABASE_URL=(\S+)/.exec(started.stdout ?? "")?.[1];
  if (started.status !== 0 || !url)
    throw new Error("could not start a PostgreSQL cluster for the size bench");
  let server: ChildProcess | undefined;
  const rows: string[] = [];
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
      env: { ...env, PORT: String(port), ANALYSIS_POLL_SECONDS: "0.5", ANALYSIS_EXPIRE_SECONDS: "3600" },
      stdio: ["ignore", "inherit", "inherit"],
    });
    const pid = server.pid!;
    const base = `http://127.0.0.1:${port}`;
    for (let i = 0; ; i++) {
      if (i > 600) throw new Error("the server did not start");
      try {
        if ((await fetch(`${base}/api/health`)).ok) break;
      } catch {
        /* not listening yet */
      }
      await sleep(100);
    }
    const author = new Client(base);
    const reviewer = new Client(base);
    await author.req("POST", "/api/auth/sign-in", { username: "author", password: "tapwright-author" });
    await reviewer.req("POST", "/api/auth/sign-in", { username: "reviewer", password: "tapwright-reviewer" });
    const projects = (await author.req("GET", "/api/projects")).json.projects as {
      id: number;
      slug: string;
    }[];
    const pid0 = projects.find((p) => p.slug === "coastwatch-s")!.id;

    for (const n of SIZES) {
      const label = `${n.toLocaleString("en")} samples`;
      const created = await during(base, pid, () =>
        author.req("POST", `/api/projects/${pid0}/designs`, { name: `size bench ${n}`, content: lfm(n) }),
      );
      if (created.result.status !== 201) {
        const msg = JSON.stringify(created.result.json?.error?.details?.[0]?.message ?? created.result.json);
        rows.push(
          `| ${label} | refused when saved (${created.result.status}) in ${(created.ms / 1000).toFixed(1)} s: ${msg.slice(0, 160)} | peak RSS ${created.peak.toFixed(0)} MiB | ${fmtLat(created.lat)} |`,
        );
        continue;
      }
      const rev = created.result.json.revision.id as number;
      await author.req("POST", `/api/revisions/${rev}/analysis`);
      for (let i = 0; ; i++) {
        const a = (await author.req("GET", `/api/revisions/${rev}/analysis`)).json.analysis;
        if (a?.state === "done") break;
        if (a?.state === "failed" || i > 36_000)
          throw new Error(`analysis of ${label}: ${JSON.stringify(a?.error ?? a?.state)}`);
        await sleep(100);
      }
      await author.req("POST", `/api/revisions/${rev}/submit`);
      const ok = await reviewer.req("POST", `/api/revisions/${rev}/decision`, {
        decision: "approved",
        comment: "bench",
      });
      if (ok.status !== 201) throw new Error(`approve ${label}: ${JSON.stringify(ok.json)}`);
      const rel = await during(base, pid, () =>
        author.req("POST", `/api/revisions/${rev}/release`, { version: "1.0.0", notes: "bench" }),
      );
      if (rel.result.status !== 201) {
        rows.push(
          `| ${label} | release refused (${rel.result.status}): ${JSON.stringify(rel.result.json).slice(0, 160)} | | |`,
        );
        continue;
      }
      const r = rel.result.json.release;
      const dl = await fetch(`${base}/api/releases/${r.id}/bundle`, { headers: { cookie: author.cookie } });
      const bytes = (await dl.arrayBuffer()).byteLength;
      rows.push(
        `| ${label} | release build ${(rel.ms / 1000).toFixed(1)} s, bundle ${(r.bundleSize / 1048576).toFixed(1)} MiB (downloaded ${dl.status}, ${bytes === r.bundleSize ? "same size" : "SIZE DIFFERS"}) | peak RSS ${rel.peak.toFixed(0)} MiB | ${fmtLat(rel.lat)} |`,
      );
    }

    const big = "1".repeat(32 * 1024 * 1024);
    const upload = await during(base, pid, async () => {
      const form = new FormData();
      form.append("file", new Blob([big]), "one-line.txt");
      const res = await fetch(`${base}/api/projects/${pid0}/uploads`, {
        method: "POST",
        body: form,
        headers: { cookie: author.cookie },
      });
      return res.status;
    });
    rows.push(
      `| 32 MiB single-line upload | answered ${upload.result} in ${(upload.ms / 1000).toFixed(1)} s | peak RSS ${upload.peak.toFixed(0)} MiB | ${fmtLat(upload.lat)} |`,
    );
    const burst = await during(base, pid, () =>
      Promise.all(
        Array.from({ length: 16 }, (_, i) =>
          new Client(base).req("POST", "/api/auth/sign-in", {
            username: `nobody-${i}`,
            password: "not-a-password",
          }),
        ),
      ),
    );
    rows.push(
      `| 16 parallel sign-ins (unknown users: a full bcrypt compare each) | all answered in ${(burst.ms / 1000).toFixed(1)} s (${burst.result
        .map((r) => r.status)
        .join(",")
        .slice(0, 40)}) | peak RSS ${burst.peak.toFixed(0)} MiB | ${fmtLat(burst.lat)} |`,
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

  const sh = (cmd: string) => {
    const r = spawnSync("bash", ["-c", cmd], { encoding: "utf8" });
    return r.status === 0 ? r.stdout.trim() : "?";
  };
  const model = /model name\s*:\s*(.*)/.exec(sh("cat /proc/cpuinfo"))?.[1] ?? cpus()[0]?.model ?? "?";
  const machine = `${sh("nproc")} CPUs (nproc), ${model}, Node ${process.version}, load average ${sh("cut -d' ' -f1-3 /proc/loadavg")}`;
  const section = [
    "<!-- bench-sizes:start -->",
    "## Release sizes (scripts/bench-sizes.ts, `npm run bench -- --sizes`)",
    "",
    "The real server on a throwaway cluster. Per size: the release POST (bundle built in the bundle lane of",
    "the CPU pool), the server's peak RSS meanwhile, and GET /api/health p50 / p99 / max from a probe every",
    "20 ms during it. Target: health p99 under 100 ms throughout. Figures from a shared machine; not asserted.",
    "",
    `Last run: ${machine}.`,
    "",
    "| case | result | memory | /api/health p50 / p99 / max |",
    "| --- | --- | ---: | ---: |",
    ...rows,
    "<!-- bench-sizes:end -->",
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
  const start = doc.indexOf("<!-- bench-sizes:start -->");
  const end = doc.indexOf("<!-- bench-sizes:end -->");
  if (start >= 0 && end > start)
    doc =
      doc.slice(0, start) + section + doc.slice(end + "<!-- bench-sizes:end -->".length).replace(/^\n/, "");
  else {
    const marker = doc.indexOf("<!-- bench:results -->");
    doc = marker >= 0 ? `${doc.slice(0, marker)}${section}\n${doc.slice(marker)}` : `${doc}\n${section}`;
  }
  writeFileSync(docUrl, doc);
}

await main();
