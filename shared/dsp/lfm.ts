/**
 * Linear FM (chirp) pulse with a rectangular envelope — M. A. Richards, "Fundamentals of Radar Signal
 * Processing", 2nd ed., 2014, §4.6 (eq. 4.82 form): complex baseband x(t) = exp(jπ(B/T)t²), t centred on the pulse.
 */
import { checkFiniteNumber, checkInteger, checkRange, MAX_SAMPLES } from "./check";
import type { ComplexSignal } from "./types";

/** Parameters of a linear FM pulse (SI units). */
export interface LinearFmOptions {
  bandwidthHz: number;
  pulseWidthS: number;
  sampleRateHz: number;
  /** "up" sweeps −B/2 → +B/2 (default), "down" the reverse. */
  direction?: "up" | "down";
  /** "complex" baseband (default) or "real" at an intermediate frequency (im = 0). */
  output?: "complex" | "real";
  /** Required for real output: centre frequency of the sweep, ≥ B/2. */
  intermediateFrequencyHz?: number;
}

/** Number of samples of a pulse: round(T·fs), checked to lie in 1..MAX_SAMPLES. */
export function pulseSamples(pulseWidthS: number, sampleRateHz: number): number {
  checkRange("pulseWidthS", pulseWidthS, 0, Number.MAX_VALUE, { exclusiveMin: true });
  checkRange("sampleRateHz", sampleRateHz, 0, Number.MAX_VALUE, { exclusiveMin: true });
  const n = Math.round(pulseWidthS * sampleRateHz);
  if (n < 1) throw new RangeError(`pulseWidthS × sampleRateHz gives ${n} samples; at least 1 is needed`);
  checkInteger("pulse samples (pulseWidthS × sampleRateHz)", n, 1, MAX_SAMPLES);
  return n;
}

/** Sample times centred on the pulse: t_n = (n − (N−1)/2)/fs. */
export function centredTime(n: number, sampleRateHz: number): Float64Array {
  const t = new Float64Array(n);
  for (let i = 0; i < n; i++) t[i] = (i - (n - 1) / 2) / sampleRateHz;
  return t;
}

/**
 * A linear FM pulse of amplitude 1 and N = round(T·fs) samples. Complex output needs fs ≥ B (Nyquist for a
 * complex signal); real output cos(2π f_IF t + π(B/T)t²) needs f_IF ≥ B/2 and fs ≥ 2(f_IF + B/2).
 */
export function linearFm(opts: LinearFmOptions): ComplexSignal {
  if (!opts || typeof opts !== "object") throw new TypeError("linearFm options must be an object");
  const { bandwidthHz, pulseWidthS, sampleRateHz } = opts;
  checkRange("bandwidthHz", bandwidthHz, 0, Number.MAX_VALUE, { exclusiveMin: true });
  const n = pulseSamples(pulseWidthS, sampleRateHz);
  const direction = opts.direction ?? "up";
  if (direction !== "up" && direction !== "down")
    throw new TypeError(`direction must be "up" or "down", got ${String(direction)}`);
  const output = opts.output ?? "complex";
  if (output !== "complex" && output !== "real")
    throw new TypeError(`output must be "complex" or "real", got ${String(output)}`);

  let fIf = 0;
  if (output === "complex") {
    if (sampleRateHz < bandwidthHz)
      throw new RangeError(
        `sampleRateHz (${sampleRateHz}) must be ≥ bandwidthHz (${bandwidthHz}) for complex output`,
      );
    if (opts.intermediateFrequencyHz !== undefined)
      throw new RangeError("intermediateFrequencyHz applies to real output only");
  } else {
    if (opts.intermediateFrequencyHz === undefined)
      throw new RangeError("intermediateFrequencyHz is required for real output");
    checkFiniteNumber("intermediateFrequencyHz", opts.intermediateFrequencyHz);
    fIf = opts.intermediateFrequencyHz;
    if (fIf < bandwidthHz / 2)
      throw new RangeError(
        `intermediateFrequencyHz (${fIf}) must be ≥ bandwidthHz/2 (${bandwidthHz / 2}) so the sweep stays above 0 Hz`,
      );
    if (sampleRateHz < 2 * (fIf + bandwidthHz / 2))
      throw new RangeError(
        `sampleRateHz (${sampleRateHz}) must be ≥ 2·(intermediateFrequencyHz + bandwidthHz/2) = ${2 * (fIf + bandwidthHz / 2)} for real output`,
      );
  }

  const k = ((direction === "up" ? 1 : -1) * bandwidthHz) / pulseWidthS;
  const t = centredTime(n, sampleRateHz);
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const ti = t[i]!;
    const phase = 2 * Math.PI * fIf * ti + Math.PI * k * ti * ti;
    re[i] = Math.cos(phase);
    if (output === "complex") im[i] = Math.sin(phase);
  }
  return { re, im };
}
