/**
 * The HDL of a bundle: a self-checking testbench in Verilog-2005 (IEEE 1364-2005) and in VHDL-2008
 * (IEEE 1076-2008) that feeds every vector set to a device under test and compares on output-valid, and
 * a plain synthesizable reference FIR of the released table in both languages that passes them.
 *
 * Port interface of the device under test (both languages, docs/bundle-format.md "HDL"):
 *   clk                 rising-edge clock
 *   rst                 synchronous, active high: clears the delay line and out_valid
 *   in_valid            one input sample this cycle
 *   in_i, in_q          signed IN_BITS input (two's complement)
 *   out_valid           one output sample this cycle (any latency; one output per input)
 *   out_i, out_q        signed OUT_BITS output
 * The testbench passes IN_BITS and OUT_BITS as parameters (generics); the reference FIR's other
 * parameters default to the released datapath.
 */
import type { ResolvedDatapath } from "../../shared/dsp/datapath";
import type { RoundingMode } from "../../shared/dsp/types";
import type { IntegerSignal } from "../../shared/dsp/bit-true";
import { binWord, hexWord } from "../../shared/exports/words";
import type { GoldenSet } from "./golden";

/** Paths of the HDL files inside the bundle. */
export const HDL_PATHS = {
  verilog: { testbench: "hdl/tw_tb.v", reference: "hdl/tw_fir.v" },
  vhdl: { testbench: "hdl/tw_tb.vhd", reference: "hdl/tw_fir.vhd" },
} as const;

/** Rounding and overflow modes as the HDL parameters number them. */
export const HDL_ROUNDING = {
  floor: 0,
  "toward-zero": 1,
  "nearest-away": 2,
  "nearest-even": 3,
  "nearest-up": 4,
  ceiling: 5,
} as const satisfies Record<RoundingMode, number>;
export const HDL_OVERFLOW = { saturate: 0, wrap: 1 } as const;

/** What the HDL needs. */
export interface HdlInput {
  title: string;
  contentHash: string;
  codes: IntegerSignal;
  datapath: ResolvedDatapath;
  sets: readonly GoldenSet[];
}

const header = (c: string, h: HdlInput, what: string) =>
  [
    `${c} Tapwright ${what}`,
    `${c} ${h.title}`,
    `${c} content ${h.contentHash}`,
    `${c} tap order: y[n] = sum over k of h[k] * x[n-k] (h[0] multiplies the newest input sample)`,
  ].join("\n");

const ascii = (s: string) => s.replace(/[^\x20-\x7e]/g, "?");

/** The reference FIR in Verilog-2005: a direct-form delay line and one registered multiply-accumulate. */
export function verilogReference(h: HdlInput): string {
  const dp = h.datapath;
  const n = h.codes.re.length;
  const c = dp.coefficientBits;
  const taps: string[] = [];
  for (let k = 0; k < n; k++) {
    taps.push(`  assign h_i[${k}] = ${c}'sh${hexWord(h.codes.re[k]!, c)};`);
    taps.push(`  assign h_q[${k}] = ${c}'sh${hexWord(h.codes.im[k]!, c)};`);
  }
  return `${header("//", h, "reference FIR (Verilog-2005, synthesizable)")}
// Ports: clk, rst (synchronous, active high), in_valid, in_i, in_q, out_valid, out_i, out_q.
// One output per input, registered: out_valid follows in_valid by one clock.
// acc_I = sum h_i[k]*x_i[n-k] - h_q[k]*x_q[n-k], acc_Q = sum h_i[k]*x_q[n-k] + h_q[k]*x_i[n-k],
// in a signed ACC_BITS register (two's complement, wraps), then shifted right by OUT_SHIFT,
// rounded (ROUNDING: 0 floor, 1 toward zero, 2 nearest ties away, 3 nearest ties even, 4 nearest ties up, 5 ceiling) and
// saturated or wrapped (OVERFLOW: 0 saturate, 1 wrap) to OUT_BITS.
\`timescale 1ns / 1ps
module tw_fir #(
  parameter IN_BITS = ${dp.inputBits},
  parameter COEF_BITS = ${c},
  parameter ACC_BITS = ${dp.accumulatorBits},
  parameter OUT_BITS = ${dp.outputBits},
  parameter OUT_SHIFT = ${dp.outputShift},
  parameter ROUNDING = ${HDL_ROUNDING[dp.outputRounding]},
  parameter OVERFLOW = ${HDL_OVERFLOW[dp.outputOverflow]}
) (
  input wire clk,
  input wire rst,
  input wire in_valid,
  input wire signed [IN_BITS-1:0] in_i,
  input wire signed [IN_BITS-1:0] in_q,
  output reg out_valid,
  output reg signed [OUT_BITS-1:0] out_i,
  output reg signed [OUT_BITS-1:0] out_q
);
  localparam N_TAPS = ${n};
  localparam W = ACC_BITS + OUT_SHIFT + 2;

  wire signed [COEF_BITS-1:0] h_i [0:N_TAPS-1];
  wire signed [COEF_BITS-1:0] h_q [0:N_TAPS-1];
${taps.join("\n")}

  // x_i[k], x_q[k]: the input k samples before the newest.
  reg signed [IN_BITS-1:0] x_i [0:N_TAPS-1];
  reg signed [IN_BITS-1:0] x_q [0:N_TAPS-1];
  reg signed [ACC_BITS-1:0] acc_i;
  reg signed [ACC_BITS-1:0] acc_q;
  integer k;

  function signed [OUT_BITS-1:0] out_stage;
    input signed [ACC_BITS-1:0] a;
    reg signed [W-1:0] aw, q, r, half, y, maxo, mino;
    reg up;
    begin
      aw = a;
      q = aw >>> OUT_SHIFT;
      r = aw - (q <<< OUT_SHIFT);
      half = (OUT_SHIFT == 0) ? 0 : (1 <<< (OUT_SHIFT - 1));
      if (r == 0) up = 1'b0;
      else case (ROUNDING)
        0: up = 1'b0;
        1: up = (aw < 0);
        2: up = (r > half) || ((r == half) && (aw > 0));
        4: up = (r >= half);
        5: up = 1'b1;
        default: up = (r > half) || ((r == half) && q[0]);
      endcase
      y = q + up;
      maxo = (1 <<< (OUT_BITS - 1)) - 1;
      mino = -(1 <<< (OUT_BITS - 1));
      if (OVERFLOW == 0 && y > maxo) out_stage = maxo[OUT_BITS-1:0];
      else if (OVERFLOW == 0 && y < mino) out_stage = mino[OUT_BITS-1:0];
      else out_stage = y[OUT_BITS-1:0];
    end
  endfunction

  always @(posedge clk) begin
    if (rst) begin
      for (k = 0; k < N_TAPS; k = k + 1) begin
        x_i[k] <= 0;
        x_q[k] <= 0;
      end
      out_valid <= 1'b0;
      out_i <= 0;
      out_q <= 0;
    end else begin
      out_valid <= in_valid;
      if (in_valid) begin
        acc_i = h_i[0] * in_i - h_q[0] * in_q;
        acc_q = h_i[0] * in_q + h_q[0] * in_i;
        for (k = 1; k < N_TAPS; k = k + 1) begin
          acc_i = acc_i + h_i[k] * x_i[k-1] - h_q[k] * x_q[k-1];
          acc_q = acc_q + h_i[k] * x_q[k-1] + h_q[k] * x_i[k-1];
        end
        for (k = N_TAPS - 1; k > 0; k = k - 1) begin
          x_i[k] <= x_i[k-1];
          x_q[k] <= x_q[k-1];
        end
        x_i[0] <= in_i;
        x_q[0] <= in_q;
        out_i <= out_stage(acc_i);
        out_q <= out_stage(acc_q);
      end
    end
  end
endmodule
`;
}

/** The self-checking Verilog-2005 testbench over every vector set. */
export function verilogTestbench(h: HdlInput): string {
  const dp = h.datapath;
  const n = h.codes.re.length;
  const maxIn = Math.max(...h.sets.map((s) => s.stimulus.length));
  const maxOut = Math.max(...h.sets.map((s) => s.expected.length));
  const runs = h.sets
    .map(
      (s) => `    // ${s.name}: ${s.stimulus.length} inputs (+ ${n - 1} zeros), ${s.expected.length} outputs
    $readmemh("${s.stimulus.hex}", stim, 0, ${2 * s.stimulus.length - 1});
    $readmemh("${s.expected.hex}", expd, 0, ${2 * s.expected.length - 1});
    fd = $fopen("sim-${s.name}.txt", "w");
    run_set("${s.name}", ${s.stimulus.length}, ${s.expected.length});
    $fclose(fd);`,
    )
    .join("\n");
  return `${header("//", h, "self-checking testbench (Verilog-2005)")}
// Run from the bundle's root folder (the golden/ paths are relative), e.g. with Icarus Verilog:
//   iverilog -g2005 -o tw_tb.vvp hdl/tw_tb.v hdl/tw_fir.v && vvp tw_tb.vvp
// Replace hdl/tw_fir.v by your design: module tw_fir, ports as in hdl/tw_fir.v (clk, rst synchronous
// active high, in_valid, in_i, in_q, out_valid, out_i, out_q), widths IN_BITS and OUT_BITS as parameters.
// Each set: reset, then its stimulus and ${n - 1} zeros, one sample per clock; every out_valid sample is
// compared with the next expected one. Prints "PASS <set> ..." or "FAIL <set> index <n> got <I> <Q> expected
// <I> <Q>" per set, then PASS or FAIL; writes the captured output to sim-<set>.txt (one "I Q" line per
// output-valid sample, # comment lines first), ready to upload as the set's simulation output.
//
// $readmemh fills each W-bit word zero-extended: a word read into a wider signed variable must be
// sign-extended explicitly, e.g. {{(64-OUT_BITS){expd[k][OUT_BITS-1]}}, expd[k]}, as below.
\`timescale 1ns / 1ps
module tw_tb;
  parameter IN_BITS = ${dp.inputBits};
  parameter OUT_BITS = ${dp.outputBits};
  localparam N_TAPS = ${n};
  localparam MAX_IN = ${maxIn};
  localparam MAX_OUT = ${maxOut};

  reg clk = 1'b0;
  always #5 clk = ~clk;
  reg rst = 1'b1;
  reg in_valid = 1'b0;
  reg signed [IN_BITS-1:0] in_i = 0;
  reg signed [IN_BITS-1:0] in_q = 0;
  wire out_valid;
  wire signed [OUT_BITS-1:0] out_i;
  wire signed [OUT_BITS-1:0] out_q;

  tw_fir #(.IN_BITS(IN_BITS), .OUT_BITS(OUT_BITS)) dut (
    .clk(clk), .rst(rst), .in_valid(in_valid), .in_i(in_i), .in_q(in_q),
    .out_valid(out_valid), .out_i(out_i), .out_q(out_q)
  );

  reg [IN_BITS-1:0] stim [0:2*MAX_IN-1];
  reg [OUT_BITS-1:0] expd [0:2*MAX_OUT-1];
  integer fd;
  integer failures = 0;

  task run_set;
    input [8*24-1:0] name;
    input integer n_in;
    input integer n_out;
    integer fed, got, cycles, bad;
    reg signed [63:0] got_i, got_q, exp_i, exp_q;
    begin
      $fdisplay(fd, "# tapwright testbench output, set %0s, %0d outputs expected", name, n_out);
      @(negedge clk);
      rst = 1'b1;
      in_valid = 1'b0;
      @(negedge clk);
      @(negedge clk);
      rst = 1'b0;
      fed = 0;
      got = 0;
      cycles = 0;
      bad = -1;
      while (got < n_out && cycles < n_in + N_TAPS + 1000) begin
        if (fed < n_in + N_TAPS - 1) begin
          in_valid = 1'b1;
          // Same width as the port: the raw word is the two's-complement code.
          in_i = (fed < n_in) ? stim[2*fed] : 0;
          in_q = (fed < n_in) ? stim[2*fed+1] : 0;
          fed = fed + 1;
        end else begin
          in_valid = 1'b0;
          in_i = 0;
          in_q = 0;
        end
        @(negedge clk);
        cycles = cycles + 1;
        if (out_valid) begin
          got_i = out_i;
          got_q = out_q;
          $fdisplay(fd, "%0d %0d", got_i, got_q);
          if (got < n_out) begin
            exp_i = {{(64-OUT_BITS){expd[2*got][OUT_BITS-1]}}, expd[2*got]};
            exp_q = {{(64-OUT_BITS){expd[2*got+1][OUT_BITS-1]}}, expd[2*got+1]};
            if (bad < 0 && (got_i !== exp_i || got_q !== exp_q)) begin
              bad = got;
              $display("FAIL %0s index %0d got %0d %0d expected %0d %0d", name, got, got_i, got_q, exp_i, exp_q);
            end
          end
          got = got + 1;
        end
      end
      in_valid = 1'b0;
      if (bad < 0 && got < n_out) begin
        bad = got;
        $display("FAIL %0s index %0d got nothing (only %0d of %0d outputs came)", name, got, got, n_out);
      end
      if (bad < 0) $display("PASS %0s %0d outputs", name, n_out);
      else failures = failures + 1;
    end
  endtask

  initial begin
${runs}
    if (failures == 0) $display("PASS");
    else $display("FAIL");
    $finish;
  end
endmodule
`;
}

/** The reference FIR in VHDL-2008 (numeric_std), same behaviour as the Verilog one. */
export function vhdlReference(h: HdlInput): string {
  const dp = h.datapath;
  const n = h.codes.re.length;
  const c = dp.coefficientBits;
  const arr = (v: ArrayLike<number>) =>
    Array.from({ length: n }, (_, k) => `    ${k} => "${binWord(v[k]!, c)}"`).join(",\n");
  return `${header("--", h, "reference FIR (VHDL-2008, synthesizable)")}
-- Ports: clk, rst (synchronous, active high), in_valid, in_i, in_q, out_valid, out_i, out_q.
-- One output per input, registered: out_valid follows in_valid by one clock. The accumulator is a
-- signed ACC_BITS register (wraps); then shift right OUT_SHIFT, ROUNDING (0 floor, 1 toward zero,
-- 2 nearest ties away, 3 nearest ties even, 4 nearest ties up, 5 ceiling), OVERFLOW (0 saturate, 1 wrap) to OUT_BITS.
library ieee;
use ieee.std_logic_1164.all;
use ieee.numeric_std.all;

entity tw_fir is
  generic (
    IN_BITS : positive := ${dp.inputBits};
    COEF_BITS : positive := ${c};
    ACC_BITS : positive := ${dp.accumulatorBits};
    OUT_BITS : positive := ${dp.outputBits};
    OUT_SHIFT : natural := ${dp.outputShift};
    ROUNDING : natural := ${HDL_ROUNDING[dp.outputRounding]};
    OVERFLOW : natural := ${HDL_OVERFLOW[dp.outputOverflow]}
  );
  port (
    clk : in std_logic;
    rst : in std_logic;
    in_valid : in std_logic;
    in_i : in signed(IN_BITS - 1 downto 0);
    in_q : in signed(IN_BITS - 1 downto 0);
    out_valid : out std_logic;
    out_i : out signed(OUT_BITS - 1 downto 0);
    out_q : out signed(OUT_BITS - 1 downto 0)
  );
end entity;

architecture rtl of tw_fir is
  constant N_TAPS : positive := ${n};
  constant W : positive := ACC_BITS + OUT_SHIFT + 2;
  type coef_array is array (0 to N_TAPS - 1) of signed(COEF_BITS - 1 downto 0);
  type sample_array is array (0 to N_TAPS - 1) of signed(IN_BITS - 1 downto 0);
  constant H_I : coef_array := (
${arr(h.codes.re)}
  );
  constant H_Q : coef_array := (
${arr(h.codes.im)}
  );
  signal x_i, x_q : sample_array := (others => (others => '0'));

  -- The low width bits of v (two's-complement wrap) or v sign-extended to width bits.
  function fit(v : signed; width : positive) return signed is
    constant vn : signed(v'length - 1 downto 0) := v;
  begin
    if vn'length >= width then
      return vn(width - 1 downto 0);
    end if;
    return resize(vn, width);
  end function;

  function out_stage(a : signed(ACC_BITS - 1 downto 0)) return signed is
    variable aw, q, r, half, y, maxo, mino : signed(W - 1 downto 0);
    variable up : boolean;
  begin
    aw := resize(a, W);
    q := shift_right(aw, OUT_SHIFT);
    r := aw - shift_left(q, OUT_SHIFT);
    half := (others => '0');
    if OUT_SHIFT > 0 then
      half(OUT_SHIFT - 1) := '1';
    end if;
    if r = 0 then
      up := false;
    elsif ROUNDING = 0 then
      up := false;
    elsif ROUNDING = 1 then
      up := aw < 0;
    elsif ROUNDING = 2 then
      up := r > half or (r = half and aw > 0);
    elsif ROUNDING = 4 then
      up := r >= half;
    elsif ROUNDING = 5 then
      up := true;
    else
      up := r > half or (r = half and q(0) = '1');
    end if;
    y := q;
    if up then
      y := q + 1;
    end if;
    maxo := (others => '0');
    maxo(OUT_BITS - 2 downto 0) := (others => '1');
    mino := (others => '1');
    mino(OUT_BITS - 2 downto 0) := (others => '0');
    if OVERFLOW = 0 and y > maxo then
      return maxo(OUT_BITS - 1 downto 0);
    elsif OVERFLOW = 0 and y < mino then
      return mino(OUT_BITS - 1 downto 0);
    end if;
    return y(OUT_BITS - 1 downto 0);
  end function;
begin
  process (clk)
    variable acc_i, acc_q : signed(ACC_BITS - 1 downto 0);
  begin
    if rising_edge(clk) then
      if rst = '1' then
        x_i <= (others => (others => '0'));
        x_q <= (others => (others => '0'));
        out_valid <= '0';
        out_i <= (others => '0');
        out_q <= (others => '0');
      else
        out_valid <= in_valid;
        if in_valid = '1' then
          acc_i := fit(H_I(0) * in_i, ACC_BITS) - fit(H_Q(0) * in_q, ACC_BITS);
          acc_q := fit(H_I(0) * in_q, ACC_BITS) + fit(H_Q(0) * in_i, ACC_BITS);
          for k in 1 to N_TAPS - 1 loop
            acc_i := acc_i + fit(H_I(k) * x_i(k - 1), ACC_BITS) - fit(H_Q(k) * x_q(k - 1), ACC_BITS);
            acc_q := acc_q + fit(H_I(k) * x_q(k - 1), ACC_BITS) + fit(H_Q(k) * x_i(k - 1), ACC_BITS);
          end loop;
          for k in N_TAPS - 1 downto 1 loop
            x_i(k) <= x_i(k - 1);
            x_q(k) <= x_q(k - 1);
          end loop;
          x_i(0) <= in_i;
          x_q(0) <= in_q;
          out_i <= out_stage(acc_i);
          out_q <= out_stage(acc_q);
        end if;
      end if;
    end if;
  end process;
end architecture;
`;
}

/** The self-checking VHDL-2008 testbench (reads the sets' .txt files with std.textio). */
export function vhdlTestbench(h: HdlInput): string {
  const dp = h.datapath;
  const n = h.codes.re.length;
  const runs = h.sets
    .map((s) => `    run_set("${s.name}", ${s.stimulus.length}, ${s.expected.length}, failures);`)
    .join("\n");
  return `${header("--", h, "self-checking testbench (VHDL-2008)")}
-- Run from the bundle's root folder (the golden/ paths are relative), e.g. with GHDL:
--   ghdl -a --std=08 hdl/tw_fir.vhd hdl/tw_tb.vhd && ghdl -e --std=08 tw_tb && ghdl -r --std=08 tw_tb
-- Replace hdl/tw_fir.vhd by your design: entity tw_fir, ports as in hdl/tw_fir.vhd (clk, rst synchronous
-- active high, in_valid, in_i, in_q, out_valid, out_i, out_q), widths IN_BITS and OUT_BITS as generics.
-- Each set: reset, then its stimulus and ${n - 1} zeros, one sample per clock; every out_valid sample is
-- compared with the next line of expected.txt. Reports "PASS <set> ..." or "FAIL <set> index <n> got
-- <I> <Q> expected <I> <Q>" per set, then PASS or FAIL; writes the captured output to sim-<set>.txt
-- (one "I Q" line per output-valid sample, # comment lines first), ready to upload.
library ieee;
use ieee.std_logic_1164.all;
use ieee.numeric_std.all;
use std.textio.all;

entity tw_tb is
  generic (
    IN_BITS : positive := ${dp.inputBits};
    OUT_BITS : positive := ${dp.outputBits}
  );
end entity;

architecture sim of tw_tb is
  constant N_TAPS : positive := ${n};
  signal clk : std_logic := '0';
  signal rst : std_logic := '1';
  signal in_valid : std_logic := '0';
  signal in_i, in_q : signed(IN_BITS - 1 downto 0) := (others => '0');
  signal out_valid : std_logic;
  signal out_i, out_q : signed(OUT_BITS - 1 downto 0);
  signal done : boolean := false;
begin
  clk <= not clk after 5 ns when not done else clk;

  dut : entity work.tw_fir
    generic map (IN_BITS => IN_BITS, OUT_BITS => OUT_BITS)
    port map (
      clk => clk, rst => rst, in_valid => in_valid, in_i => in_i, in_q => in_q,
      out_valid => out_valid, out_i => out_i, out_q => out_q
    );

  process
    -- Next "I Q" line of a golden text file (comment lines skipped); false at the end.
    procedure read_pair(file f : text; a, b : out integer; ok : out boolean) is
      variable l : line;
      variable good : boolean;
    begin
      ok := false;
      while not endfile(f) loop
        readline(f, l);
        if l'length > 0 and l(l'low) /= '#' then
          read(l, a, good);
          if good then
            read(l, b, good);
          end if;
          ok := good;
          return;
        end if;
      end loop;
    end procedure;

    procedure run_set(name : string; n_in, n_out : natural; failures : inout natural) is
      file stim_f : text;
      file exp_f : text;
      file out_f : text;
      variable l : line;
      variable si, sq, ei, eq, gi, gq : integer;
      variable ok : boolean;
      variable fed, got, cycles : natural := 0;
      variable bad : integer := -1;
    begin
      file_open(stim_f, "golden/" & name & "/stimulus.txt", read_mode);
      file_open(exp_f, "golden/" & name & "/expected.txt", read_mode);
      file_open(out_f, "sim-" & name & ".txt", write_mode);
      write(l, string'("# tapwright testbench output, set ") & name & ", " & integer'image(n_out) & " outputs expected");
      writeline(out_f, l);
      wait until falling_edge(clk);
      rst <= '1';
      in_valid <= '0';
      wait until falling_edge(clk);
      wait until falling_edge(clk);
      rst <= '0';
      while got < n_out and cycles < n_in + N_TAPS + 1000 loop
        if fed < n_in + N_TAPS - 1 then
          si := 0;
          sq := 0;
          if fed < n_in then
            read_pair(stim_f, si, sq, ok);
            assert ok report "golden/" & name & "/stimulus.txt: missing line" severity failure;
          end if;
          in_valid <= '1';
          in_i <= to_signed(si, IN_BITS);
          in_q <= to_signed(sq, IN_BITS);
          fed := fed + 1;
        else
          in_valid <= '0';
          in_i <= (others => '0');
          in_q <= (others => '0');
        end if;
        wait until falling_edge(clk);
        cycles := cycles + 1;
        if out_valid = '1' then
          gi := to_integer(out_i);
          gq := to_integer(out_q);
          write(l, integer'image(gi) & " " & integer'image(gq));
          writeline(out_f, l);
          if got < n_out then
            read_pair(exp_f, ei, eq, ok);
            if bad < 0 and (not ok or gi /= ei or gq /= eq) then
              bad := got;
              report "FAIL " & name & " index " & integer'image(got) & " got " & integer'image(gi) & " " &
                integer'image(gq) & " expected " & integer'image(ei) & " " & integer'image(eq) severity note;
            end if;
          end if;
          got := got + 1;
        end if;
      end loop;
      in_valid <= '0';
      if bad < 0 and got < n_out then
        bad := got;
        report "FAIL " & name & " index " & integer'image(got) & " got nothing (only " & integer'image(got) &
          " of " & integer'image(n_out) & " outputs came)" severity note;
      end if;
      if bad < 0 then
        report "PASS " & name & " " & integer'image(n_out) & " outputs" severity note;
      else
        failures := failures + 1;
      end if;
      file_close(stim_f);
      file_close(exp_f);
      file_close(out_f);
    end procedure;

    variable failures : natural := 0;
  begin
${runs}
    if failures = 0 then
      report "PASS" severity note;
    else
      report "FAIL" severity note;
    end if;
    done <= true;
    wait;
  end process;
end architecture;
`;
}

/** Every HDL file of the bundle. */
export function buildHdl(h: HdlInput): { path: string; text: string }[] {
  const input = { ...h, title: ascii(h.title) };
  return [
    { path: HDL_PATHS.verilog.reference, text: verilogReference(input) },
    { path: HDL_PATHS.verilog.testbench, text: verilogTestbench(input) },
    { path: HDL_PATHS.vhdl.reference, text: vhdlReference(input) },
    { path: HDL_PATHS.vhdl.testbench, text: vhdlTestbench(input) },
  ];
}
