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

const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
const NON_FINITE = /^[+-]?(?:nan|inf|infinity)$/i;
const COMPLEX =
  /^\(?\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)?\s*(?:([+-])\s*((?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)?\s*\*?\s*([ij]))?\s*\)?$/;
const I_NAMES = new Set(["i", "re", "real", "inphase", "in-phase", "value", "h", "coef", "coefficient"]);
const Q_NAMES = new Set(["q", "im", "imag", "imaginary", "quadrature"]);
const INDEX_NAMES = new Set(["n", "k", "index", "idx", "tap"]);

function describe(token: string): string {
  return token.length > 24 ? `"${token.slice(0, 24)}…"` : `"${token}"`;
}

function parseNumber(token: string, line: number, column: number): number {
  if (NUMBER.test(token)) {
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
  throw new CoefficientParseError(`expected a number, found ${describe(token)}`, line, column);
}

interface Line {
  number: number;
  text: string;
}

function contentLines(text: string): Line[] {
  const out: Line[] = [];
  const rows = text.split(/\r\n|\n|\r/);
  for (let i = 0; i < rows.length; i++) {
    let row = rows[i]!;
    const trimmed = row.trim();
    if (trimmed === "" || trimmed.startsWith("#") || trimmed.startsWith("//") || trimmed.startsWith("%"))
      continue;
    const hash = row.indexOf("#");
    if (hash > 0) row = row.slice(0, hash);
    const slashes = row.indexOf("//");
    if (slashes > 0) row = row.slice(0, slashes);
    out.push({ number: i + 1, text: row.replace(/\s+$/, "") });
  }
  return out;
}

interface Field {
  token: string;
  column: number;
}

function splitFields(line: string, separator: "," | ";" | "\t" | "space"): Field[] {
  const fields: Field[] = [];
  if (separator === "space") {
    const re = /\S+/g;
    let m: RegExpExecArray | null;
    while ((m = re.exec(line))) fields.push({ token: m[0], column: m.index + 1 });
    return fields;
  }
  let start = 0;
  for (;;) {
    const at = line.indexOf(separator, start);
    const raw = at < 0 ? line.slice(start) : line.slice(start, at);
    const lead = raw.length - raw.trimStart().length;
    fields.push({ token: raw.trim().replace(/^"(.*)"$/, "$1"), column: start + lead + 1 });
    if (at < 0) break;
    start = at + 1;
  }
  return fields;
}

function detectSeparator(sample: string): "," | ";" | "\t" | "space" {
  if (sample.includes("\t")) return "\t";
  if (sample.includes(",")) return ",";
  if (sample.includes(";")) return ";";
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

function parseComplexText(lines: Line[]): ParsedCoefficients {
  checkCount(lines.length, lines[MAX_UPLOAD_VALUES]?.number ?? 0);
  const re = new Float64Array(lines.length);
  const im = new Float64Array(lines.length);
  lines.forEach((l, i) => {
    const token = l.text.trim();
    const column = l.text.length - l.text.trimStart().length + 1;
    const m = COMPLEX.exec(token.replace(/\s+/g, ""));
    if (!m || (m[1] === undefined && m[4] === undefined) || token === "") {
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
    let r = 0;
    let q = 0;
    if (m[4] !== undefined) {
      // "bj" alone: the leading number is the imaginary part.
      if (m[2] === undefined) {
        q = m[1] === undefined ? 1 : Number(m[1]);
      } else {
        r = m[1] === undefined ? 0 : Number(m[1]);
        q = (m[2] === "-" ? -1 : 1) * (m[3] === undefined ? 1 : Number(m[3]));
      }
    } else {
      r = Number(m[1]);
    }
    if (!Number.isFinite(r) || !Number.isFinite(q))
      throw new CoefficientParseError(`${describe(token)} is too large for a double`, l.number, column);
    re[i] = r;
    im[i] = q;
  });
  return { format: "complex-text", complex: true, re, im, header: null };
}

/** Parse an uploaded coefficient file (bytes or text). Throws CoefficientParseError with the position. */
export function parseCoefficients(
  input: Uint8Array | string,
  opts: { fileName?: string } = {},
): ParsedCoefficients {
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
  const name = (opts.fileName ?? "").toLowerCase();
  const trimmed = text.trimStart();
  if (name.endsWith(".json") || trimmed.startsWith("[") || trimmed.startsWith("{")) return parseJson(text);

  const lines = contentLines(text);
  if (lines.length === 0)
    throw new CoefficientParseError("the file has no values (only blank or comment lines)", 0, 0);

  // Complex text when the first value line carries an imaginary unit.
  const firstData = lines.find((l) => /\d/.test(l.text)) ?? lines[0]!;
  if (
    /^\(?\s*[+-]?[\d.]*(?:[eE][+-]?\d+)?\s*[+-]?\s*[\d.]*(?:[eE][+-]?\d+)?\s*\*?\s*[ij]\s*\)?$/.test(
      firstData.text.trim(),
    )
  )
    return parseComplexText(lines);

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
    firstFields.some((f) => !NUMBER.test(f.token) && !NON_FINITE.test(f.token)) &&
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
