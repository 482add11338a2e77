/**
 * Number formats of the printed report (UI.md): dB with two decimals, engineering prefixes for SI units,
 * a true minus sign, and "exact"/"—" for the report's nulls.
 */

const MINUS = "\u2212";

/** A signed decimal with a true minus sign; −0 prints as 0. */
export function fixed(v: number, digits: number): string {
  const s = (v + 0).toFixed(digits);
  return /^-0(\.0+)?$/.test(s) ? s.slice(1) : s.replace("-", MINUS);
}

/** dB with two decimals; null prints as the given word. */
export function db(v: number | null | undefined, nullWord = "\u2014"): string {
  return v === null || v === undefined ? nullWord : `${fixed(v, 2)} dB`;
}

const PREFIXES: [number, string][] = [
  [1e9, "G"],
  [1e6, "M"],
  [1e3, "k"],
  [1, ""],
  [1e-3, "m"],
  [1e-6, "\u00b5"],
  [1e-9, "n"],
  [1e-12, "p"],
];

/** An SI value with an engineering prefix (digits as `plain`), e.g. 1.25 µs, 10 MHz. */
export function si(v: number | null | undefined, unit: string): string {
  if (v === null || v === undefined) return "\u2014";
  if (v === 0) return `0 ${unit}`;
  const a = Math.abs(v);
  const [scale, prefix] = PREFIXES.find(([p]) => a >= p * 0.9995) ?? PREFIXES[PREFIXES.length - 1]!;
  return `${plain(v / scale)} ${prefix}${unit}`;
}

/** A plain number: integers in full, else 4 decimals below 10, 3 below 100, 2 below 1000, 1 above; trailing zeros dropped. */
export function plain(v: number | null | undefined): string {
  if (v === null || v === undefined) return "\u2014";
  if (Number.isInteger(v)) return fixed(v, 0);
  const a = Math.abs(v);
  const digits =
    a >= 1000 ? 1 : a >= 100 ? 2 : a >= 10 ? 3 : a >= 1 ? 4 : Math.min(8, 3 - Math.floor(Math.log10(a)));
  return fixed(Number(v.toFixed(digits)), digits)
    .replace(/(\.\d*?)0+$/, "$1")
    .replace(/\.$/, "");
}
