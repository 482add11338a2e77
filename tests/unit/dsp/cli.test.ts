import { spawnSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";

const root = fileURLToPath(new URL("../../..", import.meta.url));
const fixture = fileURLToPath(new URL("./fixtures/lfm-taylor.json", import.meta.url));
const run = (args: string[], input?: string) =>
  spawnSync(process.execPath, ["--import", "tsx", "scripts/analyze.ts", ...args], {
    cwd: root,
    input,
    encoding: "utf8",
  });

describe("scripts/analyze.ts", () => {
  it("prints the analysis of a spec file", () => {
    const r = run([fixture]);
    // Only design warnings on stderr (n̄ = 5 is below the monotonic-taper minimum for −35 dB).
    expect(r.stderr).toMatch(/^(warning: [^\n]*\n)*$/);
    expect(r.status).toBe(0);
    const report = JSON.parse(r.stdout);
    expect(report.kind).toBe("waveform");
    expect(report.tables.map((t: { role: string }) => t.role)).toEqual(["tx", "rx"]);
    expect(report.sweep.rows).toHaveLength(11);
  });

  it("reads the spec from stdin with -", () => {
    const r = run(["-"], readFileSync(fixture, "utf8"));
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).fixed.pslDb).toBeLessThan(-30);
  });

  it("prints the report's design warnings on stderr (a Dolph-Chebyshev edge spike)", () => {
    const spec = JSON.parse(readFileSync(fixture, "utf8"));
    spec.rx = { window: { kind: "chebyshev", attenuationDb: 40 } };
    spec.tx.pulseWidthS = 0.0008; // 2,000 samples: long enough for the edge spike
    delete spec.sweep;
    delete spec.dopplerHz;
    const r = run(["-"], JSON.stringify(spec));
    expect(r.status).toBe(0);
    expect(r.stderr).toMatch(/^warning: Dolph-Chebyshev 40 dB over \d+ samples/m);
    expect(JSON.parse(r.stdout).warnings.length).toBeGreaterThan(0);
  });

  it("exits 2 naming an unknown key (strict spec)", () => {
    const spec = JSON.parse(readFileSync(fixture, "utf8"));
    spec.rx = { windw: { kind: "hamming" } };
    const r = run(["-"], JSON.stringify(spec));
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/invalid spec: rx: .*windw/);
  });

  it("exits 2 naming the field of a bad spec", () => {
    const spec = JSON.parse(readFileSync(fixture, "utf8"));
    spec.fixedPoint.rx.wordLength = 40;
    const r = run(["-"], JSON.stringify(spec));
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/fixedPoint\.rx\.wordLength/);
    expect(r.stdout).toBe("");
  });
});
