/**
 * Pulse compression by FFT: y = x ∗ h (linear convolution; with h the time-reversed conjugate of the
 * waveform this is the correlation with it), zero-padded to a power of two ≥ 2N−1 so the circular
 * product equals the linear one, then band-limited interpolation ×U by zero-padding the spectrum.
 * Interleaved Float64Array buffers ([re0, im0, re1, …]) throughout: the outputs reach 2^20+ points.
 * Method: Oppenheim & Schafer, "Discrete-Time Signal Processing", circular vs linear convolution (ch. 8)
 * and interpolation by spectral zero-padding (the even-length Nyquist bin split in half).
 */
import { checkInteger, checkSignal, MAX_SAMPLES } from "./check";
import { fftInterleaved, nextPow2, toInterleaved } from "./fft";
import type { ComplexSignal } from "./types";

/** Largest interpolation factor accepted (U = 16 on 2^22 samples would already need 2^27 points). */
export const MAX_INTERPOLATION = 16;

/** Transform size for a convolution of signals up to `maxLength` samples: a power of two ≥ 2N−1. */
export function convolutionSize(maxLength: number): number {
  checkInteger("signal length", maxLength, 1, MAX_SAMPLES);
  return nextPow2(Math.max(2, 2 * maxLength - 1));
}

/** Interleaved spectrum of `s` zero-padded to `size` points. */
export function spectrumOf(s: ComplexSignal, size: number): Float64Array {
  return fftInterleaved(toInterleaved(s, size));
}

/** Element-wise complex product a·b of two interleaved spectra (into `out` when given; may alias a). */
export function multiplySpectra(a: Float64Array, b: Float64Array, out?: Float64Array): Float64Array {
  if (a.length !== b.length) throw new RangeError(`spectra differ in length (${a.length} vs ${b.length})`);
  const r = out ?? new Float64Array(a.length);
  for (let i = 0; i < a.length; i += 2) {
    const ar = a[i]!;
    const ai = a[i + 1]!;
    const br = b[i]!;
    const bi = b[i + 1]!;
    r[i] = ar * br - ai * bi;
    r[i + 1] = ar * bi + ai * br;
  }
  return r;
}

/**
 * e^{j2π·q/N} for integer q, from two small tables (q = a·L + b): about one ulp, no trig per call.
 * Cached per N, like the FFT plans (a few KiB each).
 */
interface RootTable {
  n: number;
  l: number;
  hi: Float64Array;
  lo: Float64Array;
}
const rootTables = new Map<number, RootTable>();
function rootTable(n: number): RootTable {
  let t = rootTables.get(n);
  if (!t) {
    const l = Math.ceil(Math.sqrt(n));
    const hi = new Float64Array(2 * (Math.ceil(n / l) + 1));
    const lo = new Float64Array(2 * l);
    for (let a = 0; 2 * a < hi.length; a++) {
      hi[2 * a] = Math.cos((2 * Math.PI * a * l) / n);
      hi[2 * a + 1] = Math.sin((2 * Math.PI * a * l) / n);
    }
    for (let b = 0; b < l; b++) {
      lo[2 * b] = Math.cos((2 * Math.PI * b) / n);
      lo[2 * b + 1] = Math.sin((2 * Math.PI * b) / n);
    }
    t = { n, l, hi, lo };
    rootTables.set(n, t);
  }
  return t;
}

const halfTables = new Map<number, Float64Array>();
/** e^{j2π·κ(k)/(2M)} for k = 0..M−1 (κ the signed frequency), interleaved; the Nyquist entry is cos(π/2) = 0 + 0j·… as `interpolateInto` splits it. */
function halfSampleTwiddles(m: number): Float64Array {
  let t = halfTables.get(m);
  if (!t) {
    const roots = rootTable(2 * m);
    const { l, hi, lo } = roots;
    t = new Float64Array(2 * m);
    const half = m / 2;
    for (let k = 0; k < m; k++) {
      if (k === half) {
        t[2 * k] = Math.cos(Math.PI / 2);
        t[2 * k + 1] = 0;
        continue;
      }
      let q = k < half ? k : k - m;
      if (q < 0) q += 2 * m;
      const a = 2 * Math.floor(q / l);
      const b = 2 * (q - (a / 2) * l);
      t[2 * k] = hi[a]! * lo[b]! - hi[a + 1]! * lo[b + 1]!;
      t[2 * k + 1] = hi[a]! * lo[b + 1]! + hi[a + 1]! * lo[b]!;
    }
    if (halfTables.size > 8) halfTables.clear();
    halfTables.set(m, t);
  }
  return t;
}

/** Scratch for `interpolateInto`: two interleaved buffers of M points (reusable across calls of the same M). */
export interface InterpolationWorkspace {
  phase: Float64Array;
  out: Float64Array;
}

/** A workspace for spectra of `size` points (allocate once per analysis, pass to every call). */
export function interpolationWorkspace(size: number): InterpolationWorkspace {
  return { phase: new Float64Array(2 * size), out: new Float64Array(2 * size) };
}

/**
 * Band-limited interpolation ×U of a period-M sequence from its interleaved spectrum, written into
 * `y` (complex, M·U interleaved points) and/or `power` (|y|², M·U points); either may be omitted.
 *
 * The zero-padded MU-point inverse of `interpolateSpectrum` is split by output phase (decimation in
 * time of the long inverse): y_U[n·U + r] = IDFT_M(Y[k]·e^{j2π·κ(k)·r/(MU)})[n], κ(k) the signed
 * frequency (k below M/2, k − M above), and at the Nyquist bin the two halves ±M/2 sum to
 * Y[M/2]·cos(π·r/U). U transforms of M points instead of one of MU points: fewer operations
 * (log2 M vs log2 MU per point), no MU-point buffer, each transform fits the cache, and any U works.
 */
export function interpolateInto(
  spectrum: Float64Array,
  interpolation: number,
  target: { y?: Float64Array; power?: Float64Array },
  workspace?: InterpolationWorkspace,
): void {
  checkInteger("interpolation", interpolation, 1, MAX_INTERPOLATION);
  const u = interpolation;
  const m = spectrum.length / 2;
  const big = m * u;
  const { y, power } = target;
  if (y && y.length !== 2 * big) throw new RangeError(`y must hold ${big} complex points`);
  if (power && power.length !== big) throw new RangeError(`power must hold ${big} points`);
  const ws = workspace ?? interpolationWorkspace(m);
  if (ws.phase.length !== spectrum.length || ws.out.length !== spectrum.length)
    throw new RangeError("workspace does not match the spectrum length");
  const roots = u > 2 ? rootTable(big) : null;
  const half = m / 2;
  for (let r = 0; r < u; r++) {
    let src = spectrum;
    if (r > 0 && u === 2) {
      // The ×2 case (the analysis's grid): one cached table of e^{jπ·κ(k)/M}, Nyquist bin cos(π/2) = 0.
      const tw = halfSampleTwiddles(m);
      const ph = ws.phase;
      for (let i = 0; i < 2 * m; i += 2) {
        const wr = tw[i]!;
        const wi = tw[i + 1]!;
        const xr = spectrum[i]!;
        const xi = spectrum[i + 1]!;
        ph[i] = xr * wr - xi * wi;
        ph[i + 1] = xr * wi + xi * wr;
      }
      src = ph;
    } else if (r > 0) {
      const { l, hi, lo } = roots!;
      const ph = ws.phase;
      for (let k = 0; k < m; k++) {
        if (k === half) {
          const c = Math.cos((Math.PI * r) / u);
          ph[2 * k] = c * spectrum[2 * k]!;
          ph[2 * k + 1] = c * spectrum[2 * k + 1]!;
          continue;
        }
        let q = (k < half ? k : k - m) * r;
        if (q < 0) q += big;
        const a = 2 * Math.floor(q / l);
        const b = 2 * (q - (a / 2) * l);
        const hr = hi[a]!;
        const hq = hi[a + 1]!;
        const lr = lo[b]!;
        const lq = lo[b + 1]!;
        const wr = hr * lr - hq * lq;
        const wi = hr * lq + hq * lr;
        const xr = spectrum[2 * k]!;
        const xi = spectrum[2 * k + 1]!;
        ph[2 * k] = xr * wr - xi * wi;
        ph[2 * k + 1] = xr * wi + xi * wr;
      }
      src = ph;
    }
    const z = fftInterleaved(src, true, ws.out); // fft.js scales by 1/M, as the MU-point inverse of U·Y did
    if (y) {
      for (let n = 0, j = 2 * r; n < m; n++, j += 2 * u) {
        y[j] = z[2 * n]!;
        y[j + 1] = z[2 * n + 1]!;
      }
    }
    if (power) {
      for (let n = 0, j = r; n < m; n++, j += u) {
        const zr = z[2 * n]!;
        const zi = z[2 * n + 1]!;
        power[j] = zr * zr + zi * zi;
      }
    }
  }
}

/**
 * Band-limited interpolation ×U of the period-M sequence whose interleaved spectrum is `spectrum`:
 * zeros go in the middle of the spectrum, the Nyquist bin (k = M/2) is split half to +M/2 and half to
 * −M/2 so real sequences stay real and y_U[U·n] = y[n] exactly. Returns M·U interleaved samples
 * (computed phase by phase, see `interpolateInto`; `interpolateSpectrumPadded` is the textbook form).
 */
export function interpolateSpectrum(
  spectrum: Float64Array,
  interpolation: number,
  out?: Float64Array,
): Float64Array {
  checkInteger("interpolation", interpolation, 1, MAX_INTERPOLATION);
  const m = spectrum.length / 2;
  if (interpolation === 1) return fftInterleaved(spectrum, true, out);
  const y = out ?? new Float64Array(2 * m * interpolation);
  interpolateInto(spectrum, interpolation, { y });
  return y;
}

/** The textbook form of `interpolateSpectrum`: one MU-point inverse of the zero-padded spectrum (tests compare the two). */
export function interpolateSpectrumPadded(spectrum: Float64Array, interpolation: number): Float64Array {
  checkInteger("interpolation", interpolation, 1, MAX_INTERPOLATION);
  const m = spectrum.length / 2;
  const big = m * interpolation;
  const padded = new Float64Array(2 * big);
  const u = interpolation; // fft.js scales the inverse by 1/(MU); ×U restores the 1/M of the short inverse
  const half = m / 2;
  for (let k = 0; k < half; k++) {
    padded[2 * k] = u * spectrum[2 * k]!;
    padded[2 * k + 1] = u * spectrum[2 * k + 1]!;
  }
  for (let k = half + 1; k < m; k++) {
    const dst = 2 * (big - m + k);
    padded[dst] = u * spectrum[2 * k]!;
    padded[dst + 1] = u * spectrum[2 * k + 1]!;
  }
  const nyRe = (u * spectrum[2 * half]!) / 2;
  const nyIm = (u * spectrum[2 * half + 1]!) / 2;
  // Both halves land on the same bin when U = 1 (big − half = half): add, do not overwrite.
  padded[2 * half] = nyRe;
  padded[2 * half + 1] = nyIm;
  padded[2 * (big - half)] = padded[2 * (big - half)]! + nyRe;
  padded[2 * (big - half) + 1] = padded[2 * (big - half) + 1]! + nyIm;
  return fftInterleaved(padded, true);
}

/**
 * Σ|y_U|² over the whole interpolated grid, from the spectrum alone (Parseval): U/M·(Σ|Y|² with the
 * Nyquist bin counted half). Lets the sweep get ISLR's denominator without the long inverse FFT.
 */
export function interpolatedEnergy(spectrum: Float64Array, interpolation: number): number {
  const m = spectrum.length / 2;
  let e = 0;
  for (let i = 0; i < spectrum.length; i += 2)
    e += spectrum[i]! * spectrum[i]! + spectrum[i + 1]! * spectrum[i + 1]!;
  const ny = spectrum[m]! * spectrum[m]! + spectrum[m + 1]! * spectrum[m + 1]!;
  return ((e - ny / 2) * interpolation) / m;
}

/** The compressed output on the interpolated grid, with what is needed to map it back to samples. */
export interface CompressedOutput {
  /** Interleaved complex output, M·U points; fine index i is original sample i/U. */
  y: Float64Array;
  /** Transform size M (power of two ≥ 2N−1). */
  size: number;
  interpolation: number;
  /** Interleaved product spectrum X·H (M bins), kept for the sweep's reuse and for energies. */
  spectrum: Float64Array;
}

/** Options of `compress`: interpolation U (default 8), transform size (default from the lengths). */
export interface CompressOptions {
  interpolation?: number;
  size?: number;
}

/** y = x ∗ h by FFT, then interpolated ×U (default 8). Peak of a matched filter at fine index U·(N−1+delay). */
export function compress(x: ComplexSignal, h: ComplexSignal, opts?: CompressOptions): CompressedOutput {
  checkSignal("x", x);
  checkSignal("h", h);
  const u = opts?.interpolation ?? 8;
  checkInteger("interpolation", u, 1, MAX_INTERPOLATION);
  const size = opts?.size ?? convolutionSize(Math.max(x.re.length, h.re.length));
  if (size < x.re.length + h.re.length - 1)
    throw new RangeError(
      `size ${size} is shorter than the linear convolution (${x.re.length + h.re.length - 1})`,
    );
  const spectrum = multiplySpectra(spectrumOf(x, size), spectrumOf(h, size));
  return { y: interpolateSpectrum(spectrum, u), size, interpolation: u, spectrum };
}

/** |y|² of an interleaved buffer (into `out` when given). */
export function powerOf(y: Float64Array, out?: Float64Array): Float64Array {
  const n = y.length / 2;
  const p = out ?? new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const r = y[2 * i]!;
    const q = y[2 * i + 1]!;
    p[i] = r * r + q * q;
  }
  return p;
}
