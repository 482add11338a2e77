/**
 * Exact decimal text of fixed-point values, and a strict parser for uploaded decimal numbers.
 * code·2^-F is a finite decimal: for F > 0 it equals code·5^F / 10^F, so BigInt arithmetic gives
 * every digit without rounding (no decimal.js needed at run time).
 */
import { checkInteger } from "./check";

/** Fraction lengths accepted by exactDecimal (wider than the quantizer's −64..96, text grows with |F|). */
export const EXACT_DECIMAL_F_RANGE = { min: -1024, max: 1024 } as const;

/** Exact value of code·2^-fractionLength as plain decimal text, e.g. (−3, 2) → "-0.75". */
export function exactDecimal(code: number | bigint, fractionLength: number): string {
  let c: bigint;
  if (typeof code === "bigint") c = code;
  else if (typeof code === "number") {
    if (!Number.isSafeInteger(code)) throw new RangeError(`code must be a safe integer, got ${code}`);
    c = BigInt(code);
  } else throw new TypeError(`code must be a number or bigint, got ${typeof code}`);
  checkInteger("fractionLength", fractionLength, EXACT_DECIMAL_F_RANGE.min, EXACT_DECIMAL_F_RANGE.max);
  if (c === 0n) return "0";
  const negative = c < 0n;
  const magnitude = negative ? -c : c;
  const sign = negative ? "-" : "";
  if (fractionLength <= 0) return sign + (magnitude << BigInt(-fractionLength)).toString();
  const digits = (magnitude * 5n ** BigInt(fractionLength)).toString().padStart(fractionLength + 1, "0");
  const intPart = digits.slice(0, digits.length - fractionLength);
  const fracPart = digits.slice(digits.length - fractionLength).replace(/0+$/, "");
  return fracPart === "" ? sign + intPart : `${sign}${intPart}.${fracPart}`;
}

// Ordinary decimal or scientific notation: optional sign, digits with at most one point, optional exponent.
const DECIMAL_TEXT = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/**
 * Parses one uploaded number ("0.5", "-1.25e-3", "+7", ".5"); rejects NaN, Infinity, hex, commas,
 * empty text and anything else with a RangeError that quotes the text.
 */
export function parseDecimalText(text: string): number {
  if (typeof text !== "string") throw new TypeError(`text must be a string, got ${typeof text}`);
  const t = text.trim();
  if (t === "") throw new RangeError("text must be a decimal number, got empty text");
  if (!DECIMAL_TEXT.test(t)) {
    const hint = t.includes(",") ? " (use a point as the decimal separator, no thousands separators)" : "";
    throw new RangeError(`text must be a decimal number like 0.5 or -1.25e-3, got "${text}"${hint}`);
  }
  const v = Number(t);
  if (!Number.isFinite(v)) throw new RangeError(`text "${text}" is outside the float64 range`);
  return v;
}
