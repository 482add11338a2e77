/**
 * Doppler tolerance: one cut of the ambiguity function. The echo is the waveform multiplied by
 * exp(j2π·f_d·t) and compressed with the (unchanged) receive filter — M. A. Richards, "Fundamentals of
 * Radar Signal Processing", 2nd ed., 2014, §4.4 (ambiguity function) and §4.6 (range–Doppler coupling of LFM).
 */
import { checkFiniteNumber, checkRange, checkSignal } from "./check";
import { compress, powerOf } from "./compression";
import { measureResponse, peakLossDb, SPEED_OF_LIGHT } from "./metrics";
import type { ComplexSignal } from "./types";

/** s[n]·exp(j2π·f_d·n/fs): the echo of a target with Doppler frequency f_d (time origin at the first sample). */
export function applyDoppler(s: ComplexSignal, dopplerHz: number, sampleRateHz: number): ComplexSignal {
  checkSignal("s", s);
  checkFiniteNumber("dopplerHz", dopplerHz);
  checkRange("sampleRateHz", sampleRateHz, 0, Number.MAX_VALUE, { exclusiveMin: true });
  const n = s.re.length;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  const w = (2 * Math.PI * dopplerHz) / sampleRateHz;
  for (let i = 0; i < n; i++) {
    const c = Math.cos(w * i);
    const q = Math.sin(w * i);
    re[i] = s.re[i]! * c - s.im[i]! * q;
    im[i] = s.re[i]! * q + s.im[i]! * c;
  }
  return { re, im };
}

/** Figures of the Doppler cut, relative to the zero-Doppler output of the same filter. */
export interface DopplerCut {
  dopplerHz: number;
  /** Peak loss against the zero-Doppler peak, dB (positive = lower). */
  peakLossDb: number;
  pslDb: number;
  /** Shift of the peak from the target's delay (range–Doppler coupling). */
  rangeShiftSamples: number;
  rangeShiftSeconds: number;
  rangeShiftMetres: number;
}

/** Options of `dopplerCut`. */
export interface DopplerCutOptions {
  dopplerHz: number;
  sampleRateHz: number;
  interpolation: number;
  /** Zero-Doppler peak |y| of the same filter. */
  zeroDopplerPeak: number;
}

/** Compress the Doppler-shifted echo of `s` with `h` and measure peak loss, PSL and range shift. */
export function dopplerCut(s: ComplexSignal, h: ComplexSignal, opts: DopplerCutOptions): DopplerCut {
  const echo = applyDoppler(s, opts.dopplerHz, opts.sampleRateHz);
  const c = compress(echo, h, { interpolation: opts.interpolation });
  const m = measureResponse(powerOf(c.y), {
    interpolation: opts.interpolation,
    sampleRateHz: opts.sampleRateHz,
    expectedIndex: (s.re.length - 1) * opts.interpolation,
  });
  const seconds = m.peakOffsetSamples / opts.sampleRateHz;
  return {
    dopplerHz: opts.dopplerHz,
    peakLossDb: peakLossDb(opts.zeroDopplerPeak, m.peakAmplitude),
    pslDb: m.pslDb,
    rangeShiftSamples: m.peakOffsetSamples,
    rangeShiftSeconds: seconds,
    rangeShiftMetres: (seconds * SPEED_OF_LIGHT) / 2,
  };
}
