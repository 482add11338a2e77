/**
 * Bit-true model of a fixed-point radix-2 decimation-in-time FFT (Cooley–Tukey; structure as in
 * Oppenheim & Schafer, "Discrete-Time Signal Processing", ch. 9: in-place butterflies, input in
 * bit-reversed order, output in natural order). docs/fast-convolution.md defines it to the last bit;
 * this file is that definition in code.
 *
 * Integer exactness: data codes |a|, |b| ≤ 2^(Wd−1) and twiddle codes |c|, |s| ≤ 2^(Wt−1), so every
 * product b·c is ≤ 2^(Wd+Wt−2) and every butterfly sum a·2^g ± (b·W) before rounding is below
 * 2^(Wd+Wt) (g ≤ Wt−1). With Wd + Wt ≤ 53 (checked) every `*` and `+` below is on integers under
 * 2^53, exact in float64, and scaling by 2^−k is exact, so `roundByCode` sees the exact rational.
 */
import { checkInteger } from "../check";
import {
  checkOverflowMode,
  checkRoundingMode,
  integerRange,
  ROUNDING_CODE,
  roundByCode,
  wrapInteger,
} from "../quantize";
import type { OverflowMode, RoundingMode } from "../types";

/** Largest transform the bit-true model accepts (2^20 points). */
export const MAX_FIXED_FFT_SIZE = 2 ** 20;
/** Data word limits Wd (signed I and Q words at the input, between stages and at the output). */
export const DATA_BITS_RANGE = { min: 4, max: 26 } as const;
/** Twiddle word limits Wt (signed). */
export const TWIDDLE_BITS_RANGE = { min: 3, max: 26 } as const;
/** Wd + Wt must not exceed this: every intermediate integer then stays below 2^53 (exact in float64). */
export const MAX_PRODUCT_BITS = 53;
/** Largest right shift a stage may apply (radix-2 growth per component is below 1 + √2 < 4). */
export const MAX_STAGE_SHIFT = 2;

/**
 * Per-stage scaling. `every-stage`: shift right by 1 after every stage. `stages`: shift by
 * shifts[i] (0..2) after stage i+1. `block-floating-point`: one shared exponent per transform,
 * the shift of each stage chosen from the block itself — `worst-case` before the stage from the
 * largest input component (a streaming core can do this), `measured` from the stage's exact
 * results (needs the stage held at full precision, as a memory-based core can).
 */
export type StageSchedule =
  | { kind: "every-stage" }
  | { kind: "stages"; shifts: readonly number[] }
  | { kind: "block-floating-point"; rule: "worst-case" | "measured" };

/** The fixed-point model of one transform. */
export interface FixedFftSpec {
  /** Wd: signed width of I and Q at the input, after every stage and at the output (4..26). */
  dataBits: number;
  /** Wt: signed width of the twiddle codes (3..26), Wd + Wt ≤ 53. */
  twiddleBits: number;
  /** How 2^(Wt−1)·cos and −2^(Wt−1)·sin are rounded to twiddle codes. */
  twiddleRounding: RoundingMode;
  /** How butterfly products and outputs are rounded (both roundings use this mode). */
  rounding: RoundingMode;
  /**
   * g: fraction bits (below the data LSB) the twiddle product keeps before the add, 0..Wt−1.
   * Wt−1 keeps it exact (one rounding per butterfly output); 0 rounds it to the data LSB first.
   */
  productGuardBits: number;
  /** What happens to a butterfly output outside the Wd-bit range (counted either way). */
  overflow: OverflowMode;
  schedule: StageSchedule;
}

/** Twiddle codes W^k ≈ (cos[k] + j·sin[k]) / 2^(Wt−1) = e^(−j2πk/N), k = 0..N/2−1. */
export interface TwiddleTable {
  size: number;
  twiddleBits: number;
  /** round(2^(Wt−1)·cos(2πk/N)); entry 0 is 2^(Wt−1): W^0 = 1 is applied exactly (no multiplier). */
  cos: Float64Array;
  /** round(−2^(Wt−1)·sin(2πk/N)) (forward transform). */
  sin: Float64Array;
  /** Entries k ≥ 1 whose rounded value was 2^(Wt−1) and was saturated to 2^(Wt−1)−1. */
  saturated: number;
}

/** A transform's output codes (natural order) and how it was scaled. */
export interface FixedFftResult {
  re: Float64Array;
  im: Float64Array;
  /** Right shift applied after each stage (length log2 N). */
  stageShifts: number[];
  /** Σ stageShifts: the output codes stand for DFT(input codes) / 2^exponent. */
  exponent: number;
  /** Butterfly output components (I and Q separately) that overflowed Wd bits. */
  overflowCount: number;
}

/** log2 of a power-of-two transform size, with a message naming what is wrong otherwise. */
export function fftStages(size: number, name = "fftSize"): number {
  checkInteger(name, size, 2, MAX_FIXED_FFT_SIZE);
  if ((size & (size - 1)) !== 0)
    throw new RangeError(
      `${name} must be a power of two (radix-2 FFT), got ${size}; the nearest are ${2 ** Math.floor(Math.log2(size))} and ${2 ** Math.ceil(Math.log2(size))}`,
    );
  return Math.round(Math.log2(size));
}

/** Validates a FixedFftSpec for a transform of `size` points; throws RangeError/TypeError naming the field. */
export function checkFixedFftSpec(spec: FixedFftSpec, size: number, name = "fft"): void {
  if (spec == null || typeof spec !== "object")
    throw new TypeError(`${name} must be a fixed-point FFT spec object`);
  const m = fftStages(size);
  checkInteger(`${name}.dataBits`, spec.dataBits, DATA_BITS_RANGE.min, DATA_BITS_RANGE.max);
  checkInteger(`${name}.twiddleBits`, spec.twiddleBits, TWIDDLE_BITS_RANGE.min, TWIDDLE_BITS_RANGE.max);
  if (spec.dataBits + spec.twiddleBits > MAX_PRODUCT_BITS)
    throw new RangeError(
      `${name}.dataBits + ${name}.twiddleBits must be ≤ ${MAX_PRODUCT_BITS} (exact integer arithmetic), got ${spec.dataBits} + ${spec.twiddleBits}`,
    );
  checkRoundingMode(`${name}.twiddleRounding`, spec.twiddleRounding);
  checkRoundingMode(`${name}.rounding`, spec.rounding);
  checkOverflowMode(`${name}.overflow`, spec.overflow);
  checkInteger(`${name}.productGuardBits`, spec.productGuardBits, 0, spec.twiddleBits - 1);
  checkSchedule(spec.schedule, m, `${name}.schedule`);
}

function checkSchedule(s: StageSchedule, stages: number, name: string): void {
  if (s == null || typeof s !== "object") throw new TypeError(`${name} must be a schedule object`);
  if (s.kind === "every-stage") return;
  if (s.kind === "block-floating-point") {
    if (s.rule !== "worst-case" && s.rule !== "measured")
      throw new RangeError(`${name}.rule must be "worst-case" or "measured", got "${String(s.rule)}"`);
    return;
  }
  if (s.kind === "stages") {
    if (!Array.isArray(s.shifts)) throw new TypeError(`${name}.shifts must be an array`);
    if (s.shifts.length !== stages)
      throw new RangeError(
        `${name}.shifts must have one entry per stage (${stages}), got ${s.shifts.length}`,
      );
    s.shifts.forEach((v, i) => checkInteger(`${name}.shifts[${i}]`, v, 0, MAX_STAGE_SHIFT));
    return;
  }
  throw new TypeError(`${name}.kind is unknown: ${String((s as { kind?: unknown }).kind)}`);
}

/** cos and sin of 2πk/N from the first octant, so the table has the circle's symmetries exactly. */
function unitRoot(k: number, n: number): { c: number; s: number } {
  if (8 * k <= n) return { c: Math.cos((2 * Math.PI * k) / n), s: Math.sin((2 * Math.PI * k) / n) };
  if (4 * k <= n) {
    const r = unitRoot(n / 4 - k, n);
    return { c: r.s, s: r.c };
  }
  const r = unitRoot(n / 2 - k, n); // N/4 < k < N/2
  return { c: -r.c, s: r.s };
}

/**
 * The twiddle table of an N-point transform: cos[k] = round(2^(Wt−1)·cos(2πk/N)), sin[k] =
 * round(−2^(Wt−1)·sin(2πk/N)), k = 0..N/2−1, rounded with `rounding`, cos and sin of 2πk/N taken
 * from the first octant (k ≤ N/8) by the circle's symmetries. Entries k ≥ 1 that round to 2^(Wt−1)
 * saturate to 2^(Wt−1)−1 (counted); −2^(Wt−1) fits. Entry 0 (W^0 = 1) is 2^(Wt−1) and stands for an
 * exact pass-through.
 */
export function twiddleTable(size: number, twiddleBits: number, rounding: RoundingMode): TwiddleTable {
  fftStages(size);
  checkInteger("twiddleBits", twiddleBits, TWIDDLE_BITS_RANGE.min, TWIDDLE_BITS_RANGE.max);
  checkRoundingMode("twiddleRounding", rounding);
  const one = 2 ** (twiddleBits - 1);
  const code = ROUNDING_CODE[rounding];
  const half = size / 2;
  const cos = new Float64Array(half);
  const sin = new Float64Array(half);
  let saturated = 0;
  cos[0] = one;
  sin[0] = 0;
  for (let k = 1; k < half; k++) {
    const r = unitRoot(k, size);
    let c = roundByCode(one * r.c, code) + 0;
    let s = roundByCode(-one * r.s, code) + 0;
    if (c >= one) {
      c = one - 1;
      saturated++;
    }
    if (s >= one) {
      s = one - 1;
      saturated++;
    }
    cos[k] = c;
    sin[k] = s;
  }
  return { size, twiddleBits, cos, sin, saturated };
}

const tables = new Map<string, TwiddleTable>();
function cachedTable(size: number, bits: number, rounding: RoundingMode): TwiddleTable {
  const key = `${size}/${bits}/${rounding}`;
  let t = tables.get(key);
  if (!t) {
    t = twiddleTable(size, bits, rounding);
    if (tables.size > 64) tables.clear();
    tables.set(key, t);
  }
  return t;
}

/** The bit-reversed index of n in an m-bit address (rev(n) of the input permutation). */
export function bitReverse(n: number, m: number): number {
  let r = 0;
  for (let i = 0; i < m; i++) {
    r = (r << 1) | (n & 1);
    n >>>= 1;
  }
  return r;
}

/** The largest |cos[k]| + |sin[k]| (in codes) over the twiddles one stage uses: its product bound. */
function stageTwiddleBound(t: TwiddleTable, stage: number, n: number): number {
  const h = 2 ** (stage - 1);
  const stride = n / (2 * h);
  let best = 0;
  for (let j = 0; j < h; j++) {
    const k = j * stride;
    const v = Math.abs(t.cos[k]!) + Math.abs(t.sin[k]!);
    if (v > best) best = v;
  }
  return best;
}

function checkCodes(name: string, x: ArrayLike<number>, n: number, bits: number): void {
  if (x == null || typeof x.length !== "number")
    throw new TypeError(`${name} must be an array of integer codes`);
  if (x.length !== n)
    throw new RangeError(`${name} must have ${n} elements (the transform size), got ${x.length}`);
  const { min, max } = integerRange(bits, true);
  for (let i = 0; i < n; i++) {
    const v = x[i]!;
    if (!Number.isInteger(v) || v < min || v > max)
      throw new RangeError(
        `${name}[${i}] must be an integer code in ${min}..${max} (${bits}-bit signed), got ${v}`,
      );
  }
}

/**
 * Forward transform X[k] = Σ x[n]·W^(nk), W = e^(−j2π/N), of N integer I/Q codes (each Wd-bit
 * signed) in natural order. Returns codes in natural order with X[k] ≈ code·2^exponent.
 *
 * Stage s = 1..m (m = log2 N), on the bit-reversed input y[n] = x[rev(n)]: for every group start
 * q (step 2h, h = 2^(s−1)) and j = 0..h−1, with a = y[q+j], b = y[q+j+h], k = j·N/2^s:
 *   P = round((b·(cos[k] + j·sin[k])) / 2^(Wt−1−g))          (exact when g = Wt−1; k = 0: P = b·2^g)
 *   y[q+j] = ovf(round((a·2^g + P) / 2^(g+e_s))),  y[q+j+h] = ovf(round((a·2^g − P) / 2^(g+e_s)))
 * with e_s the stage's shift and ovf saturate/wrap to Wd bits.
 */
export function fixedFft(re: ArrayLike<number>, im: ArrayLike<number>, spec: FixedFftSpec): FixedFftResult {
  const n = re?.length;
  checkInteger("input length", n, 2, MAX_FIXED_FFT_SIZE);
  checkFixedFftSpec(spec, n);
  checkCodes("input.re", re, n, spec.dataBits);
  checkCodes("input.im", im, n, spec.dataBits);
  return fixedFftUnchecked(re, im, spec);
}

/** fixedFft without the input checks (callers inside this folder have already checked). */
export function fixedFftUnchecked(
  re: ArrayLike<number>,
  im: ArrayLike<number>,
  spec: FixedFftSpec,
): FixedFftResult {
  const n = re.length;
  const m = Math.round(Math.log2(n));
  const t = cachedTable(n, spec.twiddleBits, spec.twiddleRounding);
  const g = spec.productGuardBits;
  const productScale = 2 ** -(spec.twiddleBits - 1 - g);
  const aScale = 2 ** g;
  const code = ROUNDING_CODE[spec.rounding];
  const { min, max } = integerRange(spec.dataBits, true);
  const yr = new Float64Array(n);
  const yi = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const r = bitReverse(i, m);
    yr[i] = re[r]!;
    yi[i] = im[r]!;
  }
  const sr = new Float64Array(n); // the stage's exact sums a·2^g ± P
  const si = new Float64Array(n);
  const stageShifts: number[] = [];
  let overflowCount = 0;
  const sched = spec.schedule;
  for (let s = 1; s <= m; s++) {
    const h = 2 ** (s - 1);
    const stride = n / (2 * h);
    let inMax = 0;
    if (sched.kind === "block-floating-point" && sched.rule === "worst-case")
      for (let i = 0; i < n; i++) {
        const a = Math.abs(yr[i]!);
        const b = Math.abs(yi[i]!);
        if (a > inMax) inMax = a;
        if (b > inMax) inMax = b;
      }
    let lo = 0;
    let hi = 0;
    for (let q = 0; q < n; q += 2 * h) {
      for (let j = 0; j < h; j++) {
        const k = j * stride;
        const ia = q + j;
        const ib = ia + h;
        const br = yr[ib]!;
        const bi = yi[ib]!;
        let pr: number;
        let pi: number;
        if (k === 0) {
          pr = br * aScale;
          pi = bi * aScale;
        } else {
          const c = t.cos[k]!;
          const w = t.sin[k]!;
          pr = roundByCode((br * c - bi * w) * productScale, code) + 0;
          pi = roundByCode((br * w + bi * c) * productScale, code) + 0;
        }
        const ar = yr[ia]! * aScale;
        const ai = yi[ia]! * aScale;
        sr[ia] = ar + pr;
        si[ia] = ai + pi;
        sr[ib] = ar - pr;
        si[ib] = ai - pi;
      }
    }
    let e: number;
    if (sched.kind === "every-stage") e = 1;
    else if (sched.kind === "stages") e = sched.shifts[s - 1]!;
    else if (sched.rule === "worst-case") {
      // Bound before the stage: |a·2^g ± P| ≤ M·2^g + ⌈M·T/2^(Wt−1−g)⌉ (T = largest |cos|+|sin| of the
      // stage), rounding adds < 1; the smallest shift whose bound fits Wd bits.
      const tb = stageTwiddleBound(t, s, n);
      const pBound = s === 1 ? inMax * aScale : Math.ceil(inMax * tb * productScale);
      const sumBound = inMax * aScale + pBound;
      e = 0;
      while (e < MAX_STAGE_SHIFT && Math.ceil(sumBound * 2 ** -(g + e)) > max) e++;
    } else {
      for (let i = 0; i < n; i++) {
        const a = sr[i]!;
        const b = si[i]!;
        if (a < lo) lo = a;
        if (a > hi) hi = a;
        if (b < lo) lo = b;
        if (b > hi) hi = b;
      }
      // Rounding is monotonic: the extremes decide.
      e = 0;
      while (
        e < MAX_STAGE_SHIFT &&
        (roundByCode(hi * 2 ** -(g + e), code) > max || roundByCode(lo * 2 ** -(g + e), code) < min)
      )
        e++;
    }
    stageShifts.push(e);
    const outScale = 2 ** -(g + e);
    for (const [src, dst] of [
      [sr, yr],
      [si, yi],
    ] as const) {
      for (let i = 0; i < n; i++) {
        let v = roundByCode(src[i]! * outScale, code);
        if (v > max || v < min) {
          overflowCount++;
          v = spec.overflow === "saturate" ? (v > max ? max : min) : wrapInteger(v, spec.dataBits, true);
        }
        dst[i] = v + 0;
      }
    }
  }
  return { re: yr, im: yi, stageShifts, exponent: stageShifts.reduce((a, b) => a + b, 0), overflowCount };
}

/**
 * Inverse transform x[n] = Σ X[k]·W^(−nk) (no 1/N: the schedule's shifts carry it), computed with
 * the same forward core by swapping I and Q on the way in and out: swap(FFT(swap(X))) = N·IDFT(X),
 * swap(a + jb) = b + ja. The swap is exact (no negation, so −2^(Wd−1) cannot overflow) and needs no
 * second twiddle table. Rounding modes act on the swapped components.
 */
export function fixedIfft(re: ArrayLike<number>, im: ArrayLike<number>, spec: FixedFftSpec): FixedFftResult {
  const r = fixedFft(im, re, spec);
  return { ...r, re: r.im, im: r.re };
}

/** fixedIfft without the input checks. */
export function fixedIfftUnchecked(
  re: ArrayLike<number>,
  im: ArrayLike<number>,
  spec: FixedFftSpec,
): FixedFftResult {
  const r = fixedFftUnchecked(im, re, spec);
  return { ...r, re: r.im, im: r.re };
}
