/**
 * Fixed-point quantizer: scale, round, then saturate or wrap into a W-bit word, value = code · 2^-F.
 * Uniform quantization as in Oppenheim & Schafer, *Discrete-Time Signal Processing*, ch. 6; rounding
 * names after IEEE 754-2019 §4.3, overflow names after IEEE 1076-2008 fixed_pkg (fixed_saturate, fixed_wrap).
 * Every step is exact in float64: scaling by a power of two is exact, `u - floor(u)` is exact, and
 * `%` on doubles (fmod) is exact, so codes are the integers the definitions give.
 */
import { checkInteger, checkSignal } from "./check";
import type { ComplexSignal, FixedPointSpec, OverflowMode, QuantizedTable, RoundingMode } from "./types";

/** Limits of the fixed-point format (DESIGN.md): W 2..32, F −64..96. */
export const WORD_LENGTH_RANGE = { min: 2, max: 32 } as const;
export const FRACTION_LENGTH_RANGE = { min: -64, max: 96 } as const;

const ROUNDING_MODES: readonly RoundingMode[] = [
  "nearest-away",
  "nearest-even",
  "nearest-up",
  "floor",
  "ceiling",
  "toward-zero",
];
const OVERFLOW_MODES: readonly OverflowMode[] = ["saturate", "wrap"];
const SCALING_MODES = ["as-given", "normalize", "full-scale"] as const;

/** Throws RangeError/TypeError naming the field when a rounding mode name is unknown. */
export function checkRoundingMode(name: string, mode: unknown): asserts mode is RoundingMode {
  if (typeof mode !== "string") throw new TypeError(`${name} must be a string`);
  if (!ROUNDING_MODES.includes(mode as RoundingMode))
    throw new RangeError(`${name} must be one of ${ROUNDING_MODES.join(", ")}, got "${mode}"`);
}

/** Throws RangeError/TypeError naming the field when an overflow mode name is unknown. */
export function checkOverflowMode(name: string, mode: unknown): asserts mode is OverflowMode {
  if (typeof mode !== "string") throw new TypeError(`${name} must be a string`);
  if (!OVERFLOW_MODES.includes(mode as OverflowMode))
    throw new RangeError(`${name} must be one of ${OVERFLOW_MODES.join(", ")}, got "${mode}"`);
}

/** Validates a FixedPointSpec; throws RangeError/TypeError naming the offending field. */
export function checkFixedPointSpec(spec: FixedPointSpec): void {
  if (spec == null || typeof spec !== "object") throw new TypeError("spec must be a fixed-point spec object");
  checkInteger("spec.wordLength", spec.wordLength, WORD_LENGTH_RANGE.min, WORD_LENGTH_RANGE.max);
  checkInteger(
    "spec.fractionLength",
    spec.fractionLength,
    FRACTION_LENGTH_RANGE.min,
    FRACTION_LENGTH_RANGE.max,
  );
  if (typeof spec.signed !== "boolean") throw new TypeError("spec.signed must be a boolean");
  if (!SCALING_MODES.includes(spec.scaling))
    throw new RangeError(
      `spec.scaling must be one of ${SCALING_MODES.join(", ")}, got "${String(spec.scaling)}"`,
    );
  checkRoundingMode("spec.rounding", spec.rounding);
  checkOverflowMode("spec.overflow", spec.overflow);
}

/** Smallest and largest integer code of a W-bit word: signed [−2^(W−1), 2^(W−1)−1], unsigned [0, 2^W−1]. */
export function integerRange(wordLength: number, signed: boolean): { min: number; max: number } {
  return signed
    ? { min: -(2 ** (wordLength - 1)), max: 2 ** (wordLength - 1) - 1 }
    : { min: 0, max: 2 ** wordLength - 1 };
}

/** Code range of a spec (checked). */
export function codeRange(spec: FixedPointSpec): { min: number; max: number } {
  checkFixedPointSpec(spec);
  return integerRange(spec.wordLength, spec.signed);
}

/** Rounding modes as small integers, so hot loops branch on a number, not a string. */
export const ROUNDING_CODE: Readonly<Record<RoundingMode, number>> = {
  floor: 0,
  "toward-zero": 1,
  "nearest-away": 2,
  "nearest-even": 3,
  "nearest-up": 4,
  ceiling: 5,
};

/**
 * Rounds u to an integer by rounding code (see ROUNDING_CODE). `u - floor(u)` is exact in float64,
 * so ties are detected exactly (no `floor(u + 0.5)`, which misrounds 0.49999999999999994).
 */
export function roundByCode(u: number, code: number): number {
  if (code === 0) return Math.floor(u);
  if (code === 1) return Math.trunc(u);
  if (code === 5) return Math.ceil(u);
  const f = Math.floor(u);
  const d = u - f;
  if (d > 0.5) return f + 1;
  if (d < 0.5) return f;
  if (code === 2) return u > 0 ? f + 1 : f; // tie: away from zero
  if (code === 4) return f + 1; // tie: up (floor(u + 1/2), computed without the rounding of u + 0.5)
  return f % 2 === 0 ? f : f + 1; // tie: to even
}

/** Rounds a real number to an integer with the given mode (IEEE 754-2019 §4.3 semantics). */
export function roundToInteger(u: number, mode: RoundingMode): number {
  return roundByCode(u, ROUNDING_CODE[mode]);
}

/**
 * Wraps an integer into [min, min + 2^W) by arithmetic modulo 2^W (two's-complement wrap-around).
 * `%` on doubles is exact, so this is exact for every finite integer-valued input.
 */
export function wrapInteger(v: number, wordLength: number, signed: boolean): number {
  const m = 2 ** wordLength;
  let r = v % m;
  if (r < 0) r += m;
  if (signed && r >= m / 2) r -= m;
  return r;
}

/**
 * The gain the scaling mode applies before rounding (1 for an all-zero input: any gain leaves zeros
 * unchanged, and 1 avoids dividing by zero and keeps the reported gain meaningful).
 */
export function scalingGain(maxAbs: number, spec: FixedPointSpec): number {
  if (spec.scaling === "as-given" || maxAbs === 0) return 1;
  const { max } = integerRange(spec.wordLength, spec.signed);
  const largest = max * 2 ** -spec.fractionLength; // largest representable positive value at F
  if (spec.scaling === "full-scale") return largest / maxAbs;
  // normalize: the largest integer k with maxAbs·2^k ≤ largest; log2 may be off by one ulp, so correct it.
  let k = Math.floor(Math.log2(largest / maxAbs));
  if (!Number.isFinite(k))
    throw new RangeError(`signal peak ${maxAbs} cannot be normalized: the gain is outside the float64 range`);
  while (maxAbs * 2 ** (k + 1) <= largest) k++;
  while (maxAbs * 2 ** k > largest) k--;
  const gain = 2 ** k;
  if (!Number.isFinite(gain) || gain === 0)
    throw new RangeError(
      `signal peak ${maxAbs} cannot be normalized: the gain 2^${k} is outside the float64 range`,
    );
  return gain;
}

/** Largest |I| or |Q| of a signal. */
export function peakComponent(signal: ComplexSignal): number {
  let m = 0;
  const { re, im } = signal;
  for (let i = 0; i < re.length; i++) {
    const a = Math.abs(re[i]!);
    const b = Math.abs(im[i]!);
    if (a > m) m = a;
    if (b > m) m = b;
  }
  return m;
}

/**
 * Values closer than SNAP_ULPS·ε·peak to a lattice point (in input units) are snapped onto it before
 * rounding: the round-off of computing the table (cos(π/2) = 6.1e-17 for 0) must not move a code
 * under floor, ceiling or toward-zero. For the nearest modes snapping never changes the code.
 */
export const SNAP_ULPS = 4;

/** Optional output buffers (each the signal's length) so a bit-width sweep can reuse memory. */
export interface QuantizeBuffers {
  re?: Float64Array;
  im?: Float64Array;
  valueRe?: Float64Array;
  valueIm?: Float64Array;
}

function buffer(name: string, given: Float64Array | undefined, n: number): Float64Array {
  if (!given) return new Float64Array(n);
  if (given.length !== n) throw new RangeError(`out.${name} must have ${n} elements, got ${given.length}`);
  return given;
}

/**
 * Quantizes one component array in place into `codes`/`values`; returns the overflow count.
 * `scale` is gain·2^F (a power of two unless full-scale); for full-scale a component equal to ±peak
 * is set to ±max directly so the largest component lands exactly on the largest code.
 */
function quantizeComponent(
  x: Float64Array,
  codes: Float64Array,
  values: Float64Array,
  spec: FixedPointSpec,
  scale: number,
  fullScalePeak: number,
  snap: number,
): number {
  const { min, max } = integerRange(spec.wordLength, spec.signed);
  const step = 2 ** -spec.fractionLength;
  const { overflow, wordLength, signed } = spec;
  const rounding = ROUNDING_CODE[spec.rounding];
  let overflows = 0;
  for (let i = 0; i < x.length; i++) {
    const xi = x[i]!;
    // Full-scale: the peak itself maps exactly onto ±max (x·max/peak may be one ulp off, and floor would lose a code).
    const u = xi === fullScalePeak ? max : xi === -fullScalePeak ? -max : xi * scale;
    if (!Number.isFinite(u))
      throw new RangeError(`signal[${i}] × 2^${spec.fractionLength} is outside the float64 range`);
    // A value within a few ulps (of the table's peak) of a lattice point is that point: cos(π/2) =
    // 6.1e-17 is 0, and floor must not turn it into code −1.
    const near = Math.round(u);
    let c = Math.abs(u - near) <= snap ? near : roundByCode(u, rounding);
    if (c > max || c < min) {
      overflows++;
      c = overflow === "saturate" ? (c > max ? max : min) : wrapInteger(c, wordLength, signed);
    }
    c += 0; // −0 (trunc/floor of small negatives) becomes 0
    codes[i] = c;
    values[i] = c * step;
  }
  return overflows;
}

/**
 * Quantizes a complex table to the fixed-point spec: codes (exact integers), the values they stand for
 * (code·2^-F ≈ gain·input), the gain, and how many I/Q components overflowed (counted separately).
 */
export function quantize(signal: ComplexSignal, spec: FixedPointSpec, out?: QuantizeBuffers): QuantizedTable {
  checkSignal("signal", signal);
  checkFixedPointSpec(spec);
  const n = signal.re.length;
  const re = buffer("re", out?.re, n);
  const im = buffer("im", out?.im, n);
  const valueRe = buffer("valueRe", out?.valueRe, n);
  const valueIm = buffer("valueIm", out?.valueIm, n);
  const peak = peakComponent(signal);
  const gain = scalingGain(peak, spec);
  const fullScalePeak = spec.scaling === "full-scale" && peak > 0 ? peak : NaN; // NaN equals nothing: no snapping
  const scale = gain * 2 ** spec.fractionLength;
  const snap = SNAP_ULPS * Number.EPSILON * peak * scale;
  const overflowCount =
    quantizeComponent(signal.re, re, valueRe, spec, scale, fullScalePeak, snap) +
    quantizeComponent(signal.im, im, valueIm, spec, scale, fullScalePeak, snap);
  return { re, im, valueRe, valueIm, gain, overflowCount, spec: { ...spec } };
}
