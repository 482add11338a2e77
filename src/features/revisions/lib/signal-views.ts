/**
 * What the revision page plots, computed in the browser from a table's stored values: time axis, magnitude,
 * spectrum (fftshifted, 0 dB at the peak), instantaneous frequency, FIR magnitude response, and a min/max
 * envelope that keeps very long series drawable. Pure functions over typed arrays.
 */
import { fftInterleaved, fromInterleaved, nextPow2 } from "@shared/dsp/fft";

/** A table's samples, split from the stored interleaved [re0, im0, re1, im1, …] float64 values. */
export interface Samples {
  re: Float64Array;
  im: Float64Array;
}

/** Floor of every dB trace, so exact zeros (log of 0) stay plottable instead of −∞. */
export const DB_FLOOR = -300;

const LITTLE_ENDIAN = new Uint8Array(Uint16Array.of(1).buffer)[0] === 1;

/** Splits interleaved little-endian float64 bytes (the values endpoint's body) into I and Q. */
export function fromInterleavedBytes(buffer: ArrayBuffer): Samples {
  if (buffer.byteLength % 16 !== 0)
    throw new RangeError(
      `values body of ${buffer.byteLength} bytes is not a whole number of complex float64 pairs`,
    );
  // A Float64Array view reads host byte order; every browser host is little-endian, so refuse rather than misread.
  if (!LITTLE_ENDIAN)
    throw new RangeError("this host is big-endian; stored values are little-endian float64");
  return fromInterleaved(new Float64Array(buffer));
}

/** Sample times in µs: t[n] = n / fs. */
export function timeAxisUs(length: number, sampleRateHz: number): Float64Array {
  const t = new Float64Array(length);
  const scale = 1e6 / sampleRateHz;
  for (let i = 0; i < length; i++) t[i] = i * scale;
  return t;
}

/** |x[n]| = √(I² + Q²). */
export function magnitude({ re, im }: Samples): Float64Array {
  const out = new Float64Array(re.length);
  for (let i = 0; i < re.length; i++) out[i] = Math.hypot(re[i]!, im[i]!);
  return out;
}

function toDbNormalized(power: Float64Array): Float64Array {
  let peak = 0;
  for (const p of power) if (p > peak) peak = p;
  const out = new Float64Array(power.length);
  for (let i = 0; i < power.length; i++) {
    const db = peak > 0 ? 10 * Math.log10(power[i]! / peak) : DB_FLOOR;
    out[i] = Math.max(DB_FLOOR, db);
  }
  return out;
}

/** |DFT|² of the zero-padded signal on `size` bins, bin k at k·fs/size. */
function powerSpectrum({ re, im }: Samples, size: number): Float64Array {
  const buf = new Float64Array(2 * size);
  for (let i = 0; i < re.length; i++) {
    buf[2 * i] = re[i]!;
    buf[2 * i + 1] = im[i]!;
  }
  const spec = fftInterleaved(buf);
  const power = new Float64Array(size);
  for (let k = 0; k < size; k++) power[k] = spec[2 * k]! ** 2 + spec[2 * k + 1]! ** 2;
  return power;
}

/** A trace over frequency. */
export interface FrequencyTrace {
  freqMHz: Float64Array;
  db: Float64Array;
}

/**
 * Spectrum in dB (0 dB at the peak) over −fs/2 … fs/2 (fftshift: bin k ↦ k − size/2), on a power-of-two
 * grid of at least `minPoints` bins so a short pulse still shows its sidelobes.
 */
export function spectrumDb(samples: Samples, sampleRateHz: number, minPoints = 4096): FrequencyTrace {
  const size = nextPow2(Math.max(minPoints, samples.re.length));
  const power = powerSpectrum(samples, size);
  const half = size / 2;
  const shifted = new Float64Array(size);
  const freqMHz = new Float64Array(size);
  for (let k = 0; k < size; k++) {
    const src = (k + half) % size;
    shifted[k] = power[src]!;
    freqMHz[k] = ((k - half) * sampleRateHz) / size / 1e6;
  }
  return { freqMHz, db: toDbNormalized(shifted) };
}

/**
 * FIR magnitude response 20·log10|H(f)| (absolute, so the DC gain shows) on ≥ 8192 points: real taps over
 * 0 … fs/2 (the response is symmetric), complex taps over −fs/2 … fs/2.
 */
export function firResponseDb(
  taps: Samples,
  sampleRateHz: number,
  complex: boolean,
  minPoints = 8192,
): FrequencyTrace {
  const size = nextPow2(Math.max(minPoints, taps.re.length));
  const power = powerSpectrum(taps, size);
  const half = size / 2;
  const count = complex ? size : half + 1;
  const freqMHz = new Float64Array(count);
  const db = new Float64Array(count);
  for (let j = 0; j < count; j++) {
    const k = complex ? j - half : j;
    const src = ((k % size) + size) % size;
    freqMHz[j] = (k * sampleRateHz) / size / 1e6;
    db[j] = Math.max(DB_FLOOR, 10 * Math.log10(power[src]!));
  }
  return { freqMHz, db };
}

/** A trace over time (µs). */
export interface TimeTrace {
  timeUs: Float64Array;
  values: Float64Array;
}

/**
 * Instantaneous frequency in MHz: the phase step between successive samples, arg(x[n+1]·conj(x[n])),
 * times fs/2π, placed midway between the two samples. Samples where either magnitude is 0 have no phase:
 * they repeat the previous estimate (0 at the start).
 */
export function instantaneousFrequencyMHz({ re, im }: Samples, sampleRateHz: number): TimeTrace {
  const n = Math.max(0, re.length - 1);
  const timeUs = new Float64Array(n);
  const values = new Float64Array(n);
  const scale = sampleRateHz / (2 * Math.PI) / 1e6;
  let last = 0;
  for (let i = 0; i < n; i++) {
    const a = re[i]!;
    const b = im[i]!;
    const c = re[i + 1]!;
    const d = im[i + 1]!;
    // x[n+1]·conj(x[n]) = (c + jd)(a − jb)
    const pr = c * a + d * b;
    const pi = d * a - c * b;
    if (pr !== 0 || pi !== 0) last = Math.atan2(pi, pr) * scale;
    values[i] = last;
    timeUs[i] = ((i + 0.5) * 1e6) / sampleRateHz;
  }
  return { timeUs, values };
}

/** True when the samples carry a nonzero imaginary part (real tables are stored with Q = 0). */
export function hasQuadrature({ im }: Samples): boolean {
  for (const v of im) if (v !== 0) return true;
  return false;
}

/** Series sharing one x axis, as uPlot takes them. */
export interface XYSeries {
  x: Float64Array;
  ys: Float64Array[];
}

/** Above this many points a plot shows the min/max envelope instead of every sample. */
export const ENVELOPE_THRESHOLD = 200_000;

/**
 * Min/max envelope over `columns` equal index buckets of [start, end): each bucket becomes two points, at
 * its first and last x, carrying each series' minimum then maximum, so every peak of the full series is
 * still drawn at pixel resolution. Series at or below 2·columns points come back as the plain slice.
 */
export function minMaxEnvelope(data: XYSeries, columns: number, start = 0, end = data.x.length): XYSeries {
  const lo = Math.max(0, Math.min(start, data.x.length));
  const hi = Math.max(lo, Math.min(end, data.x.length));
  const n = hi - lo;
  if (columns < 1 || n <= 2 * columns)
    return { x: data.x.slice(lo, hi), ys: data.ys.map((y) => y.slice(lo, hi)) };
  const x = new Float64Array(2 * columns);
  const ys = data.ys.map(() => new Float64Array(2 * columns));
  for (let b = 0; b < columns; b++) {
    const from = lo + Math.floor((b * n) / columns);
    const to = lo + Math.floor(((b + 1) * n) / columns);
    x[2 * b] = data.x[from]!;
    x[2 * b + 1] = data.x[to - 1]!;
    data.ys.forEach((y, s) => {
      let min = Infinity;
      let max = -Infinity;
      for (let i = from; i < to; i++) {
        const v = y[i]!;
        if (v < min) min = v;
        if (v > max) max = v;
      }
      ys[s]![2 * b] = min;
      ys[s]![2 * b + 1] = max;
    });
  }
  return { x, ys };
}

/** Index range [start, end) of a sorted x axis that covers [xMin, xMax], one sample wider on each side. */
export function visibleRange(x: Float64Array, xMin: number, xMax: number): [number, number] {
  const lowerBound = (v: number) => {
    let a = 0;
    let b = x.length;
    while (a < b) {
      const m = (a + b) >>> 1;
      if (x[m]! < v) a = m + 1;
      else b = m;
    }
    return a;
  };
  return [Math.max(0, lowerBound(xMin) - 1), Math.min(x.length, lowerBound(xMax) + 1)];
}
