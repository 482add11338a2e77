/**
 * What the fixed-point FFT path loses against float direct convolution: PSL, ISLR, peak loss, SNR
 * loss and the self-noise floor (mean |y_fixed − y_float|² over the sidelobe region re |peak|²), a
 * sweep over data and twiddle widths, and the block-edge case. Figures of merit from ../metrics.ts
 * (measured on the sample grid, interpolation 1); the float reference is the linear convolution of
 * the same input codes with the unquantized filter, so input (ADC) quantization is not counted.
 */
import { checkSignal } from "../check";
import { energy, findMainlobe, measureResponse, peakLossDb, type ResponseMetrics } from "../metrics";
import { quantize } from "../quantize";
import type { ComplexSignal } from "../types";
import {
  checkFastConvolutionSpec,
  fixedFastConvolution,
  floatConvolution,
  referenceSpectrum,
  type FastConvolutionSpec,
  type SpectrumTable,
} from "./convolution";
import { fftInterleaved } from "../fft";

/** Inputs of one degradation measurement. */
export interface DegradationOptions {
  /** Integer input codes (Wd-bit signed). */
  input: { re: ArrayLike<number>; im: ArrayLike<number> };
  /** Receive filter taps h (float), as matchedFilter() returns them. */
  filter: ComplexSignal;
  /** Transmit waveform s, for the SNR loss (optional). */
  waveform?: ComplexSignal;
  spec: FastConvolutionSpec;
  sampleRateHz: number;
  /** A table to use instead of quantizing H from `filter` (e.g. the stored one). */
  table?: SpectrumTable;
  /**
   * Output samples [start, end) over which self-noise and error peaks are taken (the mainlobe is
   * always excluded); default the whole output record. Blocks whose input is all zero give exactly
   * zero, so a long empty record would dilute the mean: pass the target response's span.
   */
  sidelobeRegion?: { start: number; end: number };
  /** Thermal noise rms per I/Q component at the input, in input LSB, for `snrLossWithSelfNoiseDb` (default 1). */
  inputNoiseRms?: number;
}

/** Float direct vs fixed fast convolution. dB figures; losses positive when the fixed path is worse. */
export interface DegradationFigures {
  float: ResponseMetrics;
  fixed: ResponseMetrics;
  peakLossDb: number;
  /**
   * White-noise SNR loss of the linear part (the quantized table Ĥ) against the float filter:
   * 10·log10 of (|Σ h·s̃|²/Σ|h|²) / (|Σ_{l<L} h_q·s̃|²/Σ_{l<N}|h_q|²), h_q = IDFT(Ĥ)/G, s̃[l] = s[L−1−l].
   * Null without a waveform.
   */
  snrLossDb: number | null;
  /**
   * SNR loss with the self-noise added to the output thermal noise (white input noise of
   * `inputNoiseRms` LSB per component): 10·log10(SNR_float / SNR_fixed), SNR = peak power over output
   * noise power, the fixed noise being σ²·Σ|h_q|² plus the mean self-noise power. Null without a waveform.
   */
  snrLossWithSelfNoiseDb: number | null;
  /** 10·log10(mean |e|² over the sidelobe region / |y_float(peak)|²), e = y_fixed − y_float. */
  selfNoiseDb: number;
  /** 10·log10(max |e|² over the sidelobe region / |y_float(peak)|²): the quantization peaks. */
  errorPeakDb: number;
  /** Samples in the sidelobe region (the region outside the float mainlobe). */
  sidelobeSamples: number;
  overflowCount: number;
  /** Per block: forward, product and inverse shifts (the block exponents). */
  exponents: { fft: number; product: number; ifft: number; total: number }[];
}

const db10 = (x: number) => 10 * Math.log10(x);

function powerOf(s: ComplexSignal): Float64Array {
  const p = new Float64Array(s.re.length);
  for (let i = 0; i < p.length; i++) p[i] = s.re[i]! * s.re[i]! + s.im[i]! * s.im[i]!;
  return p;
}

/** |Σ_{l<L} h[l]·s[L−1−l]|² (the filter's response at the aligned peak). */
function alignedPeakPower(h: ComplexSignal, s: ComplexSignal, taps: number): number {
  const len = s.re.length;
  let yr = 0;
  let yi = 0;
  for (let l = 0; l < Math.min(taps, len); l++) {
    const ar = h.re[l]!;
    const ai = h.im[l]!;
    const br = s.re[len - 1 - l]!;
    const bi = s.im[len - 1 - l]!;
    yr += ar * br - ai * bi;
    yi += ar * bi + ai * br;
  }
  return yr * yr + yi * yi;
}

/** The effective circular filter of the stored table: h_q = IDFT(Ĥ)/G, N taps. */
export function effectiveFilter(table: SpectrumTable): ComplexSignal {
  const n = table.fftSize;
  const buf = new Float64Array(2 * n);
  for (let k = 0; k < n; k++) {
    buf[2 * k] = table.re[k]! / table.scale;
    buf[2 * k + 1] = table.im[k]! / table.scale;
  }
  const t = fftInterleaved(buf, true);
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    re[i] = t[2 * i]!;
    im[i] = t[2 * i + 1]!;
  }
  return { re, im };
}

/** Float direct vs fixed fast convolution on one input (see DegradationFigures). */
export function fastConvolutionDegradation(opts: DegradationOptions): DegradationFigures {
  const { input, filter, spec, sampleRateHz } = opts;
  checkSignal("filter", filter);
  checkFastConvolutionSpec(spec, filter.re.length);
  const table = opts.table ?? referenceSpectrum(filter, spec.fftSize, spec.spectrum);
  const fixed = fixedFastConvolution(input, table, spec);
  const ref = floatConvolution(input, filter);
  const pFloat = powerOf(ref);
  const pFixed = powerOf(fixed);
  const mFloat = measureResponse(pFloat, { interpolation: 1, sampleRateHz });
  const mFixed = measureResponse(pFixed, { interpolation: 1, sampleRateHz });
  const peak = Math.round(mFloat.peakPositionSamples);
  const lobe = findMainlobe(pFloat, peak);
  let sum = 0;
  let big = 0;
  let count = 0;
  const region = opts.sidelobeRegion ?? { start: 0, end: pFloat.length };
  if (
    !Number.isInteger(region.start) ||
    !Number.isInteger(region.end) ||
    region.start < 0 ||
    region.end > pFloat.length ||
    region.start >= region.end
  )
    throw new RangeError(
      `sidelobeRegion must satisfy 0 ≤ start < end ≤ ${pFloat.length} (the output length), got ${region.start}..${region.end}`,
    );
  for (let i = region.start; i < region.end; i++) {
    if (i >= lobe.left && i <= lobe.right) continue;
    const dr = fixed.re[i]! - ref.re[i]!;
    const di = fixed.im[i]! - ref.im[i]!;
    const e2 = dr * dr + di * di;
    sum += e2;
    if (e2 > big) big = e2;
    count++;
  }
  const peakPower = pFloat[peak]!;
  const selfNoise = count > 0 ? sum / count : 0;
  let snrLossDb: number | null = null;
  let snrLossWithSelfNoiseDb: number | null = null;
  if (opts.waveform) {
    const s = opts.waveform;
    checkSignal("waveform", s);
    const hq = effectiveFilter(table);
    const l = filter.re.length;
    const gFloat = alignedPeakPower(filter, s, l);
    const gFixed = alignedPeakPower(hq, s, l);
    const eFloat = energy(filter);
    const eFixed = energy(hq);
    snrLossDb = db10(gFloat / eFloat / (gFixed / eFixed));
    // SNR = |peak|² / output noise power. Float: |y_float(peak)|² / (σ²·Σ|h|²). Fixed: the aligned
    // peak scaled by the table's gain change, over σ²·Σ|h_q|² plus the self-noise power.
    const sigma2 = 2 * (opts.inputNoiseRms ?? 1) ** 2; // complex noise power per input sample
    const snrFloat = pFloat[peak]! / (sigma2 * eFloat);
    const snrFixed = (pFloat[peak]! * (gFixed / gFloat)) / (sigma2 * eFixed + selfNoise);
    snrLossWithSelfNoiseDb = db10(snrFloat / snrFixed);
  }
  return {
    float: mFloat,
    fixed: mFixed,
    peakLossDb: peakLossDb(mFloat.peakAmplitude, mFixed.peakAmplitude),
    snrLossDb,
    snrLossWithSelfNoiseDb,
    selfNoiseDb: db10(selfNoise / peakPower),
    errorPeakDb: db10(big / peakPower),
    sidelobeSamples: count,
    overflowCount: fixed.overflowCount,
    exponents: fixed.blocks.map((b) => ({
      fft: b.fftShifts.reduce((a, c) => a + c, 0),
      product: b.productShift,
      ifft: b.ifftShifts.reduce((a, c) => a + c, 0),
      total: b.exponent,
    })),
  };
}

/** Full-scale Wd-bit input codes of a float signal (nearest-even, saturate): the ADC of the sweep. */
export function inputCodes(signal: ComplexSignal, dataBits: number): ComplexSignal {
  const q = quantize(signal, {
    wordLength: dataBits,
    fractionLength: 0,
    signed: true,
    scaling: "full-scale",
    rounding: "nearest-even",
    overflow: "saturate",
  });
  return { re: q.re, im: q.im };
}

/** Limits a width must meet; absent = not checked. */
export interface WidthLimits {
  selfNoiseDbMax?: number;
  errorPeakDbMax?: number;
  pslDbMax?: number;
  islrDbMax?: number;
  peakLossDbMax?: number;
  snrLossDbMax?: number;
}

/** One point of the width sweep. */
export interface WidthPoint {
  dataBits: number;
  twiddleBits: number;
  figures: DegradationFigures;
  passes: boolean;
  /** The limits it fails, by name. */
  failed: string[];
}

function failures(f: DegradationFigures, lim: WidthLimits): string[] {
  const out: string[] = [];
  if (lim.selfNoiseDbMax !== undefined && !(f.selfNoiseDb <= lim.selfNoiseDbMax)) out.push("selfNoiseDbMax");
  if (lim.errorPeakDbMax !== undefined && !(f.errorPeakDb <= lim.errorPeakDbMax)) out.push("errorPeakDbMax");
  if (lim.pslDbMax !== undefined && !(f.fixed.pslDb <= lim.pslDbMax)) out.push("pslDbMax");
  if (lim.islrDbMax !== undefined && !(f.fixed.islrDb <= lim.islrDbMax)) out.push("islrDbMax");
  if (lim.peakLossDbMax !== undefined && !(f.peakLossDb <= lim.peakLossDbMax)) out.push("peakLossDbMax");
  if (lim.snrLossDbMax !== undefined && !(f.snrLossDb !== null && f.snrLossDb <= lim.snrLossDbMax))
    out.push("snrLossDbMax");
  return out;
}

/** Options of the width sweep: the float input is quantized to each data width at full scale. */
export interface WidthSweepOptions {
  input: ComplexSignal;
  filter: ComplexSignal;
  waveform?: ComplexSignal;
  spec: FastConvolutionSpec;
  sampleRateHz: number;
  dataBits: readonly number[];
  twiddleBits: readonly number[];
  limits: WidthLimits;
  /** As in DegradationOptions. */
  sidelobeRegion?: { start: number; end: number };
}

/**
 * Every (Wd, Wt) pair, and the smallest widths meeting the limits: the smallest Wd for which some Wt
 * passes, then the smallest passing Wt at that Wd (null when nothing passes). The table Ĥ keeps
 * spec.spectrum; a fixed productShift is taken relative to Wd (shift − spec.fft.dataBits + Wd).
 */
export function widthSweep(opts: WidthSweepOptions): {
  points: WidthPoint[];
  smallest: { dataBits: number; twiddleBits: number } | null;
} {
  const table = referenceSpectrum(opts.filter, opts.spec.fftSize, opts.spec.spectrum);
  const points: WidthPoint[] = [];
  const wds = [...opts.dataBits].sort((a, b) => a - b);
  const wts = [...opts.twiddleBits].sort((a, b) => a - b);
  for (const wd of wds) {
    const x = inputCodes(opts.input, wd);
    for (const wt of wts) {
      const ps = opts.spec.productShift;
      const spec: FastConvolutionSpec = {
        ...opts.spec,
        fft: {
          ...opts.spec.fft,
          dataBits: wd,
          twiddleBits: wt,
          productGuardBits: Math.min(opts.spec.fft.productGuardBits, wt - 1),
        },
        productShift: ps === "block-floating-point" ? ps : Math.max(0, ps - opts.spec.fft.dataBits + wd),
      };
      const figures = fastConvolutionDegradation({
        input: x,
        filter: opts.filter,
        waveform: opts.waveform,
        spec,
        sampleRateHz: opts.sampleRateHz,
        table,
        sidelobeRegion: opts.sidelobeRegion,
      });
      const failed = failures(figures, opts.limits);
      points.push({ dataBits: wd, twiddleBits: wt, figures, passes: failed.length === 0, failed });
    }
  }
  for (const wd of wds) {
    const p = points.find((q) => q.dataBits === wd && q.passes);
    if (p) return { points, smallest: { dataBits: p.dataBits, twiddleBits: p.twiddleBits } };
  }
  return { points, smallest: null };
}

/** The output span [delay, delay + Ns + L − 1) of an echo's compressed response (Ns pulse, L filter samples). */
export function responseSpan(
  delay: number,
  pulseLength: number,
  filterLength: number,
): { start: number; end: number } {
  return { start: delay, end: delay + pulseLength + filterLength - 1 };
}

/** An echo of `waveform` (amplitude 1) delayed by `delay` samples in a record of `length` samples. */
export function pointTarget(waveform: ComplexSignal, delay: number, length: number): ComplexSignal {
  const re = new Float64Array(length);
  const im = new Float64Array(length);
  for (let i = 0; i < waveform.re.length; i++) {
    const j = delay + i;
    if (j >= 0 && j < length) {
      re[j] = waveform.re[i]!;
      im[j] = waveform.im[i]!;
    }
  }
  return { re, im };
}

/**
 * Block-edge effect: the same point target with its compressed peak in the middle of output block 1
 * and exactly on the boundary between blocks 1 and 2 (first output sample of block 2), so the
 * mainlobe and near sidelobes straddle two blocks with their own exponents. The record holds
 * four blocks' worth of input; the input is quantized to Wd bits at full scale; self-noise and
 * error peaks are taken over the response's span.
 */
export function blockEdgeEffect(opts: {
  waveform: ComplexSignal;
  filter: ComplexSignal;
  spec: FastConvolutionSpec;
  sampleRateHz: number;
}): { inside: DegradationFigures; straddling: DegradationFigures; boundary: number } {
  const { waveform, filter, spec } = opts;
  checkFastConvolutionSpec(spec, filter.re.length);
  const l = filter.re.length;
  const b = spec.blockLength;
  const length = 4 * b;
  const table = referenceSpectrum(filter, spec.fftSize, spec.spectrum);
  // The compressed peak of an echo at delay d is output sample d + L − 1.
  const run = (peakAt: number) =>
    fastConvolutionDegradation({
      input: inputCodes(pointTarget(waveform, peakAt - (l - 1), length), spec.fft.dataBits),
      filter,
      waveform,
      spec,
      sampleRateHz: opts.sampleRateHz,
      table,
      sidelobeRegion: responseSpan(peakAt - (l - 1), waveform.re.length, l),
    });
  const boundary = spec.method === "overlap-save" ? 2 * b : 2 * b + Math.floor(l / 2);
  return { inside: run(b + Math.floor(b / 2)), straddling: run(boundary), boundary };
}
