import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  CoefficientParseError,
  MAX_UPLOAD_BYTES,
  MAX_UPLOAD_VALUES,
  parseCoefficients,
} from "@shared/coefficients/parse";

const arr = (a: Float64Array) => Array.from(a);

function expectError(input: string | Uint8Array, pattern: RegExp, line?: number, column?: number) {
  try {
    parseCoefficients(input);
  } catch (e) {
    expect(e).toBeInstanceOf(CoefficientParseError);
    const err = e as CoefficientParseError;
    expect(err.message).toMatch(pattern);
    if (line !== undefined) expect(err.line).toBe(line);
    if (column !== undefined) expect(err.column).toBe(column);
    return;
  }
  throw new Error("expected a CoefficientParseError");
}

describe("parseCoefficients: accepted formats", () => {
  it("reads one real value per line with comments, CRLF and a BOM", () => {
    const r = parseCoefficients("\uFEFF# taps\r\n0.5\r\n-0.25 # trailing\r\n\r\n// note\r\n1e-3\r\n");
    expect(r.format).toBe("text");
    expect(r.complex).toBe(false);
    expect(arr(r.re)).toEqual([0.5, -0.25, 0.001]);
    expect(arr(r.im)).toEqual([0, 0, 0]);
  });

  it("reads two whitespace columns as I and Q", () => {
    const r = parseCoefficients("1 0\n0.5   -0.5\n\t-1\t2\n");
    expect(r.complex).toBe(true);
    expect(arr(r.re)).toEqual([1, 0.5, -1]);
    expect(arr(r.im)).toEqual([0, -0.5, 2]);
  });

  it("reads CSV with a header and an index column", () => {
    const r = parseCoefficients("index,I,Q\n0,0.1,0.2\n1,-0.3,0.4\n");
    expect(r.format).toBe("csv");
    expect(r.header).toEqual(["index", "I", "Q"]);
    expect(arr(r.re)).toEqual([0.1, -0.3]);
    expect(arr(r.im)).toEqual([0.2, 0.4]);
  });

  it("reads headerless CSV, semicolon-separated and TSV", () => {
    expect(arr(parseCoefficients("1,2\n3,4").im)).toEqual([2, 4]);
    expect(arr(parseCoefficients("1;2\n3;4").re)).toEqual([1, 3]);
    const t = parseCoefficients("re\tim\n1\t2\n");
    expect(t.format).toBe("tsv");
    expect(arr(t.im)).toEqual([2]);
  });

  it("reads a+bj and a+bi complex text", () => {
    const r = parseCoefficients("0.5-0.25j\n(1+2j)\n-3i\n2\n1e-3+1E-3i\n");
    expect(r.format).toBe("complex-text");
    expect(arr(r.re)).toEqual([0.5, 1, 0, 2, 0.001]);
    expect(arr(r.im)).toEqual([-0.25, 2, -3, 0, 0.001]);
  });

  it("reads the JSON shapes", () => {
    expect(arr(parseCoefficients("[1, -2.5, 3e2]").re)).toEqual([1, -2.5, 300]);
    const pairs = parseCoefficients("[[1,2],[3,4]]");
    expect(pairs.complex).toBe(true);
    expect(arr(pairs.im)).toEqual([2, 4]);
    expect(arr(parseCoefficients('[{"re":1,"im":-1}]').im)).toEqual([-1]);
    const cols = parseCoefficients('{"re":[1,2],"im":[3,4]}');
    expect(arr(cols.re)).toEqual([1, 2]);
    expect(arr(cols.im)).toEqual([3, 4]);
    expect(parseCoefficients('{"re":[1,2]}').complex).toBe(false);
  });

  it("decodes bytes as UTF-8", () => {
    const r = parseCoefficients(new TextEncoder().encode("\uFEFF1\n2\n"));
    expect(arr(r.re)).toEqual([1, 2]);
  });
});

describe("parseCoefficients: refused files name the line and column", () => {
  it("a word where a number belongs", () =>
    expectError("1\n2\nabc\n", /line 3, column 1: expected a number, found "abc"/, 3, 1));
  it("the second field of a pair", () =>
    expectError("1 2\n3 x4\n", /line 2, column 3: expected a number, found "x4"/, 2, 3));
  it("NaN and infinities", () => {
    expectError("1\nNaN\n", /line 2, column 1: "NaN" is not allowed: values must be finite/, 2, 1);
    expectError("1,inf\n", /"inf" is not allowed/, 1, 3);
    expectError("-Infinity\n", /not allowed/, 1, 1);
    expectError("1e999\n", /too large/, 1, 1);
  });
  it("ragged columns", () =>
    expectError("1,2\n3,4\n5\n", /line 3, column 2: expected 2 columns as on line 1, found 1/, 3, 2));
  it("too many columns without a header", () =>
    expectError("1 2 3\n", /expected one value \(real\) or two \(I and Q\) per line, found 3/, 1, 5));
  it("an empty file and a comment-only file", () => {
    expectError("", /no values/);
    expectError("# nothing\n\n", /no values/);
    expectError("[]", /no values/);
    expectError("i,q\n", /header but no values/);
  });
  it("bad complex text", () =>
    expectError("1+2j\n3+j4\n", /line 2, column 1: expected a complex number/, 2, 1));
  it("bad JSON with its position", () => {
    expectError("[1, 2,\n 3,, 4]", /invalid JSON: unexpected character ","/, 2, 4);
    expectError("[1, 2", /unexpected end of file/, 1, 6);
  });
  it("JSON of the wrong shape", () => {
    expectError('[1, "2"]', /\[1\]: expected a number, found string/);
    expectError('{"re":[1,2],"im":[1]}', /must be the same length/);
  });
  it("more values than the limit", () => {
    const text = "0\n".repeat(MAX_UPLOAD_VALUES + 1);
    expectError(text, /more than 4,194,304 values/);
  });
  it("a file over 32 MiB", () => {
    expectError(new Uint8Array(MAX_UPLOAD_BYTES + 1), /at most 33554432 \(32 MiB\)/);
  });
  it("bytes that are not UTF-8", () => expectError(new Uint8Array([0x31, 0xff, 0x0a]), /not UTF-8/));
});

describe("parseCoefficients: decimal commas are refused with a hint", () => {
  it("a single column of 0,5-style numbers", () =>
    expectError(
      "0,5\n-0,25\n1,0\n",
      /line 1, column 1: "0,5" looks like a number with a decimal comma: write it with a decimal point \("0\.5"\)/,
      1,
      1,
    ));
  it("decimal-comma pairs between spaces, semicolons or tabs", () => {
    expectError("0,5 -0,25\n", /"0,5" looks like a number with a decimal comma/, 1, 1);
    expectError("# pairs\n0,5;-0,25\n", /decimal comma/, 2, 1);
    expectError("0,5\t0,25\n", /decimal comma/, 1, 1);
  });
  it("a decimal-comma field among semicolon columns names its column", () =>
    expectError(
      "0.5;0.25\n0.5;0,25\n",
      /line 2, column 5: "0,25" looks like a number with a decimal comma/,
      2,
      5,
    ));
  it("integer I,Q pairs, a header or 0/1 phase pairs are still read as columns", () => {
    expect(arr(parseCoefficients("1,2\n3,4").im)).toEqual([2, 4]);
    expect(arr(parseCoefficients("i,q\n0,5\n0,25\n").im)).toEqual([5, 25]);
    expect(arr(parseCoefficients("1,0\n0,1\n-1,0\n").re)).toEqual([1, 0, -1]);
    expect(arr(parseCoefficients("0,-5\n0,5\n").im)).toEqual([-5, 5]);
  });
});

describe("parseCoefficients: long lines", () => {
  it("a value line over the limit is refused at once, naming its length", () =>
    expectError(
      "1".repeat(40_000),
      /line 1, column 1: the line is longer than 1,024 characters; a value line may have at most 1,024/,
      1,
      1,
    ));
  it("a long comment is skipped", () =>
    expect(arr(parseCoefficients(`# ${"x".repeat(10_000)}\n0.5\n`).re)).toEqual([0.5]));
  it("a bare imaginary part bj is read", () => {
    const r = parseCoefficients("2j\n0.5\n-3*i\n");
    expect(arr(r.im)).toEqual([2, 0, -3]);
  });
});

// The patterns the parser used before its scanners were hand-written: an independent statement of the
// number and complex grammar, run here only on short tokens (they backtrack on long ones).
const OLD_NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
const OLD_COMPLEX =
  /^\(?\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)?\s*(?:([+-])\s*((?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)?\s*\*?\s*([ij]))?\s*\)?$/;
const tokenArb = fc
  .array(fc.constantFrom("0", "1", "9", ".", "e", "E", "+", "-", "j", "i", "*", "(", ")", " "), {
    maxLength: 10,
  })
  .map((a) => a.join(""));

describe("parseCoefficients: the scanners agree with the regular grammar", () => {
  it("numbers: a token is read iff the number pattern matches it, to the same value", () =>
    fc.assert(
      fc.property(tokenArb, (t) => {
        const tok = t.replace(/\s/g, "");
        if (tok === "" || /[ij]\)*$/.test(tok)) return; // complex text, checked below
        let value: number | null = null;
        try {
          value = parseCoefficients(`${tok}\n`).re[0]!;
        } catch {
          value = null;
        }
        if (OLD_NUMBER.test(tok)) expect(value).toBe(Number(tok));
        else expect(value).toBeNull();
      }),
      { numRuns: 2000 },
    ));
  it("complex text: every line the complex pattern reads gives the same parts", () =>
    fc.assert(
      fc.property(tokenArb, (t) => {
        const tok = t.replace(/\s/g, "");
        const m = OLD_COMPLEX.exec(tok);
        if (!m || m[4] === undefined) return; // the old pattern's real-only and bj cases are not complex lines
        const r = parseCoefficients(`1+1j\n${tok}\n`);
        const re = m[1] === undefined ? 0 : Number(m[1]);
        const im = (m[2] === "-" ? -1 : 1) * (m[3] === undefined ? 1 : Number(m[3]));
        expect([r.re[1], r.im[1]]).toEqual([re, im]);
      }),
      { numRuns: 2000 },
    ));
});

describe("parseCoefficients: cost grows linearly with the input (operation count, not time)", () => {
  // Lines that make backtracking patterns quadratic or worse: long digit runs with a bad end, runs of
  // white space before a character, repeated exponents, signs and parentheses.
  const unit = fc.constantFrom(
    "1",
    "0",
    ".",
    "e",
    "+",
    "-",
    " ",
    "\t",
    "j",
    "(",
    ")",
    ",",
    ";",
    "x",
    "#",
    "/",
  );
  const adversarial = fc.record({
    piece: fc.array(unit, { minLength: 1, maxLength: 6 }).map((a) => a.join("")),
    repeat: fc.integer({ min: 1, max: 300 }),
    tail: fc.constantFrom("", "x", "j", "1e", ",", "\n0.5", "\n1+2j", " "),
    lines: fc.integer({ min: 1, max: 4 }),
  });
  it("steps ≤ 40 × characters for every adversarial file, refused or not", () =>
    fc.assert(
      fc.property(adversarial, ({ piece, repeat, tail, lines }) => {
        const line = piece.repeat(repeat) + tail;
        const text = Array.from({ length: lines }, () => line).join("\n");
        const meter = { steps: 0 };
        try {
          parseCoefficients(text, { meter });
        } catch (e) {
          expect(e).toBeInstanceOf(CoefficientParseError);
        }
        expect(meter.steps).toBeLessThanOrEqual(40 * (text.length + 1));
      }),
      { numRuns: 500 },
    ));
  it("doubling a long line at most doubles the steps (ratio of counts)", () => {
    const steps = (n: number) => {
      const meter = { steps: 0 };
      try {
        parseCoefficients(`${"1".repeat(n)}x\n`, { meter });
      } catch {
        /* refused: the count is what matters */
      }
      return meter.steps;
    };
    for (const n of [100, 400, 1000]) expect(steps(2 * n)).toBeLessThanOrEqual(2.2 * steps(n));
  });
});
