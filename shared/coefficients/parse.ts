/**
 * Parser for uploaded coefficient files. Pure (no I/O) so the server validates uploads and the
 * browser can preview them with the same rules. Accepted formats:
 *  - plain text: one real value per line, or two columns (I Q) separated by white space, comma, semicolon or tab;
 *  - CSV / TSV with or without a header row (header names: i|re|real and q|im|imag, an optional index column n|k|index|idx);
 *  - complex text: one `a+bj` / `a-bi` / `(a+bj)` / `bj` value per line;
 *  - JSON: [x, …], [[i, q], …], [{re, im}, …] or {re: […], im: […]} (also i/q, real/imag keys).
 * Comment lines start with #, // or %; a trailing `# …` or `// …` is ignored too. CRLF and a UTF-8 BOM are accepted.
 * Every error names the line and column (1-based) and what was expected.
 */

/** Largest accepted table (2^22 complex values), as for the DSP core. */
export const MAX_UPLOAD_VALUES = 4_194_304;
/** Largest accepted file (32 MiB). */
export const MAX_UPLOAD_BYTES = 32 * 1024 * 1024;

export type CoefficientFormat = "text" | "csv" | "tsv" | "complex-text" | "json";

export interface ParsedCoefficients {
  format: CoefficientFormat;
  complex: boolean;
  re: Float64Array;
  im: Float64Array;
  /** Header names when the file had a header row. */
  header: string[] | null;
}

/** A parse failure with its position; `line`/`column` are 1-based (0 when the error concerns the whole file). */
export class CoefficientParseError extends Error {
  constructor(
    message: string,
    readonly line: number,
    readonly column: number,
  ) {
    super(line > 0 ? `line ${line}, column ${column}: ${message}` : message);
    this.name = "CoefficientParseError";
  }
}

const NON_FINITE = /^[+-]?(?:nan|inf|infinity)$/i;
const I_NAMES = new Set(["i", "re", "real", "inphase", "in-phase", "value", "h", "coef", "coefficient"]);
const Q_NAMES = new Set(["q", "im", "imag", "imaginary", "quadrature"]);
const INDEX_NAMES = new Set(["n", "k", "index", "idx", "tap"]);

function describe(token: string): string {
  return token.length > 24 ? `"${token.slice(0, 24)}…"` : `"${token}"`;
}

/**
 * Longest accepted value line (characters, after its comment is cut off). A line of a table holds one or
 * two numbers; a longer one is not a coefficient file, and refusing it early bounds the work per line.
 */
export const MAX_LINE_CHARS = 1024;

/**
 * Counts the characters the line scanners below visit. The scanners are hand-written single passes (no
 * regular expression runs on a value line), so a parse costs at most a small constant times the input
 * length; tests/unit/coefficients/parse.test.ts checks that bound with this count.
 */
export interface ScanMeter {
  steps: number;
}

// The meter of the parse under way (parsing is synchronous, so one slot is enough).
let meter: ScanMeter | null = null;
const tick = (n: number) => {
  if (meter) meter.steps += n;
};

const isDigit = (c: number) => c >= 48 && c <= 57;
// The characters JavaScript's \s matches (ECMA-262 WhiteSpace and LineTerminator).
function isSpace(c: number): boolean {
  return (
    c === 32 ||
    (c >= 9 && c <= 13) ||
    c === 0xa0 ||
    c === 0x1680 ||
    (c >= 0x2000 && c <= 0x200a) ||
    c === 0x2028 ||
    c === 0x2029 ||
    c === 0x202f ||
    c === 0x205f ||
    c === 0x3000 ||
    c === 0xfeff
  );
}

/**
 * End of an unsigned decimal number starting at `i` (before `end`): `d+[.d*]` or `.d+`, then an optional
 * exponent `e[+-]d+` taken only when complete. -1 when no number starts there. One pass, no backtracking.
 */
function unsignedEnd(s: string, i: number, end: number): number {
  const start = i;
  while (i < end && isDigit(s.charCodeAt(i))) i++;
  const intDigits = i - start;
  if (i < end && s.charCodeAt(i) === 46 /* . */) {
    const dot = i++;
    while (i < end && isDigit(s.charCodeAt(i))) i++;
    if (intDigits === 0 && i === dot + 1) return -1;
  } else if (intDigits === 0) return -1;
  if (i < end && (s.charCodeAt(i) | 32) === 101 /* e or E */) {
    let j = i + 1;
    if (j < end && (s.charCodeAt(j) === 43 || s.charCodeAt(j) === 45)) j++;
    const expStart = j;
    while (j < end && isDigit(s.charCodeAt(j))) j++;
    if (j > expStart) i = j;
  }
  tick(i - start + 1);
  return i;
}

/** End of `[+-]?` + an unsigned number at `i`, or -1. */
function signedEnd(s: string, i: number, end: number): number {
  const c = s.charCodeAt(i);
  return unsignedEnd(s, i < end && (c === 43 || c === 45) ? i + 1 : i, end);
}

/** A whole token is a decimal number (`[+-]?(d+[.d*]|.d+)([eE][+-]?d+)?`). */
function isNumber(token: string): boolean {
  return token.length > 0 && signedEnd(token, 0, token.length) === token.length;
}

/** `[+-]?d+,d+`: a number written with a decimal comma. */
function isDecimalComma(token: string): boolean {
  const n = token.length;
  let i = n > 0 && (token[0] === "+" || token[0] === "-") ? 1 : 0;
  const a = i;
  while (i < n && isDigit(token.charCodeAt(i))) i++;
  if (i === a || token[i] !== ",") return false;
  const b = ++i;
  while (i < n && isDigit(token.charCodeAt(i))) i++;
  tick(n);
  return i === n && i > b;
}

function decimalCommaError(token: string, line: number, column: number): CoefficientParseError {
  return new CoefficientParseError(
    `${describe(token)} looks like a number with a decimal comma: write it with a decimal point (${describe(token.replace(",", "."))}); a comma separates the I and Q columns. If these are I,Q columns, add the header line "i,q"`,
    line,
    column,
  );
}

function parseNumber(token: string, line: number, column: number): number {
  if (isNumber(token)) {
    const v = Number(token);
    if (!Number.isFinite(v))
      throw new CoefficientParseError(`${describe(token)} is too large for a double`, line, column);
    return v;
  }
  if (NON_FINITE.test(token))
    throw new CoefficientParseError(
      `${describe(token)} is not allowed: values must be finite numbers`,
      line,
      column,
    );
  if (token === "") throw new CoefficientParseError("expected a number, found an empty field", line, column);
  if (isDecimalComma(token)) throw decimalCommaError(token, line, column);
  throw new CoefficientParseError(`expected a number, found ${describe(token)}`, line, column);
}

interface Line {
  number: number;
  text: string;
}

/** A comment line starts with #, % or //. */
function isCommentStart(text: string, at: number): boolean {
  const c = text[at];
  return c === "#" || c === "%" || (c === "/" && text[at + 1] === "/");
}

/** Value lines (comments and blank lines dropped, a trailing comment cut off, trailing space trimmed). */
function contentLines(text: string): Line[] {
  const out: Line[] = [];
  const n = text.length;
  let number = 0;
  let start = 0;
  while (start <= n) {
    number++;
    // One pass to the line end, noting the first "#" and "//" on the way.
    let end = start;
    let hash = -1;
    let slashes = -1;
    let first = -1;
    for (; end < n; end++) {
      const c = text.charCodeAt(end);
      if (c === 10 || c === 13) break;
      if (first < 0 && !isSpace(c)) first = end;
      if (c === 35 /* # */ && hash < 0) hash = end;
      else if (c === 47 /* / */ && slashes < 0 && text.charCodeAt(end + 1) === 47) slashes = end;
      // A value line past the limit with no comment begun: refuse now rather than scan the rest of it.
      if (
        end - start > MAX_LINE_CHARS &&
        hash < 0 &&
        slashes < 0 &&
        first >= 0 &&
        !isCommentStart(text, first)
      )
        throw new CoefficientParseError(
          `the line is longer than ${MAX_LINE_CHARS.toLocaleString("en")} characters; a value line may have at most ${MAX_LINE_CHARS.toLocaleString("en")} (one or two numbers per line)`,
          number,
          1,
        );
    }
    tick(end - start + 1);
    const next =
      end < n && text.charCodeAt(end) === 13 && text.charCodeAt(end + 1) === 10 ? end + 2 : end + 1;
    const comment = first >= 0 && isCommentStart(text, first);
    if (first >= 0 && !comment) {
      let stop = end;
      if (hash > start && hash < stop) stop = hash;
      if (slashes > start && slashes < stop) stop = slashes;
      while (stop > start && isSpace(text.charCodeAt(stop - 1))) stop--;
      tick(end - stop + 1);
      if (stop - start > MAX_LINE_CHARS)
        throw new CoefficientParseError(
          `the line is ${(stop - start).toLocaleString("en")} characters long; a value line may have at most ${MAX_LINE_CHARS.toLocaleString("en")} (one or two numbers per line)`,
          number,
          1,
        );
      if (stop > first) out.push({ number, text: text.slice(start, stop) });
    }
    start = next;
  }
  return out;
}

interface Field {
  token: string;
  column: number;
}

function splitFields(line: string, separator: "," | ";" | "\t" | "space"): Field[] {
  const fields: Field[] = [];
  const n = line.length;
  tick(n + 1);
  if (separator === "space") {
    let i = 0;
    while (i < n) {
      while (i < n && isSpace(line.charCodeAt(i))) i++;
      if (i >= n) break;
      const s = i;
      while (i < n && !isSpace(line.charCodeAt(i))) i++;
      fields.push({ token: line.slice(s, i), column: s + 1 });
    }
    return fields;
  }
  let start = 0;
  for (;;) {
    const at = line.indexOf(separator, start);
    const stop = at < 0 ? n : at;
    let a = start;
    let b = stop;
    while (a < b && isSpace(line.charCodeAt(a))) a++;
    while (b > a && isSpace(line.charCodeAt(b - 1))) b--;
    // A field in double quotes is read without them.
    if (b - a >= 2 && line[a] === '"' && line[b - 1] === '"')
      fields.push({ token: line.slice(a + 1, b - 1), column: a + 1 });
    else fields.push({ token: line.slice(a, b), column: a + 1 });
    if (at < 0) break;
    start = at + 1;
  }
  return fields;
}

function detectSeparator(sample: string): "," | ";" | "\t" | "space" {
  if (sample.includes("\t")) return "\t";
  // "0,5;0,25": semicolon-separated columns of decimal-comma numbers; the fields then say so.
  if (sample.includes(";")) return ";";
  if (sample.includes(",")) return ",";
  return "space";
}

function checkCount(n: number, line: number) {
  if (n > MAX_UPLOAD_VALUES)
    throw new CoefficientParseError(
      `more than ${MAX_UPLOAD_VALUES.toLocaleString("en")} values (the limit)`,
      line,
      1,
    );
}

function parseJson(text: string): ParsedCoefficients {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (e) {
    // V8's message carries no position on every Node version, so locate the first syntax error ourselves.
    const offset = jsonErrorOffset(text);
    const before = text.slice(0, offset);
    const line = before.split(/\r\n|\n|\r/).length;
    const column = offset - Math.max(before.lastIndexOf("\n"), before.lastIndexOf("\r"));
    const found = offset < text.length ? `character ${describe(text[offset]!)}` : "end of file";
    throw new CoefficientParseError(
      `invalid JSON: unexpected ${found} (${(e as Error).message.split("\n")[0]})`,
      line,
      column,
    );
  }
  const at = (path: string) => new CoefficientParseError(`${path}`, 0, 0);
  const num = (v: unknown, path: string): number => {
    if (typeof v !== "number")
      throw at(`${path}: expected a number, found ${v === null ? "null" : typeof v}`);
    return v;
  };
  const pick = (o: Record<string, unknown>, names: string[]) => names.find((k) => k in o);
  if (Array.isArray(data)) {
    checkCount(data.length, 0);
    if (data.length === 0) throw new CoefficientParseError("the file has no values", 0, 0);
    const first = data[0];
    const re = new Float64Array(data.length);
    const im = new Float64Array(data.length);
    let complex = false;
    if (typeof first === "number") {
      data.forEach((v, i) => (re[i] = num(v, `[${i}]`)));
    } else if (Array.isArray(first)) {
      complex = true;
      data.forEach((v, i) => {
        if (!Array.isArray(v) || v.length !== 2) throw at(`[${i}]: expected a pair [i, q]`);
        re[i] = num(v[0], `[${i}][0]`);
        im[i] = num(v[1], `[${i}][1]`);
      });
    } else if (first && typeof first === "object") {
      complex = true;
      data.forEach((v, i) => {
        if (!v || typeof v !== "object" || Array.isArray(v)) throw at(`[${i}]: expected an object {re, im}`);
        const o = v as Record<string, unknown>;
        const rk = pick(o, ["re", "i", "real"]);
        const ik = pick(o, ["im", "q", "imag"]);
        if (!rk || !ik) throw at(`[${i}]: expected keys re and im (or i and q)`);
        re[i] = num(o[rk], `[${i}].${rk}`);
        im[i] = num(o[ik], `[${i}].${ik}`);
      });
    } else {
      throw at(`[0]: expected a number, a pair [i, q] or an object {re, im}`);
    }
    return { format: "json", complex, re, im, header: null };
  }
  if (data && typeof data === "object") {
    const o = data as Record<string, unknown>;
    const rk = pick(o, ["re", "i", "real"]);
    const ik = pick(o, ["im", "q", "imag"]);
    if (!rk || !Array.isArray(o[rk])) throw at("expected an array, or an object with arrays re and im");
    const reIn = o[rk] as unknown[];
    const imIn = ik && Array.isArray(o[ik]) ? (o[ik] as unknown[]) : null;
    if (reIn.length === 0) throw new CoefficientParseError("the file has no values", 0, 0);
    checkCount(reIn.length, 0);
    if (imIn && imIn.length !== reIn.length)
      throw at(`${rk} has ${reIn.length} values but ${ik} has ${imIn.length}: they must be the same length`);
    const re = Float64Array.from(reIn, (v, i) => num(v, `${rk}[${i}]`));
    const im = imIn ? Float64Array.from(imIn, (v, i) => num(v, `${ik}[${i}]`)) : new Float64Array(re.length);
    return { format: "json", complex: imIn !== null, re, im, header: null };
  }
  throw at("expected an array, or an object with arrays re and im");
}

/** Offset of the first JSON syntax error (a small recursive-descent scanner, used only after JSON.parse failed). */
function jsonErrorOffset(text: string): number {
  let i = 0;
  const ws = () => {
    while (i < text.length && " \t\r\n\uFEFF".includes(text[i]!)) i++;
  };
  const fail = (): never => {
    throw i;
  };
  const value = (): void => {
    ws();
    const c = text[i];
    if (c === "[" || c === "{") {
      const close = c === "[" ? "]" : "}";
      i++;
      ws();
      if (text[i] === close) return void i++;
      for (;;) {
        if (close === "}") {
          ws();
          if (text[i] !== '"') fail();
          value();
          ws();
          if (text[i] !== ":") fail();
          i++;
        }
        value();
        ws();
        if (text[i] === ",") {
          i++;
          continue;
        }
        if (text[i] === close) return void i++;
        fail();
      }
    }
    if (c === '"') {
      i++;
      while (i < text.length && text[i] !== '"') i += text[i] === "\\" ? 2 : 1;
      if (i >= text.length) fail();
      return void i++;
    }
    const m = /^-?(?:0|[1-9]\d*)(?:\.\d+)?(?:[eE][+-]?\d+)?|^true|^false|^null/.exec(text.slice(i, i + 400));
    if (!m) fail();
    i += m![0].length;
  };
  try {
    value();
    ws();
    return i;
  } catch (at) {
    return typeof at === "number" ? Math.min(at, text.length) : 0;
  }
}

/** Whitespace removed (one pass). */
function withoutSpace(s: string): string {
  tick(s.length + 1);
  let out = "";
  let from = 0;
  for (let i = 0; i < s.length; i++) {
    if (isSpace(s.charCodeAt(i))) {
      if (i > from) out += s.slice(from, i);
      from = i + 1;
    }
  }
  return from === 0 ? s : out + s.slice(from);
}

/** `[+-] [number] [*] (i|j)` from `i` to exactly `end`: the signed imaginary part, or null. */
function imaginaryAt(t: string, i: number, end: number, signRequired: boolean): number | null {
  const c = t.charCodeAt(i);
  let sign = 0;
  if (i < end && (c === 43 || c === 45)) {
    sign = c === 45 ? -1 : 1;
    i++;
  } else if (signRequired) return null;
  const numEnd = unsignedEnd(t, i, end);
  // A unit with no number is 1j, but only after a sign: "j" alone is not a value.
  const magnitude = numEnd >= 0 ? Number(t.slice(i, numEnd)) : sign !== 0 ? 1 : NaN;
  if (sign === 0) sign = 1;
  let j = numEnd < 0 ? i : numEnd;
  if (t[j] === "*") j++;
  if (j + 1 !== end || (t[j] !== "i" && t[j] !== "j") || Number.isNaN(magnitude)) return null;
  return sign * magnitude;
}

/**
 * One complex value, white space already removed: `a`, `a±bj`, `±bj`, `bj` (also `i`, an optional `*`
 * before the unit, optional parentheses). [re, im], or null when it is none of these.
 */
function complexParts(t: string): [number, number] | null {
  let s = 0;
  let e = t.length;
  if (t[s] === "(") s++;
  if (e > s && t[e - 1] === ")") e--;
  if (s >= e) return null;
  const a = signedEnd(t, s, e);
  if (a >= 0) {
    if (a === e) return [Number(t.slice(s, e)), 0];
    const im = imaginaryAt(t, a, e, true);
    if (im !== null) return [Number(t.slice(s, a)), im];
  }
  // No real part: `±bj` or `bj`.
  const im = imaginaryAt(t, s, e, false);
  return im === null ? null : [0, im];
}

/**
 * Does a value line look like complex text? It ends in the unit i or j (before an optional ")") and holds
 * nothing but digits, ".", "e", signs, "*", parentheses and white space. A near miss is then read as complex
 * text, whose error names what was expected.
 */
function looksComplex(text: string): boolean {
  let e = text.length;
  while (e > 0 && (isSpace(text.charCodeAt(e - 1)) || text[e - 1] === ")")) e--;
  if (e === 0 || (text[e - 1] !== "i" && text[e - 1] !== "j")) return false;
  tick(text.length + 1);
  for (let i = 0; i < e - 1; i++) {
    const c = text.charCodeAt(i);
    if (!(
      isDigit(c) ||
      isSpace(c) ||
      c === 46 ||
      c === 43 ||
      c === 45 ||
      c === 42 ||
      c === 40 ||
      (c | 32) === 101
    ))
      return false;
  }
  return true;
}

function parseComplexText(lines: Line[]): ParsedCoefficients {
  checkCount(lines.length, lines[MAX_UPLOAD_VALUES]?.number ?? 0);
  const re = new Float64Array(lines.length);
  const im = new Float64Array(lines.length);
  lines.forEach((l, i) => {
    const token = l.text.trim();
    const column = l.text.length - l.text.trimStart().length + 1;
    const parts = complexParts(withoutSpace(token));
    if (!parts) {
      if (NON_FINITE.test(token) || /nan|inf/i.test(token))
        throw new CoefficientParseError(
          `${describe(token)} is not allowed: values must be finite numbers`,
          l.number,
          column,
        );
      throw new CoefficientParseError(
        `expected a complex number like 0.5-0.25j, found ${describe(token)}`,
        l.number,
        column,
      );
    }
    const [r, q] = parts;
    if (!Number.isFinite(r) || !Number.isFinite(q))
      throw new CoefficientParseError(`${describe(token)} is too large for a double`, l.number, column);
    re[i] = r;
    im[i] = q;
  });
  return { format: "complex-text", complex: true, re, im, header: null };
}

/**
 * Refuse a file of decimal-comma numbers before it is read as I,Q columns: either the first value line
 * holds only decimal-comma tokens (between spaces, tabs or semicolons) and at least two of them, or every
 * line is `[±]0,ddd` / `[±]1,ddd` with no space (a real table of magnitudes up to 1 in decimal-comma notation,
 * which as I,Q pairs would be integers I of -1, 0 or 1 beside unsigned Q) and some fraction is not just 0 or 1.
 * A header line ("i,q") says the columns are meant, and skips the second check.
 */
function refuseDecimalCommas(lines: Line[], separator: "," | ";" | "\t" | "space"): void {
  const first = lines[0]!;
  // "0,5 0,25", "0,5;0,25", "0,5<TAB>0,25": decimal-comma pairs.
  const tokens = splitFields(first.text.replaceAll(";", " "), "space");
  if (tokens.length >= 2 && tokens.every((f) => isDecimalComma(f.token)))
    throw decimalCommaError(tokens[0]!.token, first.number, tokens[0]!.column);
  if (separator !== ",") return;
  let fractionBeyondBit = false;
  for (const l of lines) {
    const t = l.text.trim();
    if (!isDecimalComma(t)) return;
    const unsignedInt =
      t[0] === "+" || t[0] === "-" ? t.slice(1, t.indexOf(",")) : t.slice(0, t.indexOf(","));
    if (unsignedInt !== "0" && unsignedInt !== "1") return;
    const fraction = t.slice(t.indexOf(",") + 1);
    if (fraction !== "0" && fraction !== "1") fractionBeyondBit = true;
  }
  if (fractionBeyondBit) {
    const col = first.text.length - first.text.trimStart().length + 1;
    throw decimalCommaError(first.text.trim(), first.number, col);
  }
}

/** Parse an uploaded coefficient file (bytes or text). Throws CoefficientParseError with the position. */
export function parseCoefficients(
  input: Uint8Array | string,
  opts: { fileName?: string; meter?: ScanMeter } = {},
): ParsedCoefficients {
  meter = opts.meter ?? null;
  try {
    return parseAny(input, opts.fileName ?? "");
  } finally {
    meter = null;
  }
}

function parseAny(input: Uint8Array | string, fileName: string): ParsedCoefficients {
  let text: string;
  if (typeof input === "string") {
    text = input;
  } else {
    if (input.byteLength > MAX_UPLOAD_BYTES)
      throw new CoefficientParseError(
        `the file is ${input.byteLength} bytes; at most ${MAX_UPLOAD_BYTES} (32 MiB) are accepted`,
        0,
        0,
      );
    try {
      text = new TextDecoder("utf-8", { fatal: true }).decode(input);
    } catch {
      throw new CoefficientParseError("the file is not UTF-8 text", 0, 0);
    }
  }
  if (text.length > MAX_UPLOAD_BYTES) throw new CoefficientParseError(`the file is larger than 32 MiB`, 0, 0);
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  const name = fileName.toLowerCase();
  let lead = 0;
  while (lead < text.length && isSpace(text.charCodeAt(lead))) lead++;
  tick(lead + 1);
  if (name.endsWith(".json") || text[lead] === "[" || text[lead] === "{") return parseJson(text);

  const lines = contentLines(text);
  if (lines.length === 0)
    throw new CoefficientParseError("the file has no values (only blank or comment lines)", 0, 0);

  // Complex text when the first value line carries an imaginary unit.
  let firstData = lines[0]!;
  for (const l of lines) {
    let digit = false;
    for (let i = 0; i < l.text.length && !digit; i++) digit = isDigit(l.text.charCodeAt(i));
    tick(l.text.length + 1);
    if (digit) {
      firstData = l;
      break;
    }
  }
  if (looksComplex(firstData.text)) return parseComplexText(lines);

  const separator = detectSeparator(firstData.text);
  const format: CoefficientFormat =
    separator === "\t"
      ? "tsv"
      : separator === "," || separator === ";"
        ? "csv"
        : name.endsWith(".tsv")
          ? "tsv"
          : "text";

  // A header row is a first line whose fields are not all numbers.
  let header: string[] | null = null;
  let body = lines;
  const firstFields = splitFields(lines[0]!.text, separator);
  if (
    firstFields.some((f) => !isNumber(f.token) && !NON_FINITE.test(f.token)) &&
    firstFields.some((f) => /[a-z]/i.test(f.token))
  ) {
    const names = firstFields.map((f) => f.token.toLowerCase());
    const known = names.every((n) => I_NAMES.has(n) || Q_NAMES.has(n) || INDEX_NAMES.has(n));
    if (!known) {
      const bad = firstFields.find((f) => {
        const n = f.token.toLowerCase();
        return !(I_NAMES.has(n) || Q_NAMES.has(n) || INDEX_NAMES.has(n));
      })!;
      // Either an unknown header or a stray word in the first data line: say both possibilities.
      throw new CoefficientParseError(
        `expected a number or a header name (i, q, re, im, index), found ${describe(bad.token)}`,
        lines[0]!.number,
        bad.column,
      );
    }
    header = firstFields.map((f) => f.token);
    body = lines.slice(1);
    if (body.length === 0) throw new CoefficientParseError("the file has a header but no values", 0, 0);
  }
  if (!header || separator !== ",") refuseDecimalCommas(body, separator);

  // Which columns hold I and Q.
  const width = header ? header.length : splitFields(body[0]!.text, separator).length;
  let iCol = 0;
  let qCol = -1;
  if (header) {
    const names = header.map((h) => h.toLowerCase());
    const dataCols = names.map((n, k) => (INDEX_NAMES.has(n) ? -1 : k)).filter((k) => k >= 0);
    iCol = names.findIndex((n) => I_NAMES.has(n));
    qCol = names.findIndex((n) => Q_NAMES.has(n));
    if (iCol < 0) iCol = dataCols[0] ?? 0;
    if (dataCols.length > 2)
      throw new CoefficientParseError(
        `expected one value column or two (I, Q), found ${dataCols.length}`,
        lines[0]!.number,
        1,
      );
  } else {
    if (width > 2)
      throw new CoefficientParseError(
        `expected one value (real) or two (I and Q) per line, found ${width}`,
        body[0]!.number,
        splitFields(body[0]!.text, separator)[2]!.column,
      );
    qCol = width === 2 ? 1 : -1;
  }

  checkCount(body.length, body[MAX_UPLOAD_VALUES]?.number ?? 0);
  const re = new Float64Array(body.length);
  const im = new Float64Array(body.length);
  const firstLine = body[0]!.number;
  for (let i = 0; i < body.length; i++) {
    const l = body[i]!;
    const fields = splitFields(l.text, separator);
    if (fields.length !== width) {
      const col = fields.length > width ? fields[width]!.column : l.text.length + 1;
      throw new CoefficientParseError(
        `expected ${width} column${width === 1 ? "" : "s"} as on line ${header ? lines[0]!.number : firstLine}, found ${fields.length}`,
        l.number,
        col,
      );
    }
    for (const f of fields) parseNumber(f.token, l.number, f.column); // every field must be numeric, index included
    re[i] = Number(fields[iCol]!.token);
    if (qCol >= 0) im[i] = Number(fields[qCol]!.token);
  }
  return { format, complex: qCol >= 0, re, im, header };
}
