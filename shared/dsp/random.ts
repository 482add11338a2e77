/**
 * Seeded, portable pseudo-random numbers for reproducible stimuli.
 *
 * - Generator: xoshiro128** 1.1 — D. Blackman, S. Vigna, "Scrambled linear pseudorandom number
 *   generators", ACM Trans. Math. Softw. 47(4), 2021 — 32-bit state words, so it runs in plain JS integer
 *   arithmetic (Math.imul, >>>) with the same result on every engine.
 * - Seeding: the 128-bit state is the first two outputs of SplitMix64 — G. Steele, D. Lea, C. Flood,
 *   "Fast splittable pseudorandom number generators", OOPSLA 2014 — as the xoshiro authors recommend;
 *   each 64-bit output gives state words (low, high).
 * - uniform(): 53 random bits from two outputs, (a>>>5)·2^26 + (b>>>6) over 2^53, in [0, 1).
 * - gaussian(): Box–Muller in Marsaglia's polar form (G. Marsaglia, T. Bray, "A convenient method for
 *   generating normal variables", SIAM Review 6(3), 1964), which needs no sine or cosine. Math.log is
 *   "implementation-approximated" in ECMAScript, so the logarithm here uses only + − × ÷ (correctly
 *   rounded in IEEE 754): the same seed gives the same bits on every platform. sqrt is correctly rounded.
 */
import { checkInteger } from "./check";

/** A seeded stream of random numbers. */
export interface Rng {
  /** Next raw 32-bit output of xoshiro128** as an unsigned integer. */
  nextUint32(): number;
  /** Uniform in [0, 1) with 53 random bits. */
  uniform(): number;
  /** Standard normal (mean 0, variance 1). */
  gaussian(): number;
}

const MASK64 = (1n << 64n) - 1n;

/** SplitMix64 (Steele, Lea, Flood 2014): returns the next output and the new state, as BigInt. */
export function splitMix64(state: bigint): { value: bigint; state: bigint } {
  const s = (state + 0x9e3779b97f4a7c15n) & MASK64;
  let z = s;
  z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & MASK64;
  z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & MASK64;
  return { value: z ^ (z >> 31n), state: s };
}

const LN2 = 0.6931471805599453; // ln 2 rounded to float64
const SQRT2 = Math.SQRT2;

/**
 * Natural logarithm from + − × ÷ only (portable bit for bit): x = m·2^k with m in [√2/2, √2),
 * ln m = 2·atanh(z), z = (m−1)/(m+1), |z| < 0.172, series to 1e-17.
 */
export function portableLog(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) throw new RangeError(`portableLog needs a finite x > 0, got ${x}`);
  let m = x;
  let k = 0;
  while (m >= 2) {
    m *= 0.5;
    k++;
  }
  while (m < 1) {
    m *= 2;
    k--;
  }
  if (m > SQRT2) {
    m *= 0.5;
    k++;
  }
  const z = (m - 1) / (m + 1);
  const z2 = z * z;
  // atanh(z) = z·(1 + z²/3 + z⁴/5 + …); 13 terms: 0.172^26/27 < 1e-21.
  let sum = 0;
  for (let n = 25; n >= 1; n -= 2) sum = 1 / n + z2 * sum;
  return k * LN2 + 2 * z * sum;
}

/** xoshiro128** (Blackman & Vigna) from four 32-bit state words; returns the output function. */
export function xoshiro128StarStar(w0: number, w1: number, w2: number, w3: number): () => number {
  let s0 = w0 >>> 0;
  let s1 = w1 >>> 0;
  let s2 = w2 >>> 0;
  let s3 = w3 >>> 0;
  // xoshiro must not start from the all-zero state (SplitMix64 practically never yields it).
  if ((s0 | s1 | s2 | s3) === 0) s0 = 1;
  return (): number => {
    const x = Math.imul(s1, 5);
    const result = Math.imul((x << 7) | (x >>> 25), 9) >>> 0;
    const t = s1 << 9;
    s2 ^= s0;
    s3 ^= s1;
    s1 ^= s2;
    s0 ^= s3;
    s2 ^= t;
    s3 = (s3 << 11) | (s3 >>> 21);
    return result;
  };
}

/** Creates a generator from a seed (an integer 0..2^53−1); same seed → same sequence everywhere. */
export function createRng(seed: number): Rng {
  checkInteger("seed", seed, 0, Number.MAX_SAFE_INTEGER);
  let sm = BigInt(seed);
  const words: number[] = [];
  for (let i = 0; i < 2; i++) {
    const r = splitMix64(sm);
    sm = r.state;
    words.push(Number(r.value & 0xffffffffn), Number(r.value >> 32n));
  }
  const nextUint32 = xoshiro128StarStar(words[0]!, words[1]!, words[2]!, words[3]!);

  const uniform = (): number => {
    const a = nextUint32() >>> 5;
    const b = nextUint32() >>> 6;
    return (a * 67108864 + b) / 9007199254740992;
  };

  let spare = 0;
  let hasSpare = false;
  const gaussian = (): number => {
    if (hasSpare) {
      hasSpare = false;
      return spare;
    }
    let u: number;
    let v: number;
    let s: number;
    do {
      u = 2 * uniform() - 1;
      v = 2 * uniform() - 1;
      s = u * u + v * v;
    } while (s >= 1 || s === 0);
    const f = Math.sqrt((-2 * portableLog(s)) / s);
    spare = v * f;
    hasSpare = true;
    return u * f;
  };

  return { nextUint32, uniform, gaussian };
}
