/**
 * Fixed-point words as text: two's-complement hex and binary digits, the unsigned reading of a word,
 * and the C storage type. BigInt throughout, so W = 32 and the most negative code stay exact.
 * Hex digits per word follow IEEE 1364-2005 §17.2.9 memory files: ⌈W/4⌉ digits, no width in the file.
 */
import { transliterate } from "./identifiers";
import { checkInteger } from "../dsp/check";

/** Word lengths the export helpers accept (the quantizer's W range). */
export const EXPORT_WORD_RANGE = { min: 2, max: 32 } as const;

function checkWord(code: unknown, wordLength: unknown, signed: boolean): bigint {
  checkInteger("wordLength", wordLength, EXPORT_WORD_RANGE.min, EXPORT_WORD_RANGE.max);
  if (typeof code !== "number" || !Number.isSafeInteger(code))
    throw new RangeError(`code must be an integer, got ${String(code)}`);
  const c = BigInt(code);
  const w = BigInt(wordLength);
  const min = signed ? -(1n << (w - 1n)) : 0n;
  const max = signed ? (1n << (w - 1n)) - 1n : (1n << w) - 1n;
  if (c < min || c > max)
    throw new RangeError(
      `code ${code} does not fit a ${signed ? "signed" : "unsigned"} ${wordLength}-bit word`,
    );
  return c;
}

/** The unsigned integer a W-bit two's-complement word holds (−1 at W = 12 → 4095). */
export function twosComplement(code: number, wordLength: number, signed = true): bigint {
  const c = checkWord(code, wordLength, signed);
  const m = 1n << BigInt(wordLength);
  return c < 0n ? c + m : c;
}

/** ⌈W/4⌉ upper-case hex digits of the word (−1 at W = 12 → "FFF", −2048 → "800"). */
export function hexWord(code: number, wordLength: number, signed = true): string {
  return twosComplement(code, wordLength, signed)
    .toString(16)
    .toUpperCase()
    .padStart(Math.ceil(wordLength / 4), "0");
}

/** W binary digits of the word, most significant first (−1 at W = 4 → "1111"). */
export function binWord(code: number, wordLength: number, signed = true): string {
  return twosComplement(code, wordLength, signed).toString(2).padStart(wordLength, "0");
}

/** Storage width in bits for a word: the smallest of 8, 16 and 32 that holds W bits. */
export function storageBits(wordLength: number): 8 | 16 | 32 {
  checkInteger("wordLength", wordLength, EXPORT_WORD_RANGE.min, EXPORT_WORD_RANGE.max);
  return wordLength <= 8 ? 8 : wordLength <= 16 ? 16 : 32;
}

/** The <stdint.h> exact-width type for a word: int8_t/int16_t/int32_t, or uint… when unsigned (C99 §7.18.1.1). */
export function cIntegerType(wordLength: number, signed: boolean): string {
  return `${signed ? "" : "u"}int${storageBits(wordLength)}_t`;
}

/**
 * A C99 integer constant for a code that is valid for its storage type: INT32_MIN is written
 * (-2147483647 - 1) because 2147483648 alone is not an int (C99 §6.4.4.1), large unsigned get a U.
 */
export function cLiteral(code: number): string {
  if (!Number.isSafeInteger(code)) throw new RangeError(`code must be an integer, got ${String(code)}`);
  if (code === -2147483648) return "(-2147483647 - 1)";
  if (code > 2147483647) return `${code}U`;
  return String(code);
}

/** Pads text on the left (or on the right when width < 0) to |width| characters with `fill`. */
export function padText(text: string, width: number, fill = " "): string {
  checkInteger("width", width, -4096, 4096);
  if (typeof fill !== "string" || fill.length !== 1) throw new RangeError("fill must be one character");
  return width >= 0 ? text.padStart(width, fill) : text.padEnd(-width, fill);
}

/** Printable ASCII only, for comments in generated sources: accents dropped, anything else (newlines too) → "?". */
export function asciiText(text: string): string {
  return transliterate(text)
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .replace(/[^\x20-\x7e]/g, "?");
}
