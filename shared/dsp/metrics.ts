/**
 * Pulse-compression figures of merit as DESIGN.md defines them: peak, mainlobe from the peak out to the
 * first local minimum on each side, PSL, ISLR, −3 dB width, mismatch (SNR) loss, peak loss and the
 * coefficient SQNR. Definitions follow M. A. Richards, "Fundamentals of Radar Signal Processing",
 * 2nd ed., 2014, ch. 4 (PSL/ISLR, loss in peak gain vs SNR loss) — only the mainlobe rule is ours.
 */
import { checkFiniteNumber, checkSignal } from "./check";
import { interpolateInto, type InterpolationWorkspace } from "./compression";
import type { ComplexSignal } from "./types";

/** Speed of light in vacuum, m/s (SI definition, exact). */
export const SPEED_OF_LIGHT = 299_792_458;

/** Inclusive fine-grid indices of the mainlobe: the first local minima either side of the peak. */
export interface Mainlobe {
  left: number;
  right: number;
}

/** Walk out from `peak` while |y|² keeps falling; the first sample that does not fall bounds the lobe. */
export function findMainlobe(power: Float64Array, peak: number): Mainlobe {
  let right = peak;
  while (right + 1 < power.length && power[right + 1]! < power[right]!) right++;
  let left = peak;
  while (left > 0 && power[left - 1]! < power[left]!) left--;
  return { left, right };
}

/** Index of the largest |y|² (first one on ties). */
export function argMax(power: Float64Array, from = 0, to = power.length): number {
  let best = from;
  let v = -Infinity;
  for (let i = from; i < to; i++) {
    if (power[i]! > v) {
      v = power[i]!;
      best = i;
    }
  }
  return best;
}

/** Where |y|² crosses `level` walking out of the mainlobe from `peak` (fractional fine index, linear in |y|). */
export function halfPowerCrossing(power: Float64Array, peak: number, level: number, step: 1 | -1): number {
  let i = peak;
  while (i + step >= 0 && i + step < power.length && power[i + step]! >= level) i += step;
  const j = i + step;
  if (j < 0 || j >= power.length) return i;
  const a = Math.sqrt(power[i]!);
  const b = Math.sqrt(power[j]!);
  const t = (a - Math.sqrt(level)) / (a - b);
  return i + step * t;
}

/** Compression figures measured on one output (interpolated grid). */
export interface ResponseMetrics {
  /** Peak |y| (linear, in the units of the tables' values). */
  peakAmplitude: number;
  /** Peak position in original samples (fine index / U). */
  peakPositionSamples: number;
  /** Peak position minus the expected (target) position, in original samples. */
  peakOffsetSamples: number;
  pslDb: number;
  islrDb: number;
  /** −3 dB mainlobe width. */
  width3dbSamples: number;
  width3dbSeconds: number;
  width3dbMetres: number;
  /** Mainlobe extent (first minima) in original samples, relative to the peak. */
  mainlobeSamples: { left: number; right: number };
}

/** Options of `measureResponse`. */
export interface MeasureOptions {
  interpolation: number;
  sampleRateHz: number;
  /** Expected peak in fine-grid indices (the target's delay); default: the measured peak. */
  expectedIndex?: number;
  /** Σ|y|² over the whole grid when already known (Parseval); summed otherwise. */
  totalEnergy?: number;
}

const db10 = (x: number) => 10 * Math.log10(x);

function lobeEnergy(power: Float64Array, lobe: Mainlobe): number {
  let e = 0;
  for (let i = lobe.left; i <= lobe.right; i++) e += power[i]!;
  return e;
}

/** The figures once peak, mainlobe, its energy, the total energy and the largest sidelobe are known. */
function figuresOf(
  power: Float64Array,
  opts: MeasureOptions,
  peak: number,
  lobe: Mainlobe,
  mainE: number,
  total: number,
  maxSide: number,
): ResponseMetrics {
  const u = opts.interpolation;
  const peakPower = power[peak]!;
  const sideE = Math.max(total - mainE, 0);
  const half = peakPower / 2;
  const w = (halfPowerCrossing(power, peak, half, 1) - halfPowerCrossing(power, peak, half, -1)) / u;
  const seconds = w / opts.sampleRateHz;
  return {
    peakAmplitude: Math.sqrt(peakPower),
    peakPositionSamples: peak / u,
    peakOffsetSamples: (peak - (opts.expectedIndex ?? peak)) / u,
    pslDb: db10(maxSide / peakPower),
    islrDb: db10(sideE / mainE),
    width3dbSamples: w,
    width3dbSeconds: seconds,
    width3dbMetres: (seconds * SPEED_OF_LIGHT) / 2,
    mainlobeSamples: { left: (lobe.left - peak) / u, right: (lobe.right - peak) / u },
  };
}

/** Block length of the sidelobe maxima kept by the first pass of `measureResponse`. */
const BLOCK = 256;

/** Peak, PSL, ISLR and −3 dB width from |y|² on the ×U grid; an all-zero output is a RangeError. */
export function measureResponse(power: Float64Array, opts: MeasureOptions): ResponseMetrics {
  checkFiniteNumber("sampleRateHz", opts.sampleRateHz);
  // One pass over the grid: the peak (first on ties), Σ|y|² and the maximum of every block, so the
  // largest sidelobe needs only the blocks outside the mainlobe, not a second pass.
  const len = power.length;
  const blocks = new Float64Array(Math.ceil(len / BLOCK));
  let peak = 0;
  let peakPower = -Infinity;
  let sum = 0;
  for (let b = 0, i = 0; i < len; b++) {
    const end = Math.min(i + BLOCK, len);
    let bm = 0;
    for (; i < end; i++) {
      const v = power[i]!;
      sum += v;
      if (v > bm) bm = v;
      if (v > peakPower) {
        peakPower = v;
        peak = i;
      }
    }
    blocks[b] = bm;
  }
  if (!(peakPower > 0)) throw new RangeError("compressed output is zero everywhere: no peak to measure");
  const lobe = findMainlobe(power, peak);
  const mainE = lobeEnergy(power, lobe);
  const total = opts.totalEnergy ?? sum;
  let maxSide = 0;
  const firstBlock = Math.floor(lobe.left / BLOCK);
  const lastBlock = Math.floor(lobe.right / BLOCK);
  for (let b = 0; b < firstBlock; b++) if (blocks[b]! > maxSide) maxSide = blocks[b]!;
  for (let b = lastBlock + 1; b < blocks.length; b++) if (blocks[b]! > maxSide) maxSide = blocks[b]!;
  // The blocks the mainlobe cuts through: only their samples outside it.
  for (let i = firstBlock * BLOCK; i < lobe.left; i++) if (power[i]! > maxSide) maxSide = power[i]!;
  for (let i = lobe.right + 1; i < Math.min((lastBlock + 1) * BLOCK, len); i++)
    if (power[i]! > maxSide) maxSide = power[i]!;
  return figuresOf(power, opts, peak, lobe, mainE, total, maxSide);
}

/** The straightforward `measureResponse` (separate passes, no blocks): the reference its tests compare with. */
export function measureResponseDirect(power: Float64Array, opts: MeasureOptions): ResponseMetrics {
  checkFiniteNumber("sampleRateHz", opts.sampleRateHz);
  const peak = argMax(power);
  const peakPower = power[peak]!;
  if (!(peakPower > 0)) throw new RangeError("compressed output is zero everywhere: no peak to measure");
  const lobe = findMainlobe(power, peak);
  const mainE = lobeEnergy(power, lobe);
  let total = opts.totalEnergy;
  let maxSide = 0;
  if (total === undefined) {
    total = mainE;
    for (let i = 0; i < lobe.left; i++) total += power[i]!;
    for (let i = lobe.right + 1; i < power.length; i++) total += power[i]!;
  }
  for (let i = 0; i < lobe.left; i++) if (power[i]! > maxSide) maxSide = power[i]!;
  for (let i = lobe.right + 1; i < power.length; i++) if (power[i]! > maxSide) maxSide = power[i]!;
  return figuresOf(power, opts, peak, lobe, mainE, total, maxSide);
}

/** Σ|s|². */
export function energy(s: ComplexSignal): number {
  let e = 0;
  for (let i = 0; i < s.re.length; i++) e += s.re[i]! * s.re[i]! + s.im[i]! * s.im[i]!;
  return e;
}

/**
 * Mismatch (SNR) loss of receive filter h against waveform s in white noise, dB (≥ 0 by Cauchy–Schwarz):
 * −10·log10(|y0|²/(Σ|h|²·Σ|s|²)), y0 = Σ h[n]·s[N−1−n] (DESIGN.md; Richards 2014 §4.7, eq. for SNR loss).
 */
export function mismatchLossDb(s: ComplexSignal, h: ComplexSignal): number {
  checkSignal("s", s);
  checkSignal("h", h);
  const n = s.re.length;
  if (h.re.length !== n) throw new RangeError(`h has ${h.re.length} samples; the waveform has ${n}`);
  let yr = 0;
  let yi = 0;
  for (let k = 0; k < n; k++) {
    const ar = h.re[k]!;
    const ai = h.im[k]!;
    const br = s.re[n - 1 - k]!;
    const bi = s.im[n - 1 - k]!;
    yr += ar * br - ai * bi;
    yi += ar * bi + ai * br;
  }
  const den = energy(h) * energy(s);
  if (!(den > 0)) throw new RangeError("mismatch loss needs non-zero h and s");
  return -db10((yr * yr + yi * yi) / den);
}

/** Peak loss of the fixed-point output against the float one, dB (positive = fixed peak lower). */
export function peakLossDb(floatPeak: number, fixedPeak: number): number {
  checkFiniteNumber("floatPeak", floatPeak);
  checkFiniteNumber("fixedPeak", fixedPeak);
  if (!(floatPeak > 0) || !(fixedPeak > 0)) throw new RangeError("peak loss needs positive peaks");
  return 20 * Math.log10(floatPeak / fixedPeak);
}

/**
 * Coefficient SQNR, dB: 10·log10(Σ|h|²/Σ|h − ĥ/g|²), with `fixed` already divided by the gain.
 * Infinite when the table is represented exactly.
 */
export function coefficientSqnrDb(float: ComplexSignal, fixed: ComplexSignal): number {
  checkSignal("float", float);
  checkSignal("fixed", fixed);
  if (fixed.re.length !== float.re.length) throw new RangeError("float and fixed tables differ in length");
  let err = 0;
  for (let i = 0; i < float.re.length; i++) {
    const dr = float.re[i]! - fixed.re[i]!;
    const di = float.im[i]! - fixed.im[i]!;
    err += dr * dr + di * di;
  }
  return db10(energy(float) / err);
}

/** Buffers `measureInterpolated` may reuse: the ×U power grid and the interpolation scratch. */
export interface MeasureWorkspace {
  power?: Float64Array;
  interpolation?: InterpolationWorkspace;
}

/**
 * A product spectrum interpolated ×U and measured on the whole grid. `complex: false` skips the
 * complex ×U output (only |y|² is kept): half the memory of `measureSpectrum`.
 */
export function measureInterpolated(
  spectrum: Float64Array,
  opts: MeasureOptions,
  work?: { complex?: boolean; workspace?: MeasureWorkspace },
): { metrics: ResponseMetrics; y: Float64Array | null; power: Float64Array } {
  const points = (spectrum.length / 2) * opts.interpolation;
  const given = work?.workspace?.power;
  const power = given && given.length === points ? given : new Float64Array(points);
  const y = work?.complex === false ? null : new Float64Array(2 * points);
  interpolateInto(spectrum, opts.interpolation, y ? { y, power } : { power }, work?.workspace?.interpolation);
  return { metrics: measureResponse(power, opts), y, power };
}

/** A product spectrum interpolated ×U and measured: the full (reference) computation. */
export function measureSpectrum(
  spectrum: Float64Array,
  opts: MeasureOptions,
): { metrics: ResponseMetrics; y: Float64Array; power: Float64Array } {
  const r = measureInterpolated(spectrum, opts, { complex: true });
  return { metrics: r.metrics, y: r.y!, power: r.power };
}
