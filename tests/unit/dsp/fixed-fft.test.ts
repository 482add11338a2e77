import { describe, expect, it } from "vitest";
import { fftInterleaved } from "@shared/dsp/fft";
import {
  bitReverse,
  fixedFft,
  fixedIfft,
  twiddleTable,
  type StageSchedule,
} from "@shared/dsp/fast-convolution/fixed-fft";
import type { OverflowMode, RoundingMode } from "@shared/dsp/types";
import { naiveDft, randomCodes, refFft, spec } from "./fixed-fft-reference";

const MODES: RoundingMode[] = ["nearest-away", "nearest-even", "floor", "toward-zero"];

// ---- tests ------------------------------------------------------------------------------------

describe("fixed-point radix-2 DIT FFT: bit for bit against the BigInt recurrence", () => {
  const schedules: StageSchedule[] = [
    { kind: "every-stage" },
    { kind: "block-floating-point", rule: "worst-case" },
    { kind: "block-floating-point", rule: "measured" },
  ];
  const overflows: OverflowMode[] = ["saturate", "wrap"];
  let seed = 1;
  for (const n of [8, 16, 32, 64]) {
    it(`N = ${n}: every schedule, rounding mode, overflow mode and guard width`, () => {
      const m = Math.log2(n);
      const sch = [
        ...schedules,
        { kind: "stages" as const, shifts: Array.from({ length: m }, (_, i) => i % 3) },
      ];
      let cases = 0;
      let overflowSeen = 0;
      for (const schedule of sch)
        for (const rounding of MODES)
          for (const overflow of overflows)
            for (const [wd, wt, g] of [
              [6, 5, 0],
              [9, 9, 8],
              [12, 8, 3],
            ] as const) {
              const x = randomCodes(seed++, n, wd);
              const s = spec({
                dataBits: wd,
                twiddleBits: wt,
                productGuardBits: g,
                rounding,
                overflow,
                schedule,
                twiddleRounding: rounding,
              });
              const got = fixedFft(x.re, x.im, s);
              const want = refFft(x.re, x.im, s);
              expect(Array.from(got.re)).toEqual(want.re);
              expect(Array.from(got.im)).toEqual(want.im);
              expect(got.stageShifts).toEqual(want.shifts);
              expect(got.overflowCount).toBe(want.overflow);
              overflowSeen += got.overflowCount;
              cases++;
            }
      expect(cases).toBe(4 * 4 * 2 * 3);
      expect(overflowSeen).toBeGreaterThan(0); // the "stages" schedule with zero shifts overflows
    });
  }

  it("widest words (Wd = Wt = 26, exact sums near 2^52) stay bit-exact", () => {
    for (const schedule of [
      { kind: "every-stage" } as const,
      { kind: "block-floating-point", rule: "measured" } as const,
    ]) {
      const x = randomCodes(99, 32, 26);
      const s = spec({ dataBits: 26, twiddleBits: 26, productGuardBits: 25, schedule });
      const got = fixedFft(x.re, x.im, s);
      const want = refFft(x.re, x.im, s);
      expect(Array.from(got.re)).toEqual(want.re);
      expect(Array.from(got.im)).toEqual(want.im);
    }
  });

  it("block floating point never overflows on full-scale input", () => {
    for (let t = 0; t < 20; t++) {
      const x = randomCodes(500 + t, 64, 8);
      for (const rule of ["worst-case", "measured"] as const) {
        const r = fixedFft(
          x.re,
          x.im,
          spec({ dataBits: 8, schedule: { kind: "block-floating-point", rule } }),
        );
        expect(r.overflowCount).toBe(0);
      }
    }
    // A constant (all energy into bin 0) grows by 2 per stage: measured BFP shifts every stage.
    const c = new Array<number>(64).fill(127);
    const r = fixedFft(
      c,
      new Array<number>(64).fill(0),
      spec({ dataBits: 8, schedule: { kind: "block-floating-point", rule: "measured" } }),
    );
    expect(r.stageShifts).toEqual([1, 1, 1, 1, 1, 1]);
    expect(r.re[0]).toBe(127);
  });
});

describe("inverse transform (I/Q swap form) against the conjugate-twiddle recurrence", () => {
  it("bit for bit, every schedule and rounding mode", () => {
    let seed = 9000;
    for (const n of [8, 32, 64])
      for (const schedule of [
        { kind: "every-stage" } as const,
        { kind: "block-floating-point", rule: "worst-case" } as const,
        { kind: "block-floating-point", rule: "measured" } as const,
      ])
        for (const rounding of MODES) {
          const x = randomCodes(seed++, n, 9);
          const s = spec({ dataBits: 9, twiddleBits: 8, productGuardBits: 2, rounding, schedule });
          const got = fixedIfft(x.re, x.im, s);
          const want = refFft(x.re, x.im, s, true);
          expect(Array.from(got.re)).toEqual(want.re);
          expect(Array.from(got.im)).toEqual(want.im);
          expect(got.stageShifts).toEqual(want.shifts);
        }
  });
});

describe("hand-computed N = 2 butterflies (rounding of the stage shift)", () => {
  // X0 = (x0 + x1)/2, X1 = (x0 − x1)/2 with shift 1; ±1.5 exercises every tie rule.
  const cases: [RoundingMode, number, number][] = [
    ["nearest-even", 2, -2],
    ["nearest-away", 2, -2],
    ["floor", 1, -2],
    ["toward-zero", 1, -1],
  ];
  for (const [mode, pos, neg] of cases)
    it(mode, () => {
      const s = spec({ dataBits: 4, rounding: mode });
      expect(Array.from(fixedFft([3, 0], [0, 0], s).re)).toEqual([pos, pos]);
      expect(Array.from(fixedFft([-3, 0], [0, 0], s).re)).toEqual([neg, neg]);
      expect(Array.from(fixedFft([3, 1], [0, 0], s).re)).toEqual([2, 1]);
    });
});

describe("no-quantization limit against float DFTs", () => {
  it("wide words and no shifts give the DFT within twiddle round-off", () => {
    for (const n of [8, 64, 1024]) {
      const x = randomCodes(7 + n, n, 14); // |x| < 2^13, growth ≤ N·2^13 < 2^25
      const r = fixedFft(
        x.re,
        x.im,
        spec({
          dataBits: 26,
          twiddleBits: 26,
          productGuardBits: 25,
          schedule: { kind: "stages", shifts: new Array<number>(Math.log2(n)).fill(0) },
        }),
      );
      const buf = new Float64Array(2 * n);
      for (let i = 0; i < n; i++) {
        buf[2 * i] = x.re[i]!;
        buf[2 * i + 1] = x.im[i]!;
      }
      const f = fftInterleaved(buf);
      let err = 0;
      let sq = 0;
      let peak = 0;
      for (let k = 0; k < n; k++) {
        const dr = r.re[k]! - f[2 * k]!;
        const di = r.im[k]! - f[2 * k + 1]!;
        err = Math.max(err, Math.abs(dr), Math.abs(di));
        sq += dr * dr + di * di;
        peak = Math.max(peak, Math.hypot(f[2 * k]!, f[2 * k + 1]!));
      }
      const m = Math.log2(n);
      const twiddle = m * peak * 2 ** -24; // |W_q − W| ≤ 2^-25·√2 per product, m products
      // Worst case: stage s's rounding (≤ 1/2 per component, ≤ 1/√2 in modulus) grows ×2 per later stage.
      expect(err).toBeLessThanOrEqual((n - 1) / Math.SQRT2 + twiddle);
      // Typical: variance 1/12 per component per stage, power ×2 per later stage → ≈ N/12 per component.
      expect(Math.sqrt(sq / (2 * n))).toBeLessThan(2 * Math.sqrt(n / 12) + twiddle);
      if (n <= 64) {
        const d = naiveDft(x.re, x.im);
        for (let k = 0; k < n; k++) expect(Math.abs(d.re[k]! - f[2 * k]!)).toBeLessThan(1e-6 * peak);
      }
    }
  });

  it("inverse (I/Q swap form) with shift-every-stage undoes an unscaled forward transform", () => {
    const n = 256;
    const x = randomCodes(3, n, 12);
    const wide = spec({ dataBits: 26, twiddleBits: 24, productGuardBits: 23 });
    const X = fixedFft(x.re, x.im, {
      ...wide,
      schedule: { kind: "stages", shifts: new Array<number>(8).fill(0) },
    });
    const y = fixedIfft(X.re, X.im, wide);
    expect(y.exponent).toBe(8);
    for (let i = 0; i < n; i++) {
      expect(Math.abs(y.re[i]! - x.re[i]!)).toBeLessThanOrEqual(1);
      expect(Math.abs(y.im[i]! - x.im[i]!)).toBeLessThanOrEqual(1);
    }
    // and the inverse's direction: a single bin k = 1 gives e^{+j2πn/N}
    const d = naiveDft([0, 1000, 0, 0, 0, 0, 0, 0], new Array<number>(8).fill(0), +1);
    const z = fixedIfft(
      [0, 1000, 0, 0, 0, 0, 0, 0],
      new Array<number>(8).fill(0),
      spec({
        dataBits: 16,
        twiddleBits: 16,
        productGuardBits: 15,
        schedule: { kind: "stages", shifts: [0, 0, 0] },
      }),
    );
    for (let i = 0; i < 8; i++) {
      expect(Math.abs(z.re[i]! - d.re[i]!)).toBeLessThanOrEqual(1);
      expect(Math.abs(z.im[i]! - d.im[i]!)).toBeLessThanOrEqual(1);
    }
  });
});

describe("twiddle table", () => {
  it("rounds 2^(Wt−1)·(cos, −sin) with the chosen mode and keeps the circle's symmetries", () => {
    const n = 256;
    const t = twiddleTable(n, 12, "nearest-even");
    const one = 2048;
    for (let k = 1; k < n / 2; k++) {
      expect(Math.abs(t.cos[k]! - one * Math.cos((2 * Math.PI * k) / n))).toBeLessThanOrEqual(0.5);
      expect(Math.abs(t.sin[k]! + one * Math.sin((2 * Math.PI * k) / n))).toBeLessThanOrEqual(0.5);
      expect(t.cos[k]! + t.cos[n / 2 - k]!).toBe(0); // cos(π − θ) = −cos θ, exactly
      expect(t.sin[k]).toBe(t.sin[n / 2 - k]);
      if (k < n / 4) expect(t.cos[k]! + t.sin[n / 4 - k]!).toBe(0);
    }
    expect(t.cos[n / 4]).toBe(0);
    expect(t.sin[n / 4]).toBe(-one); // −1 fits a signed word exactly
    expect(t.saturated).toBe(0);
    const f = twiddleTable(n, 12, "floor");
    for (let k = 1; k < n / 2; k++) expect(f.cos[k]).toBe(Math.floor(one * Math.cos((2 * Math.PI * k) / n)));
  });

  it("saturates entries that round up to +1 and counts them", () => {
    // cos(2π·k/4096)·2^15 ≥ 32767.5 for k ≤ 5 (1 − cos x ≈ x²/2 ≤ 2^-16)
    const t = twiddleTable(4096, 16, "nearest-even");
    const expected = Array.from({ length: 2047 }, (_, i) => i + 1).filter(
      (k) => Math.round(32768 * Math.cos((2 * Math.PI * k) / 4096)) >= 32768,
    ).length;
    expect(expected).toBeGreaterThan(0);
    expect(t.saturated).toBe(expected);
    expect(t.cos[1]).toBe(32767);
  });

  it("bit reversal", () => {
    expect([0, 1, 2, 3, 4, 5, 6, 7].map((i) => bitReverse(i, 3))).toEqual([0, 4, 2, 6, 1, 5, 3, 7]);
  });
});

describe("validation says what cannot work", () => {
  it("sizes, widths, schedules and codes", () => {
    expect(() => fixedFft(new Array<number>(12).fill(0), new Array<number>(12).fill(0), spec({}))).toThrow(
      /must be a power of two .* got 12; the nearest are 8 and 16/,
    );
    expect(() => fixedFft([0, 0], [0], spec({}))).toThrow(/input.im must have 2 elements/);
    expect(() => fixedFft([600, 0], [0, 0], spec({}))).toThrow(
      /input.re\[0\] must be an integer code in -512..511/,
    );
    expect(() => fixedFft([0, 0], [0, 0], spec({ dataBits: 3 }))).toThrow(/fft.dataBits must be in 4..26/);
    expect(() => fixedFft([0, 0], [0, 0], spec({ productGuardBits: 10 }))).toThrow(
      /productGuardBits must be in 0..9/,
    );
    expect(() =>
      fixedFft([0, 0, 0, 0], [0, 0, 0, 0], spec({ schedule: { kind: "stages", shifts: [1] } })),
    ).toThrow(/one entry per stage \(2\), got 1/);
    expect(() =>
      fixedFft([0, 0, 0, 0], [0, 0, 0, 0], spec({ schedule: { kind: "stages", shifts: [1, 3] } })),
    ).toThrow(/shifts\[1\] must be in 0..2/);
  });
});
