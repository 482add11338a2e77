/**
 * The analysis's numbers against independent computations: brute-force band-limited references
 * (direct correlation, then y(t) = Σ y[k]·sinc(t − k) summed directly), textbook values, BigInt.
 */
import { describe, expect, it } from "vitest";
import { ZodError } from "zod";
import { analyze } from "@shared/dsp/analysis";
import { shiftRoundBigInt } from "@shared/dsp/bit-true";
import { quantize, ROUNDING_CODE, roundByCode } from "@shared/dsp/quantize";
import { createRng } from "@shared/dsp/random";
import type { FixedPointSpec, RoundingMode } from "@shared/dsp/types";

type C = { re: number[]; im: number[] };

/** Linear cross-correlation output y = s ∗ h, direct sums (2N−1 points). */
function convolve(s: C, h: C): C {
  const n = s.re.length + h.re.length - 1;
  const y: C = { re: new Array<number>(n).fill(0), im: new Array<number>(n).fill(0) };
  for (let i = 0; i < s.re.length; i++)
    for (let j = 0; j < h.re.length; j++) {
      y.re[i + j]! += s.re[i]! * h.re[j]! - s.im[i]! * h.im[j]!;
      y.im[i + j]! += s.re[i]! * h.im[j]! + s.im[i]! * h.re[j]!;
    }
  return y;
}

/** |y(t)|² of the band-limited (aperiodic) interpolation of y at t, by direct sinc sums. */
function bandLimited(y: C, t: number): number {
  let re = 0;
  let im = 0;
  for (let k = 0; k < y.re.length; k++) {
    const x = t - k;
    const c = x === 0 ? 1 : Math.sin(Math.PI * x) / (Math.PI * x);
    re += c * y.re[k]!;
    im += c * y.im[k]!;
  }
  return re * re + im * im;
}

/** |y_a(t)|² of the analytic signal of a real y: sinc plus j·its Hilbert transform (1 − cos πx)/(πx). */
function analytic(y: C, t: number): number {
  let re = 0;
  let im = 0;
  for (let k = 0; k < y.re.length; k++) {
    const x = t - k;
    re += (x === 0 ? 1 : Math.sin(Math.PI * x) / (Math.PI * x)) * y.re[k]!;
    im += (x === 0 ? 0 : (1 - Math.cos(Math.PI * x)) / (Math.PI * x)) * y.re[k]!;
  }
  return re * re + im * im;
}

/** PSL, ISLR (over the grid, sidelobes out to `pad` samples beyond the output) and −3 dB width. */
function bruteForce(y: C, u: number, pad = 200, at: (y: C, t: number) => number = bandLimited) {
  const bandLimited = at;
  const from = -pad * u;
  const p: number[] = [];
  for (let j = from; j <= (y.re.length + pad) * u; j++) p.push(bandLimited(y, j / u));
  let pk = 0;
  for (let i = 1; i < p.length; i++) if (p[i]! > p[pk]!) pk = i;
  let l = pk;
  while (l > 0 && p[l - 1]! < p[l]!) l--;
  let r = pk;
  while (r + 1 < p.length && p[r + 1]! < p[r]!) r++;
  let side = 0;
  let sideE = 0;
  let mainE = 0;
  for (let i = 0; i < p.length; i++) {
    if (i >= l && i <= r) mainE += p[i]!;
    else {
      sideE += p[i]!;
      side = Math.max(side, p[i]!);
    }
  }
  // −3 dB crossings by bisection on the band-limited output itself.
  const t0 = (pk + from) / u;
  const half = p[pk]! / 2;
  const cross = (dir: 1 | -1) => {
    let a = t0;
    let b = t0 + dir;
    while (bandLimited(y, b) >= half) b += dir;
    for (let k = 0; k < 60; k++) {
      const c = (a + b) / 2;
      if (bandLimited(y, c) >= half) a = c;
      else b = c;
    }
    return a;
  };
  return {
    pslDb: 10 * Math.log10(side / p[pk]!),
    islrDb: 10 * Math.log10(sideE / mainE),
    width: cross(1) - cross(-1),
  };
}

const BARKER: Record<number, number[]> = {
  5: [1, 1, 1, -1, 1],
  13: [1, 1, 1, 1, 1, -1, -1, 1, 1, -1, 1, -1, 1],
};
const fp = { wordLength: 16, fractionLength: 15 };
const barker = (length: 5 | 13, extra: object = {}) => ({
  kind: "waveform",
  tx: { kind: "phase-code", code: { kind: "barker", length }, sampleRateHz: 1e6 },
  fixedPoint: { tx: fp, rx: fp },
  ...extra,
});

describe("short sequences at U > 1 do not alias (brute-force band-limited reference)", () => {
  it.each([
    [5, -11.3],
    [13, -15.09],
  ] as const)("Barker-%i at U = 8 reads PSL %f dB, as the direct sinc sum gives", (length, rounded) => {
    const c = BARKER[length]!;
    const y = convolve({ re: c, im: c.map(() => 0) }, { re: [...c].reverse(), im: c.map(() => 0) });
    const ref = bruteForce(y, 8, 1000);
    const r = analyze(barker(length, { interpolation: 8 }));
    expect(ref.pslDb).toBeCloseTo(rounded, 2);
    expect(Math.abs(r.float.pslDb! - ref.pslDb)).toBeLessThan(0.005);
    expect(Math.abs(r.float.islrDb! - ref.islrDb)).toBeLessThan(0.02);
    expect(r.measurement?.interpolation).toBe(8);
    expect(r.measurement?.interpolationDefaulted).toBe(false);
  });

  it("Barker-13 at the default settings gives the textbook PSL 20·log10(1/13) = −22.28 dB (Barker 1953; Levanon & Mozeson, Radar Signals, 2004, table 6.1)", () => {
    const r = analyze(barker(13));
    expect(r.interpolation).toBe(1);
    expect(r.measurement).toMatchObject({ interpolation: 1, interpolationDefaulted: true });
    expect(r.measurement?.mainlobe).toMatch(/first local minimum/);
    expect(r.float.pslDb).toBeCloseTo(20 * Math.log10(1 / 13), 9);
  });
});

describe("real IF waveforms are measured on the envelope", () => {
  it("LFM 2 MHz / 20 µs, fs 16 MHz, IF 3 MHz, Hamming: the baseband figures (brute force on the complex baseband pulse)", () => {
    const B = 2e6;
    const T = 20e-6;
    const fs = 16e6;
    const r = analyze({
      kind: "waveform",
      tx: {
        kind: "lfm",
        bandwidthHz: B,
        pulseWidthS: T,
        sampleRateHz: fs,
        output: "real",
        intermediateFrequencyHz: 3e6,
      },
      rx: { window: { kind: "hamming" } },
      fixedPoint: { tx: fp, rx: fp },
    });
    expect(r.measurement?.signal).toBe("envelope");
    // Independent: the real output by direct correlation, its analytic signal by direct sums of the
    // band-limited kernel and its Hilbert transform; the same pulse from its formula (centred time).
    const n = Math.round(T * fs);
    const s: C = { re: [], im: [] };
    for (let i = 0; i < n; i++) {
      const t = (i - (n - 1) / 2) / fs;
      s.re.push(Math.cos(2 * Math.PI * 3e6 * t + (Math.PI * B * t * t) / T));
      s.im.push(0);
    }
    const h: C = { re: [], im: [] };
    for (let i = 0; i < n; i++) {
      const w = 0.54 - 0.46 * Math.cos((2 * Math.PI * i) / (n - 1));
      h.re.push(w * s.re[n - 1 - i]!);
      h.im.push(0);
    }
    const ref = bruteForce(convolve(s, h), 8, 40, analytic);
    expect(Math.abs(r.float.pslDb! - ref.pslDb)).toBeLessThan(0.05);
    expect(Math.abs(r.float.islrDb! - ref.islrDb)).toBeLessThan(0.05);
    expect(Math.abs(r.float.width3dbSamples! / ref.width - 1)).toBeLessThan(1e-3);
    // Near the baseband figures (PSL −34.5, ISLR −21.0 dB, 10.5 samples; the negative-frequency image's
    // skirts add a little), far from the carrier's (PSL −0.76 dB, width 1.32 samples).
    expect(r.float.pslDb!).toBeLessThan(-33);
    expect(r.float.islrDb!).toBeLessThan(-20.5);
    expect(r.float.width3dbSamples!).toBeCloseTo(10.5, 0);
  });
});

describe("the −3 dB width is the band-limited crossing at every U", () => {
  it("at U = 1 a complex LFM's width is the brute-force crossing, not the straight line between samples", () => {
    const spec = (u: number) => ({
      kind: "waveform",
      tx: { kind: "lfm", bandwidthHz: 1e6, pulseWidthS: 100e-6, sampleRateHz: 1.25e6 },
      rx: { window: { kind: "taylor", nbar: 5, sidelobeDb: -35 } },
      fixedPoint: { tx: fp, rx: fp },
      interpolation: u,
    });
    const r1 = analyze(spec(1));
    const r8 = analyze(spec(8));
    expect(Math.abs(r1.float.width3dbSamples! - r8.float.width3dbSamples!)).toBeLessThan(1e-6);
    // Brute force with the rectangular filter (its width is also the textbook 0.886/B): the pulse from its formula.
    const rect = (u: number) => ({ ...spec(u), rx: { window: { kind: "rectangular" } } });
    const n = 125;
    const s: C = { re: [], im: [] };
    for (let i = 0; i < n; i++) {
      const t = (i - (n - 1) / 2) / 1.25e6;
      s.re.push(Math.cos((Math.PI * 1e6 * t * t) / 100e-6));
      s.im.push(Math.sin((Math.PI * 1e6 * t * t) / 100e-6));
    }
    const h: C = { re: [...s.re].reverse(), im: [...s.im].reverse().map((v) => -v) };
    const ref = bruteForce(convolve(s, h), 1, 10);
    const w1 = analyze(rect(1)).float.width3dbSamples!;
    expect(Math.abs(w1 - ref.width)).toBeLessThan(1e-4);
    expect(Math.abs(w1 / (0.886 * 1.25) - 1)).toBeLessThan(0.01); // Richards 2014, rectangular LFM −3 dB width ≈ 0.886/B
  });
});

describe("degenerate and refused inputs", () => {
  it("refuses a one-sample pulse (it has no sidelobes)", () => {
    expect(() =>
      analyze({
        kind: "waveform",
        tx: { kind: "samples", sampleRateHz: 1e6, re: [1] },
        fixedPoint: { tx: fp, rx: fp },
      }),
    ).toThrow(/at least 2 are needed/);
  });

  it("reports PSL and ISLR as null (no sidelobes) when the whole output is mainlobe", () => {
    // [1, 1] ⋆ [1, 1] = [1, 2, 1]: at U = 1 the lobe runs to both ends, nothing is left for sidelobes.
    const r = analyze({
      kind: "waveform",
      tx: { kind: "samples", sampleRateHz: 1e6, re: [1, 1] },
      fixedPoint: { tx: fp, rx: fp },
      interpolation: 1,
    });
    expect(r.float.pslDb).toBeNull();
    expect(r.float.islrDb).toBeNull();
  });

  it("names an unknown key instead of dropping it (rx.windw)", () => {
    let err: unknown;
    try {
      analyze({
        kind: "waveform",
        tx: { kind: "lfm", bandwidthHz: 1e6, pulseWidthS: 10e-6, sampleRateHz: 2e6 },
        rx: { windw: { kind: "hamming" } },
        fixedPoint: { tx: fp, rx: fp },
      });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(ZodError);
    expect(JSON.stringify((err as ZodError).issues)).toMatch(/windw/);
    expect((err as ZodError).issues[0]!.path).toEqual(["rx"]);
  });

  it("refuses signed: false on a bipolar table, naming how many components are negative", () => {
    expect(() =>
      analyze({
        kind: "waveform",
        tx: { kind: "lfm", bandwidthHz: 1e6, pulseWidthS: 80e-6, sampleRateHz: 2e6 },
        fixedPoint: { tx: fp, rx: { ...fp, signed: false } },
      }),
    ).toThrow(/fixedPoint\.rx\.signed: false, but the rx table has \d+ negative components of 320/);
  });

  it("puts the Dolph-Chebyshev edge-spike warning in the report", () => {
    const r = analyze({
      kind: "waveform",
      tx: { kind: "lfm", bandwidthHz: 1e6, pulseWidthS: 1e-3, sampleRateHz: 2e6 },
      rx: { window: { kind: "chebyshev", attenuationDb: 40 } },
      fixedPoint: { tx: fp, rx: fp },
    });
    expect(r.warnings?.some((w) => /Dolph-Chebyshev 40 dB over 2000 samples/.test(w))).toBe(true);
  });

  it("rounds T·fs = 312.5 up to 313 samples (documented rule: round half away from zero)", () => {
    const r = analyze({
      kind: "waveform",
      tx: { kind: "lfm", bandwidthHz: 1e6, pulseWidthS: 312.5e-6, sampleRateHz: 1e6 },
      fixedPoint: { tx: fp, rx: fp },
    });
    expect(r.tables[0]!.length).toBe(313);
  });
});

describe("rounding at exact lattice points and the two added modes", () => {
  const spec = (rounding: RoundingMode, fractionLength = 15): FixedPointSpec => ({
    wordLength: 16,
    fractionLength,
    signed: true,
    scaling: "as-given",
    rounding,
    overflow: "saturate",
  });
  const codes = (xs: number[], mode: RoundingMode, f?: number) =>
    Array.from(quantize({ re: Float64Array.from(xs), im: new Float64Array(xs.length) }, spec(mode, f)).re);

  it("cos(π/2) (6.1e-17, not 0) is code 0 under floor, toward-zero and ceiling", () => {
    const x = [1, Math.cos(Math.PI / 2), -Math.cos(Math.PI / 2), 0.5];
    for (const mode of ["floor", "toward-zero", "ceiling"] as const) expect(codes(x, mode)[1]).toBe(0);
    expect(codes(x, "floor")[2]).toBe(0);
    expect(codes([1, -1e-9], "floor")[1]).toBe(-1); // a real negative value still floors down
  });

  it("floor and toward-zero leave exact lattice values alone (Q.2: ±0.25 → ±1, ±0.75 → ±3)", () => {
    for (const mode of ["floor", "toward-zero", "ceiling", "nearest-up"] as const)
      expect(codes([0.25, -0.25, 0.75, -0.75], mode, 2)).toEqual([1, -1, 3, -3]);
  });

  it("nearest-up rounds ties toward +∞ (add ½ LSB, floor); ceiling rounds toward +∞", () => {
    expect(codes([2.5, -2.5, 2.4, -2.6, 0.5, -0.5], "nearest-up", 0)).toEqual([3, -2, 2, -3, 1, 0]);
    expect(codes([2.1, -2.9, 2, -2, 0.01], "ceiling", 0)).toEqual([3, -2, 2, -2, 1]);
  });

  it("the bit-true shift rounds as the BigInt definitions (add half then floor; −floor(−x)), float path included", () => {
    const rng = createRng(11);
    for (let i = 0; i < 2000; i++) {
      const shift = 1 + Math.floor(rng.uniform() * 12);
      const acc = BigInt(Math.round((rng.uniform() * 2 - 1) * 2 ** 20));
      const s = BigInt(shift);
      const up = (acc + (1n << (s - 1n))) >> s;
      const ceil = -(-acc >> s);
      expect(shiftRoundBigInt(acc, shift, "nearest-up")).toBe(up);
      expect(shiftRoundBigInt(acc, shift, "ceiling")).toBe(ceil);
      const u = Number(acc) * 2 ** -shift;
      expect(BigInt(roundByCode(u, ROUNDING_CODE["nearest-up"]))).toBe(up);
      expect(BigInt(roundByCode(u, ROUNDING_CODE.ceiling) + 0)).toBe(ceil);
    }
  });
});
