import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { bitTrueFilter, DIRECT_MAX_MACS } from "@shared/dsp/bit-true";
import { exactComplexConvolution, MAX_TRANSFORM_LOG2, nttPrimes } from "@shared/dsp/exact-convolution";

// Independent reference: the textbook double sum y[n] = Σ_k h[k]·x[n−k] in BigInt.
function direct(x: { re: number[]; im: number[] }, h: { re: number[]; im: number[] }) {
  const ny = x.re.length + h.re.length - 1;
  const re: bigint[] = [];
  const im: bigint[] = [];
  for (let n = 0; n < ny; n++) {
    let ar = 0n;
    let ai = 0n;
    for (let k = 0; k < h.re.length; k++) {
      const j = n - k;
      if (j < 0 || j >= x.re.length) continue;
      ar += BigInt(h.re[k]!) * BigInt(x.re[j]!) - BigInt(h.im[k]!) * BigInt(x.im[j]!);
      ai += BigInt(h.re[k]!) * BigInt(x.im[j]!) + BigInt(h.im[k]!) * BigInt(x.re[j]!);
    }
    re.push(ar);
    im.push(ai);
  }
  return { re, im };
}

const MIN32 = -(2 ** 31);
const MAX32 = 2 ** 31 - 1;
// Codes of a 32-bit word, the extremes (−2^31 and 2^31 − 1, where products and sums are widest) often.
const code32 = fc.oneof(
  fc.constantFrom(MIN32, MAX32, MIN32 + 1, -1, 0, 1),
  fc.integer({ min: MIN32, max: MAX32 }),
);
const signal = (max: number) =>
  fc.integer({ min: 1, max }).chain((n) =>
    fc.record({
      re: fc.array(code32, { minLength: n, maxLength: n }),
      im: fc.array(code32, { minLength: n, maxLength: n }),
    }),
  );

describe("exactComplexConvolution (NTT modulo primes < 2^26.5, Garner CRT)", () => {
  it("the primes are primes of the form c·2^20 + 1 with roots of unity of order 2^20", () => {
    const primes = nttPrimes();
    expect(primes.length).toBeGreaterThanOrEqual(4);
    for (const { p, root } of primes) {
      expect((p - 1) % 2 ** MAX_TRANSFORM_LOG2).toBe(0);
      expect((p - 1) * (p - 1)).toBeLessThan(2 ** 53); // products of residues stay exact in float64
      // root^(2^20) = 1 and root^(2^19) = −1 (order exactly 2^20), by BigInt powers.
      const P = BigInt(p);
      let r = BigInt(root);
      for (let i = 0; i < MAX_TRANSFORM_LOG2 - 1; i++) r = (r * r) % P;
      expect(r).toBe(P - 1n);
    }
  });

  it("equals the direct BigInt convolution, 32-bit extreme codes included", () =>
    fc.assert(
      fc.property(signal(40), signal(40), (x, h) => {
        expect(exactComplexConvolution(x, h)).toEqual(direct(x, h));
      }),
      { numRuns: 150 },
    ));

  it("all-extreme inputs (the widest accumulators: 2^62 per product)", () => {
    const n = 300;
    const x = { re: Array(n).fill(MIN32), im: Array(n).fill(MAX32) };
    const h = { re: Array(n).fill(MIN32), im: Array(n).fill(MIN32) };
    expect(exactComplexConvolution(x, h)).toEqual(direct(x, h));
  });

  it("convolutions longer than one transform are cut into blocks with the same result", () =>
    fc.assert(
      fc.property(signal(70), signal(70), fc.integer({ min: 1, max: 5 }), (x, h, log2) => {
        expect(exactComplexConvolution(x, h, { transformLog2: log2 })).toEqual(direct(x, h));
      }),
      { numRuns: 60 },
    ));
});

describe("bitTrueFilter dispatches long filters to the exact NTT convolution", () => {
  it("past DIRECT_MAX_MACS the outputs equal the direct sums, rounded and saturated the same way", () => {
    const nx = 2048;
    const nh = DIRECT_MAX_MACS / nx + 1; // just past the threshold
    let s = 99;
    const rnd = (m: number) => () => ((s = (s * 69069 + 1) % 2 ** 32), (s % (2 * m + 1)) - m);
    const x = { re: Array.from({ length: nx }, rnd(8191)), im: Array.from({ length: nx }, rnd(8191)) };
    const h = { re: Array.from({ length: nh }, rnd(32767)), im: Array.from({ length: nh }, rnd(32767)) };
    const y = bitTrueFilter({
      input: x,
      coefficients: h,
      outputShift: 20,
      rounding: "nearest-even",
      overflow: "saturate",
      outputBits: 24,
      inputBits: 14,
      coefficientBits: 16,
    });
    expect(y.exactPath).toBe("ntt");
    // Spot checks by the direct double sum in BigInt, rounded half to even and saturated to 24 bits.
    const round = (acc: bigint) => {
      const d = 1n << 20n;
      const fl = acc >= 0n ? acc / d : -((-acc + d - 1n) / d);
      const twice = 2n * (acc - fl * d);
      const r = twice > d ? fl + 1n : twice < d ? fl : fl % 2n === 0n ? fl : fl + 1n;
      const max = (1n << 23n) - 1n;
      return Number(r > max ? max : r < -max - 1n ? -max - 1n : r);
    };
    for (const n of [0, 1, 1000, nh - 1, nx + nh - 2]) {
      let ar = 0n;
      let ai = 0n;
      for (let k = Math.max(0, n - nx + 1); k <= Math.min(n, nh - 1); k++) {
        ar += BigInt(h.re[k]! * x.re[n - k]! - h.im[k]! * x.im[n - k]!);
        ai += BigInt(h.re[k]! * x.im[n - k]! + h.im[k]! * x.re[n - k]!);
      }
      expect([y.re[n], y.im[n]]).toEqual([round(ar), round(ai)]);
    }
  });
});
