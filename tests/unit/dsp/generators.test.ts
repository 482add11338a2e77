import { describe, expect, it } from "vitest";
import { fftInterleaved, nextPow2, toInterleaved } from "@shared/dsp/fft";
import { linearFm } from "@shared/dsp/lfm";
import { matchedFilter } from "@shared/dsp/matched-filter";
import type { ComplexSignal } from "@shared/dsp/types";

const db20 = (x: number) => 20 * Math.log10(x);

/**
 * |y| of y = s ∗ h computed by FFT (zero-padded to a power of two ≥ 2N−1) and interpolated ×U by zero-padding the
 * spectrum — the product's definition in DESIGN.md, built here from fft.ts alone so the generators are tested
 * independently of the metrics module.
 */
function compress(s: ComplexSignal, h: ComplexSignal, u = 8): Float64Array {
  const size = nextPow2(s.re.length + h.re.length - 1);
  const a = fftInterleaved(toInterleaved(s, size));
  const b = fftInterleaved(toInterleaved(h, size));
  const big = new Float64Array(2 * size * u);
  for (let k = 0; k < size; k++) {
    const re = a[2 * k]! * b[2 * k]! - a[2 * k + 1]! * b[2 * k + 1]!;
    const im = a[2 * k]! * b[2 * k + 1]! + a[2 * k + 1]! * b[2 * k]!;
    // Split the Nyquist bin between both ends so the interpolated output stays exact for real inputs too.
    if (k === size / 2 && u > 1) {
      big[2 * k] = re / 2;
      big[2 * k + 1] = im / 2;
      const d = k + size * (u - 1);
      big[2 * d] = re / 2;
      big[2 * d + 1] = im / 2;
      continue;
    }
    const d = k < size / 2 ? k : k + size * (u - 1);
    big[2 * d] = re;
    big[2 * d + 1] = im;
  }
  const y = fftInterleaved(big, true);
  const mag = new Float64Array(size * u);
  for (let k = 0; k < size * u; k++) mag[k] = Math.hypot(y[2 * k]!, y[2 * k + 1]!) * u;
  return mag;
}

/** Peak and PSL with the mainlobe running to the first local minimum on each side (DESIGN.md). */
function peakSidelobe(mag: Float64Array) {
  let p = 0;
  for (let i = 1; i < mag.length; i++) if (mag[i]! > mag[p]!) p = i;
  let l = p;
  while (l > 0 && mag[l - 1]! < mag[l]!) l--;
  let r = p;
  while (r < mag.length - 1 && mag[r + 1]! < mag[r]!) r++;
  let side = 0;
  for (let i = 0; i < mag.length; i++) if (i < l || i > r) side = Math.max(side, mag[i]!);
  return { peak: mag[p]!, index: p, pslDb: db20(side / mag[p]!) };
}

/** Instantaneous frequency between samples i and i+1 from the phase increment (Hz). */
function instFreq(s: ComplexSignal, fs: number): Float64Array {
  const f = new Float64Array(s.re.length - 1);
  for (let i = 0; i < f.length; i++) {
    const re = s.re[i + 1]! * s.re[i]! + s.im[i + 1]! * s.im[i]!;
    const im = s.im[i + 1]! * s.re[i]! - s.re[i + 1]! * s.im[i]!;
    f[i] = (Math.atan2(im, re) * fs) / (2 * Math.PI);
  }
  return f;
}

describe("linear FM", () => {
  const B = 5e6;
  const T = 20e-6;
  const fs = 12.5e6;

  it("has N = round(T·fs) samples of unit modulus", () => {
    const s = linearFm({ bandwidthHz: B, pulseWidthS: T, sampleRateHz: fs });
    expect(s.re.length).toBe(250);
    for (let i = 0; i < 250; i++) expect(Math.hypot(s.re[i]!, s.im[i]!)).toBeCloseTo(1, 14);
  });

  it("sweeps −B/2 → +B/2 linearly at B/T Hz/s (up) and the reverse (down) — Richards 2014 §4.6", () => {
    const up = instFreq(linearFm({ bandwidthHz: B, pulseWidthS: T, sampleRateHz: fs }), fs);
    const down = instFreq(linearFm({ bandwidthHz: B, pulseWidthS: T, sampleRateHz: fs, direction: "down" }), fs);
    const n = 250;
    const slope = B / T;
    for (let i = 0; i < up.length; i++) {
      // Phase increment of samples i, i+1 is the chirp's frequency at their midpoint: (i + ½ − (N−1)/2)/fs.
      const want = slope * ((i + 0.5 - (n - 1) / 2) / fs);
      expect(Math.abs(up[i]! - want)).toBeLessThan(1e-6 * B);
      expect(Math.abs(down[i]! + want)).toBeLessThan(1e-6 * B);
    }
    // End points within one sample's sweep (B/N) of ±B/2 (the first increment is centred half a sample in).
    expect(Math.abs(up[0]! + B / 2)).toBeLessThanOrEqual(1.001 * (B / n));
    expect(Math.abs(up[up.length - 1]! - B / 2)).toBeLessThanOrEqual(1.001 * (B / n));
    expect(Math.abs(down[0]! - B / 2)).toBeLessThanOrEqual(1.001 * (B / n));
  });

  it("real output at an IF: im = 0 and the spectrum is centred at f_IF", () => {
    const fIf = 10e6;
    const rate = 50e6;
    const s = linearFm({ bandwidthHz: B, pulseWidthS: T, sampleRateHz: rate, output: "real", intermediateFrequencyHz: fIf });
    expect(s.re.length).toBe(1000);
    expect(s.im.every((v) => v === 0)).toBe(true);
    const size = 8192;
    const x = fftInterleaved(toInterleaved(s, size));
    let p = 0;
    let pf = 0;
    let inBand = 0;
    for (let k = 0; k <= size / 2; k++) {
      const f = (k * rate) / size;
      const pw = x[2 * k]! ** 2 + x[2 * k + 1]! ** 2;
      p += pw;
      pf += pw * f;
      if (Math.abs(f - fIf) <= B / 2) inBand += pw;
    }
    // Power-weighted mean frequency of the positive half (the sweep is symmetric about f_IF; derived).
    expect(Math.abs(pf / p - fIf)).toBeLessThan(0.005 * B);
    expect(inBand / p).toBeGreaterThan(0.97);
  });

  it("matched-filter PSL follows Richards eq. 4.99 at finite BT (fs = 8B, ×8 interpolation)", () => {
    // Derived from |χ(t)| = (1−|t|/T)·|sinc(Bt(1−|t|/T))| (REFERENCES.md): −14.90 dB at BT = 10, −13.52 at 50, −13.39 at 100.
    // Measured: −14.88, −13.52, −13.39.
    for (const [bt, want] of [
      [10, -14.9],
      [50, -13.52],
      [100, -13.39],
    ] as const) {
      const b = 1e6;
      const s = linearFm({ bandwidthHz: b, pulseWidthS: bt / b, sampleRateHz: 8 * b });
      const r = peakSidelobe(compress(s, matchedFilter(s)));
      expect(Math.abs(r.pslDb - want)).toBeLessThan(0.05);
      expect(r.peak).toBeCloseTo(s.re.length, 6); // y0 = Σ|s|² = N
    }
  });
});

describe("matched filter h[n] = w[n]·conj(s[N−1−n])", () => {
  it("is the conjugate time reverse, weighted sample by sample", () => {
    const s = { re: Float64Array.of(1, 2, 3), im: Float64Array.of(0.5, -1, 0) };
    const h = matchedFilter(s);
    expect(Array.from(h.re)).toEqual([3, 2, 1]);
    expect(Array.from(h.im)).toEqual([0, 1, -0.5]);
    const hw = matchedFilter(s, { kind: "hann" });
    expect(Array.from(hw.re)).toEqual([0, 2, 0]);
  });

  it("Hamming receive weighting at BT = 100: PSL −40.7 dB (Richards 2014 §4.7.2, Fig. 4.36), mismatch loss 1.34–1.35 dB (Richards p. 288)", () => {
    const b = 1e6;
    const s = linearFm({ bandwidthHz: b, pulseWidthS: 100 / b, sampleRateHz: 8 * b });
    const h = matchedFilter(s, { kind: "hamming" });
    // Measured −40.75 dB.
    expect(Math.abs(peakSidelobe(compress(s, h)).pslDb + 40.7)).toBeLessThan(0.1);
    // Mismatch loss −10·log10(|y0|² / (Σ|h|²·Σ|s|²)), y0 = Σ h[n]·s[N−1−n] (DESIGN.md).
    const n = s.re.length;
    let y0re = 0;
    let y0im = 0;
    let eh = 0;
    let es = 0;
    for (let i = 0; i < n; i++) {
      const sr = s.re[n - 1 - i]!;
      const si = s.im[n - 1 - i]!;
      y0re += h.re[i]! * sr - h.im[i]! * si;
      y0im += h.re[i]! * si + h.im[i]! * sr;
      eh += h.re[i]! ** 2 + h.im[i]! ** 2;
      es += s.re[i]! ** 2 + s.im[i]! ** 2;
    }
    const loss = -10 * Math.log10((y0re ** 2 + y0im ** 2) / (eh * es));
    expect(loss).toBeGreaterThanOrEqual(1.33);
    expect(loss).toBeLessThanOrEqual(1.36);
    // Unweighted: 0 dB.
    const m = matchedFilter(s);
    let e = 0;
    for (let i = 0; i < n; i++) e += m.re[i]! ** 2 + m.im[i]! ** 2;
    expect(e).toBeCloseTo(n, 9);
  });

  it("rejects bad signals", () => {
    expect(() => matchedFilter({ re: new Float64Array(0), im: new Float64Array(0) })).toThrow(/s\.re/);
    expect(() => matchedFilter({ re: Float64Array.of(1, Number.NaN), im: Float64Array.of(0, 0) })).toThrow(/s\.re\[1\]/);
    expect(() => matchedFilter({ re: Float64Array.of(1, 2), im: Float64Array.of(0) })).toThrow(RangeError);
  });
});

describe("linear FM bad input names the parameter", () => {
  const ok = { bandwidthHz: 1e6, pulseWidthS: 1e-5, sampleRateHz: 2e6 };
  it("throws RangeError/TypeError", () => {
    expect(() => linearFm({ ...ok, bandwidthHz: Number.NaN })).toThrow(/bandwidthHz/);
    expect(() => linearFm({ ...ok, bandwidthHz: 0 })).toThrow(/bandwidthHz/);
    expect(() => linearFm({ ...ok, bandwidthHz: -1 })).toThrow(RangeError);
    expect(() => linearFm({ ...ok, pulseWidthS: Infinity })).toThrow(/pulseWidthS/);
    expect(() => linearFm({ ...ok, pulseWidthS: -1e-6 })).toThrow(/pulseWidthS/);
    expect(() => linearFm({ ...ok, pulseWidthS: 1e-9 })).toThrow(/samples/);
    expect(() => linearFm({ ...ok, sampleRateHz: 0 })).toThrow(/sampleRateHz/);
    expect(() => linearFm({ ...ok, sampleRateHz: 0.5e6 })).toThrow(/sampleRateHz.*bandwidthHz/);
    expect(() => linearFm({ ...ok, pulseWidthS: 10 })).toThrow(/at most|must be in/);
    expect(() => linearFm({ ...ok, output: "real" })).toThrow(/intermediateFrequencyHz/);
    expect(() => linearFm({ ...ok, output: "real", intermediateFrequencyHz: 5e6 })).toThrow(/sampleRateHz/);
    expect(() => linearFm({ ...ok, sampleRateHz: 20e6, output: "real", intermediateFrequencyHz: 0.2e6 })).toThrow(
      /intermediateFrequencyHz/,
    );
    expect(() => linearFm({ ...ok, direction: "sideways" as "up" })).toThrow(TypeError);
    expect(() => linearFm({ ...ok, bandwidthHz: "1e6" as unknown as number })).toThrow(TypeError);
  });
});
