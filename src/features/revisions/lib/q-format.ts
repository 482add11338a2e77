/** Q notation of a fixed-point word, with the integer part counting the sign bit (e.g. 16 bits, F = 15 → Q1.15; common practice). */
export function qFormat(wordLength: number, fractionLength: number, signed: boolean): string {
  return `${signed ? "" : "U"}Q${wordLength - fractionLength}.${fractionLength}`;
}

/** The value of one LSB, 2^-F. */
export function lsb(fractionLength: number): number {
  return 2 ** -fractionLength;
}

/** The representable range [min, max] of a W-bit word at fraction length F (two's complement when signed). */
export function qRange(wordLength: number, fractionLength: number, signed: boolean): [number, number] {
  const step = lsb(fractionLength);
  return signed
    ? [-(2 ** (wordLength - 1)) * step, (2 ** (wordLength - 1) - 1) * step]
    : [0, (2 ** wordLength - 1) * step];
}
