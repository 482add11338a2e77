import { describe, expect, it } from "vitest";
import { createRng, portableLog, splitMix64, xoshiro128StarStar } from "@shared/dsp/random";
import { makeStimulus } from "@shared/dsp/stimulus";

// Independent xoshiro128** in BigInt, written from the published C reference (Blackman & Vigna 2018/2021).
function xoshiroBigInt(seed: [bigint, bigint, bigint, bigint]) {
  const s = [...seed];
  const M = 0xffffffffn;
  const rotl = (x: bigint, k: bigint) => ((x << k) | (x >> (32n - k))) & M;
  return () => {
    const result = (rotl((s[1]! * 5n) & M, 7n) * 9n) & M;
    const t = (s[1]! << 9n) & M;
    s[2]! ^= s[0]!;
    s[3]! ^= s[1]!;
    s[1]! ^= s[2]!;
    s[0]! ^= s[3]!;
    s[2]! ^= t;
    s[3] = rotl(s[3]!, 11n);
    return Number(result);
  };
}

describe("random", () => {
  it("xoshiro128** from state (1, 2, 3, 4) gives the reference outputs", () => {
    // First outputs of the reference C code from state {1,2,3,4} (values from memory), also checked
    // against the BigInt implementation above for 10,000 outputs.
    const fast = xoshiro128StarStar(1, 2, 3, 4);
    expect([fast(), fast(), fast(), fast(), fast(), fast()]).toEqual([
      11520, 0, 5927040, 70819200, 2031721883, 1637235492,
    ]);
    const a = xoshiro128StarStar(0x9e3779b9, 0x7f4a7c15, 0xdeadbeef, 0x01234567);
    const b = xoshiroBigInt([0x9e3779b9n, 0x7f4a7c15n, 0xdeadbeefn, 0x01234567n]);
    for (let i = 0; i < 10_000; i++) expect(a()).toBe(b());
  });

  it("SplitMix64 gives the published outputs", () => {
    // Seed 1234567 (values from memory of the reference test vectors used by xoshiro ports) and seed 0.
    let state = 1234567n;
    const outs: bigint[] = [];
    for (let i = 0; i < 5; i++) {
      const r = splitMix64(state);
      state = r.state;
      outs.push(r.value);
    }
    expect(outs).toEqual([
      6457827717110365317n,
      3203168211198807973n,
      9817491932198370423n,
      4593380528125082431n,
      16408922859458223821n,
    ]);
    expect(splitMix64(0n).value).toBe(0xe220a8397b1dcdafn);
  });

  it("pins the first values of createRng(42) (regression pins of this implementation)", () => {
    const r = createRng(42);
    expect(r.uniform()).toBe(0.4137016681565887);
    expect(r.gaussian()).toBe(0.5139502722128898);
    expect(r.nextUint32()).toBe(3162131937);
  });

  it("portableLog agrees with Math.log to 2e-16 relative over 1e-300..1e300", () => {
    for (let e = -300; e <= 300; e += 0.37) {
      const x = 10 ** e;
      const want = Math.log(x);
      expect(Math.abs(portableLog(x) - want)).toBeLessThanOrEqual(4e-16 * Math.max(1, Math.abs(want)));
    }
    expect(portableLog(1)).toBe(0);
  });

  it("uniform has mean 1/2, variance 1/12; gaussian mean 0, variance 1 (5 standard errors)", () => {
    const r = createRng(7);
    const n = 200_000;
    let su = 0;
    let su2 = 0;
    let sg = 0;
    let sg2 = 0;
    let outside = 0;
    for (let i = 0; i < n; i++) {
      const u = r.uniform();
      if (!(u >= 0 && u < 1)) outside++;
      su += u;
      su2 += u * u;
      const g = r.gaussian();
      sg += g;
      sg2 += g * g;
    }
    expect(outside).toBe(0);
    expect(Math.abs(su / n - 0.5)).toBeLessThan(5 * Math.sqrt(1 / 12 / n));
    expect(Math.abs(su2 / n - (su / n) ** 2 - 1 / 12)).toBeLessThan(5 * Math.sqrt(1 / 180 / n));
    expect(Math.abs(sg / n)).toBeLessThan(5 / Math.sqrt(n));
    expect(Math.abs(sg2 / n - 1)).toBeLessThan(5 * Math.sqrt(2 / n));
  });
});

// A baseband LFM chirp written here (s[n] = exp(jπ·(B/T)·t²), t centred), amplitude 1.
function chirp(n: number, bt: number) {
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const t = (i - (n - 1) / 2) / n;
    const phase = Math.PI * bt * t * t;
    re[i] = Math.cos(phase);
    im[i] = Math.sin(phase);
  }
  return { re, im };
}

// Naive correlation with the waveform at lag d: Σ x[d+m]·conj(s[m]).
function correlate(
  x: { re: Float64Array; im: Float64Array },
  s: { re: Float64Array; im: Float64Array },
  d: number,
) {
  let cr = 0;
  let ci = 0;
  for (let m = 0; m < s.re.length && d + m < x.re.length; m++) {
    cr += x.re[d + m]! * s.re[m]! + x.im[d + m]! * s.im[m]!;
    ci += x.im[d + m]! * s.re[m]! - x.re[d + m]! * s.im[m]!;
  }
  return { mag: Math.hypot(cr, ci), phase: Math.atan2(ci, cr) };
}

describe("makeStimulus", () => {
  const waveform = chirp(128, 64);
  const base = {
    waveform,
    length: 2048,
    targets: [
      { delay: 300, amplitude: 0.3 },
      { delay: 1100, amplitude: 0.15, phaseRad: 1.0 },
    ],
    noiseRms: 0.05,
    seed: 2024,
    inputBits: 14,
  };

  it("gives identical integers for the same seed and different ones for another seed", () => {
    const a = makeStimulus(base);
    const b = makeStimulus(base);
    const c = makeStimulus({ ...base, seed: 2025 });
    expect(Array.from(a.re)).toEqual(Array.from(b.re));
    expect(Array.from(a.im)).toEqual(Array.from(b.im));
    expect(a.scenario).toEqual(b.scenario);
    let differ = 0;
    for (let i = 0; i < a.re.length; i++) if (a.re[i] !== c.re[i]) differ++;
    expect(differ).toBeGreaterThan(1000);
    for (const v of [...a.re, ...a.im]) expect(Number.isInteger(v) && v >= -8192 && v <= 8191).toBe(true);
    expect(a.scenario.fullScaleCode).toBe(8191);
    expect(a.scenario.targets[0]).toEqual({ delay: 300, amplitude: 0.3, phaseRad: 0 });
    expect(JSON.parse(JSON.stringify(a.scenario))).toEqual(a.scenario); // serializable for the bundle
  });

  it("has the requested noise RMS within 2 % (noise only, 65,536 samples)", () => {
    const s = makeStimulus({ ...base, targets: [], length: 65536, noiseRms: 0.1, inputBits: 16 });
    let p = 0;
    for (let i = 0; i < s.re.length; i++) p += s.re[i]! ** 2 + s.im[i]! ** 2;
    const rms = Math.sqrt(p / s.re.length) / s.scenario.fullScaleCode;
    // Standard error of an RMS estimate over 2·65,536 Gaussian components ≈ 0.2 %.
    expect(Math.abs(rms / 0.1 - 1)).toBeLessThan(0.02);
    expect(s.clippedCount).toBe(0);
  });

  it("puts the targets at the stated delays with the stated phase (found by correlation)", () => {
    const s = makeStimulus(base);
    const mags = Array.from({ length: base.length }, (_, d) => correlate(s, waveform, d).mag);
    const best = mags.indexOf(Math.max(...mags));
    expect(best).toBe(300);
    // The second target: the largest peak at least one pulse length away from the first.
    const second = mags.reduce((bi, m, i) => (Math.abs(i - 300) > 128 && m > (mags[bi] ?? -1) ? i : bi), 0);
    expect(second).toBe(1100);
    // Amplitude ratio 0.15/0.3 and phase 1.0 rad, up to noise (SNR after compression ≈ 128·0.15²/0.05²).
    expect(mags[1100]! / mags[300]!).toBeCloseTo(0.5, 1);
    expect(Math.abs(correlate(s, waveform, 1100).phase - 1.0)).toBeLessThan(0.05);
    expect(Math.abs(correlate(s, waveform, 300).phase)).toBeLessThan(0.05);
  });

  it("saturates and reports clips when the echo exceeds full scale", () => {
    const s = makeStimulus({ ...base, targets: [{ delay: 0, amplitude: 1.5 }], noiseRms: 0 });
    expect(s.clippedCount).toBeGreaterThan(0);
    expect(s.scenario.quantization.clippedCount).toBe(s.clippedCount);
    expect(Math.max(...s.re)).toBe(8191);
    expect(Math.min(...s.re)).toBe(-8192);
  });

  it("rejects bad input with errors naming the parameter", () => {
    expect(() => makeStimulus({ ...base, inputBits: 1 })).toThrow(/inputBits/);
    expect(() => makeStimulus({ ...base, length: 0 })).toThrow(/length/);
    expect(() => makeStimulus({ ...base, seed: -1 })).toThrow(/seed/);
    expect(() => makeStimulus({ ...base, seed: 1.5 })).toThrow(/seed/);
    expect(() => makeStimulus({ ...base, noiseRms: NaN })).toThrow(/noiseRms/);
    expect(() => makeStimulus({ ...base, targets: [{ delay: 5000, amplitude: 0.1 }] })).toThrow(
      /targets\[0\]\.delay/,
    );
    expect(() => makeStimulus({ ...base, targets: [{ delay: 1, amplitude: -1 }] })).toThrow(
      /targets\[0\]\.amplitude/,
    );
    expect(() =>
      makeStimulus({ ...base, waveform: { re: new Float64Array(0), im: new Float64Array(0) } }),
    ).toThrow(/waveform\.re/);
    expect(() =>
      makeStimulus({ ...base, waveform: { re: Float64Array.of(Infinity), im: Float64Array.of(0) } }),
    ).toThrow(/waveform\.re\[0\]/);
  });
});
