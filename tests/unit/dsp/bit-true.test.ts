import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { accumulatorGrowth } from "@shared/dsp/accumulator";
import { bitTrueFilter, shiftRoundBigInt } from "@shared/dsp/bit-true";
import type { OverflowMode, RoundingMode } from "@shared/dsp/types";

const MODES: RoundingMode[] = ["nearest-away", "nearest-even", "floor", "toward-zero"];

// Independent reference: rounding of acc / 2^s by exact rational comparison (BigInt division
// truncates toward zero; 2·remainder is compared with the divisor), not by shifts.
function refRound(acc: bigint, s: number, mode: RoundingMode): bigint {
  const d = 2n ** BigInt(s);
  const t = acc / d; // toward zero
  const rem = acc - t * d; // same sign as acc
  if (rem === 0n || mode === "toward-zero") return t;
  const down = acc < 0n ? t - 1n : t; // floor
  if (mode === "floor") return down;
  const twice = 2n * (acc - down * d); // 2·(fractional part)·d, in (0, 2d)
  if (twice > d) return down + 1n;
  if (twice < d) return down;
  if (mode === "nearest-away") return acc > 0n ? down + 1n : down;
  return down % 2n === 0n ? down : down + 1n;
}

// Independent reference: textbook direct convolution y[n] = Σ_k h[k]·x[n−k] in BigInt, then the
// reference rounding, then saturate or wrap by modular arithmetic written out.
function refFilter(
  x: { re: number[]; im: number[] },
  h: { re: number[]; im: number[] },
  shift: number,
  mode: RoundingMode,
  overflow: OverflowMode,
  bits: number,
) {
  const ny = x.re.length + h.re.length - 1;
  const lo = -(2n ** BigInt(bits - 1));
  const hi = 2n ** BigInt(bits - 1) - 1n;
  const m = 2n ** BigInt(bits);
  let overflows = 0;
  const fix = (v: bigint) => {
    if (v >= lo && v <= hi) return v;
    overflows++;
    if (overflow === "saturate") return v > hi ? hi : lo;
    return ((((v - lo) % m) + m) % m) + lo;
  };
  const re: number[] = [];
  const im: number[] = [];
  for (let n = 0; n < ny; n++) {
    let ar = 0n;
    let ai = 0n;
    for (let k = 0; k < h.re.length; k++) {
      const j = n - k;
      if (j < 0 || j >= x.re.length) continue;
      const [a, b, c, d] = [h.re[k]!, h.im[k]!, x.re[j]!, x.im[j]!].map(BigInt) as [
        bigint,
        bigint,
        bigint,
        bigint,
      ];
      ar += a * c - b * d;
      ai += a * d + b * c;
    }
    re.push(Number(fix(refRound(ar, shift, mode))));
    im.push(Number(fix(refRound(ai, shift, mode))));
  }
  return { re, im, overflows };
}

const codes = (bits: number, len: { min: number; max: number }) =>
  fc.array(fc.integer({ min: -(2 ** (bits - 1)), max: 2 ** (bits - 1) - 1 }), {
    minLength: len.min,
    maxLength: len.max,
  });

function complexCodes(bits: number, len: { min: number; max: number }) {
  return fc
    .integer({ min: len.min, max: len.max })
    .chain((n) => fc.record({ re: codes(bits, { min: n, max: n }), im: codes(bits, { min: n, max: n }) }));
}

describe("bitTrueFilter", () => {
  // One property for both paths: random codes of the given widths, every shift, rounding and overflow.
  function agreesWithReference(
    widths: { x: number; h: number; nx: number; nh: number; maxShift: number; maxBits: number },
    path: "float64" | "bigint",
    runs: number,
    seed: number,
  ) {
    fc.assert(
      fc.property(
        complexCodes(widths.x, { min: 1, max: widths.nx }),
        complexCodes(widths.h, { min: 1, max: widths.nh }),
        fc.integer({ min: 0, max: widths.maxShift }),
        fc.constantFrom(...MODES),
        fc.constantFrom<OverflowMode>("saturate", "wrap"),
        fc.integer({ min: 2, max: widths.maxBits }),
        (x, h, shift, mode, overflow, bits) => {
          // For the BigInt path one full-scale input and coefficient make M·S ≥ 2^62 > 2^53.
          if (path === "bigint") [x.re[0], h.re[0]] = [-(2 ** (widths.x - 1)), -(2 ** (widths.h - 1))];
          const got = bitTrueFilter({
            input: x,
            coefficients: h,
            outputShift: shift,
            rounding: mode,
            overflow,
            outputBits: bits,
            inputBits: widths.x,
            coefficientBits: widths.h,
          });
          const want = refFilter(x, h, shift, mode, overflow, bits);
          expect(got.exactPath).toBe(path);
          expect(Array.from(got.re)).toEqual(want.re);
          expect(Array.from(got.im)).toEqual(want.im);
          expect(got.overflowCount).toBe(want.overflows);
        },
      ),
      { numRuns: runs, seed },
    );
  }

  it("equals an independent BigInt convolution on the float64 path (all roundings, both overflows)", () => {
    agreesWithReference(
      { x: 12, h: 14, nx: 40, nh: 24, maxShift: 30, maxBits: 30 },
      "float64",
      300,
      20240601,
    );
  });

  it("equals an independent BigInt convolution on the BigInt path (32-bit words)", () => {
    agreesWithReference({ x: 32, h: 32, nx: 12, nh: 8, maxShift: 70, maxBits: 53 }, "bigint", 200, 7);
  });

  it("rounds hand-picked ties of the shift as each mode defines (IEEE 754-2019 §4.3 names)", () => {
    // acc / 2^shift → expected per mode [away, even, floor, toward-zero]
    const cases: [number, number, number[]][] = [
      [5, 1, [3, 2, 2, 2]], // 2.5
      [-5, 1, [-3, -2, -3, -2]], // −2.5
      [3, 1, [2, 2, 1, 1]], // 1.5
      [-3, 1, [-2, -2, -2, -1]], // −1.5
      [6, 2, [2, 2, 1, 1]], // 1.5
      [7, 2, [2, 2, 1, 1]], // 1.75
      [-7, 2, [-2, -2, -2, -1]], // −1.75
      [1, 1, [1, 0, 0, 0]], // 0.5
      [-1, 1, [-1, 0, -1, 0]], // −0.5
    ];
    for (const [acc, shift, want] of cases) {
      MODES.forEach((mode, i) => {
        const y = bitTrueFilter({
          input: { re: [acc], im: [0] },
          coefficients: { re: [1], im: [0] },
          outputShift: shift,
          rounding: mode,
          overflow: "saturate",
          outputBits: 16,
          inputBits: 16,
          coefficientBits: 4,
        });
        expect(y.re[0], `${acc}>>${shift} ${mode}`).toBe(want[i]);
        expect(Object.is(y.im[0], 0)).toBe(true); // never −0
        expect(Number(shiftRoundBigInt(BigInt(acc), shift, mode))).toBe(want[i]);
      });
    }
  });

  it("takes the float64 path up to M·S = 2^53 and BigInt beyond", () => {
    // M = 2^31 (input −2^31), S = 2^22: M·S = 2^53 exactly, the largest exact bound.
    const base = { outputShift: 0, rounding: "floor" as const, overflow: "wrap" as const, outputBits: 53 };
    const at = bitTrueFilter({
      ...base,
      input: { re: [-(2 ** 31)], im: [0] },
      coefficients: { re: [2 ** 22], im: [0] },
      inputBits: 32,
      coefficientBits: 24,
    });
    expect(at.exactPath).toBe("float64");
    const beyond = bitTrueFilter({
      ...base,
      input: { re: [-(2 ** 31)], im: [0] },
      coefficients: { re: [2 ** 22], im: [1] },
      inputBits: 32,
      coefficientBits: 24,
    });
    expect(beyond.exactPath).toBe("bigint");
    // Both give re = 2^22·(−2^31) = −2^53, which wraps to 0 in 53 bits (−2^53 ≡ 0 mod 2^53).
    expect([at.re[0], at.overflowCount]).toEqual([0, 1]);
    expect([beyond.re[0], beyond.im[0], beyond.overflowCount]).toEqual([0, -(2 ** 31), 1]);
  });

  it("runs a 4,096-tap complex filter over 16,384 complex samples in the float path fast", () => {
    let s = 12345;
    const rnd = (bits: number) => {
      s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
      return Math.floor((s / 2 ** 32) * 2 ** bits) - 2 ** (bits - 1);
    };
    const x = {
      re: Float64Array.from({ length: 16384 }, () => rnd(12)),
      im: Float64Array.from({ length: 16384 }, () => rnd(12)),
    };
    const h = {
      re: Float64Array.from({ length: 4096 }, () => rnd(16)),
      im: Float64Array.from({ length: 4096 }, () => rnd(16)),
    };
    const opts = {
      input: x,
      coefficients: h,
      outputShift: 22,
      rounding: "nearest-even" as const,
      overflow: "saturate" as const,
      outputBits: 18,
      inputBits: 12,
      coefficientBits: 16,
    };
    // Speed is measured by `npm run bench` (docs/benchmarks.md), never asserted here: this checks the
    // large case takes the exact float64 path and gives the right values.
    const y = bitTrueFilter(opts);
    expect(y.exactPath).toBe("float64");
    expect(y.re.length).toBe(16384 + 4096 - 1);
    // Spot-check a few outputs against the BigInt reference restricted to those indices.
    for (const n of [0, 1, 4095, 10000, 20478]) {
      let ar = 0n;
      for (let k = 0; k < 4096; k++) {
        const j = n - k;
        if (j < 0 || j >= 16384) continue;
        ar += BigInt(h.re[k]!) * BigInt(x.re[j]!) - BigInt(h.im[k]!) * BigInt(x.im[j]!);
      }
      let v = refRound(ar, 22, "nearest-even");
      const hi = 2n ** 17n - 1n;
      v = v > hi ? hi : v < -hi - 1n ? -hi - 1n : v;
      expect(y.re[n]).toBe(Number(v));
    }
  });

  it("rejects bad input with errors naming the parameter", () => {
    const ok = {
      input: { re: [1, 2], im: [0, 0] },
      coefficients: { re: [1], im: [0] },
      outputShift: 0,
      rounding: "floor" as RoundingMode,
      overflow: "wrap" as OverflowMode,
      outputBits: 16,
      inputBits: 8,
      coefficientBits: 8,
    };
    expect(() => bitTrueFilter({ ...ok, inputBits: 33 })).toThrow(/inputBits/);
    expect(() => bitTrueFilter({ ...ok, outputBits: 54 })).toThrow(/outputBits/);
    expect(() => bitTrueFilter({ ...ok, outputShift: 1.5 })).toThrow(/outputShift/);
    expect(() => bitTrueFilter({ ...ok, rounding: "up" as RoundingMode })).toThrow(/rounding/);
    expect(() => bitTrueFilter({ ...ok, input: { re: [1, 2], im: [0] } })).toThrow(RangeError);
    expect(() => bitTrueFilter({ ...ok, input: { re: [], im: [] } })).toThrow(/input\.re/);
    expect(() => bitTrueFilter({ ...ok, input: { re: [NaN, 1], im: [0, 0] } })).toThrow(/input\.re\[0\]/);
    expect(() => bitTrueFilter({ ...ok, input: { re: [128, 1], im: [0, 0] } })).toThrow(/input\.re\[0\]/);
    expect(() => bitTrueFilter({ ...ok, input: { re: [1.5, 1], im: [0, 0] } })).toThrow(RangeError);
    expect(() => bitTrueFilter({ ...ok, coefficients: { re: [1], im: [Infinity] } })).toThrow(
      /coefficients\.im/,
    );
    expect(() => bitTrueFilter({ ...ok, coefficients: { re: [-129], im: [0] } })).toThrow(/codes\.re\[0\]/);
  });
});

describe("accumulatorGrowth", () => {
  it("follows input bits + coefficient bits + ⌈log2 Σ|ĥ|⌉ (DESIGN.md) and covers the exact bound", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 24 }),
        fc
          .integer({ min: 2, max: 20 })
          .chain((b) => fc.tuple(fc.constant(b), complexCodes(b, { min: 1, max: 64 }))),
        (inputBits, [coefBits, h]) => {
          const g = accumulatorGrowth(inputBits, coefBits, h);
          // Independent: Σ(|re|+|im|) in BigInt; growth = smallest g with Σ ≤ 2^(B−1+g), by search.
          const sum = h.re.reduce((a, v, i) => a + BigInt(Math.abs(v)) + BigInt(Math.abs(h.im[i]!)), 0n);
          expect(g.absoluteSum).toBe(sum.toString());
          if (sum > 0n) {
            let growth = -(coefBits + 2);
            while (sum > 2n ** BigInt(coefBits - 1 + growth + 64) / 2n ** 64n) growth++;
            expect(g.worstCaseBits).toBe(Math.max(2, inputBits + coefBits + growth));
          }
          // The adversarial input x = −2^(B−1)·sign-matched reaches M·S, which must fit the exact width.
          const bound = sum * 2n ** BigInt(inputBits - 1);
          expect(bound <= 2n ** BigInt(g.exactBits - 1) - 1n).toBe(true);
          if (g.exactBits > 2) expect(bound > 2n ** BigInt(g.exactBits - 2) - 1n).toBe(true);
          expect(g.worstCaseBits).toBeGreaterThanOrEqual(g.exactBits);
          expect(g.recommendedBits).toBe(g.worstCaseBits);
        },
      ),
      { numRuns: 300, seed: 99 },
    );
  });

  it("gives 12 + 16 + 12 bits for 4,096 full-scale taps (Σ|ĥ| = 4096 = 2^12; derived)", () => {
    const re = new Float64Array(4096).fill(-(2 ** 15));
    const g = accumulatorGrowth(12, 16, { re, im: new Float64Array(4096) });
    // Σ|ĥ| = 4096 · 2^15 / 2^15 = 4096 → ⌈log2⌉ = 12.
    expect(g.worstCaseBits).toBe(40);
    // Exact: 2^11 · 4096 · 2^15 = 2^38 > 2^38 − 1, so 40 signed bits (the bound is a power of two).
    expect(g.exactBits).toBe(40);
  });
});
