/**
 * Built-in exports read back by tools from outside the project: Icarus Verilog's $readmemh, gcc, GHDL,
 * decimal.js and DataView. Each expected integer comes from the DSP core's quantizer (tables.ts).
 * A missing simulator or compiler skips its check with a note; .ci/run installs them.
 */
import Decimal from "decimal.js";
import { spawnSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { builtinTemplate } from "../../../server/exports/builtins";
import { renderExport } from "../../../server/exports/render";
import { edge32Case, firCase, lfmCase, unsigned8Case, type TableCase } from "./tables";

function has(tool: string): boolean {
  return spawnSync("sh", ["-c", `command -v ${tool}`], { encoding: "utf8" }).status === 0;
}
const TOOLS = { iverilog: has("iverilog") && has("vvp"), gcc: has("gcc"), ghdl: has("ghdl") };
for (const [tool, ok] of Object.entries(TOOLS))
  if (!ok)
    console.warn(`exports: ${tool} is not installed; its checks are SKIPPED (apt-get install -y ${tool})`);

const work = mkdtempSync(path.join(tmpdir(), "tapwright-exports-"));
afterAll(() => rmSync(work, { recursive: true, force: true }));

function run(cmd: string, args: string[], cwd: string): string {
  const r = spawnSync(cmd, args, { cwd, encoding: "utf8", timeout: 60_000 });
  if (r.status !== 0)
    throw new Error(`${cmd} ${args.join(" ")} failed (${r.status}):\n${r.stdout}\n${r.stderr}`);
  return r.stdout;
}

async function render(
  id: string,
  c: TableCase,
): Promise<{ text: string; bytes: Uint8Array; fileName: string }> {
  const t = builtinTemplate(id);
  if (!t) throw new Error(`no built-in ${id}`);
  const r = await renderExport(t, c.ctx);
  return { text: new TextDecoder().decode(r.bytes), bytes: r.bytes, fileName: r.fileName };
}

function dir(name: string): string {
  const d = path.join(work, name);
  rmSync(d, { recursive: true, force: true });
  spawnSync("mkdir", ["-p", d]);
  return d;
}

const numbers = (out: string) => out.trim().split(/\s+/).map(Number);

const CASES = [lfmCase(), firCase(), edge32Case(), unsigned8Case()];

describe("the fixtures are what the tests claim", () => {
  it("LFM: 100 complex 16-bit taps; FIR: 12-bit with negative taps and −2048; edge: ±2^31 extremes; unsigned 8-bit", () => {
    const [lfm, fir, edge] = CASES as [TableCase, TableCase, TableCase];
    expect(lfm.ctx.table.length).toBe(100);
    expect(lfm.ctx.spec.word_length).toBe(16);
    expect(Math.max(...lfm.codesI, ...lfm.codesQ)).toBe(32767); // full scale reaches the largest code
    expect(fir.ctx.spec.word_length).toBe(12);
    expect(fir.codesI).toContain(-2048);
    expect(fir.codesI.filter((c) => c < 0).length).toBeGreaterThan(1);
    expect(fir.codesI.filter((c) => c > 0).length).toBeGreaterThan(1);
    expect(edge.codesI).toEqual([-(2 ** 31), 2 ** 31 - 1, -1, 0, 2 ** 30]);
    expect(CASES[3]!.codesI).toEqual([0, 1, 128, 192, 255, 26]); // 0.1·256 = 25.6 → 26
  });
});

describe.each(CASES)("$label", (c) => {
  const expectedWords = c.ctx.table.complex ? c.codesI.flatMap((v, k) => [v, c.codesQ[k]!]) : c.codesI;
  const W = c.ctx.spec.word_length;
  const signed = c.ctx.spec.signed;

  it.skipIf(!TOOLS.iverilog)(
    "$readmemh in Icarus Verilog (-g2012) prints the quantized integers with the header's sign-extension idiom",
    async () => {
      const d = dir(`v-${c.ctx.table.ident}-${W}`);
      const hex = await render("readmemh", c);
      // IEEE 1364-2005 §17.2.9: one word per line, ⌈W/4⌉ digits; -1 at W=12 is FFF (REFERENCES.md).
      const dataLines = hex.text.split("\n").filter((l) => l !== "" && !l.startsWith("//"));
      expect(dataLines.length).toBe(expectedWords.length);
      for (const l of dataLines) expect(l).toMatch(new RegExp(`^[0-9A-F]{${Math.ceil(W / 4)}}$`));
      writeFileSync(path.join(d, "table.hex"), hex.bytes);
      // The header states the idiom for widening a word; use it as written (A = 40 here).
      const idiom = /^\/\/ {3}wire signed \[A-1:0\] h = (.*);$/m.exec(hex.text)?.[1];
      if (signed) expect(idiom).toBe(`{{(A-${W}){mem[k][${W - 1}]}}, mem[k]}`);
      else expect(idiom).toBeUndefined();
      const value = signed ? idiom!.replaceAll("A", "40") : "mem[k]";
      writeFileSync(
        path.join(d, "tb.v"),
        `module tb;
  reg [${W - 1}:0] mem [0:${expectedWords.length - 1}];
  reg signed [39:0] wide;
  integer k;
  initial begin
    $readmemh("table.hex", mem);
    for (k = 0; k < ${expectedWords.length}; k = k + 1) begin
      wide = ${value};
      $display("%0d", wide);
    end
    $finish;
  end
endmodule
`,
      );
      run("iverilog", ["-g2012", "-o", "tb.vvp", "tb.v"], d);
      const out = run("vvp", ["-n", "tb.vvp"], d);
      expect(out).not.toMatch(/[xz]/i);
      expect(numbers(out)).toEqual(expectedWords);
    },
  );

  it.skipIf(!TOOLS.gcc)(
    "the C header compiles with gcc -std=c99 -Wall -Wextra -Werror and prints the integers",
    async () => {
      const d = dir(`c-${c.ctx.table.ident}-${W}`);
      const h = await render("c-header", c);
      writeFileSync(path.join(d, "table.h"), h.bytes);
      const id = c.ctx.table.ident;
      const ID = id.toUpperCase();
      const arrays = c.ctx.table.complex ? [`${id}_i`, `${id}_q`] : [id];
      writeFileSync(
        path.join(d, "main.c"),
        `#include <stdio.h>
#include "table.h"
#include "table.h" /* the include guard makes a second include harmless */
int main(void) {
  int k;
  printf("%d %d %d %d\\n", ${ID}_N, ${ID}_W, ${ID}_F, ${ID}_COMPLEX);
  for (k = 0; k < ${ID}_N; k++) {
${arrays.map((a) => `    printf("%lld\\n", (long long)${a}[k]);`).join("\n")}
  }
  return 0;
}
`,
      );
      // A second unit that includes the header but uses nothing: no unused-variable warning may fail it.
      writeFileSync(
        path.join(d, "other.c"),
        `#include "table.h"\nint other(void);\nint other(void) { return 0; }\n`,
      );
      const flags = ["-std=c99", "-pedantic", "-Wall", "-Wextra", "-Werror"];
      run("gcc", [...flags, "-o", "prog", "main.c", "other.c"], d);
      const [head, ...rest] = run(path.join(d, "prog"), [], d).trim().split("\n");
      expect(numbers(head!)).toEqual([
        c.ctx.table.length,
        W,
        c.ctx.spec.fraction_length,
        c.ctx.table.complex ? 1 : 0,
      ]);
      expect(rest.map(Number)).toEqual(expectedWords);
      const type = h.text.match(/static const (\w+) /)?.[1];
      expect(type).toBe(`${signed ? "" : "u"}${W <= 8 ? "int8_t" : W <= 16 ? "int16_t" : "int32_t"}`);
    },
  );

  it.skipIf(!TOOLS.ghdl)(
    "GHDL analyses the VHDL-2008 package and a testbench prints the integers (ghdl -r)",
    async () => {
      const d = dir(`vhdl-${c.ctx.table.ident}-${W}`);
      const pkg = await render("vhdl-package", c);
      writeFileSync(path.join(d, "table_pkg.vhd"), pkg.bytes);
      const id = /^package (\w+)_pkg is/m.exec(pkg.text)?.[1];
      expect(id).toBeTruthy();
      const ints = c.ctx.spec.vhdl_integer_ok;
      const parts = c.ctx.table.complex ? ["i", "q"] : ["i"];
      const lines = parts
        .map((p) => {
          const viaVector = `write(l, integer'image(to_integer(${id}_${p}(k)))); writeline(output, l);`;
          const viaInt = ints ? `write(l, integer'image(${id}_${p}_int(k))); writeline(output, l);` : "";
          return `${viaVector} ${viaInt}`;
        })
        .join("\n        ");
      writeFileSync(
        path.join(d, "tb.vhd"),
        `library ieee;
use ieee.numeric_std.all;
use std.textio.all;
use work.${id}_pkg.all;
entity tb is
end entity tb;
architecture sim of tb is
begin
  process
    variable l : line;
  begin
    for k in 0 to ${id}_n - 1 loop
        ${lines}
    end loop;
    wait;
  end process;
end architecture sim;
`,
      );
      run("ghdl", ["-a", "--std=08", "table_pkg.vhd"], d);
      run("ghdl", ["-a", "--std=08", "tb.vhd"], d);
      run("ghdl", ["-e", "--std=08", "tb"], d);
      const out = numbers(run("ghdl", ["-r", "--std=08", "tb"], d));
      // Per tap: I via the vector, I via the integer array (when present), then the same for Q.
      const perPart = ints ? 2 : 1;
      const expected = c.codesI.flatMap((v, k) => {
        const i = Array<number>(perPart).fill(v);
        const q = c.ctx.table.complex ? Array<number>(perPart).fill(c.codesQ[k]!) : [];
        return [...i, ...q];
      });
      expect(out).toEqual(expected);
    },
  );

  it("CSV: integers equal the codes and every exact decimal equals decimal.js's code/2^F", async () => {
    const csv = await render("csv", c);
    const D = Decimal.clone({ precision: 200, toExpNeg: -500, toExpPos: 500 });
    const F = c.ctx.spec.fraction_length;
    const [header, ...rows] = csv.text.trimEnd().split("\n");
    expect(header).toBe(
      c.ctx.table.complex ? "index,i_code,i_exact,i_float,q_code,q_exact,q_float" : "index,code,exact,float",
    );
    expect(rows.length).toBe(c.ctx.table.length);
    rows.forEach((row, k) => {
      const cells = row.split(",");
      const groups = c.ctx.table.complex
        ? [
            [c.codesI[k]!, 1],
            [c.codesQ[k]!, 4],
          ]
        : [[c.codesI[k]!, 1]];
      expect(Number(cells[0])).toBe(k);
      for (const [code, at] of groups as [number, number][]) {
        expect(Number(cells[at])).toBe(code);
        expect(cells[at + 1]).toBe(new D(code).div(new D(2).pow(F)).toFixed());
        // The float reference is within half an LSB of the exact value (rounding, no overflow here).
        const lsb = 2 ** -F;
        if (Math.abs(code) < 2 ** (W - 1) - 1)
          expect(Math.abs(Number(cells[at + 2]) - code * lsb)).toBeLessThanOrEqual(lsb / 2);
      }
    });
  });

  it("binary: DataView reads back the codes, little-endian, I then Q", async () => {
    const bin = await render("binary", c);
    const bytes = W <= 8 ? 1 : W <= 16 ? 2 : 4;
    expect(bin.bytes.length).toBe(expectedWords.length * bytes);
    const view = new DataView(bin.bytes.buffer, bin.bytes.byteOffset, bin.bytes.byteLength);
    const read = expectedWords.map((_, k) =>
      signed
        ? bytes === 1
          ? view.getInt8(k)
          : bytes === 2
            ? view.getInt16(2 * k, true)
            : view.getInt32(4 * k, true)
        : bytes === 1
          ? view.getUint8(k)
          : bytes === 2
            ? view.getUint16(2 * k, true)
            : view.getUint32(4 * k, true),
    );
    expect(read).toEqual(expectedWords);
  });

  it("JSON: parses, and its codes and spec equal the quantizer's", async () => {
    const json = JSON.parse((await render("json", c)).text) as {
      spec: { word_length: number; fraction_length: number };
      taps: { i: number; q: number; i_exact: string }[];
      tap_order: string;
      length: number;
    };
    expect(json.length).toBe(c.ctx.table.length);
    expect(json.spec.word_length).toBe(W);
    expect(json.tap_order).toBe("y[n] = Σ h[k]·x[n−k]");
    expect(json.taps.map((t) => t.i)).toEqual(c.codesI);
    expect(json.taps.map((t) => t.q)).toEqual(c.codesQ);
  });
});
