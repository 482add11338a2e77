// The verification parser and comparator: exact integer arithmetic, so every expectation is exact. Hex
// sign extension checked against values worked by hand (0xF971 = 63857 = 65536 − 1679).
import { describe, expect, it } from "vitest";
import {
  compareSamples,
  formatOfName,
  parseDecimalSamples,
  parseHexSamples,
  SampleParseError,
  type Samples,
} from "../../../server/services/verification-compare";
import { compareInThread } from "../../../server/services/verification-runner";
import { tableSummariesOf, vectorSetsOf } from "../../../server/services/verifications";

const enc = (s: string) => new TextEncoder().encode(s);
const samples = (pairs: [number, number][]): Samples => ({
  re: Float64Array.from(pairs.map((p) => p[0])),
  im: Float64Array.from(pairs.map((p) => p[1])),
});
function parseError(f: () => unknown): SampleParseError {
  try {
    f();
  } catch (e) {
    if (e instanceof SampleParseError) return e;
    throw e;
  }
  throw new Error("expected a SampleParseError");
}

describe("decimal I Q text", () => {
  it("reads samples, skips # comments and blank lines, accepts CRLF and tabs", () => {
    const s = parseDecimalSamples(enc("# testbench output\r\n1 -2\r\n\r\n  -32768\t32767  \n# end\n0 0"), 16);
    expect([...s.re]).toEqual([1, -32768, 0]);
    expect([...s.im]).toEqual([-2, 32767, 0]);
  });

  it.each([
    ["1 2\n3 x\n", 2, 3, /decimal integer \(Q/],
    ["1 2\n3\n", 2, 2, /second integer \(Q/],
    ["1 2 3\n", 1, 5, /end of the line after I and Q, found "3"/],
    ["1 2\n1.5 2\n", 2, 2, /expected a space, then the Q value, found "\."/],
    ["0 32768\n", 1, 3, /Q = 32768 is outside the signed 16-bit output range -32768 … 32767/],
    ["007 1\n", 1, 1, /leading zeros/],
    ["# only a comment\n", 1, 1, /at least one sample/],
    ["1,2\n", 1, 2, /found ","/],
  ])("refuses %j at line %i, column %i", (text, line, column, message) => {
    const e = parseError(() => parseDecimalSamples(enc(text), 16));
    expect([e.line, e.column]).toEqual([line, column]);
    expect(e.message).toMatch(message);
    expect(e.message).toMatch(new RegExp(`^line ${line}, column ${column}: `));
  });
});

describe("$readmemh hex words", () => {
  it("sign-extends two's-complement words of the output width and reads I Q pairs in order", () => {
    const s = parseHexSamples(enc("// out\nF971 0001\n8000\n7FFF /* q */\n0_0_0_0 FFFF\n"), 16);
    expect([...s.re]).toEqual([-1679, -32768, 0]);
    expect([...s.im]).toEqual([1, 32767, -1]);
  });

  it("pads nothing: a 3-digit word at 12 bits, 0x800 = −2048", () => {
    expect([...parseHexSamples(enc("800 7ff\n"), 12).re]).toEqual([-2048]);
  });

  it.each([
    ["0001 0002\n0003 xxxx\n", 2, 6, /unknown \(x\)/],
    ["0001 0002\n@10\n", 2, 1, /address directives/],
    ["0001 10002\n", 1, 6, /at most 4 hex digits/],
    ["0001 0002\n0003\n", 2, 1, /even number of words/],
    ["0001 00G2\n", 1, 8, /hex digit 0-9 or A-F, found "G"/],
    ["/* open\n0001 0002\n", 1, 1, /close this comment/],
  ])("refuses %j at line %i, column %i", (text, line, column, message) => {
    const e = parseError(() => parseHexSamples(enc(text), 16));
    expect([e.line, e.column]).toEqual([line, column]);
    expect(e.message).toMatch(message);
  });

  it("refuses a word above the width at 14 bits (4 digits hold 16)", () => {
    const e = parseError(() => parseHexSamples(enc("4000 0000\n"), 14));
    expect(e.message).toMatch(/wider than the 14-bit output/);
  });

  it("chooses the format by file name", () => {
    expect(["out.hex", "OUT.MEM", "x.memh", "out.txt", "out"].map(formatOfName)).toEqual([
      "hex",
      "hex",
      "hex",
      "text",
      "text",
    ]);
  });
});

describe("comparison", () => {
  const expected = samples([
    [5, -1],
    [7, 2],
    [-3, 0],
    [0, 9],
  ]);

  it("passes an identical output at latency 0", () => {
    const c = compareSamples(expected, expected);
    expect(c).toMatchObject({ verdict: "pass", compared: 4, mismatches: 0, firstMismatch: null });
    expect(c).toMatchObject({ latencySamples: 0, latencySource: "searched", maxAbsErrorLsb: 0 });
  });

  it("finds the first mismatch by expected index and the largest error in LSBs", () => {
    const got = samples([
      [5, -1],
      [7, 2],
      [-2, 0],
      [0, 6],
    ]);
    const c = compareSamples(expected, got, 0);
    expect(c.verdict).toBe("fail");
    expect(c.mismatches).toBe(2);
    expect(c.firstMismatch).toEqual({ index: 2, expected: { re: -3, im: 0 }, got: { re: -2, im: 0 } });
    expect(c.maxAbsErrorLsb).toBe(3);
    expect(c.latencySource).toBe("declared");
  });

  it("searches the latency: three leading zeros of pipeline fill, two trailing extras", () => {
    const got = samples([
      [0, 0],
      [0, 0],
      [0, 0],
      [5, -1],
      [7, 2],
      [-3, 0],
      [0, 9],
      [0, 0],
      [1, 1],
    ]);
    const c = compareSamples(expected, got);
    expect(c).toMatchObject({ verdict: "pass", latencySamples: 3, extraSamples: 2, uploadedSamples: 9 });
  });

  it("fails a short output with the first missing sample and got = null", () => {
    const c = compareSamples(
      expected,
      samples([
        [5, -1],
        [7, 2],
      ]),
      0,
    );
    expect(c).toMatchObject({ verdict: "fail", mismatches: 2, missingSamples: 2 });
    expect(c.firstMismatch).toEqual({ index: 2, expected: { re: -3, im: 0 }, got: null });
  });

  it("keeps the error envelope's maxima per bucket", () => {
    const n = 3000;
    const e = samples(Array.from({ length: n }, (_, k) => [k, -k] as [number, number]));
    const g = samples(
      Array.from({ length: n }, (_, k) => [k + (k === 2500 ? 7 : 0), -k] as [number, number]),
    );
    const c = compareSamples(e, g, 0);
    expect(c.errorEnvelope.bucket).toBe(3);
    expect(c.errorEnvelope.maxAbsLsb.length).toBe(1000);
    expect(c.errorEnvelope.maxAbsLsb[833]).toBe(7);
    expect(c.errorEnvelope.maxAbsLsb.filter((v) => v > 0).length).toBe(1);
  });

  it("gives the same answer in a worker thread, and the parser's line and column from there", async () => {
    const task = {
      expected: enc("1 2\n3 4\n"),
      upload: enc("0 0\n1 2\n3 5\n"),
      format: "text" as const,
      bits: 8,
    };
    const c = await compareInThread(task);
    expect(c).toMatchObject({ verdict: "fail", latencySamples: 1, mismatches: 1 });
    expect(c.firstMismatch).toEqual({ index: 1, expected: { re: 3, im: 4 }, got: { re: 3, im: 5 } });
    await expect(compareInThread({ ...task, upload: enc("1 2\n3 q\n") })).rejects.toMatchObject({
      line: 2,
      column: 3,
      name: "SampleParseError",
    });
  });
});

describe("vector sets of a manifest", () => {
  it("reads a format 1.x manifest's one golden set as `scenario`", () => {
    const sets = vectorSetsOf({
      golden: {
        scenario: "golden/scenario.json",
        stimulus: { text: "golden/stimulus.txt", hex: "golden/stimulus.hex", length: 40, bits: 12, seed: 1 },
        expected: { text: "golden/expected.txt", hex: "golden/expected.hex", length: 52, bits: 32 },
      },
    });
    expect(sets.map((s) => [s.name, s.expected.text, s.expected.bits])).toEqual([
      ["scenario", "golden/expected.txt", 32],
    ]);
  });

  it("reads golden.sets of the new layout (a hand-made manifest)", () => {
    const set = (name: string) => ({
      name,
      description: `${name} set`,
      stimulus: {
        text: `golden/${name}/stimulus.txt`,
        hex: `golden/${name}/stimulus.hex`,
        length: 64,
        bits: 12,
      },
      expected: {
        text: `golden/${name}/expected.txt`,
        hex: `golden/${name}/expected.hex`,
        length: 76,
        bits: 18,
      },
      maxAbsAccumulator: "34359738368",
      accumulatorBound: 34359738368,
    });
    const sets = vectorSetsOf({
      golden: { sets: ["scenario", "impulse", "worst-case", "rounding", "random-full-scale"].map(set) },
    });
    expect(sets.map((s) => s.name)).toEqual([
      "scenario",
      "impulse",
      "worst-case",
      "rounding",
      "random-full-scale",
    ]);
    expect(sets[2]).toMatchObject({
      expected: { text: "golden/worst-case/expected.txt", bits: 18, length: 76 },
      maxAbsAccumulator: "34359738368",
      accumulatorBound: "34359738368",
    });
    expect(vectorSetsOf({})).toEqual([]);
  });

  it("summarises tables with defaults for fields an older manifest lacks", () => {
    const [t] = tableSummariesOf({
      tables: [
        {
          role: "rx",
          complex: true,
          length: 13,
          gain: 0.5,
          overflowCount: 0,
          fixedPoint: {
            wordLength: 14,
            fractionLength: 13,
            signed: true,
            rounding: "convergent",
            overflow: "wrap",
          },
        },
      ],
    });
    expect(t).toEqual({
      role: "rx",
      complex: true,
      length: 13,
      wordLength: 14,
      fractionLength: 13,
      signed: true,
      gain: 0.5,
      rounding: "convergent",
      overflow: "wrap",
      overflowCount: 0,
      datapath: null,
    });
  });
});
