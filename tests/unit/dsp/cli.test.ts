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
    expect(r.stderr).toBe("");
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

  it("exits 2 naming the field of a bad spec", () => {
    const spec = JSON.parse(readFileSync(fixture, "utf8"));
    spec.fixedPoint.rx.wordLength = 40;
    const r = run(["-"], JSON.stringify(spec));
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/fixedPoint\.rx\.wordLength/);
    expect(r.stdout).toBe("");
  });
});
