/**
 * Types shared by every module of the DSP core. Signals are split real/imaginary Float64Arrays
 * (a real signal has an all-zero `im`), which keeps them transferable to worker threads.
 */

/** A sampled complex signal; `re` and `im` always have the same length. */
export interface ComplexSignal {
  re: Float64Array;
  im: Float64Array;
}

/** Rounding modes of DESIGN.md (IEEE 754-2019 §4.3 names in comments). */
export type RoundingMode =
  | "nearest-away" // roundTiesToAway
  | "nearest-even" // roundTiesToEven
  | "nearest-up" // ties toward +∞: add half an LSB, then floor (the cheapest rounding in hardware)
  | "floor" // roundTowardNegative ("truncate" in two's complement)
  | "ceiling" // roundTowardPositive
  | "toward-zero"; // roundTowardZero

export type OverflowMode = "saturate" | "wrap";

/**
 * `as-given`: use F as stated (gain 1).
 * `normalize`: the largest power-of-two gain 2^k with max(|I|,|Q|)·2^k representable at F.
 * `full-scale`: the gain that maps max(|I|,|Q|) to the largest positive code.
 */
export type ScalingMode = "as-given" | "normalize" | "full-scale";

/** The fixed-point format of one coefficient table. */
export interface FixedPointSpec {
  /** Word length W in bits, 2..32. */
  wordLength: number;
  /** Fraction length F (Q notation); value = integer · 2^-F. May be negative or exceed W. */
  fractionLength: number;
  /** Two's complement when true, unsigned otherwise. */
  signed: boolean;
  scaling: ScalingMode;
  rounding: RoundingMode;
  overflow: OverflowMode;
}

/** Result of quantizing a (possibly complex) table. */
export interface QuantizedTable {
  /** Integer codes (exact integers stored in float64; W ≤ 32 so they are exact). */
  re: Float64Array;
  im: Float64Array;
  /** Values the codes stand for: code · 2^-F (i.e. ≈ gain · input). */
  valueRe: Float64Array;
  valueIm: Float64Array;
  /** Gain applied to the input before rounding (1 for `as-given`). */
  gain: number;
  /** Number of real components (I and Q counted separately) that overflowed. */
  overflowCount: number;
  spec: FixedPointSpec;
}

/** Acceptance limits; every field optional, absent = not checked. dB values as DESIGN.md defines them. */
export interface AcceptanceLimits {
  pslDbMax?: number;
  islrDbMax?: number;
  mismatchLossDbMax?: number;
  peakLossDbMax?: number;
  coefficientSqnrDbMin?: number;
  stopbandAttenuationDbMin?: number;
  passbandRippleDbMax?: number;
}
