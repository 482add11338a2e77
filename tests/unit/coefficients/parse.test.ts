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
