/**
 * The bit-exact comparison behind verification runs (docs/verification.md): read a vector set's expected
 * output and a simulation's output, both as complex integer samples, align them (a declared latency or a
 * bounded search) and compare every expected sample. Pure and linear in the file sizes (one pass over the
 * bytes; the latency search looks at a 1,024-sample prefix only, then one full pass), so it can run in a
 * worker thread (verification-thread.ts) for large files.
 */
import { MAX_LATENCY_SEARCH } from "../../shared/schemas/verifications";

/** A file the parser refused: where (1-based line and column) and what was expected there. */
export class SampleParseError extends Error {
  constructor(
    message: string,
    readonly line: number,
    readonly column: number,
  ) {
    super(`line ${line}, column ${column}: ${message}`);
    this.name = "SampleParseError";
  }
}

/** Complex integer samples (exact in float64 up to 2^53; output words are at most 48 bits here). */
export interface Samples {
  re: Float64Array;
  im: Float64Array;
}

/** The formats a file can be read in: decimal `I Q` lines, or `$readmemh`-style hex words. */
export type SampleFormat = "text" | "hex";

/** `hex` for .hex/.mem/.memh file names, otherwise `text` (the expected-output text format). */
export function formatOfName(fileName: string): SampleFormat {
  return /\.(hex|mem|memh)$/i.test(fileName) ? "hex" : "text";
}

const MAX_BITS = 48;
const SP = 0x20;
const TAB = 0x09;
const LF = 0x0a;
const CR = 0x0d;
const HASH = 0x23;

/** The printable form of the byte at i, for messages. */
function shown(bytes: Uint8Array, i: number): string {
  if (i >= bytes.length) return "the end of the file";
  const b = bytes[i]!;
  if (b === LF || b === CR) return "the end of the line";
  if (b < 0x20 || b > 0x7e) return `byte 0x${b.toString(16).padStart(2, "0").toUpperCase()}`;
  return `"${String.fromCharCode(b)}"`;
}

/** Growable float64 storage (amortised O(1) push), trimmed at the end. */
class Column {
  private data = new Float64Array(1024);
  length = 0;
  push(v: number): void {
    if (this.length === this.data.length) {
      const next = new Float64Array(this.data.length * 2);
      next.set(this.data);
      this.data = next;
    }
    this.data[this.length++] = v;
  }
  done(): Float64Array {
    return this.data.slice(0, this.length);
  }
}

function checkBits(bits: number): void {
  if (!Number.isInteger(bits) || bits < 2 || bits > MAX_BITS)
    throw new RangeError(`output width must be an integer from 2 to ${MAX_BITS} bits, got ${bits}`);
}

/**
 * Decimal text: one sample a line, `I Q` as signed decimal integers separated by spaces or tabs; lines whose
 * first non-blank character is `#` are comments; blank lines are skipped; LF or CRLF line ends. Each value
 * must fit a signed `bits`-bit word.
 */
export function parseDecimalSamples(bytes: Uint8Array, bits: number): Samples {
  checkBits(bits);
  const max = 2 ** (bits - 1) - 1;
  const min = -(2 ** (bits - 1));
  const re = new Column();
  const im = new Column();
  let i = 0;
  let line = 1;
  let lineStart = 0;
  const col = (at: number) => at - lineStart + 1;
  const fail = (message: string, at: number): never => {
    throw new SampleParseError(message, line, col(at));
  };
  const skipBlanks = () => {
    while (i < bytes.length && (bytes[i] === SP || bytes[i] === TAB)) i++;
  };
  const atLineEnd = () =>
    i >= bytes.length ||
    bytes[i] === LF ||
    (bytes[i] === CR && (bytes[i + 1] === LF || i + 1 === bytes.length));
  const integer = (part: "I" | "Q"): number => {
    const start = i;
    let negative = false;
    if (bytes[i] === 0x2d) {
      negative = true;
      i++;
    }
    const digitsStart = i;
    let value = 0;
    while (i < bytes.length && bytes[i]! >= 0x30 && bytes[i]! <= 0x39) {
      // Stop accumulating once far out of range; the range check below reports it.
      if (value <= 2 ** 53) value = value * 10 + (bytes[i]! - 0x30);
      i++;
    }
    if (i === digitsStart)
      fail(
        `expected a decimal integer (${part}${part === "I" ? ", the real part" : ", the imaginary part"}), found ${shown(bytes, i)}`,
        i,
      );
    if (i - digitsStart > 1 && bytes[digitsStart] === 0x30)
      fail(`expected a decimal integer without leading zeros (${part})`, start);
    const v = negative ? -value : value;
    if (v > max || v < min)
      fail(
        `${part} = ${new TextDecoder().decode(bytes.subarray(start, i))} is outside the signed ${bits}-bit output range ${min} … ${max}`,
        start,
      );
    return v === 0 ? 0 : v;
  };
  while (i < bytes.length) {
    skipBlanks();
    if (atLineEnd()) {
      // blank line
    } else if (bytes[i] === HASH) {
      while (i < bytes.length && bytes[i] !== LF) i++;
    } else {
      const realPart = integer("I");
      if (atLineEnd()) fail("expected a second integer (Q, the imaginary part) on this line", i);
      if (bytes[i] !== SP && bytes[i] !== TAB)
        fail(`expected a space, then the Q value, found ${shown(bytes, i)}`, i);
      skipBlanks();
      if (atLineEnd()) fail("expected a second integer (Q, the imaginary part) on this line", i);
      const imagPart = integer("Q");
      skipBlanks();
      if (!atLineEnd()) fail(`expected the end of the line after I and Q, found ${shown(bytes, i)}`, i);
      re.push(realPart);
      im.push(imagPart);
    }
    if (bytes[i] === CR) i++;
    if (i < bytes.length && bytes[i] === LF) {
      i++;
      line++;
      lineStart = i;
    }
  }
  if (re.length === 0)
    throw new SampleParseError("expected at least one sample line `I Q` (decimal integers)", 1, 1);
  return { re: re.done(), im: im.done() };
}

const hexValue = (b: number): number =>
  b >= 0x30 && b <= 0x39
    ? b - 0x30
    : b >= 0x41 && b <= 0x46
      ? b - 0x37
      : b >= 0x61 && b <= 0x66
        ? b - 0x57
        : -1;

/**
 * `$readmemh`-style hex (IEEE 1364-2005 §17.2.9): whitespace-separated two's-complement words of the output
 * width, read in order as I0 Q0 I1 Q1 …; `//` and `/* … *\/` comments and `#` comment lines are skipped, `_`
 * may separate digits. Address directives (`@…`) and x/z digits are refused.
 */
export function parseHexSamples(bytes: Uint8Array, bits: number): Samples {
  checkBits(bits);
  const digits = Math.ceil(bits / 4);
  const modulus = 2 ** bits;
  const half = 2 ** (bits - 1);
  const re = new Column();
  const im = new Column();
  let i = 0;
  let line = 1;
  let lineStart = 0;
  let words = 0;
  let lastWord = { line: 1, column: 1 };
  const fail = (message: string, at: number): never => {
    throw new SampleParseError(message, line, at - lineStart + 1);
  };
  let lineHasWord = false;
  while (i < bytes.length) {
    const b = bytes[i]!;
    if (b === LF) {
      i++;
      line++;
      lineStart = i;
      lineHasWord = false;
    } else if (b === SP || b === TAB || b === CR) {
      i++;
    } else if (b === 0x2f && bytes[i + 1] === 0x2f) {
      while (i < bytes.length && bytes[i] !== LF) i++;
    } else if (b === 0x2f && bytes[i + 1] === 0x2a) {
      const open = i;
      const openLine = line;
      const openStart = lineStart;
      i += 2;
      while (i < bytes.length && !(bytes[i] === 0x2a && bytes[i + 1] === 0x2f)) {
        if (bytes[i] === LF) {
          line++;
          lineStart = i + 1;
        }
        i++;
      }
      if (i >= bytes.length)
        throw new SampleParseError("expected */ to close this comment", openLine, open - openStart + 1);
      i += 2;
    } else if (b === HASH && !lineHasWord) {
      while (i < bytes.length && bytes[i] !== LF) i++;
    } else if (b === 0x40) {
      fail("address directives (@…) are not supported: write the words in order, I then Q per sample", i);
    } else {
      const start = i;
      let value = 0;
      let count = 0;
      while (i < bytes.length) {
        const c = bytes[i]!;
        if (c === SP || c === TAB || c === LF || c === CR) break;
        if (c === 0x2f && (bytes[i + 1] === 0x2f || bytes[i + 1] === 0x2a)) break;
        if (c === 0x5f && count > 0) {
          i++;
          continue;
        }
        const h = hexValue(c);
        if (h < 0) {
          if (c === 0x78 || c === 0x58 || c === 0x7a || c === 0x5a)
            fail(
              `expected a hex digit, found ${shown(bytes, i)}: the simulation wrote an unknown (x) or high-impedance (z) value`,
              i,
            );
          fail(`expected a hex digit 0-9 or A-F, found ${shown(bytes, i)}`, i);
        }
        count++;
        if (count > digits)
          fail(`expected at most ${digits} hex digits for a ${bits}-bit word, this word has more`, start);
        value = value * 16 + h;
        i++;
      }
      if (value >= modulus)
        fail(
          `the word is wider than the ${bits}-bit output (at most ${(modulus - 1).toString(16).toUpperCase()})`,
          start,
        );
      const signed = value >= half ? value - modulus : value;
      if (words % 2 === 0) re.push(signed);
      else im.push(signed);
      words++;
      lastWord = { line, column: start - lineStart + 1 };
      lineHasWord = true;
    }
  }
  if (words === 0) throw new SampleParseError("expected hex words (I Q per sample)", 1, 1);
  if (words % 2 === 1)
    throw new SampleParseError(
      "expected an even number of words: this last I word has no Q word after it",
      lastWord.line,
      lastWord.column,
    );
  return { re: re.done(), im: im.done() };
}

/** Read samples in a format. */
export function parseSamples(bytes: Uint8Array, format: SampleFormat, bits: number): Samples {
  return format === "hex" ? parseHexSamples(bytes, bits) : parseDecimalSamples(bytes, bits);
}

/** The result of one comparison. */
export interface Comparison {
  verdict: "pass" | "fail";
  compared: number;
  mismatches: number;
  firstMismatch: {
    index: number;
    expected: { re: number; im: number };
    got: { re: number; im: number } | null;
  } | null;
  latencySamples: number;
  latencySource: "declared" | "searched";
  maxAbsErrorLsb: number;
  missingSamples: number;
  extraSamples: number;
  uploadedSamples: number;
  errorEnvelope: { bucket: number; maxAbsLsb: number[] };
}

/** Points in the error envelope at most (the plot's resolution). */
export const ENVELOPE_POINTS = 1024;

/** Expected samples the latency search looks at (a prefix: the search stays linear in the file size). */
export const LATENCY_SEARCH_WINDOW = 1024;

/** Mismatches among the first `window` expected samples at latency L, stopping above `stopAbove`. */
function countMismatches(
  expected: Samples,
  got: Samples,
  L: number,
  window: number,
  stopAbove: number,
): number {
  const n = Math.min(expected.re.length, window);
  const available = Math.max(0, got.re.length - L);
  let bad = Math.max(0, n - available);
  const upto = Math.min(n, available);
  for (let k = 0; k < upto && bad <= stopAbove; k++)
    if (got.re[k + L] !== expected.re[k] || got.im[k + L] !== expected.im[k]) bad++;
  return bad;
}

/**
 * Compare every expected sample with the upload shifted by a latency: the declared one, or the one the
 * search picks on the first LATENCY_SEARCH_WINDOW expected samples: the smallest L in 0…MAX_LATENCY_SEARCH
 * with no mismatch there, else the one with the fewest (the smallest on a tie).
 */
export function compareSamples(expected: Samples, got: Samples, declaredLatency?: number): Comparison {
  const n = expected.re.length;
  let L: number;
  if (declaredLatency !== undefined) L = declaredLatency;
  else {
    L = 0;
    let best = Number.POSITIVE_INFINITY;
    const last = Math.min(MAX_LATENCY_SEARCH, got.re.length);
    for (let candidate = 0; candidate <= last; candidate++) {
      const bad = countMismatches(expected, got, candidate, LATENCY_SEARCH_WINDOW, best - 1);
      if (bad < best) {
        best = bad;
        L = candidate;
        if (bad === 0) break;
      }
    }
  }
  const available = Math.max(0, got.re.length - L);
  const upto = Math.min(n, available);
  const bucket = Math.max(1, Math.ceil(n / ENVELOPE_POINTS));
  const envelope = new Array<number>(Math.ceil(n / bucket)).fill(0);
  let mismatches = 0;
  let maxAbs = 0;
  let first: Comparison["firstMismatch"] = null;
  for (let k = 0; k < upto; k++) {
    const dre = Math.abs(got.re[k + L]! - expected.re[k]!);
    const dim = Math.abs(got.im[k + L]! - expected.im[k]!);
    const e = Math.max(dre, dim);
    if (e > 0) {
      mismatches++;
      if (!first)
        first = {
          index: k,
          expected: { re: expected.re[k]!, im: expected.im[k]! },
          got: { re: got.re[k + L]!, im: got.im[k + L]! },
        };
      if (e > maxAbs) maxAbs = e;
      const b = Math.floor(k / bucket);
      if (e > envelope[b]!) envelope[b] = e;
    }
  }
  const missing = n - upto;
  if (missing > 0) {
    mismatches += missing;
    first ??= { index: upto, expected: { re: expected.re[upto]!, im: expected.im[upto]! }, got: null };
  }
  return {
    verdict: mismatches === 0 ? "pass" : "fail",
    compared: n,
    mismatches,
    firstMismatch: first,
    latencySamples: L,
    latencySource: declaredLatency === undefined ? "searched" : "declared",
    maxAbsErrorLsb: maxAbs,
    missingSamples: missing,
    extraSamples: Math.max(0, available - n),
    uploadedSamples: got.re.length,
    errorEnvelope: { bucket, maxAbsLsb: envelope },
  };
}

/** What a comparison task needs: the expected output's text, the upload, its format and the output width. */
export interface CompareTask {
  expected: Uint8Array;
  upload: Uint8Array;
  format: SampleFormat;
  bits: number;
  latency?: number;
}

/** Parse both files and compare; a SampleParseError names the upload's line and column. */
export function runCompareTask(task: CompareTask): Comparison {
  let expected: Samples;
  try {
    expected = parseDecimalSamples(task.expected, task.bits);
  } catch (e) {
    // The bundle's own file: never the uploader's fault, so not a SampleParseError.
    throw new Error(`the release's expected output cannot be read: ${(e as Error).message}`);
  }
  const got = parseSamples(task.upload, task.format, task.bits);
  return compareSamples(expected, got, task.latency);
}
