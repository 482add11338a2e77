/**
 * Bit-true model of a complex integer FIR for golden vectors: y[n] = Σ_k h[k]·x[n−k] over the full
 * convolution (Nx + Nh − 1 outputs), exact integer multiply-accumulate on I and Q, then an arithmetic
 * right shift by `outputShift` with the chosen rounding, then saturate or wrap to `outputBits`.
 *
 * Exactness: with M = max(|x_re|, |x_im|) over the input and S = Σ_k (|h_re[k]| + |h_im[k]|), every
 * product and every partial sum of either accumulator is an integer of magnitude ≤ M·S (triangle
 * inequality). Float64 holds every integer of magnitude ≤ 2^53 exactly, so if M·S ≤ 2^53 each `*` and
 * `+` below is exact and the float path equals integer arithmetic; otherwise the BigInt path runs.
 * No floating-point FFT: its round-off would make the result approximate. Long filters use the exact
 * number-theoretic convolution instead (DIRECT_MAX_MACS), whose accumulators are the same integers.
 */
import { absoluteCodeSum, accumulatorGrowth, checkSignedCodes } from "./accumulator";
import { checkInteger, checkSignal, MAX_SAMPLES } from "./check";
import { exactComplexConvolution } from "./exact-convolution";
import {
  checkOverflowMode,
  checkRoundingMode,
  integerRange,
  ROUNDING_CODE,
  roundByCode,
  wrapInteger,
} from "./quantize";
import type { OverflowMode, RoundingMode } from "./types";

/** Integer I/Q samples (exact integers in float64 or plain arrays). */
export interface IntegerSignal {
  re: ArrayLike<number>;
  im: ArrayLike<number>;
}

/** Parameters of the bit-true filter. */
export interface BitTrueOptions {
  input: IntegerSignal;
  coefficients: IntegerSignal;
  /** Right shift applied to the accumulator before rounding (0..256). */
  outputShift: number;
  rounding: RoundingMode;
  overflow: OverflowMode;
  /** Signed output width, 2..53 (outputs are stored exactly in float64). */
  outputBits: number;
  /** Signed input width, 2..32: every input code must fit. */
  inputBits: number;
  /** Signed coefficient width, 2..32: every coefficient code must fit. */
  coefficientBits: number;
  /** Signed accumulator width of the datapath (absent = wide enough for any sum). */
  accumulatorBits?: number;
}

/** Output codes of the bit-true filter and how they were computed. */
export interface BitTrueResult {
  re: Float64Array;
  im: Float64Array;
  /** Output components (I and Q counted separately) that exceeded `outputBits` before saturate/wrap. */
  overflowCount: number;
  /** Accumulator components that did not fit `accumulatorBits` and wrapped. */
  accumulatorOverflowCount: number;
  /** Largest |exact accumulator| over I and Q (decimal text). */
  maxAbsAccumulator: string;
  /** Worst-case accumulator width for the declared input and coefficient widths (accumulatorGrowth). */
  accumulatorBits: number;
  /** How the exact accumulators were computed: direct float64, direct BigInt, or NTT (exact-convolution.ts). */
  exactPath: "float64" | "bigint" | "ntt";
}

/**
 * Above this many multiply-accumulates (Nx × Nh) the accumulators come from the exact number-theoretic
 * convolution (shared/dsp/exact-convolution.ts): the same integers, in O(L log L) instead of Nx × Nh.
 */
export const DIRECT_MAX_MACS = 2 ** 27;

/** Largest integer magnitude the float path may meet (every integer up to it is exact in float64). */
export const FLOAT_EXACT_LIMIT = 2 ** 53;

/**
 * acc / 2^shift rounded to an integer with the given mode, exactly, in BigInt.
 * `>>` on BigInt is floor division by 2^shift; the remainder decides the other modes.
 */
export function shiftRoundBigInt(acc: bigint, shift: number, mode: RoundingMode): bigint {
  if (shift === 0) return acc;
  const s = BigInt(shift);
  const q = acc >> s;
  const r = acc - (q << s); // 0 ≤ r < 2^shift
  if (r === 0n || mode === "floor") return q;
  if (mode === "ceiling") return q + 1n;
  if (mode === "toward-zero") return acc < 0n ? q + 1n : q;
  const half = 1n << (s - 1n);
  if (r > half) return q + 1n;
  if (r < half) return q;
  if (mode === "nearest-up") return q + 1n; // (acc + 2^(shift−1)) >> shift
  if (mode === "nearest-away") return acc > 0n ? q + 1n : q;
  return (q & 1n) === 0n ? q : q + 1n; // nearest-even
}

function largestMagnitude(x: IntegerSignal): number {
  let m = 0;
  for (let i = 0; i < x.re.length; i++) {
    const a = Math.abs(x.re[i]!);
    const b = Math.abs(x.im[i]!);
    if (a > m) m = a;
    if (b > m) m = b;
  }
  return m;
}

/**
 * Direct-form convolution in float64 (exact under the 2^53 bound). Layout for speed, same sums:
 * h reversed and interleaved, x interleaved with Nh−1 zeros each side, so y[n] = Σ_j hRev[j]·xPad[n+j];
 * two outputs per pass share each coefficient load (about twice as fast as the textbook loop).
 * The zeros add nothing, so every partial sum is still a partial sum of the exact convolution.
 */
function convolveFloat(x: IntegerSignal, h: IntegerSignal, accRe: Float64Array, accIm: Float64Array): void {
  const nx = x.re.length;
  const nh = h.re.length;
  const ny = accRe.length;
  const hRev = new Float64Array(2 * nh);
  for (let k = 0; k < nh; k++) {
    hRev[2 * (nh - 1 - k)] = h.re[k]!;
    hRev[2 * (nh - 1 - k) + 1] = h.im[k]!;
  }
  const xPad = new Float64Array(2 * (nx + 2 * (nh - 1)) + 2);
  for (let i = 0; i < nx; i++) {
    xPad[2 * (i + nh - 1)] = x.re[i]!;
    xPad[2 * (i + nh - 1) + 1] = x.im[i]!;
  }
  for (let n = 0; n < ny; n += 2) {
    // Taps that meet input samples for output n or n+1 (outside them xPad is zero).
    const jLo = nh - 2 - n > 0 ? nh - 2 - n : 0;
    const jHi = nh + nx - 2 - n < nh - 1 ? nh + nx - 2 - n : nh - 1;
    let ar0 = 0;
    let ai0 = 0;
    let ar1 = 0;
    let ai1 = 0;
    let p = 2 * (n + jLo);
    let c0 = xPad[p]!;
    let d0 = xPad[p + 1]!;
    for (let j = 2 * jLo; j <= 2 * jHi; j += 2, p += 2) {
      const a = hRev[j]!;
      const b = hRev[j + 1]!;
      const c1 = xPad[p + 2]!;
      const d1 = xPad[p + 3]!;
      ar0 += a * c0 - b * d0;
      ai0 += a * d0 + b * c0;
      ar1 += a * c1 - b * d1;
      ai1 += a * d1 + b * c1;
      c0 = c1;
      d0 = d1;
    }
    accRe[n] = ar0;
    accIm[n] = ai0;
    if (n + 1 < ny) {
      accRe[n + 1] = ar1;
      accIm[n + 1] = ai1;
    }
  }
}

function convolveBigInt(x: IntegerSignal, h: IntegerSignal, ny: number): { re: bigint[]; im: bigint[] } {
  const xr = Array.from(x.re, BigInt);
  const xi = Array.from(x.im, BigInt);
  const hr = Array.from(h.re, BigInt);
  const hi = Array.from(h.im, BigInt);
  const re: bigint[] = new Array<bigint>(ny);
  const im: bigint[] = new Array<bigint>(ny);
  for (let n = 0; n < ny; n++) {
    const kLo = Math.max(0, n - xr.length + 1);
    const kHi = Math.min(n, hr.length - 1);
    let ar = 0n;
    let ai = 0n;
    for (let k = kLo; k <= kHi; k++) {
      ar += hr[k]! * xr[n - k]! - hi[k]! * xi[n - k]!;
      ai += hr[k]! * xi[n - k]! + hi[k]! * xr[n - k]!;
    }
    re[n] = ar;
    im[n] = ai;
  }
  return { re, im };
}

/**
 * The exact accumulators of the full convolution, acc[n] = Σ_k h[k]·x[n−k] on I and Q (no width limit).
 * float64 when the bound M·S ≤ 2^53 makes every sum exact (see the file comment), BigInt otherwise.
 * Kept apart from the output stage so a faster exact method (e.g. a number-theoretic transform) can
 * replace its inside without touching rounding, saturation or the golden files.
 */
export type ExactAccumulators =
  | { path: "float64"; re: Float64Array; im: Float64Array }
  | { path: "bigint" | "ntt"; re: bigint[]; im: bigint[] };

/** Runs the exact multiply-accumulate of a complex integer FIR over the full convolution. */
export function exactAccumulate(input: IntegerSignal, coefficients: IntegerSignal): ExactAccumulators {
  checkSignal("input", input);
  checkSignal("coefficients", coefficients);
  const ny = input.re.length + coefficients.re.length - 1;
  if (ny > MAX_SAMPLES)
    throw new RangeError(`output would have ${ny} samples; at most ${MAX_SAMPLES} are allowed`);
  // Long convolutions: the same exact integers by number-theoretic transforms (exact-convolution.ts).
  if (input.re.length * coefficients.re.length > DIRECT_MAX_MACS)
    return { path: "ntt", ...exactComplexConvolution(input, coefficients) };
  const bound = BigInt(largestMagnitude(input)) * absoluteCodeSum(coefficients);
  if (bound <= BigInt(FLOAT_EXACT_LIMIT)) {
    const re = new Float64Array(ny);
    const im = new Float64Array(ny);
    convolveFloat(input, coefficients, re, im);
    return { path: "float64", re, im };
  }
  return { path: "bigint", ...convolveBigInt(input, coefficients, ny) };
}

/** The output stage of the datapath: accumulator width, shift, rounding, overflow, output width. */
export interface OutputStageOptions {
  /** Signed accumulator width: sums wrap modulo 2^accumulatorBits as a two's-complement register does (absent = no limit). */
  accumulatorBits?: number;
  outputShift: number;
  rounding: RoundingMode;
  overflow: OverflowMode;
  outputBits: number;
}

/** What the output stage produced and met. */
export interface OutputStageResult {
  re: Float64Array;
  im: Float64Array;
  /** Output components (I and Q counted separately) that exceeded `outputBits` before saturate/wrap. */
  overflowCount: number;
  /** Accumulator components whose exact value does not fit `accumulatorBits` (they wrapped). */
  accumulatorOverflowCount: number;
  /** Largest |exact accumulator| over I and Q, before any wrap (decimal text: it may pass 2^53). */
  maxAbsAccumulator: string;
}

/** acc (exact) → wrapped to the accumulator, shifted, rounded, saturated or wrapped to the output width. */
export function outputStage(acc: ExactAccumulators, opts: OutputStageOptions): OutputStageResult {
  const { accumulatorBits, outputShift, rounding, overflow, outputBits } = opts;
  if (accumulatorBits !== undefined) checkInteger("accumulatorBits", accumulatorBits, 2, 256);
  checkInteger("outputBits", outputBits, 2, 53);
  checkInteger("outputShift", outputShift, 0, 256);
  checkRoundingMode("rounding", rounding);
  checkOverflowMode("overflow", overflow);
  const ny = acc.re.length;
  const { min, max } = integerRange(outputBits, true);
  const re = new Float64Array(ny);
  const im = new Float64Array(ny);
  let overflowCount = 0;
  let accumulatorOverflowCount = 0;
  let maxAbs = 0n;
  const accMax = accumulatorBits === undefined ? null : (1n << BigInt(accumulatorBits - 1)) - 1n;
  // float64 fast path: exact when no wrap is possible (|acc| ≤ 2^53 and the accumulator holds it).
  if (acc.path === "float64") {
    let m = 0;
    for (const y of [acc.re, acc.im]) for (let n = 0; n < ny; n++) m = Math.max(m, Math.abs(y[n]!));
    maxAbs = BigInt(m);
  }
  const floatOk = acc.path === "float64" && (accMax === null || maxAbs <= accMax);
  if (floatOk) {
    const code = ROUNDING_CODE[rounding];
    const step = 2 ** -outputShift; // exact: |acc| ≤ 2^53 and a power-of-two scale loses no bits
    for (const [src, dst] of [
      [acc.re as Float64Array, re],
      [acc.im as Float64Array, im],
    ] as const) {
      for (let n = 0; n < ny; n++) {
        let c = roundByCode(src[n]! * step, code);
        if (c > max || c < min) {
          overflowCount++;
          c = overflow === "saturate" ? (c > max ? max : min) : wrapInteger(c, outputBits, true);
        }
        dst[n] = c + 0; // + 0 turns −0 into 0
      }
    }
  } else {
    const bMin = BigInt(min);
    const bMax = BigInt(max);
    for (const [src, dst] of [
      [acc.re, re],
      [acc.im, im],
    ] as const) {
      for (let n = 0; n < ny; n++) {
        let a = typeof src[n] === "bigint" ? (src[n] as bigint) : BigInt(src[n] as number);
        const mag = a < 0n ? -a : a;
        if (mag > maxAbs) maxAbs = mag;
        if (accMax !== null && (a > accMax || a < -accMax - 1n)) {
          accumulatorOverflowCount++;
          a = BigInt.asIntN(accumulatorBits!, a);
        }
        let c = shiftRoundBigInt(a, outputShift, rounding);
        if (c > bMax || c < bMin) {
          overflowCount++;
          c = overflow === "saturate" ? (c > bMax ? bMax : bMin) : BigInt.asIntN(outputBits, c);
        }
        dst[n] = Number(c);
      }
    }
  }
  return { re, im, overflowCount, accumulatorOverflowCount, maxAbsAccumulator: maxAbs.toString() };
}

/** Runs the bit-true complex FIR; outputs are exact integer codes of `outputBits`-bit signed words. */
export function bitTrueFilter(opts: BitTrueOptions): BitTrueResult {
  if (opts == null || typeof opts !== "object") throw new TypeError("options must be an object");
  const { input, coefficients, outputShift, rounding, overflow, outputBits, inputBits, coefficientBits } =
    opts;
  checkInteger("inputBits", inputBits, 2, 32);
  checkInteger("coefficientBits", coefficientBits, 2, 32);
  checkInteger("outputBits", outputBits, 2, 53);
  checkInteger("outputShift", outputShift, 0, 256);
  checkRoundingMode("rounding", rounding);
  checkOverflowMode("overflow", overflow);
  checkSignal("input", input);
  checkSignal("coefficients", coefficients);
  checkSignedCodes("input.re", input.re, inputBits);
  checkSignedCodes("input.im", input.im, inputBits);
  // Also checks the coefficient codes against coefficientBits.
  const { worstCaseBits } = accumulatorGrowth(inputBits, coefficientBits, coefficients);
  const acc = exactAccumulate(input, coefficients);
  const out = outputStage(acc, {
    accumulatorBits: opts.accumulatorBits,
    outputShift,
    rounding,
    overflow,
    outputBits,
  });
  return { ...out, accumulatorBits: worstCaseBits, exactPath: acc.path };
}
