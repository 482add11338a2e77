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

const sh = (cmd: string) => {
  try {
    return execSync(cmd, { encoding: "utf8" }).trim();
  } catch {
    return "?";
  }
};
const model = /model name\s*:\s*(.*)/.exec(sh("cat /proc/cpuinfo"))?.[1] ?? cpus()[0]?.model ?? "?";
const machine = `${sh("nproc")} CPUs (nproc), ${model}, Node ${process.version}, load average ${sh("cut -d' ' -f1-3 /proc/loadavg")}`;
const ms = (v: number) => (Number.isFinite(v) ? v.toFixed(1) : "n/a");
const table = [
  `| case (median of ${RUNS} after 1 warm-up) | wall (ms) | CPU, process (ms) | CPU, main thread (ms) |`,
  "| --- | ---: | ---: | ---: |",
  ...rows.map(([k, v]) => `| ${k} | ${ms(v.wall)} | ${ms(v.cpu)} | ${ms(v.mainCpu)} |`),
  `| peak RSS (sampled every 5 ms) | ${(peakRss / 2 ** 20).toFixed(0)} MiB | | |`,
].join("\n");
console.log(machine);
console.log(table);

const docUrl = new URL("../docs/benchmarks.md", import.meta.url);
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
