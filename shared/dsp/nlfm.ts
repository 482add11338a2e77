/**
 * Nonlinear FM by the stationary-phase principle (C. E. Cook, M. Bernfeld, "Radar Signals", 1967, ch. 3;
 * M. A. Richards, "Fundamentals of Radar Signal Processing", 2nd ed., 2014, §4.6.3).
 *
 * For a constant-envelope pulse with a large time-bandwidth product, the energy at frequency f is proportional to
 * the time the sweep spends near f: |S(f)|² ∝ dt/df. To give the spectrum the shape of a window W over the band
 * [−B/2, B/2], the group delay must be the normalized cumulative window:
 *     t(f) = T·(C(f) − ½),  C(f) = ∫_{−B/2}^{f} W / ∫_{−B/2}^{B/2} W.
 * The instantaneous frequency f(t) is its inverse (found numerically on a fine grid and interpolated), and the
 * phase is φ(t) = 2π∫f dt (trapezoidal rule, exact for a linear sweep). The matched filter's output then
 * approximates the window's transform, so the range sidelobes fall without receive weighting (no mismatch loss).
 * A rectangular window gives back the linear FM chirp exactly.
 */
import { checkRange } from "./check";
import { centredTime, pulseSamples } from "./lfm";
import type { ComplexSignal } from "./types";
import { checkWindowSpec, makeWindow, type WindowSpec } from "./windows";

/** Parameters of a stationary-phase NLFM pulse: band B, width T, sample rate, and the spectral window. */
export interface NonlinearFmOptions {
  bandwidthHz: number;
  pulseWidthS: number;
  sampleRateHz: number;
  /** Shape of the power spectral density over the band. */
  window: WindowSpec;
}

// Grid for C(f): at least 4 points per output sample, within a memory cap (16 MiB of float64).
const MIN_GRID = 4097;
const MAX_GRID = 2 ** 21 + 1;

/**
 * Instantaneous frequency (Hz) at each centred sample time, f(t) = C⁻¹(t/T + ½) mapped onto [−B/2, B/2].
 * Exported for plots of the sweep law.
 */
export function nlfmFrequency(opts: NonlinearFmOptions): Float64Array {
  const { bandwidthHz, pulseWidthS, sampleRateHz } = checkNlfm(opts);
  const n = pulseSamples(pulseWidthS, sampleRateHz);
  const m = Math.min(MAX_GRID, Math.max(MIN_GRID, 4 * n + 1));
  const w = makeWindow(opts.window, m);
  // Cumulative trapezoid of the window over the band, normalized to 0..1.
  const c = new Float64Array(m);
  for (let j = 1; j < m; j++) {
    const a = w[j - 1]!;
    const b = w[j]!;
    if (a < -1e-12 || b < -1e-12)
      throw new RangeError("window must be non-negative to shape a power spectrum");
    c[j] = c[j - 1]! + (Math.max(0, a) + Math.max(0, b)) / 2;
  }
  const total = c[m - 1]!;
  if (!(total > 0)) throw new RangeError("window has no area over the band");
  for (let j = 0; j < m; j++) c[j] = c[j]! / total;

  const t = centredTime(n, sampleRateHz);
  const f = new Float64Array(n);
  let j = 0;
  for (let i = 0; i < n; i++) {
    const u = t[i]! / pulseWidthS + 0.5;
    // t increases with i, so the bracket only moves forward.
    while (j < m - 2 && c[j + 1]! <= u) j++;
    const c0 = c[j]!;
    const c1 = c[j + 1]!;
    const frac = c1 > c0 ? Math.min(1, Math.max(0, (u - c0) / (c1 - c0))) : 0.5;
    f[i] = bandwidthHz * ((j + frac) / (m - 1) - 0.5);
  }
  return f;
}

/** A unit-amplitude NLFM pulse of N = round(T·fs) samples whose spectrum follows `window` (see the module comment). */
export function nonlinearFm(opts: NonlinearFmOptions): ComplexSignal {
  const f = nlfmFrequency(opts);
  const fs = opts.sampleRateHz;
  const n = f.length;
  const phase = new Float64Array(n);
  for (let i = 1; i < n; i++) phase[i] = phase[i - 1]! + (Math.PI * (f[i - 1]! + f[i]!)) / fs;
  // Reference the phase to the pulse centre (t = 0), as linearFm does, so the two agree for a rectangular window.
  let centre: number;
  if (n % 2 === 1) centre = phase[(n - 1) / 2]!;
  else {
    const k = n / 2 - 1;
    const f0 = (f[k]! + f[k + 1]!) / 2; // frequency at t = 0, between the two middle samples
    centre = phase[k]! + (Math.PI * (f[k]! + f0)) / (2 * fs);
  }
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const p = phase[i]! - centre;
    re[i] = Math.cos(p);
    im[i] = Math.sin(p);
  }
  return { re, im };
}

function checkNlfm(opts: NonlinearFmOptions): NonlinearFmOptions {
  if (!opts || typeof opts !== "object") throw new TypeError("nonlinearFm options must be an object");
  checkRange("bandwidthHz", opts.bandwidthHz, 0, Number.MAX_VALUE, { exclusiveMin: true });
  pulseSamples(opts.pulseWidthS, opts.sampleRateHz);
  if (opts.sampleRateHz < opts.bandwidthHz)
    throw new RangeError(`sampleRateHz (${opts.sampleRateHz}) must be ≥ bandwidthHz (${opts.bandwidthHz})`);
  if (opts.window === undefined) throw new TypeError("window is required (the spectral shape of the sweep)");
  checkWindowSpec(opts.window);
  return opts;
}
