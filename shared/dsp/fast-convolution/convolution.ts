/**
 * Fast convolution with a stored reference spectrum, bit-true: each block of input codes goes through
 * the fixed-point FFT (fixed-fft.ts), is multiplied bin by bin by the quantized table Ĥ[k], rounded
 * back to the data width, and goes through the fixed-point inverse FFT; overlap-save keeps the
 * un-aliased outputs of each block, overlap-add sums the blocks' tails. Methods as in Oppenheim &
 * Schafer, "Discrete-Time Signal Processing", ch. 8 (block convolution by the DFT).
 *
 * H[k] = Σ_{n<L} h[n]·e^(−j2πkn/N), k = 0..N−1 in natural order (bin 0 = DC, bins above N/2 the
 * negative frequencies), h the receive filter taps exactly as matchedFilter() returns them (already
 * time-reversed and conjugated, window applied): the product is Y[k] = X[k]·H[k] with no further
 * conjugation. A core that stores conj(H) and conjugates in its multiplier must be given conj(Ĥ).
 */
import { checkSignal, MAX_SAMPLES } from "../check";
import { fftInterleaved, nextPow2, toInterleaved } from "../fft";
import {
  checkFixedPointSpec,
  integerRange,
  quantize,
  ROUNDING_CODE,
  roundByCode,
  wrapInteger,
} from "../quantize";
import type { ComplexSignal, FixedPointSpec } from "../types";
import {
  checkFixedFftSpec,
  fftStages,
  fixedFftUnchecked,
  fixedIfftUnchecked,
  MAX_PRODUCT_BITS,
  type FixedFftSpec,
  type StageSchedule,
} from "./fixed-fft";

/** Overlap-save (frames of N with hop B, keep N−L+1 ≥ B outputs) or overlap-add (segments of B, sum tails). */
export type BlockMethod = "overlap-save" | "overlap-add";

/** The whole frequency-domain compression path. */
export interface FastConvolutionSpec {
  method: BlockMethod;
  /** N, a power of two. */
  fftSize: number;
  /** B: new input samples per block (overlap-save) or segment length (overlap-add); B + L − 1 ≤ N. */
  blockLength: number;
  /** The forward transform; the inverse uses the same widths and modes. */
  fft: FixedFftSpec;
  /** Schedule of the inverse transform (default: fft.schedule). */
  inverseSchedule?: StageSchedule;
  /** Format of the stored reference spectrum Ĥ (signed; its scaling decides the gain G). */
  spectrum: FixedPointSpec;
  /**
   * Right shift of X·Ĥ back to Wd bits: a fixed shift, or "block-floating-point" (per block, the
   * smallest shift ≥ 0 with which every rounded product fits Wd bits).
   */
  productShift: number | "block-floating-point";
}

/** The stored reference spectrum: codes Ĥ[k] ≈ G·H[k], natural bin order. */
export interface SpectrumTable {
  fftSize: number;
  /** L, the receive filter's length. */
  filterLength: number;
  re: Float64Array;
  im: Float64Array;
  /** G = gain·2^F: codes per unit of H (quantize.ts). */
  scale: number;
  spec: FixedPointSpec;
  /** I/Q components that overflowed the table format. */
  overflowCount: number;
  /** The unquantized H[k], interleaved [re0, im0, …] (float64 FFT). */
  float: Float64Array;
}

/** One block's bit-true record (enough to write golden vectors: input frame, exponents, output codes). */
export interface BlockRecord {
  index: number;
  /** Input sample index of the frame's first point (may be negative: zeros before the record). */
  inputStart: number;
  /** Output sample index of the first kept output. */
  outputStart: number;
  fftShifts: number[];
  productShift: number;
  ifftShifts: number[];
  /** E: kept output values are code·2^E / G (G the table scale). */
  exponent: number;
  /** Kept output codes: B of them (overlap-save, frame points L−1..L+B−2) or B+L−1 (overlap-add). */
  re: Float64Array;
  im: Float64Array;
  overflow: { fft: number; product: number; ifft: number };
}

/** Result of the fixed-point fast convolution. */
export interface FastConvolutionResult {
  /** y ≈ x ∗ h over the full linear convolution (Nx + L − 1 samples), in input-code × filter units. */
  re: Float64Array;
  im: Float64Array;
  blocks: BlockRecord[];
  overflowCount: number;
}

/**
 * Checks a fast-convolution spec against a receive filter of `filterLength` taps; every message says
 * what cannot work and the nearest value that would.
 */
export function checkFastConvolutionSpec(spec: FastConvolutionSpec, filterLength: number): void {
  if (spec == null || typeof spec !== "object")
    throw new TypeError("fast convolution spec must be an object");
  if (spec.method !== "overlap-save" && spec.method !== "overlap-add")
    throw new RangeError(`method must be "overlap-save" or "overlap-add", got "${String(spec.method)}"`);
  const n = spec.fftSize;
  fftStages(n, "fftSize");
  const l = filterLength;
  if (!Number.isInteger(l) || l < 1)
    throw new RangeError(`the receive filter must have at least 1 tap, got ${l}`);
  if (l > n)
    throw new RangeError(
      `fftSize ${n} is shorter than the receive filter (${l} taps): H[k] of an N-point FFT holds at most N taps; ` +
        `use fftSize ≥ ${nextPow2(l + 1)} (a pulse longer than the FFT needs a partitioned filter, not modelled)`,
    );
  if (!Number.isInteger(spec.blockLength) || spec.blockLength < 1)
    throw new RangeError(`blockLength must be an integer ≥ 1, got ${spec.blockLength}`);
  if (spec.blockLength + l - 1 > n)
    throw new RangeError(
      `blockLength ${spec.blockLength} + filter length ${l} − 1 = ${spec.blockLength + l - 1} exceeds fftSize ${n}: ` +
        `the circular convolution would wrap into the kept outputs; with fftSize ${n} the longest block is ${n - l + 1}`,
    );
  checkFixedFftSpec(spec.fft, n, "fft");
  if (spec.inverseSchedule !== undefined)
    checkFixedFftSpec({ ...spec.fft, schedule: spec.inverseSchedule }, n, "inverse");
  checkFixedPointSpec(spec.spectrum);
  if (!spec.spectrum.signed) throw new RangeError("spectrum.signed must be true: H[k] has both signs");
  if (spec.fft.dataBits + spec.spectrum.wordLength > MAX_PRODUCT_BITS)
    throw new RangeError(
      `fft.dataBits + spectrum.wordLength must be ≤ ${MAX_PRODUCT_BITS} (exact X·Ĥ products), got ${spec.fft.dataBits} + ${spec.spectrum.wordLength}`,
    );
  const ps = spec.productShift;
  if (ps !== "block-floating-point") {
    const top = spec.fft.dataBits + spec.spectrum.wordLength;
    if (!Number.isInteger(ps) || ps < 0 || ps > top)
      throw new RangeError(
        `productShift must be "block-floating-point" or an integer in 0..${top}, got ${String(ps)}`,
      );
  }
}

/** H[k] = FFT_N of the receive filter taps (zero-padded), quantized to `spec`. */
export function referenceSpectrum(
  filter: ComplexSignal,
  fftSize: number,
  spec: FixedPointSpec,
): SpectrumTable {
  checkSignal("filter", filter);
  fftStages(fftSize, "fftSize");
  if (filter.re.length > fftSize)
    throw new RangeError(`fftSize ${fftSize} is shorter than the receive filter (${filter.re.length} taps)`);
  checkFixedPointSpec(spec);
  const float = fftInterleaved(toInterleaved(filter, fftSize));
  const re = new Float64Array(fftSize);
  const im = new Float64Array(fftSize);
  for (let k = 0; k < fftSize; k++) {
    re[k] = float[2 * k]!;
    im[k] = float[2 * k + 1]!;
  }
  const q = quantize({ re, im }, spec);
  return {
    fftSize,
    filterLength: filter.re.length,
    re: q.re,
    im: q.im,
    scale: q.gain * 2 ** spec.fractionLength,
    spec: { ...spec },
    overflowCount: q.overflowCount,
    float,
  };
}

/** Float64 linear convolution x ∗ h by one zero-padded FFT (round-off ≈ 1e-13 of the peak): the reference. */
export function floatConvolution(
  x: { re: ArrayLike<number>; im: ArrayLike<number> },
  h: ComplexSignal,
): ComplexSignal {
  checkSignal("input", x);
  checkSignal("filter", h);
  const ny = x.re.length + h.re.length - 1;
  if (ny > MAX_SAMPLES) throw new RangeError(`output would have ${ny} samples; at most ${MAX_SAMPLES}`);
  const size = nextPow2(Math.max(2, ny));
  const xs = { re: Float64Array.from(x.re), im: Float64Array.from(x.im) };
  const a = fftInterleaved(toInterleaved(xs, size));
  const b = fftInterleaved(toInterleaved(h, size));
  for (let i = 0; i < a.length; i += 2) {
    const ar = a[i]!;
    const ai = a[i + 1]!;
    a[i] = ar * b[i]! - ai * b[i + 1]!;
    a[i + 1] = ar * b[i + 1]! + ai * b[i]!;
  }
  const y = fftInterleaved(a, true);
  const re = new Float64Array(ny);
  const im = new Float64Array(ny);
  for (let i = 0; i < ny; i++) {
    re[i] = y[2 * i]!;
    im[i] = y[2 * i + 1]!;
  }
  return { re, im };
}

/** Number of blocks the method needs for Nx input samples and an L-tap filter. */
export function blockCount(
  method: BlockMethod,
  inputLength: number,
  filterLength: number,
  blockLength: number,
): number {
  return method === "overlap-save"
    ? Math.ceil((inputLength + filterLength - 1) / blockLength)
    : Math.ceil(inputLength / blockLength);
}

/**
 * The bit-true fast convolution of integer input codes (each Wd-bit signed) with the stored table.
 * Per block: frame → fixedFft → P[k] = X[k]·Ĥ[k] exact, round(P/2^e) and saturate/wrap to Wd bits →
 * fixedIfft (swap form) → kept codes. Overlap-save frame b holds x[bB − (L−1) + i], i = 0..N−1 (zeros
 * outside the record) and keeps frame points L−1..L+B−2 as y[bB..bB+B−1]; overlap-add segment b holds
 * x[bB..bB+B−1] zero-padded and adds its B+L−1 outputs at y[bB..]. Overlapping tails are summed in
 * float64 on the values code·2^E/G (blocks may differ in E); how a core aligns and requantizes that
 * sum is not modelled — its golden vectors are the per-block codes and exponents.
 */
export function fixedFastConvolution(
  input: { re: ArrayLike<number>; im: ArrayLike<number> },
  table: SpectrumTable,
  spec: FastConvolutionSpec,
): FastConvolutionResult {
  checkSignal("input", input);
  checkFastConvolutionSpec(spec, table.filterLength);
  if (table.fftSize !== spec.fftSize)
    throw new RangeError(`the spectrum table has ${table.fftSize} bins but fftSize is ${spec.fftSize}`);
  const n = spec.fftSize;
  const m = fftStages(n);
  const l = table.filterLength;
  const b = spec.blockLength;
  const wd = spec.fft.dataBits;
  const { min, max } = integerRange(wd, true);
  for (const part of ["re", "im"] as const) {
    const v = input[part];
    for (let i = 0; i < v.length; i++) {
      const c = v[i]!;
      if (!Number.isInteger(c) || c < min || c > max)
        throw new RangeError(
          `input.${part}[${i}] must be an integer code in ${min}..${max} (fft.dataBits ${wd}), got ${c}`,
        );
    }
  }
  const nx = input.re.length;
  const ny = nx + l - 1;
  const os = spec.method === "overlap-save";
  const count = blockCount(spec.method, nx, l, b);
  const keep = os ? b : b + l - 1;
  const inv: FixedFftSpec = { ...spec.fft, schedule: spec.inverseSchedule ?? spec.fft.schedule };
  const code = ROUNDING_CODE[spec.fft.rounding];
  const yr = new Float64Array(ny);
  const yi = new Float64Array(ny);
  const fr = new Float64Array(n);
  const fi = new Float64Array(n);
  const pr = new Float64Array(n);
  const pi = new Float64Array(n);
  const blocks: BlockRecord[] = [];
  let overflowCount = 0;
  for (let blk = 0; blk < count; blk++) {
    const inputStart = os ? blk * b - (l - 1) : blk * b;
    const frameLen = os ? n : b;
    fr.fill(0);
    fi.fill(0);
    for (let i = 0; i < frameLen; i++) {
      const j = inputStart + i;
      if (j >= 0 && j < nx) {
        fr[i] = input.re[j]!;
        fi[i] = input.im[j]!;
      }
    }
    const x = fixedFftUnchecked(fr, fi, spec.fft);
    let lo = 0;
    let hi = 0;
    for (let k = 0; k < n; k++) {
      const ar = x.re[k]!;
      const ai = x.im[k]!;
      const hr = table.re[k]!;
      const hv = table.im[k]!;
      const a = ar * hr - ai * hv; // |·| ≤ 2^(Wd+Wh−1) ≤ 2^52: exact
      const c = ar * hv + ai * hr;
      pr[k] = a;
      pi[k] = c;
      if (a < lo) lo = a;
      if (a > hi) hi = a;
      if (c < lo) lo = c;
      if (c > hi) hi = c;
    }
    let e: number;
    if (spec.productShift === "block-floating-point") {
      e = 0;
      while (roundByCode(hi * 2 ** -e, code) > max || roundByCode(lo * 2 ** -e, code) < min) e++;
    } else e = spec.productShift;
    const scale = 2 ** -e;
    let productOverflow = 0;
    for (const arr of [pr, pi]) {
      for (let k = 0; k < n; k++) {
        let v = roundByCode(arr[k]! * scale, code);
        if (v > max || v < min) {
          productOverflow++;
          v = spec.fft.overflow === "saturate" ? (v > max ? max : min) : wrapInteger(v, wd, true);
        }
        arr[k] = v + 0;
      }
    }
    const y = fixedIfftUnchecked(pr, pi, inv);
    const exponent = x.exponent + e + y.exponent - m;
    const outputStart = blk * b;
    const first = os ? l - 1 : 0;
    const kr = y.re.slice(first, first + keep);
    const ki = y.im.slice(first, first + keep);
    const unit = 2 ** exponent / table.scale;
    for (let i = 0; i < keep; i++) {
      const t = outputStart + i;
      if (t >= ny) break;
      yr[t] = yr[t]! + kr[i]! * unit;
      yi[t] = yi[t]! + ki[i]! * unit;
    }
    overflowCount += x.overflowCount + productOverflow + y.overflowCount;
    blocks.push({
      index: blk,
      inputStart,
      outputStart,
      fftShifts: x.stageShifts,
      productShift: e,
      ifftShifts: y.stageShifts,
      exponent,
      re: kr,
      im: ki,
      overflow: { fft: x.overflowCount, product: productOverflow, ifft: y.overflowCount },
    });
  }
  return { re: yr, im: yi, blocks, overflowCount };
}
