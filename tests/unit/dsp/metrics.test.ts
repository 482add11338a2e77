import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { compress, interpolatedEnergy, powerOf } from "@shared/dsp/compression";
import { coefficientSqnrDb, measureResponse, mismatchLossDb, peakLossDb } from "@shared/dsp/metrics";
import { quantize } from "@shared/dsp/quantize";
import type { ComplexSignal } from "@shared/dsp/types";

// Test signals are built here from their formulas, independently of the generator modules.
/** Baseband LFM with time-bandwidth product `bt`, sampled at `os`·B (B = 1 Hz, so fs = os). */
function chirp(bt: number, os: number): ComplexSignal {
  const n = Math.round(bt * os);
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const t = (i - (n - 1) / 2) / n; // time in units of T
    re[i] = Math.cos(Math.PI * bt * t * t);
    im[i] = Math.sin(Math.PI * bt * t * t);
  }
  return { re, im };
}
/** h[n] = w[n]·conj(s[N−1−n]). */
function matched(s: ComplexSignal, w?: (i: number, n: number) => number): ComplexSignal {
  const n = s.re.length;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const g = w ? w(i, n) : 1;
    re[i] = g * s.re[n - 1 - i]!;
    im[i] = -g * s.im[n - 1 - i]!;
  }
  return { re, im };
}
const hamming = (i: number, n: number) => 0.54 - 0.46 * Math.cos((2 * Math.PI * i) / (n - 1));
function measure(s: ComplexSignal, h: ComplexSignal, fs: number, u = 8, size?: number) {
  const c = compress(s, h, { interpolation: u, size });
  return measureResponse(powerOf(c.y), { interpolation: u, sampleRateHz: fs });
}
/**
 * PSL of the finite-BT zero-Doppler cut |χ(t)| = (1−|t|/T)·|sinc(BT·t(1−|t|/T))| — Richards,
 * "Fundamentals of Radar Signal Processing", 2nd ed., 2014, eq. 4.99 (form from memory), searched densely.
 */
function richardsPsl(bt: number): number {
  let best = 0;
  let prev = 1;
  let inMain = true;
  for (let i = 1; i < 1_000_000; i++) {
    const t = i / 1_000_000;
    const x = bt * t * (1 - t);
    const v = (1 - t) * Math.abs(Math.sin(Math.PI * x) / (Math.PI * x));
    if (inMain && v > prev) inMain = false;
    if (!inMain && v > best) best = v;
    prev = v;
  }
  return 20 * Math.log10(best);
}

describe("compression", () => {
  it("equals a naive direct convolution (independent computation), and ×8 keeps the samples", () => {
    const x = chirp(7, 1.6);
    const h = matched(x, hamming);
    const n = x.re.length;
    const c1 = compress(x, h, { interpolation: 1 });
    const c8 = compress(x, h, { interpolation: 8 });
    for (let k = 0; k < 2 * n - 1; k++) {
      let r = 0;
      let q = 0;
      for (let j = 0; j < n; j++) {
        const i = k - j;
        if (i < 0 || i >= n) continue;
        r += x.re[i]! * h.re[j]! - x.im[i]! * h.im[j]!;
        q += x.re[i]! * h.im[j]! + x.im[i]! * h.re[j]!;
      }
      expect(Math.abs(c1.y[2 * k]! - r)).toBeLessThan(1e-12);
      expect(Math.abs(c1.y[2 * k + 1]! - q)).toBeLessThan(1e-12);
      expect(Math.abs(c8.y[16 * k]! - r)).toBeLessThan(1e-12);
      expect(Math.abs(c8.y[16 * k + 1]! - q)).toBeLessThan(1e-12);
    }
    // Parseval on the interpolated grid (the sweep relies on it for ISLR).
    const p = powerOf(c8.y);
    const direct = p.reduce((a, b) => a + b, 0);
    expect(interpolatedEnergy(c8.spectrum, 8) / direct - 1).toBeLessThan(1e-12);
  });
});

describe("linear FM, rectangular envelope, matched filter", () => {
  // Tolerances: the formula is the continuous output; sampled at fs = 4B and interpolated ×8 we measured
  // |error| ≤ 0.01 dB at BT ≥ 50 (at fs = 1.25B aliasing of the sinc tails costs up to 0.09 dB).
  it.each([
    [50, -13.52],
    [100, -13.39],
    [1000, -13.27],
  ])("PSL at BT = %i matches Richards eq. 4.99 (%f dB)", (bt, published) => {
    const s = chirp(bt, 4);
    const m = measure(s, matched(s), 4);
    expect(Math.abs(m.pslDb - richardsPsl(bt))).toBeLessThan(0.03);
    expect(Math.abs(m.pslDb - published)).toBeLessThan(0.03); // REFERENCES.md rounds to 0.01 dB
  });

  it("tends to the sinc's −13.26 dB and has width 0.886/B, ISLR ≈ −9.7 dB, mismatch loss 0 (Richards p. 370)", () => {
    const s = chirp(1000, 2);
    const m = measure(s, matched(s), 2);
    expect(Math.abs(m.pslDb - -13.26)).toBeLessThan(0.1);
    // −3 dB width in 1/B units (B = 1 Hz): measured 0.8854.
    expect(Math.abs(m.width3dbSeconds - 0.886)).toBeLessThan(0.005);
    expect(m.width3dbMetres).toBeCloseTo((m.width3dbSeconds * 299_792_458) / 2, 6);
    // Derived ∫sinc² range −9.62…−9.72 dB (REFERENCES.md); measured −9.686.
    expect(m.islrDb).toBeGreaterThan(-9.75);
    expect(m.islrDb).toBeLessThan(-9.6);
    expect(Math.abs(mismatchLossDb(s, matched(s)))).toBeLessThan(1e-9);
  });

  it("Hamming receive weighting at BT = 1000: PSL −42.7, SNR loss 1.34–1.35, peak-gain loss 5.35 dB (Richards §4.7.2, §5)", () => {
    const s = chirp(1000, 2);
    const h = matched(s, hamming);
    const m = measure(s, h, 2);
    const m0 = measure(s, matched(s), 2);
    expect(Math.abs(m.pslDb - -42.7)).toBeLessThan(0.1); // measured −42.69
    const loss = mismatchLossDb(s, h);
    expect(loss).toBeGreaterThan(1.335); // measured 1.3460
    expect(loss).toBeLessThan(1.355);
    expect(Math.abs(peakLossDb(m0.peakAmplitude, m.peakAmplitude) - 5.35)).toBeLessThan(0.02); // measured 5.356
  });
});

describe("Barker-13", () => {
  it("PSL −22.28 dB on the ×8-interpolated output (Richards Table 4.1)", () => {
    const code = [1, 1, 1, 1, 1, -1, -1, 1, 1, -1, 1, -1, 1];
    const spc = 16; // several samples per chip, so the sampled response is the chip triangle (REFERENCES.md grid trap)
    const re = new Float64Array(code.length * spc).map((_, i) => code[Math.floor(i / spc)]!);
    const s = { re, im: new Float64Array(re.length) };
    const m = measure(s, matched(s), spc);
    // The kinks of the piecewise-linear response ring under band-limited interpolation: measured error < 0.05 dB.
    expect(Math.abs(m.pslDb - 20 * Math.log10(1 / 13))).toBeLessThan(0.05);
  });
});

describe("coefficient SQNR of a full-scale unit-modulus chirp", () => {
  // Derived (REFERENCES.md): I and Q follow a sine's amplitude law, so SQNR ≈ 6.02·W + 1.76 dB (Kester,
  // Analog Devices MT-229, for the sine). Tolerance ±0.3 dB: the chirp's finite length and its peak
  // component (max |I|,|Q| ≤ 1, the scale reference) differ slightly from an ideal full-scale sine.
  it.each([8, 10, 12, 16])("W = %i", (w) => {
    const s = chirp(2000, 2);
    const q = quantize(s, {
      wordLength: w,
      fractionLength: w - 1,
      signed: true,
      scaling: "full-scale",
      rounding: "nearest-even",
      overflow: "saturate",
    });
    const fixed = { re: q.valueRe.map((v) => v / q.gain), im: q.valueIm.map((v) => v / q.gain) };
    expect(Math.abs(coefficientSqnrDb(s, fixed) - (6.02 * w + 1.76))).toBeLessThan(0.3);
  });
});

describe("invariances", () => {
  it("metrics do not change when the echo is delayed (property)", () => {
    const s = chirp(40, 2);
    const h = matched(s, hamming);
    // One transform size for every delay, so the periodic interpolation grid is the same.
    const size = 512;
    const base = measure(s, h, 2, 8, size);
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 250 }), (d) => {
        const re = new Float64Array(s.re.length + d);
        const im = new Float64Array(s.re.length + d);
        re.set(s.re, d);
        im.set(s.im, d);
        const m = measure({ re, im }, h, 2, 8, size);
        expect(m.peakPositionSamples - base.peakPositionSamples).toBeCloseTo(d, 9);
        expect(Math.abs(m.pslDb - base.pslDb)).toBeLessThan(1e-6);
        expect(Math.abs(m.islrDb - base.islrDb)).toBeLessThan(1e-6);
        expect(Math.abs(m.width3dbSamples - base.width3dbSamples)).toBeLessThan(1e-6);
      }),
      { numRuns: 12, seed: 42 },
    );
  });

  it("U = 1 and U = 8 agree on a smooth (8× oversampled) output", () => {
    const s = chirp(200, 8);
    const h = matched(s, hamming);
    const m1 = measure(s, h, 8, 1);
    const m8 = measure(s, h, 8, 8);
    expect(Math.abs(m1.pslDb - m8.pslDb)).toBeLessThan(0.05);
    expect(Math.abs(m1.islrDb - m8.islrDb)).toBeLessThan(0.05);
    expect(Math.abs(m1.width3dbSamples / m8.width3dbSamples - 1)).toBeLessThan(0.01);
  });

  it("peak loss is 0 when fixed = float; SQNR is infinite for an exact table", () => {
    const s = chirp(50, 2);
    const m = measure(s, matched(s), 2);
    expect(peakLossDb(m.peakAmplitude, m.peakAmplitude)).toBe(0);
    expect(coefficientSqnrDb(s, s)).toBe(Infinity);
  });

  it("rejects bad input with errors naming the parameter", () => {
    const s = chirp(10, 2);
    expect(() => compress(s, s, { interpolation: 0 })).toThrow(/interpolation/);
    expect(() => compress({ re: new Float64Array([NaN]), im: new Float64Array(1) }, s)).toThrow(/x\.re\[0\]/);
    expect(() => mismatchLossDb(s, chirp(11, 2))).toThrow(/h has/);
    expect(() => measureResponse(new Float64Array(8), { interpolation: 1, sampleRateHz: 1 })).toThrow(/zero/);
  });
});
