/**
 * Accumulator bit growth of a direct-form FIR with integer input and coefficients (DESIGN.md):
 * worst case = input bits + coefficient bits + ⌈log2 Σ|ĥ|⌉, with ĥ the coefficient codes as fractions
 * of full scale (code / 2^(coefficientBits−1)), so a filter with Σ|ĥ| ≤ 1 needs no growth bits.
 */
import { checkInteger, checkSignal } from "./check";

/** Checks that every element is an integer code of a signed `bits`-bit word. */
export function checkSignedCodes(name: string, values: ArrayLike<number>, bits: number): void {
  const lo = -(2 ** (bits - 1));
  const hi = 2 ** (bits - 1) - 1;
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!;
    if (!Number.isInteger(v) || v < lo || v > hi)
      throw new RangeError(
        `${name}[${i}] must be an integer code in ${lo}..${hi} (${bits}-bit signed), got ${v}`,
      );
  }
}

/**
 * Σ over taps of |re| + |im| (in codes), exact. For I/Q accumulators this is the tight per-component worst
 * case: |Σ h_re·x_re − h_im·x_im| ≤ max|x|·Σ(|h_re| + |h_im|), reached by x = ±max with matching signs.
 * For a real filter it is Σ|h|.
 */
export function absoluteCodeSum(codes: { re: ArrayLike<number>; im: ArrayLike<number> }): bigint {
  let s = 0;
  for (let i = 0; i < codes.re.length; i++) s += Math.abs(codes.re[i]!) + Math.abs(codes.im[i]!);
  if (s < 2 ** 53) return BigInt(s); // every partial sum was an integer below 2^53, hence exact
  let b = 0n;
  for (let i = 0; i < codes.re.length; i++)
    b += BigInt(Math.abs(codes.re[i]!)) + BigInt(Math.abs(codes.im[i]!));
  return b;
}

/** Number of bits of a non-negative BigInt (0 for 0): the smallest e with v < 2^e. */
export function bitLength(v: bigint): number {
  return v === 0n ? 0 : v.toString(2).length;
}

/**
 * Worst-case accumulator width of a signed integer FIR. `recommendedBits` equals `worstCaseBits`: the
 * formula is never below the exact bound `exactBits` (usually one bit above, equal only when the bound
 * is an exact power of two), and sizing the accumulator to a proven worst case so that it can never
 * overflow is common practice; guard bits beyond that buy nothing for a fixed filter.
 */
export function accumulatorGrowth(
  inputBits: number,
  coefficientBits: number,
  codes: { re: ArrayLike<number>; im: ArrayLike<number> },
): { worstCaseBits: number; recommendedBits: number; absoluteSum: string; exactBits: number } {
  checkInteger("inputBits", inputBits, 2, 32);
  checkInteger("coefficientBits", coefficientBits, 2, 32);
  checkSignal("codes", codes);
  checkSignedCodes("codes.re", codes.re, coefficientBits);
  checkSignedCodes("codes.im", codes.im, coefficientBits);
  const sum = absoluteCodeSum(codes);
  // ⌈log2 Σ|ĥ|⌉ with ĥ = code / 2^(B−1), exactly: the smallest g with sum ≤ 2^(B−1+g).
  // An all-zero filter grows nothing, so only the product width counts.
  let growth = 0;
  if (sum > 0n) {
    const e = bitLength(sum - 1n); // smallest e with sum ≤ 2^e
    growth = e - (coefficientBits - 1);
  }
  const worstCaseBits = Math.max(2, inputBits + coefficientBits + growth);
  // Smallest signed width A with 2^(inputBits−1)·sum ≤ 2^(A−1) − 1 (so both signs fit).
  const bound = sum << BigInt(inputBits - 1);
  const exactBits = Math.max(2, bitLength(bound) + 1);
  // absoluteSum as decimal text: exact, and safe to put in a JSON report (a BigInt is not).
  return { worstCaseBits, recommendedBits: worstCaseBits, absoluteSum: sum.toString(), exactBits };
}
