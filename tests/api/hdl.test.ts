// The bundle's HDL run by tools we did not write: Icarus Verilog (iverilog -g2005, vvp) and GHDL
// (ghdl --std=08) simulate the bundle's own testbench against its reference FIR (PASS) and against broken
// copies of it — an accumulator one bit short of the width the worst case needs, the taps reversed, floor
// instead of the chosen rounding — each of which must FAIL on the set made to catch it, naming the first
// mismatch as it stands in the set's expected.txt. A missing simulator skips its half with a note.
import { execFileSync } from "node:child_process";
import { readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { useApiTestDatabase } from "./helpers";
import { barker13, signedIn } from "./lifecycle-helpers";
import { bundleOf, releasedDesign, unzipToTemp } from "./bundles-helpers";

const t = useApiTestDatabase();
// Simulations on a loaded 2-core CI machine: generous limits (speed is measured in docs/benchmarks.md).
const SIM_TIMEOUT = 300_000;

const has = (tool: string) => {
  try {
    execFileSync("which", [tool], { stdio: "ignore" });
    return true;
  } catch {
    return false;
  }
};
const ICARUS = has("iverilog") && has("vvp");
const GHDL = has("ghdl");
if (!ICARUS)
  console.warn("hdl.test.ts: iverilog/vvp not installed (apt-get install iverilog): Verilog runs skipped");
if (!GHDL) console.warn("hdl.test.ts: ghdl not installed (apt-get install ghdl): VHDL runs skipped");

/** Barker-13 with 12-bit receive words and a 12-bit ADC: small, asymmetric, and its ties are reachable. */
const barkerDatapath = {
  ...barker13,
  fixedPoint: { tx: { wordLength: 12, fractionLength: 11 }, rx: { wordLength: 12, fractionLength: 11 } },
  inputBits: 12,
  datapath: { outputBits: 16, outputRounding: "nearest-even" },
};

/** A short complex LFM (32 samples), nearest-away output rounding and a shift set by hand (it saturates). */
const shortLfm = {
  kind: "waveform",
  tx: { kind: "lfm", bandwidthHz: 1e6, pulseWidthS: 16e-6, sampleRateHz: 2e6 },
  rx: { window: { kind: "hamming" } },
  fixedPoint: { tx: { wordLength: 16, fractionLength: 15 }, rx: { wordLength: 16, fractionLength: 15 } },
  interpolation: 1,
  inputBits: 14,
  datapath: { outputBits: 18, outputShift: 12, outputRounding: "nearest-away" },
};

type Manifest = {
  tables: {
    role: string;
    length: number;
    datapath: { accumulatorBits: number; accumulatorRequiredBits: number; outputShift: number } | null;
  }[];
  golden: { filterTable: string; sets: { name: string; expected: { text: string; length: number } }[] };
};

interface Bundle {
  dir: string;
  manifest: Manifest;
  dp: NonNullable<Manifest["tables"][number]["datapath"]>;
  taps: number;
  cleanup(): void;
}

async function bundle(content: object, version: string): Promise<Bundle> {
  const rel = await releasedDesign(t, content, version);
  const firmware = await signedIn(t.app, "firmware");
  const res = await bundleOf(firmware, rel.release.id);
  expect(res.status).toBe(200);
  const u = unzipToTemp(res.body);
  const manifest = JSON.parse(u.read("manifest.json").toString("utf8")) as Manifest;
  const table = manifest.tables.find((x) => x.role === manifest.golden.filterTable)!;
  return { dir: u.dir, manifest, dp: table.datapath!, taps: table.length, cleanup: u.cleanup };
}

/** Lines of a set's expected.txt without comments. */
function expectedLines(b: Bundle, set: string): string[] {
  return readFileSync(path.join(b.dir, `golden/${set}/expected.txt`), "utf8")
    .split("\n")
    .filter((l) => l !== "" && !l.startsWith("#"));
}

/** Runs Verilog with the reference FIR edited by `edit`; returns stdout lines. */
function runVerilog(b: Bundle, edit: (src: string) => string = (s) => s): string[] {
  const ref = readFileSync(path.join(b.dir, "hdl/tw_fir.v"), "utf8");
  const dut = edit(ref);
  writeFileSync(path.join(b.dir, "dut.v"), dut);
  execFileSync("iverilog", ["-g2005", "-Wall", "-o", "tb.vvp", "hdl/tw_tb.v", "dut.v"], { cwd: b.dir });
  return execFileSync("vvp", ["-n", "tb.vvp"], { cwd: b.dir, encoding: "utf8" }).trimEnd().split("\n");
}

/** Runs VHDL with the reference FIR edited by `edit`; returns the report lines (message only). */
function runVhdl(b: Bundle, edit: (src: string) => string = (s) => s): string[] {
  const ref = readFileSync(path.join(b.dir, "hdl/tw_fir.vhd"), "utf8");
  writeFileSync(path.join(b.dir, "dut.vhd"), edit(ref));
  const opts = { cwd: b.dir, encoding: "utf8" as const };
  execFileSync("ghdl", ["-a", "--std=08", "dut.vhd", "hdl/tw_tb.vhd"], opts);
  execFileSync("ghdl", ["-e", "--std=08", "tw_tb"], opts);
  const out = execFileSync("ghdl", ["-r", "--std=08", "tw_tb"], opts);
  return out
    .trimEnd()
    .split("\n")
    .map((l) => l.replace(/^.*\(report note\): /, ""));
}

/**
 * What reversed taps must print on the impulse set: output k of the impulse is P·h[k], so with the taps
 * reversed it is expected line Nh−1−k; the first k where the two lines differ is the first mismatch.
 */
function reversedMismatch(b: Bundle): RegExp {
  const lines = expectedLines(b, "impulse");
  const k = lines.findIndex((l, i) => i < b.taps && l !== lines[b.taps - 1 - i]);
  expect(k).toBeGreaterThanOrEqual(0); // the table is asymmetric
  return new RegExp(`^FAIL index ${k} got ${lines[b.taps - 1 - k]} expected ${lines[k]}$`);
}

/** The summary lines: one per set, then PASS or FAIL. */
function verdicts(lines: string[]) {
  const sets = new Map<string, string>();
  for (const l of lines) {
    const m = /^(PASS|FAIL) ([a-z-]+) (.*)$/.exec(l);
    if (m) sets.set(m[2]!, `${m[1]} ${m[3]}`);
  }
  return { sets, overall: lines[lines.length - 1] };
}

// Broken copies, as a firmware engineer might get them wrong.
const verilogEdits = {
  accumulatorShort: (b: Bundle) => (s: string) =>
    s.replace(
      `parameter ACC_BITS = ${b.dp.accumulatorBits}`,
      `parameter ACC_BITS = ${b.dp.accumulatorRequiredBits - 1}`,
    ),
  reversed: (b: Bundle) => (s: string) =>
    s.replace(
      /assign h_([iq])\[(\d+)\]/g,
      (_, c: string, k: string) => `assign h_${c}[${b.taps - 1 - Number(k)}]`,
    ),
  floor: () => (s: string) => s.replace(/parameter ROUNDING = \d/, "parameter ROUNDING = 0"),
};
const vhdlEdits = {
  accumulatorShort: (b: Bundle) => (s: string) =>
    s.replace(
      `ACC_BITS : positive := ${b.dp.accumulatorBits}`,
      `ACC_BITS : positive := ${b.dp.accumulatorRequiredBits - 1}`,
    ),
  reversed: (b: Bundle) => (s: string) =>
    s.replace(/^ {4}(\d+) => "/gm, (_, k: string) => `    ${b.taps - 1 - Number(k)} => "`),
  floor: () => (s: string) => s.replace(/ROUNDING : natural := \d/, "ROUNDING : natural := 0"),
};

describe("bundle HDL: self-checking testbenches and the reference FIR", () => {
  let barker: Bundle;
  let lfm: Bundle;

  beforeAll(async () => {
    barker = await bundle(barkerDatapath, "1.0.0");
    lfm = await bundle(shortLfm, "1.0.1");
  }, 240_000);
  afterAll(() => {
    barker?.cleanup();
    lfm?.cleanup();
  });

  it(
    "the datapath in the manifest: rule accumulator, required width one below it, shift = accumulator − output",
    () => {
      // Σ|ĥ| = 13·2047/2048, so the rule gives 12 + 12 + ⌈log2 12.99⌉ = 28 bits; the extreme
      // 2047·(9·2048 + 4·2047) = 54,491,140 (9 chips +1, 4 chips −1) is below 2^26, so 27 bits hold it.
      expect(barker.dp).toMatchObject({ accumulatorBits: 28, accumulatorRequiredBits: 27, outputShift: 12 });
      expect(lfm.dp.outputShift).toBe(12);
    },
    SIM_TIMEOUT,
  );

  it.skipIf(!ICARUS)(
    "Icarus: the reference passes every set, and the captured output equals expected.txt line for line",
    () => {
      for (const b of [barker, lfm]) {
        const v = verdicts(runVerilog(b));
        expect(v.overall).toBe("PASS");
        expect([...v.sets.keys()]).toEqual([
          "scenario",
          "impulse",
          "worst-case",
          "rounding",
          "random-full-scale",
        ]);
        for (const set of b.manifest.golden.sets) {
          expect(v.sets.get(set.name)).toBe(`PASS ${set.expected.length} outputs`);
          const sim = readFileSync(path.join(b.dir, `sim-${set.name}.txt`), "utf8").split("\n");
          expect(sim[0]).toMatch(/^# /);
          expect(sim.filter((l) => l !== "" && !l.startsWith("#"))).toEqual(expectedLines(b, set.name));
        }
      }
    },
    SIM_TIMEOUT,
  );

  it.skipIf(!ICARUS)(
    "Icarus: one accumulator bit short of the required width fails worst-case",
    () => {
      const v = verdicts(runVerilog(barker, verilogEdits.accumulatorShort(barker)));
      expect(v.overall).toBe("FAIL");
      // The first extreme sits at output Nh − 1 of the worst-case set.
      const idx = barker.taps - 1;
      const want = expectedLines(barker, "worst-case")[idx];
      expect(v.sets.get("worst-case")).toMatch(
        new RegExp(`^FAIL index ${idx} got -?\\d+ -?\\d+ expected ${want}$`),
      );
      expect(v.sets.get("scenario")).toMatch(/^PASS/);
    },
    SIM_TIMEOUT,
  );

  it.skipIf(!ICARUS)(
    "Icarus: reversed taps fail impulse on the asymmetric Barker table, at the first asymmetric tap",
    () => {
      const v = verdicts(runVerilog(barker, verilogEdits.reversed(barker)));
      expect(v.overall).toBe("FAIL");
      expect(v.sets.get("impulse")).toMatch(reversedMismatch(barker));
    },
    SIM_TIMEOUT,
  );

  it.skipIf(!ICARUS)(
    "Icarus: floor instead of the chosen rounding fails rounding (on the complex LFM too)",
    () => {
      for (const b of [barker, lfm]) {
        const v = verdicts(runVerilog(b, verilogEdits.floor()));
        expect(v.overall).toBe("FAIL");
        expect(v.sets.get("rounding")).toMatch(/^FAIL index \d+ got -?\d+ -?\d+ expected -?\d+ -?\d+$/);
      }
    },
    SIM_TIMEOUT,
  );

  it.skipIf(!GHDL)(
    "GHDL: the VHDL testbench passes the VHDL reference and fails the same three broken copies",
    () => {
      for (const b of [barker, lfm]) {
        const v = verdicts(runVhdl(b));
        expect(v.overall).toBe("PASS");
        for (const set of b.manifest.golden.sets)
          expect(v.sets.get(set.name)).toBe(`PASS ${set.expected.length} outputs`);
        const sim = readFileSync(path.join(b.dir, "sim-rounding.txt"), "utf8").split("\n");
        expect(sim.filter((l) => l !== "" && !l.startsWith("#"))).toEqual(expectedLines(b, "rounding"));
      }
      const short = verdicts(runVhdl(barker, vhdlEdits.accumulatorShort(barker)));
      expect(short.sets.get("worst-case")).toMatch(
        new RegExp(
          `^FAIL index ${barker.taps - 1} got -?\\d+ -?\\d+ expected ${expectedLines(barker, "worst-case")[barker.taps - 1]}$`,
        ),
      );
      const reversed = verdicts(runVhdl(barker, vhdlEdits.reversed(barker)));
      expect(reversed.sets.get("impulse")).toMatch(reversedMismatch(barker));
      const floor = verdicts(runVhdl(barker, vhdlEdits.floor()));
      expect(floor.sets.get("rounding")).toMatch(/^FAIL index \d+/);
      expect(floor.overall).toBe("FAIL");
    },
    SIM_TIMEOUT,
  );
});
