import { describe, expect, it } from "vitest";
import { fftInterleaved, nextPow2, toInterleaved } from "@shared/dsp/fft";
import { linearFm } from "@shared/dsp/lfm";
import { matchedFilter } from "@shared/dsp/matched-filter";
import { nlfmFrequency, nonlinearFm } from "@shared/dsp/nlfm";
import { BARKER_CODES, phaseCode, phaseCodePhases, type PhaseCodeSpec } from "@shared/dsp/phase-codes";
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
    const down = instFreq(
      linearFm({ bandwidthHz: B, pulseWidthS: T, sampleRateHz: fs, direction: "down" }),
      fs,
    );
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
    const s = linearFm({
      bandwidthHz: B,
      pulseWidthS: T,
      sampleRateHz: rate,
      output: "real",
      intermediateFrequencyHz: fIf,
    });
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
    expect(() => matchedFilter({ re: Float64Array.of(1, Number.NaN), im: Float64Array.of(0, 0) })).toThrow(
      /s\.re\[1\]/,
    );
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
    expect(() =>
      linearFm({ ...ok, sampleRateHz: 20e6, output: "real", intermediateFrequencyHz: 0.2e6 }),
    ).toThrow(/intermediateFrequencyHz/);
    expect(() => linearFm({ ...ok, direction: "sideways" as "up" })).toThrow(TypeError);
    expect(() => linearFm({ ...ok, bandwidthHz: "1e6" as unknown as number })).toThrow(TypeError);
  });
});

/** Aperiodic (or periodic) autocorrelation magnitude |r(l)|, l = 0..N−1, by its definition (independent of the FFT). */
function directAcf(s: ComplexSignal, periodic = false): Float64Array {
  const n = s.re.length;
  const out = new Float64Array(n);
  for (let l = 0; l < n; l++) {
    let re = 0;
    let im = 0;
    for (let k = 0; k < n; k++) {
      if (!periodic && k + l >= n) break;
      const j = (k + l) % n;
      re += s.re[j]! * s.re[k]! + s.im[j]! * s.im[k]!;
      im += s.im[j]! * s.re[k]! - s.re[j]! * s.im[k]!;
    }
    out[l] = Math.hypot(re, im);
  }
  return out;
}
const maxSide = (r: Float64Array) => Math.max(...r.subarray(1));

describe("Barker codes (Richards 2014, Table 4.1 and p. 305)", () => {
  // PSL = 20·log10(1/N): −6.02, −9.54, −12.04, −13.98, −16.90, −20.83, −22.28 dB.
  const table = [
    [2, -6.02],
    [3, -9.54],
    [4, -12.04],
    [5, -13.98],
    [7, -16.9],
    [11, -20.83],
    [13, -22.28],
  ] as const;
  for (const [n, psl] of table) {
    it(`length ${n}: peak ${n}, sidelobes of magnitude ≤ 1, PSL ${psl} dB`, () => {
      const s = phaseCode({ kind: "barker", length: n });
      expect(s.re.length).toBe(n);
      const r = directAcf(s);
      expect(r[0]).toBe(n);
      for (let l = 1; l < n; l++) expect(r[l]!).toBeLessThanOrEqual(1 + 1e-12);
      expect(db20(maxSide(r) / r[0]!)).toBeCloseTo(psl, 2);
    });
  }

  it("Barker-13 is +++++−−++−+−+ with ISL over all nonzero lags 10·log10(12/169) = −11.49 dB (derived)", () => {
    expect(BARKER_CODES[13].map((c) => (c > 0 ? "+" : "−")).join("")).toBe("+++++−−++−+−+");
    const r = directAcf(phaseCode({ kind: "barker", length: 13 }));
    let side = 0;
    for (let l = 1; l < 13; l++) side += 2 * r[l]! ** 2; // both sides of the (symmetric) autocorrelation
    expect(10 * Math.log10(side / r[0]! ** 2)).toBeCloseTo(-11.49, 2);
    expect(Array.from(phaseCode({ kind: "barker", length: 13 }).im).every((v) => v === 0)).toBe(true);
  });

  it("samples per chip repeat each chip; the chip-lag autocorrelation scales by the repeat", () => {
    const spc = 3;
    const s = phaseCode({ kind: "barker", length: 13 }, { samplesPerChip: spc });
    expect(s.re.length).toBe(39);
    expect(Array.from(s.re.subarray(15, 21))).toEqual([-1, -1, -1, -1, -1, -1]);
    const r = directAcf(s);
    const chip = directAcf(phaseCode({ kind: "barker", length: 13 }));
    for (let l = 0; l < 13; l++) expect(r[l * spc]).toBeCloseTo(chip[l]! * spc, 12);
    // Mainlobe to the first local minimum (lag spc here), as DESIGN.md defines it.
    let l = 0;
    while (r[l + 1]! < r[l]!) l++;
    expect(l).toBe(spc);
    expect(db20(Math.max(...r.subarray(l)) / r[0]!)).toBeCloseTo(-22.28, 2);
  });
});

describe("polyphase codes", () => {
  it("Frank N = 16 has PSL −21.1 dB (Richards 2014 p. 311)", () => {
    const r = directAcf(phaseCode({ kind: "frank", order: 4 }));
    expect(r.length).toBe(16);
    expect(db20(maxSide(r) / r[0]!)).toBeCloseTo(-21.07, 2);
  });

  it("Frank, P1 and P2 meet PSL = 20·log10(1/(N·sin(π/M))) for even M (REFERENCES.md, derived)", () => {
    // Measured: M = 6 → −25.10 dB, M = 8 → −27.78 dB, M = 10 → −29.80 dB for all three.
    for (const kind of ["frank", "p1", "p2"] as const) {
      for (const m of [4, 6, 8, 10]) {
        const r = directAcf(phaseCode({ kind, order: m }));
        const want = db20(1 / (m * m * Math.sin(Math.PI / m)));
        expect(Math.abs(db20(maxSide(r) / r[0]!) - want)).toBeLessThan(0.01);
      }
    }
  });

  it("Frank, P1, P4 (any N) and P3 (even N) have zero periodic sidelobes (Frank 1963; Chu, IEEE Trans. IT-18, 1972)", () => {
    const specs: PhaseCodeSpec[] = [
      { kind: "frank", order: 5 },
      { kind: "frank", order: 8 },
      { kind: "p1", order: 5 },
      { kind: "p1", order: 8 },
      { kind: "p3", length: 36 },
      { kind: "p3", length: 64 },
      { kind: "p4", length: 25 },
      { kind: "p4", length: 64 },
    ];
    for (const spec of specs) {
      const r = directAcf(phaseCode(spec), true);
      expect(maxSide(r) / r[0]!).toBeLessThan(1e-12);
    }
  });

  it("P2 is palindromic and each group is a constant frequency centred on 0 (Lewis & Kretschmer 1981, derived)", () => {
    const m = 6;
    const phi = phaseCodePhases({ kind: "p2", order: m });
    for (let i = 0; i < m * m; i++) expect(phi[i]).toBeCloseTo(phi[m * m - 1 - i]!, 12);
    const steps: number[] = [];
    for (let g = 0; g < m; g++) {
      const step = phi[g * m + 1]! - phi[g * m]!;
      for (let k = 1; k < m; k++) expect(phi[g * m + k]! - phi[g * m + k - 1]!).toBeCloseTo(step, 12);
      steps.push(step);
    }
    expect(steps.reduce((a, b) => a + b, 0)).toBeCloseTo(0, 12);
  });

  it("P4 is a sampled chirp with B = fs (Lewis & Kretschmer 1982), offset by half a frequency bin", () => {
    // Derived: π(i − (N−1)/2)²/N = πi²/N − πi + πi/N + const, so P4·conj(LFM) advances by −π/N per chip.
    const n = 64;
    const p4 = phaseCode({ kind: "p4", length: n });
    const lfm = linearFm({ bandwidthHz: 1, pulseWidthS: n, sampleRateHz: 1 });
    const prodPhase = (i: number) =>
      Math.atan2(
        p4.im[i]! * lfm.re[i]! - p4.re[i]! * lfm.im[i]!,
        p4.re[i]! * lfm.re[i]! + p4.im[i]! * lfm.im[i]!,
      );
    for (let i = 1; i < n; i++) {
      const d = prodPhase(i) - prodPhase(i - 1);
      const wrapped = Math.atan2(Math.sin(d), Math.cos(d));
      expect(wrapped).toBeCloseTo(-Math.PI / n, 10);
    }
  });

  it("P3 and P4 share their aperiodic autocorrelation magnitude (P4 = P3·(−1)^i, derived)", () => {
    for (const n of [25, 64]) {
      const a = directAcf(phaseCode({ kind: "p3", length: n }));
      const b = directAcf(phaseCode({ kind: "p4", length: n }));
      for (let l = 0; l < n; l++) expect(a[l]).toBeCloseTo(b[l]!, 9);
    }
  });

  it("bad input names the parameter", () => {
    expect(() => phaseCode({ kind: "barker", length: 6 as 7 })).toThrow(/code\.length/);
    expect(() => phaseCode({ kind: "barker", length: 6 as 7 })).toThrow(RangeError);
    expect(() => phaseCode({ kind: "frank", order: 1 })).toThrow(/code\.order/);
    expect(() => phaseCode({ kind: "frank", order: 2.5 })).toThrow(/code\.order/);
    expect(() => phaseCode({ kind: "p2", order: 5 })).toThrow(/even/);
    expect(() => phaseCode({ kind: "p3", length: Number.NaN })).toThrow(/code\.length/);
    expect(() => phaseCode({ kind: "p4", length: 0 })).toThrow(/code\.length/);
    expect(() => phaseCode({ kind: "barker", length: 13 }, { samplesPerChip: 0 })).toThrow(/samplesPerChip/);
    expect(() => phaseCode({ kind: "barker", length: 13 }, { samplesPerChip: Infinity })).toThrow(
      /samplesPerChip/,
    );
    expect(() => phaseCode({ kind: "golay" } as unknown as PhaseCodeSpec)).toThrow(TypeError);
  });
});

describe("nonlinear FM by stationary phase (Cook & Bernfeld 1967; Richards 2014 §4.6.3)", () => {
  const B = 1e6;

  it("a rectangular spectral window gives back the linear FM chirp (odd and even N)", () => {
    for (const fs of [3e6, 2e6]) {
      const s = nonlinearFm({
        bandwidthHz: B,
        pulseWidthS: 1e-4,
        sampleRateHz: fs,
        window: { kind: "rectangular" },
      });
      const l = linearFm({ bandwidthHz: B, pulseWidthS: 1e-4, sampleRateHz: fs });
      for (let i = 0; i < s.re.length; i++)
        expect(Math.hypot(s.re[i]! - l.re[i]!, s.im[i]! - l.im[i]!)).toBeLessThan(1e-12);
    }
  });

  it("has unit modulus and a monotonic sweep over −B/2..+B/2", () => {
    const opts = {
      bandwidthHz: B,
      pulseWidthS: 2e-4,
      sampleRateHz: 2e6,
      window: { kind: "hamming" },
    } as const;
    const s = nonlinearFm(opts);
    expect(s.re.length).toBe(400);
    for (let i = 0; i < 400; i++) expect(Math.hypot(s.re[i]!, s.im[i]!)).toBeCloseTo(1, 14);
    const f = nlfmFrequency(opts);
    for (let i = 1; i < f.length; i++) expect(f[i]!).toBeGreaterThan(f[i - 1]!);
    expect(f[0]!).toBeGreaterThan(-B / 2);
    expect(f[f.length - 1]!).toBeLessThan(B / 2);
    // Sweeps fastest where the window is small: the edges cover more band per sample than the centre.
    expect(f[1]! - f[0]!).toBeGreaterThan(3 * (f[201]! - f[200]!));
  });

  it("its power spectrum follows the window: Hamming at ±B/4 is 0.54 of the centre (−2.7 dB) at BT = 1000", () => {
    // Stationary phase (Cook & Bernfeld 1967): |S(f)|² ∝ W(f). Averaged over B/10-wide bands to smooth the Fresnel
    // ripple; the Hamming window at x = ¼ or ¾ of its span is 0.54 − 0.46·cos(π/2) = 0.54 (derived). Measured −2.64 dB.
    const fs = 4e6;
    const s = nonlinearFm({
      bandwidthHz: B,
      pulseWidthS: 1e-3,
      sampleRateHz: fs,
      window: { kind: "hamming" },
    });
    const size = 16384;
    const x = fftInterleaved(toInterleaved(s, size));
    const bandPower = (fc: number) => {
      let p = 0;
      for (let k = 0; k < size; k++) {
        const f = ((k < size / 2 ? k : k - size) * fs) / size;
        if (Math.abs(f - fc) <= B / 20) p += x[2 * k]! ** 2 + x[2 * k + 1]! ** 2;
      }
      return p;
    };
    const centre = bandPower(0);
    for (const fc of [-B / 4, B / 4])
      expect(Math.abs(10 * Math.log10(bandPower(fc) / centre) - 10 * Math.log10(0.54))).toBeLessThan(0.3);
  });

  it("autocorrelation PSL is far below the LFM's at BT = 100 and nears the window's level as BT grows", () => {
    // REFERENCES.md: LFM −13.39 dB at BT = 100 (eq. 4.99). Measured at fs = 2B, ×8 interpolation:
    // Taylor(n̄ 6, −35 dB) NLFM −29.3 dB at BT = 100, −34.4 dB at BT = 1000; Hamming NLFM −31.9 dB at BT = 100.
    const psl = (bt: number, window: Parameters<typeof nonlinearFm>[0]["window"]) => {
      const s = nonlinearFm({ bandwidthHz: B, pulseWidthS: bt / B, sampleRateHz: 2 * B, window });
      return peakSidelobe(compress(s, matchedFilter(s))).pslDb;
    };
    const taylor = { kind: "taylor", nbar: 6, sidelobeDb: -35 } as const;
    const lfm = linearFm({ bandwidthHz: B, pulseWidthS: 100 / B, sampleRateHz: 2 * B });
    const lfmPsl = peakSidelobe(compress(lfm, matchedFilter(lfm))).pslDb;
    expect(lfmPsl).toBeGreaterThan(-13.6);
    const t100 = psl(100, taylor);
    expect(t100).toBeLessThan(-25);
    expect(t100).toBeLessThan(lfmPsl - 12);
    expect(psl(100, { kind: "hamming" })).toBeLessThan(-25);
    const t1000 = psl(1000, taylor);
    expect(t1000).toBeLessThan(t100);
    expect(Math.abs(t1000 + 35)).toBeLessThan(1); // within 1 dB of the window's own −35 dB
  });

  it("bad input names the parameter", () => {
    const ok = { bandwidthHz: B, pulseWidthS: 1e-4, sampleRateHz: 2e6, window: { kind: "hann" } } as const;
    expect(() => nonlinearFm({ ...ok, bandwidthHz: Number.NaN })).toThrow(/bandwidthHz/);
    expect(() => nonlinearFm({ ...ok, bandwidthHz: 0 })).toThrow(/bandwidthHz/);
    expect(() => nonlinearFm({ ...ok, pulseWidthS: -1 })).toThrow(/pulseWidthS/);
    expect(() => nonlinearFm({ ...ok, sampleRateHz: 0.5e6 })).toThrow(/sampleRateHz/);
    expect(() => nonlinearFm({ ...ok, sampleRateHz: Infinity })).toThrow(/sampleRateHz/);
    expect(() => nonlinearFm({ ...ok, window: undefined as unknown as typeof ok.window })).toThrow(TypeError);
    expect(() => nonlinearFm({ ...ok, window: { kind: "kaiser", beta: Number.NaN } })).toThrow(/beta/);
  });
});
