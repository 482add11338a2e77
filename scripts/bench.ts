/**
 * Benchmarks: medians of ≥ 5 runs for complex LFM analyses (4,096 / 65,536 / 262,144 samples, U = 8),
 * the W = 6…24 sweep on 65,536 samples, and bit-true golden vectors (1,024 and 4,096 complex taps over
 * 16,384 samples); peak RSS sampled. Prints a table and writes docs/benchmarks.md.
 *
 * Per case: median wall time, median CPU time of the process (process.cpuUsage, user + system; includes
 * V8's helper threads, e.g. concurrent GC) and median CPU time of the main thread alone (Linux
 * /proc/self/task/<pid>/schedstat, ns). The machine is shared, so wall time carries other people's load;
 * the main thread's CPU time is what the code costs and what an idle machine's wall time would be.
 */
import { execFileSync, execSync } from "node:child_process";
import { readFileSync, writeFileSync } from "node:fs";
import { cpus } from "node:os";
import { fileURLToPath } from "node:url";
import { analyze } from "../shared/dsp/analysis";
import { bitTrueFilter } from "../shared/dsp/bit-true";
import { createRng } from "../shared/dsp/random";

// `npm run bench -- --sizes`: only the release-size benchmark (scripts/bench-sizes.ts, its own section).
if (process.argv.includes("--sizes")) {
  execFileSync(
    process.execPath,
    ["--import", "tsx", fileURLToPath(new URL("./bench-sizes.ts", import.meta.url))],
    {
      stdio: "inherit",
    },
  );
  process.exit(0);
}

const RUNS = 5;
let peakRss = 0;
const sample = () => (peakRss = Math.max(peakRss, process.memoryUsage().rss));
const timer = setInterval(sample, 5);

/** Main-thread CPU time in ms from schedstat (first field, ns); NaN where /proc has no schedstat. */
const schedstatPath = `/proc/self/task/${process.pid}/schedstat`;
function mainThreadCpuMs(): number {
  try {
    return Number(readFileSync(schedstatPath, "utf8").split(" ")[0]) / 1e6;
  } catch {
    return NaN;
  }
}

/** Medians of one case's runs, ms. */
interface Timing {
  wall: number;
  cpu: number;
  mainCpu: number;
}

const mid = (v: number[]) => v.sort((a, b) => a - b)[Math.floor(v.length / 2)]!;

function median(f: () => void): Timing {
  const wall: number[] = [];
  const cpu: number[] = [];
  const mainCpu: number[] = [];
  f(); // warm-up: JIT and FFT plans, not counted
  for (let i = 0; i < RUNS; i++) {
    const m0 = mainThreadCpuMs();
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    f();
    wall.push(performance.now() - t0);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000);
    mainCpu.push(mainThreadCpuMs() - m0);
    sample();
  }
  return { wall: mid(wall), cpu: mid(cpu), mainCpu: mid(mainCpu) };
}

const lfm = (n: number, sweep: boolean) => ({
  kind: "waveform",
  tx: { kind: "lfm", bandwidthHz: 10e6, pulseWidthS: n / 12.5e6, sampleRateHz: 12.5e6 },
  rx: { window: { kind: "taylor", nbar: 5, sidelobeDb: -35 } },
  fixedPoint: { tx: { wordLength: 14, fractionLength: 13 }, rx: { wordLength: 12, fractionLength: 11 } },
  limits: { pslDbMax: -34, islrDbMax: -25, coefficientSqnrDbMin: 50 },
  ...(sweep ? { sweep: { minBits: 6, maxBits: 24 } } : {}),
});

function golden(taps: number) {
  const rng = createRng(7);
  const code = (bits: number) => Math.round((rng.uniform() * 2 - 1) * (2 ** (bits - 1) - 1));
  const mk = (n: number, bits: number) => ({
    re: Float64Array.from({ length: n }, () => code(bits)),
    im: Float64Array.from({ length: n }, () => code(bits)),
  });
  const input = mk(16_384, 14);
  const coefficients = mk(taps, 16);
  return () =>
    bitTrueFilter({
      input,
      coefficients,
      outputShift: 16,
      rounding: "nearest-even",
      overflow: "saturate",
      outputBits: 24,
      inputBits: 14,
      coefficientBits: 16,
    });
}

/**
 * `--vs-numpy`: the product's analyze() against the numpy/scipy kernel (scripts/numpy-kernel.py: complex
 * LFM, Taylor 5/−35, 16-bit receive table, ×8, PSL/ISLR; the W = 6…24 sweep as a full recompute per W),
 * in 3 alternating rounds (Node, then Python, each timing itself in-process), medians of the rounds.
 * Skipped with a note when Debian's python3-numpy / python3-scipy are missing.
 */
const PYTHON = process.env.BENCH_PYTHON ?? "/usr/bin/python3";
const KERNEL = fileURLToPath(new URL("./numpy-kernel.py", import.meta.url));
const ROUNDS = 3;

/**
 * The kernel's functions timed in its own process as the kernel times them (one warm-up, median of 5, of 3
 * at ≥ 262,144 samples; sweep = difference of two medians), on two clocks: wall (perf_counter, what the
 * kernel prints) and the thread's CPU time (thread_time), which other people's load does not inflate.
 */
const NUMPY_TIMER = `
import importlib.util, json, sys, time
spec = importlib.util.spec_from_file_location("k", sys.argv[1]); k = importlib.util.module_from_spec(spec); spec.loader.exec_module(k)
def med(f, n):
    f(); w = []; c = []
    for _ in range(n):
        t, u = time.perf_counter(), time.thread_time(); f(); w.append((time.perf_counter() - t) * 1e3); c.append((time.thread_time() - u) * 1e3)
    return sorted(w)[n // 2], sorted(c)[n // 2]
sizes = [int(a) for a in sys.argv[2:]]; out = {}
for n in sizes or (4096, 65536, 262144):
    out[f"analysis_{n}_ms"], out[f"analysis_{n}_cpu"] = med(lambda: k.analysis(n), 3 if n >= 262144 else 5)
if not sizes:
    a = med(lambda: k.analysis(65536, widths=range(6, 25)), 3); b = med(lambda: k.analysis(65536), 3)
    out["sweep_6_24_65536_ms"], out["sweep_6_24_65536_cpu"] = a[0] - b[0], a[1] - b[1]
print(json.dumps(out))
`;
function numpyRun(sizes: number[]): Record<string, number> {
  const env = { ...process.env };
  delete env.OPENBLAS_CORETYPE; // they slow numpy on this machine (the kernel's docstring)
  delete env.OPENBLAS_L2_SIZE;
  const out = execFileSync(PYTHON, ["-c", NUMPY_TIMER, KERNEL, ...sizes.map(String)], {
    encoding: "utf8",
    env,
  });
  return JSON.parse(out.trim().split("\n").pop()!) as Record<string, number>;
}

function numpyAvailable(): string | null {
  try {
    execFileSync(PYTHON, ["-c", "import numpy, scipy"], { stdio: "ignore" });
    return null;
  } catch {
    return `${PYTHON} with numpy and scipy not found (Debian: apt-get install python3-numpy python3-scipy)`;
  }
}

/** Medians like the kernel's: one warm-up, then k runs (3 at ≥ 262,144 samples, else 5); wall and main-thread CPU. */
function productMs(f: () => void, k: number): { wall: number; cpu: number } {
  f();
  const t: number[] = [];
  const c: number[] = [];
  for (let i = 0; i < k; i++) {
    const c0 = mainThreadCpuMs();
    const t0 = performance.now();
    f();
    t.push(performance.now() - t0);
    c.push(mainThreadCpuMs() - c0);
    sample();
  }
  return { wall: mid(t), cpu: mid(c) };
}

/** The kernel's spec as a product spec: complex LFM of N samples at fs = 4·B (B·T = N/4), 16-bit rx. */
const kernelSpec = (n: number, sweep: boolean) => ({
  kind: "waveform",
  tx: { kind: "lfm", bandwidthHz: 1e6, pulseWidthS: n / 4e6, sampleRateHz: 4e6 },
  rx: { window: { kind: "taylor", nbar: 5, sidelobeDb: -35 } },
  fixedPoint: { tx: { wordLength: 16, fractionLength: 15 }, rx: { wordLength: 16, fractionLength: 15 } },
  interpolation: 8,
  ...(sweep ? { sweep: { minBits: 6, maxBits: 24 } } : {}),
});

function productRound(): Record<string, number> {
  const out: Record<string, number> = {};
  for (const n of [4096, 65_536, 262_144]) {
    const t = productMs(() => analyze(kernelSpec(n, false)), n >= 262_144 ? 3 : 5);
    out[`analysis_${n}_ms`] = t.wall;
    out[`analysis_${n}_cpu`] = t.cpu;
  }
  const a = productMs(() => analyze(kernelSpec(65_536, true)), 3);
  const b = productMs(() => analyze(kernelSpec(65_536, false)), 3);
  out.sweep_6_24_65536_ms = a.wall - b.wall;
  out.sweep_6_24_65536_cpu = a.cpu - b.cpu;
  return out;
}

const CASES: [string, string, number][] = [
  ["analysis_4096_ms", "4,096 samples", 0.4],
  ["analysis_65536_ms", "65,536 samples", 0.4],
  ["analysis_262144_ms", "262,144 samples", 0.4],
  ["sweep_6_24_65536_ms", "sweep W = 6…24, 65,536 samples", 0.2],
];

function vsNumpy(): string {
  const missing = numpyAvailable();
  if (missing) return `Skipped: ${missing}.`;
  const ours: Record<string, number>[] = [];
  const theirs: Record<string, number>[] = [];
  for (let r = 0; r < ROUNDS; r++) {
    ours.push(productRound());
    theirs.push(numpyRun([]));
    console.log(`round ${r + 1}/${ROUNDS}`, JSON.stringify(ours[r]), JSON.stringify(theirs[r]));
  }
  const med = (rs: Record<string, number>[], k: string) => mid(rs.map((x) => x[k]!));
  const ratioRows = CASES.map(([k, label, goal]) => {
    const cpuKey = k.replace(/_ms$/, "_cpu");
    const ratioOf = (key: string) => {
      const rs = ours.map((o, i) => o[key]! / theirs[i]![key]!);
      return { ratio: mid([...rs]), rs };
    };
    const w = ratioOf(k);
    const c = ratioOf(cpuKey);
    const list = (rs: number[]) => rs.map((x) => x.toFixed(2)).join(", ");
    return `| ${label} | ${ms(med(ours, k))} / ${ms(med(ours, cpuKey))} | ${ms(med(theirs, k))} / ${ms(med(theirs, cpuKey))} | ${w.ratio.toFixed(2)} (${list(w.rs)}) | ${c.ratio.toFixed(2)} (${list(c.rs)}) | ≤ ${goal} | ${c.ratio <= goal ? "met" : "not met"} |`;
  });
  sample();
  const rssRatios = peakRss; // the ratio rounds' largest case is 262,144 samples
  // Growth: one pass per size (Node, then Python), ms and ms per N·log2 N.
  // `--no-growth` skips it (a quicker run).
  const growthSizes = process.argv.includes("--no-growth") ? [] : [4096, 16_384, 65_536, 262_144, 1_048_576];
  const growth = growthSizes.map((n) => {
    const a = productMs(() => analyze(kernelSpec(n, false)), n >= 262_144 ? 3 : 5).cpu;
    const b = numpyRun([n])[`analysis_${n}_cpu`]!;
    const nlogn = (n * Math.log2(n)) / 1e6;
    return `| ${n.toLocaleString("en")} | ${ms(a)} | ${(a / nlogn).toFixed(2)} | ${ms(b)} | ${(b / nlogn).toFixed(2)} | ${(a / b).toFixed(2)} |`;
  });
  return [
    `${ROUNDS} alternating rounds (product, then numpy/scipy), each side's in-process medians; ratio = median of the rounds' ratios (the rounds in brackets).`,
    "",
    "Times are wall / CPU of the computing thread (Node main thread from schedstat; Python thread_time), ms. The goal is judged on the CPU ratio: on this shared machine the wall clock mostly measures the other jobs.",
    "",
    "| case | product, wall / CPU | numpy/scipy, wall / CPU | ratio, wall (rounds) | ratio, CPU (rounds) | goal | (CPU) |",
    "| --- | ---: | ---: | ---: | ---: | ---: | --- |",
    ...ratioRows,
    "",
    ...(growth.length
      ? [
          "Growth (one pass per size, CPU ms of the computing thread, and ms per million N·log2 N):",
          "",
          "| samples | product (ms) | per N·log N | numpy/scipy (ms) | per N·log N | ratio |",
          "| ---: | ---: | ---: | ---: | ---: | ---: |",
          ...growth,
          "",
        ]
      : []),
    `Peak RSS of the Node process (sampled every 5 ms): ${(rssRatios / 2 ** 20).toFixed(0)} MiB up to 262,144 samples (goal ≤ 256 MiB), ${(peakRss / 2 ** 20).toFixed(0)} MiB with the 1,048,576-sample growth case.`,
  ].join("\n");
}

const ms = (v: number) => (Number.isFinite(v) ? v.toFixed(1) : "n/a");
const sh = (cmd: string) => {
  try {
    return execSync(cmd, { encoding: "utf8" }).trim();
  } catch {
    return "?";
  }
};
const model = /model name\s*:\s*(.*)/.exec(sh("cat /proc/cpuinfo"))?.[1] ?? cpus()[0]?.model ?? "?";
const machineLine = () =>
  `${sh("nproc")} CPUs (nproc), ${model}, Node ${process.version}, load average ${sh("cut -d' ' -f1-3 /proc/loadavg")}`;
const docUrl = new URL("../docs/benchmarks.md", import.meta.url);

/** Rewrite the section of docs/benchmarks.md between `<!-- name:start -->` and `<!-- name:end -->` (appended when absent). */
function writeSection(name: string, body: string) {
  let doc = "";
  try {
    doc = readFileSync(docUrl, "utf8");
  } catch {
    doc = "# Benchmarks\n";
  }
  const start = `<!-- ${name}:start -->`;
  const end = `<!-- ${name}:end -->`;
  const block = `${start}\n\n${body}\n\n${end}`;
  const i = doc.indexOf(start);
  const j = doc.indexOf(end);
  writeFileSync(
    docUrl,
    i >= 0 && j > i ? doc.slice(0, i) + block + doc.slice(j + end.length) : `${doc}\n${block}\n`,
  );
}

// Flags: one mode per run. Other modes (`--load`, `--sizes`) hook in here beside `--vs-numpy`.
if (process.argv.includes("--vs-numpy")) {
  const body = vsNumpy();
  clearInterval(timer);
  const machine = machineLine();
  console.log(machine);
  console.log(body);
  // Keeps the last three runs: each run's block is prepended to the section, the oldest dropped.
  let doc = "";
  try {
    doc = readFileSync(docUrl, "utf8");
  } catch {
    /* new file */
  }
  const prev = /<!-- vs-numpy:start -->([\s\S]*?)<!-- vs-numpy:end -->/.exec(doc)?.[1] ?? "";
  const runs = prev
    .split("<!-- vs-numpy:run -->")
    .map((x) => x.trim())
    .filter((x) => x.startsWith("Run "));
  const stamp = new Date().toISOString().slice(0, 16).replace("T", " ");
  runs.unshift(`Run ${stamp} UTC: ${machine}.\n\n${body}`);
  writeSection(
    "vs-numpy",
    `## Product vs numpy/scipy (\`npm run bench -- --vs-numpy\`, last three runs)\n\n<!-- vs-numpy:run -->\n\n${runs
      .slice(0, 3)
      .join("\n\n<!-- vs-numpy:run -->\n\n")}`,
  );
  process.exit(0);
}

const rows: [string, Timing][] = [];
for (const n of [4096, 65_536, 262_144])
  rows.push([
    `complex LFM analysis, ${n.toLocaleString("en")} samples, U = 8`,
    median(() => analyze(lfm(n, false))),
  ]);
const full = median(() => analyze(lfm(65_536, true)));
rows.push(["analysis + sweep W = 6…24, 65,536 samples", full]);
const alone = rows[1]![1];
rows.push([
  "sweep W = 6…24 alone (difference of the two 65,536-sample rows)",
  { wall: full.wall - alone.wall, cpu: full.cpu - alone.cpu, mainCpu: full.mainCpu - alone.mainCpu },
]);
for (const taps of [1024, 4096])
  rows.push([
    `golden vectors, ${taps.toLocaleString("en")} complex taps × 16,384 samples`,
    median(golden(taps)),
  ]);
clearInterval(timer);
sample();

const machine = machineLine();
const table = [
  `| case (median of ${RUNS} after 1 warm-up) | wall (ms) | CPU, process (ms) | CPU, main thread (ms) |`,
  "| --- | ---: | ---: | ---: |",
  ...rows.map(([k, v]) => `| ${k} | ${ms(v.wall)} | ${ms(v.cpu)} | ${ms(v.mainCpu)} |`),
  `| peak RSS (sampled every 5 ms) | ${(peakRss / 2 ** 20).toFixed(0)} MiB | | |`,
].join("\n");
console.log(machine);
console.log(table);

const marker = "<!-- bench:results -->";
let doc = "";
try {
  doc = readFileSync(docUrl, "utf8");
} catch {
  doc = `# Benchmarks\n\n${marker}\n`;
}
const head = doc.includes(marker) ? doc.slice(0, doc.indexOf(marker) + marker.length) : `${doc}\n${marker}`;
writeFileSync(docUrl, `${head}\n\nLast run (\`npm run bench\`): ${machine}.\n\n${table}\n`);

// The API and analysis-queue figures (own PostgreSQL cluster and server); they write their own section above.
// `npm run bench -- --dsp-only` skips them.
if (!process.argv.includes("--dsp-only")) {
  execFileSync(
    process.execPath,
    ["--import", "tsx", fileURLToPath(new URL("./bench-api.ts", import.meta.url))],
    { stdio: "inherit" },
  );
}

// `npm run bench -- --load`: also the HTTP load figures (scripts/bench-load.ts, own cluster and server).
if (process.argv.includes("--load")) {
  execFileSync(
    process.execPath,
    ["--import", "tsx", fileURLToPath(new URL("./bench-load.ts", import.meta.url))],
    { stdio: "inherit" },
  );
}
