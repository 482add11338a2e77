// The revision page's signal views, each checked against a computation that does not share code with it:
// a naive O(N²) DFT, closed forms (Dirichlet kernel, a tone's and a chirp's instantaneous frequency),
// Node's Buffer for the byte order, and brute-force scans for the envelope.
import { describe, expect, it } from "vitest";
import {
  DB_FLOOR,
  firResponseDb,
  fromInterleavedBytes,
  hasQuadrature,
  instantaneousFrequencyMHz,
  magnitude,
  minMaxEnvelope,
  spectrumDb,
  timeAxisUs,
  visibleRange,
  type Samples,
} from "@/features/revisions/lib/signal-views";
import { plotCsv } from "@/components/plot/plot-csv";

/** Seeded LCG (Numerical Recipes constants) so the random signal is the same on every run. */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(1664525, s) + 1013904223) >>> 0;
    return s / 2 ** 32 - 0.5;
  };
}

/** Naive DFT power |X[k]|² on `size` bins of the zero-padded signal, straight from the definition. */
function naiveDftPower({ re, im }: Samples, size: number): number[] {
  const out: number[] = [];
  for (let k = 0; k < size; k++) {
    let sr = 0;
    let si = 0;
    for (let n = 0; n < re.length; n++) {
      const a = (-2 * Math.PI * k * n) / size;
      sr += re[n]! * Math.cos(a) - im[n]! * Math.sin(a);
      si += re[n]! * Math.sin(a) + im[n]! * Math.cos(a);
    }
    out.push(sr * sr + si * si);
  }
  return out;
}

function tone(n: number, fHz: number, fs: number, phase = 0.3): Samples {
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    re[i] = Math.cos((2 * Math.PI * fHz * i) / fs + phase);
    im[i] = Math.sin((2 * Math.PI * fHz * i) / fs + phase);
  }
  return { re, im };
}

describe("fromInterleavedBytes", () => {
  it("reads little-endian float64 pairs as written by Node's Buffer.writeDoubleLE", () => {
    const values = [1.5, -2.25, Math.PI, -0, 1e-300, -123456789.125];
    const buf = Buffer.alloc(values.length * 8);
    values.forEach((v, i) => buf.writeDoubleLE(v, 8 * i));
    const { re, im } = fromInterleavedBytes(
      buf.buffer.slice(buf.byteOffset, buf.byteOffset + buf.byteLength),
    );
    expect(Array.from(re)).toEqual([1.5, Math.PI, 1e-300]);
    expect(Array.from(im)).toEqual([-2.25, -0, -123456789.125]);
  });
  it("refuses a body that is not whole complex pairs", () => {
    expect(() => fromInterleavedBytes(new ArrayBuffer(24))).toThrow(RangeError);
  });
});

describe("time axis, magnitude, quadrature", () => {
  it("t[n] = n/fs in µs and |x| = √(I²+Q²) (3-4-5 triangle exactly)", () => {
    expect(Array.from(timeAxisUs(4, 12.5e6))).toEqual([0, 0.08, 0.16, 0.24]);
    const m = magnitude({ re: Float64Array.of(3, 0, -5), im: Float64Array.of(4, -2, 12) });
    expect(Array.from(m)).toEqual([5, 2, 13]);
    expect(hasQuadrature({ re: Float64Array.of(1, 2), im: Float64Array.of(0, 0) })).toBe(false);
    expect(hasQuadrature({ re: Float64Array.of(1, 2), im: Float64Array.of(0, 1e-12) })).toBe(true);
  });
});

describe("spectrumDb", () => {
  it("matches a naive DFT of a seeded random complex signal, fftshifted and normalized to 0 dB", () => {
    const rnd = lcg(42);
    const n = 37;
    const s: Samples = {
      re: Float64Array.from({ length: n }, rnd),
      im: Float64Array.from({ length: n }, rnd),
    };
    const fs = 5e6;
    const size = 64;
    const { freqMHz, db } = spectrumDb(s, fs, size);
    expect(db.length).toBe(size);
    const ref = naiveDftPower(s, size);
    const peak = Math.max(...ref);
    for (let j = 0; j < size; j++) {
      const k = (j + size / 2) % size; // fftshift
      expect(db[j]).toBeCloseTo(10 * Math.log10(ref[k]! / peak), 9);
      expect(freqMHz[j]).toBeCloseTo(((j - size / 2) * fs) / size / 1e6, 12);
    }
    expect(Math.max(...db)).toBe(0);
  });

  it("puts a tone at its frequency: bin-centred tone at +1.25 MHz with fs = 10 MHz", () => {
    const fs = 10e6;
    const { freqMHz, db } = spectrumDb(tone(256, 1.25e6, fs), fs, 256);
    const peakBin = db.indexOf(0);
    expect(freqMHz[peakBin]).toBeCloseTo(1.25, 12);
    // Bin-centred: every other bin is a zero of the Dirichlet kernel, at the floor or far below the peak.
    expect(db[peakBin + 1]!).toBeLessThan(-250);
  });

  it("rectangular pulse: highest sidelobe of the Dirichlet kernel, about -13.26 dB (Harris 1978, Proc. IEEE 66(1), Table I: -13 dB)", () => {
    const n = 64;
    const { db } = spectrumDb({ re: new Float64Array(n).fill(1), im: new Float64Array(n) }, 1e6, 1 << 16);
    const centre = db.length / 2;
    // Walk out of the mainlobe to its first null, then take the largest value of the first sidelobe.
    let i = centre;
    while (db[i + 1]! < db[i]!) i++;
    let side = -Infinity;
    for (let j = i; j < centre + (2 * db.length) / n; j++) side = Math.max(side, db[j]!);
    // Independent: |sin(πNu)/(N·sin(πu))| scanned densely over the first sidelobe u ∈ (1/N, 2/N).
    let ref = -Infinity;
    for (let q = 1; q < 200_000; q++) {
      const u = (1 + q / 200_000) / n;
      ref = Math.max(ref, 20 * Math.log10(Math.abs(Math.sin(Math.PI * n * u) / (n * Math.sin(Math.PI * u)))));
    }
    expect(side).toBeCloseTo(ref, 4);
    expect(side).toBeCloseTo(-13.25, 1); // N = 64: a hair above the sinc limit -13.26 dB
  });

  it("an all-zero signal stays at the floor instead of NaN", () => {
    const { db } = spectrumDb({ re: new Float64Array(8), im: new Float64Array(8) }, 1e6, 8);
    expect(Array.from(db)).toEqual(new Array(8).fill(DB_FLOOR));
  });
});

describe("instantaneousFrequencyMHz", () => {
  it("a constant tone reads its own frequency at every step, for + and − frequencies", () => {
    const fs = 12.5e6;
    for (const f of [2.1e6, -4.7e6, 0]) {
      const { values, timeUs } = instantaneousFrequencyMHz(tone(100, f, fs), fs);
      expect(values.length).toBe(99);
      for (const v of values) expect(v).toBeCloseTo(f / 1e6, 10);
      expect(timeUs[0]).toBeCloseTo(0.04, 12); // midway between samples 0 and 1 at 80 ns spacing
    }
  });

  it("a chirp x = exp(jπk t²) reads k·t at the midpoint t of each step (exact for a quadratic phase)", () => {
    // Phase step π·k·(t₁² − t₀²) = 2π·k·t_mid/fs, so f = k·t_mid: B = 10 MHz over T = 50 µs, fs = 12.5 MHz.
    const fs = 12.5e6;
    const B = 10e6;
    const T = 50e-6;
    const k = B / T;
    const n = Math.round(T * fs);
    const re = new Float64Array(n);
    const im = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const t = i / fs - T / 2;
      re[i] = Math.cos(Math.PI * k * t * t);
      im[i] = Math.sin(Math.PI * k * t * t);
    }
    const { values, timeUs } = instantaneousFrequencyMHz({ re, im }, fs);
    for (let i = 0; i < values.length; i++) {
      const tMid = timeUs[i]! / 1e6 - T / 2;
      expect(values[i]).toBeCloseTo((k * tMid) / 1e6, 6);
    }
    expect(values[0]).toBeCloseTo(-4.992, 6); // t_mid = 0.04 µs − 25 µs, k = 2e11 Hz/s
  });

  it("a zero sample keeps the previous estimate", () => {
    const { values } = instantaneousFrequencyMHz(
      { re: Float64Array.of(1, 0, 0, 1), im: Float64Array.of(0, 1, 0, 0) },
      4e6,
    );
    expect(Array.from(values)).toEqual([1, 1, 1]);
  });
});

describe("firResponseDb", () => {
  it("an M-tap moving sum follows the Dirichlet kernel |sin(πfM/fs)/sin(πf/fs)| (Oppenheim & Schafer, DTSP, ex. 2.x)", () => {
    const M = 9;
    const fs = 100e6;
    const taps: Samples = { re: new Float64Array(M).fill(1), im: new Float64Array(M) };
    const { freqMHz, db } = firResponseDb(taps, fs, false);
    expect(db.length).toBe(8192 / 2 + 1);
    expect(freqMHz[0]).toBe(0);
    expect(freqMHz[freqMHz.length - 1]).toBe(50);
    expect(db[0]).toBeCloseTo(20 * Math.log10(M), 10); // DC gain Σh = 9
    for (const j of [1, 17, 300, 1000, 2500, 4095]) {
      const x = (Math.PI * freqMHz[j]! * 1e6) / fs;
      const ref = 20 * Math.log10(Math.abs(Math.sin(M * x) / Math.sin(x)));
      expect(db[j]).toBeCloseTo(ref, 8);
    }
  });

  it("complex taps show −fs/2 … fs/2 and match a naive DFT", () => {
    const rnd = lcg(7);
    const taps: Samples = {
      re: Float64Array.from({ length: 11 }, rnd),
      im: Float64Array.from({ length: 11 }, rnd),
    };
    const { freqMHz, db } = firResponseDb(taps, 8e6, true, 16);
    expect(freqMHz.length).toBe(16);
    expect(freqMHz[0]).toBe(-4);
    const ref = naiveDftPower(taps, 16);
    for (let j = 0; j < 16; j++) expect(db[j]).toBeCloseTo(10 * Math.log10(ref[(j + 8) % 16]!), 9);
  });
});

describe("minMaxEnvelope", () => {
  const rnd = lcg(3);
  const n = 300_001;
  const x = Float64Array.from({ length: n }, (_, i) => i * 0.08);
  const y1 = Float64Array.from({ length: n }, rnd);
  const y2 = Float64Array.from({ length: n }, (_, i) => Math.sin(i / 1000));

  it("keeps every bucket's extremes: each sample lies within its bucket's [min, max], global extremes kept", () => {
    const cols = 1280;
    const env = minMaxEnvelope({ x, ys: [y1, y2] }, cols);
    expect(env.x.length).toBe(2 * cols);
    for (const [s, y] of [y1, y2].entries()) {
      const e = env.ys[s]!;
      // Brute force: recompute the bucket of every sample from the x it sits between.
      let b = 0;
      for (let i = 0; i < n; i++) {
        while (x[i]! > env.x[2 * b + 1]!) b++;
        expect(y[i]! >= e[2 * b]! && y[i]! <= e[2 * b + 1]!).toBe(true);
      }
      expect(Math.min(...e)).toBe(y.reduce((a, v) => Math.min(a, v), Infinity));
      expect(Math.max(...e)).toBe(y.reduce((a, v) => Math.max(a, v), -Infinity));
    }
    expect(env.x[0]).toBe(0);
    expect(env.x[env.x.length - 1]).toBe(x[n - 1]);
  });

  it("returns the plain slice when it is short enough, and windows by index range", () => {
    const env = minMaxEnvelope({ x, ys: [y1] }, 100, 10, 150);
    expect(Array.from(env.x)).toEqual(Array.from(x.slice(10, 150)));
    const [a, b] = visibleRange(x, 0.8, 1.6);
    // x[10] = 0.8 and x[20] = 1.6000000000000001: from one sample before the start through the first sample ≥ the end.
    expect([a, b]).toEqual([9, 21]);
  });
});

describe("plotCsv", () => {
  it("writes a header with units and every value at full (round-trip) precision", () => {
    const csv = plotCsv(
      { label: "Time", unit: "µs" },
      [
        { label: "I", unit: "" },
        { label: "Q", unit: "" },
      ],
      Float64Array.of(0, 0.08),
      [Float64Array.of(0.1, -1 / 3), Float64Array.of(2 ** -52, 1e21)],
    );
    expect(csv).toBe("Time (µs),I,Q\r\n0,0.1,2.220446049250313e-16\r\n0.08,-0.3333333333333333,1e+21\r\n");
    for (const line of csv.trim().split("\r\n").slice(1))
      for (const v of line.split(",")) expect(Number.isFinite(Number(v))).toBe(true);
  });
});
