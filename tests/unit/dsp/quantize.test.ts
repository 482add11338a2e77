import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { codeRange, quantize, SNAP_ULPS } from "@shared/dsp/quantize";
import type { FixedPointSpec, OverflowMode, RoundingMode, ScalingMode } from "@shared/dsp/types";

const MODES: RoundingMode[] = ["nearest-away", "nearest-even", "floor", "toward-zero"];

function spec(w: number, f: number, more: Partial<FixedPointSpec> = {}): FixedPointSpec {
  return {
    wordLength: w,
    fractionLength: f,
    signed: true,
    scaling: "as-given",
    rounding: "nearest-even",
    overflow: "saturate",
    ...more,
  };
}

const real = (values: number[]) => ({ re: Float64Array.from(values), im: new Float64Array(values.length) });

// Arbitrary specs over the whole allowed space: W 2..32, F −64..96, signed or not, every mode.
const specArb = fc.record({
  wordLength: fc.integer({ min: 2, max: 32 }),
  fractionLength: fc.integer({ min: -64, max: 96 }),
  signed: fc.boolean(),
  scaling: fc.constant<ScalingMode>("as-given"),
  rounding: fc.constantFrom(...MODES),
  overflow: fc.constantFrom<OverflowMode>("saturate", "wrap"),
});

// Inputs of a few word ranges around the format (u = x·2^F in ±2^(W+2)), so overflow happens too.
const inputsFor = (s: FixedPointSpec) =>
  fc
    .array(fc.double({ min: -(2 ** (s.wordLength + 2)), max: 2 ** (s.wordLength + 2), noNaN: true }), {
      minLength: 1,
      maxLength: 40,
    })
    .map((us) => us.map((u) => u * 2 ** -s.fractionLength));

describe("quantize: properties (fast-check)", () => {
  it("is idempotent: quantizing the represented values again changes nothing", () => {
    fc.assert(
      fc.property(
        specArb.chain((s) => fc.tuple(fc.constant(s), inputsFor(s))),
        ([s, xs]) => {
          const q1 = quantize(real(xs), s);
          const q2 = quantize({ re: q1.valueRe, im: q1.valueIm }, s);
          expect(Array.from(q2.re)).toEqual(Array.from(q1.re));
          expect(q2.overflowCount).toBe(0);
        },
      ),
      { numRuns: 500, seed: 1 },
    );
  });

  it("is monotonic (non-decreasing) in the input with saturate", () => {
    fc.assert(
      fc.property(
        specArb
          .map((s) => ({ ...s, overflow: "saturate" as const }))
          .chain((s) => fc.tuple(fc.constant(s), inputsFor(s))),
        ([s, xs]) => {
          const sorted = [...xs].sort((a, b) => a - b);
          const q = quantize(real(sorted), s);
          for (let i = 1; i < q.re.length; i++) expect(q.re[i]!).toBeGreaterThanOrEqual(q.re[i - 1]!);
        },
      ),
      { numRuns: 500, seed: 2 },
    );
  });

  it("never leaves the code range with saturate, and the values are code·2^-F", () => {
    fc.assert(
      fc.property(
        specArb.map((s) => ({ ...s, overflow: "saturate" as const })),
        fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 40 }),
        (s, xs) => {
          const { min, max } = codeRange(s);
          const q = quantize({ re: Float64Array.from(xs), im: Float64Array.from(xs, (v) => -v) }, s);
          for (let i = 0; i < xs.length; i++) {
            const pairs: [number, number][] = [
              [q.re[i]!, q.valueRe[i]!],
              [q.im[i]!, q.valueIm[i]!],
            ];
            for (const [c, v] of pairs) {
              expect(Number.isInteger(c) && c >= min && c <= max).toBe(true);
              expect(v).toBe(c * 2 ** -s.fractionLength);
            }
          }
        },
      ),
      { numRuns: 500, seed: 3 },
    );
  });

  it("wrap equals arithmetic modulo 2^W (checked in BigInt), with overflows counted", () => {
    fc.assert(
      fc.property(
        // Floor and toward-zero have exact JS references (Math.floor, Math.trunc).
        specArb.chain((s) =>
          fc
            .constantFrom<RoundingMode>("floor", "toward-zero")
            .map((rounding) => ({ ...s, rounding, overflow: "wrap" as const })),
        ),
        fc.array(fc.double({ min: -1e12, max: 1e12, noNaN: true }), { minLength: 1, maxLength: 40 }),
        (s, us) => {
          const xs = us.map((u) => u * 2 ** -s.fractionLength);
          const q = quantize(real(xs), s);
          const { min, max } = codeRange(s);
          const m = 2n ** BigInt(s.wordLength);
          let overflows = 0;
          // Values within SNAP_ULPS ulps of the peak from an integer are that integer (quantize.ts).
          const peak = Math.max(...xs.map(Math.abs));
          const snap = SNAP_ULPS * Number.EPSILON * peak * 2 ** s.fractionLength;
          xs.forEach((x, i) => {
            const u = x * 2 ** s.fractionLength;
            const near = Math.round(u);
            const r = BigInt(
              Math.abs(u - near) <= snap ? near : s.rounding === "floor" ? Math.floor(u) : Math.trunc(u),
            );
            if (r < BigInt(min) || r > BigInt(max)) overflows++;
            const want = ((((r - BigInt(min)) % m) + m) % m) + BigInt(min);
            expect(BigInt(q.re[i]!)).toBe(want);
          });
          expect(q.overflowCount).toBe(overflows);
        },
      ),
      { numRuns: 500, seed: 4 },
    );
  });
});

describe("quantize: rounding bias (common practice; O&S ch. 6)", () => {
  const meanError = (xs: number[], mode: RoundingMode) => {
    const q = quantize(real(xs), spec(24, 0, { rounding: mode }));
    return xs.reduce((acc, x, i) => acc + (q.re[i]! - x), 0) / xs.length;
  };
  // Ties k + 0.5 for k = 0..1999: as many even as odd k.
  const ties = Array.from({ length: 2000 }, (_, k) => k + 0.5);

  it("ties-to-even has zero mean error over ties; ties-away +q/2, floor and toward-zero −q/2", () => {
    expect(meanError(ties, "nearest-even")).toBe(0);
    expect(meanError(ties, "nearest-away")).toBe(0.5);
    expect(meanError(ties, "floor")).toBe(-0.5);
    expect(meanError(ties, "toward-zero")).toBe(-0.5);
    // Over ties of both signs ties-away is unbiased too, floor is not.
    const both = [...ties, ...ties.map((t) => -t)];
    expect(meanError(both, "nearest-away")).toBe(0);
    expect(meanError(both, "floor")).toBe(-0.5);
  });

  it("floor has mean error −q/2 and rounding has error variance q²/12 on uniform inputs (MT-229)", () => {
    let s = 99;
    const xs = Array.from({ length: 200_000 }, () => {
      s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
      return (s / 2 ** 32) * 2000 - 1000;
    });
    // Standard error of the mean of a uniform error: (1/√12)/√n ≈ 6.5e-4; allow 5 of them.
    expect(Math.abs(meanError(xs, "floor") + 0.5)).toBeLessThan(3.3e-3);
    expect(Math.abs(meanError(xs, "nearest-even"))).toBeLessThan(3.3e-3);
    const q = quantize(real(xs), spec(24, 0, { rounding: "nearest-even" }));
    const variance = xs.reduce((a, x, i) => a + (q.re[i]! - x) ** 2, 0) / xs.length;
    expect(Math.abs(variance - 1 / 12) / (1 / 12)).toBeLessThan(0.01);
  });
});

describe("quantize: SQNR of a full-scale sine (Kester, MT-229: 6.02·B + 1.76 dB)", () => {
  for (const bits of [8, 12, 16]) {
    it(`is within ±0.3 dB of 6.02·${bits} + 1.76 dB`, () => {
      // 65,536 samples with 4,099 cycles (coprime), so the error is spread over all codes.
      const n = 65536;
      const x = Float64Array.from({ length: n }, (_, i) => Math.sin((2 * Math.PI * 4099 * i) / n));
      const q = quantize({ re: x, im: new Float64Array(n) }, spec(bits, bits - 1, { scaling: "full-scale" }));
      let sig = 0;
      let err = 0;
      for (let i = 0; i < n; i++) {
        const ideal = x[i]! * q.gain;
        sig += ideal * ideal;
        err += (q.valueRe[i]! - ideal) ** 2;
      }
      const sqnr = 10 * Math.log10(sig / err);
      const theory = 6.0206 * bits + 1.7609;
      console.info(`SQNR B=${bits}: ${sqnr.toFixed(3)} dB (theory ${theory.toFixed(2)})`);
      expect(Math.abs(sqnr - theory)).toBeLessThan(0.3);
      expect(q.overflowCount).toBe(0);
    });
  }
});

describe("quantize: formats and scaling", () => {
  it("Q1.(W−1) cannot hold +1.0: wrap gives −1, saturate gives 2^(W−1)−1 (common practice)", () => {
    for (let w = 2; w <= 32; w++) {
      const wrapped = quantize(real([1]), spec(w, w - 1, { overflow: "wrap" }));
      expect([wrapped.re[0], wrapped.valueRe[0], wrapped.overflowCount]).toEqual([-(2 ** (w - 1)), -1, 1]);
      const sat = quantize(real([1]), spec(w, w - 1, { overflow: "saturate" }));
      expect([sat.re[0], sat.overflowCount]).toEqual([2 ** (w - 1) - 1, 1]);
    }
  });

  it("has the two's-complement and unsigned code ranges", () => {
    expect(codeRange(spec(2, 0))).toEqual({ min: -2, max: 1 });
    expect(codeRange(spec(16, 15))).toEqual({ min: -32768, max: 32767 });
    expect(codeRange(spec(32, 0, { signed: false }))).toEqual({ min: 0, max: 4294967295 });
    const u = quantize(real([-0.3, 300, 255.2]), spec(8, 0, { signed: false }));
    expect(Array.from(u.re)).toEqual([0, 255, 255]);
    expect(u.overflowCount).toBe(1); // −0.3 rounds to 0, which fits
    const uw = quantize(real([-1, 256, 257]), spec(8, 0, { signed: false, overflow: "wrap" }));
    expect(Array.from(uw.re)).toEqual([255, 0, 1]);
  });

  it("normalize picks the largest power of two that fits, full-scale hits the largest code exactly", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 32 }),
        fc.integer({ min: -64, max: 96 }),
        fc.boolean(),
        fc.double({ min: 1e-30, max: 1e30, noNaN: true }),
        fc.constantFrom(...MODES),
        (w, f, signed, peak, rounding) => {
          const s = spec(w, f, { signed, rounding, scaling: "normalize" });
          const largest = codeRange(s).max * 2 ** -f;
          const sig = { re: Float64Array.of(peak * 0.5, -peak), im: Float64Array.of(0.25 * peak, 0) };
          const qn = quantize(sig, s);
          expect(Number.isInteger(Math.log2(qn.gain))).toBe(true);
          expect(peak * qn.gain).toBeLessThanOrEqual(largest);
          expect(peak * qn.gain * 2).toBeGreaterThan(largest);
          const qf = quantize(
            { re: Float64Array.of(peak * 0.5, peak), im: Float64Array.of(-peak, 0) },
            { ...s, scaling: "full-scale" },
          );
          expect(qf.re[1]).toBe(codeRange(s).max);
          expect(qf.overflowCount).toBe(signed ? 0 : 1); // unsigned: −peak cannot be held
        },
      ),
      { numRuns: 300, seed: 5 },
    );
  });

  it("an all-zero input under normalize or full-scale keeps gain 1 (nothing to scale)", () => {
    for (const scaling of ["normalize", "full-scale"] as const) {
      const q = quantize(real([0, 0, 0]), spec(12, 11, { scaling }));
      expect(q.gain).toBe(1);
      expect(Array.from(q.re)).toEqual([0, 0, 0]);
    }
  });

  it("quantizes 262,144 complex samples for every W of a 6–24 sweep into reused buffers", () => {
    const n = 262_144;
    const re = Float64Array.from({ length: n }, (_, i) => Math.cos(1e-5 * i * i));
    const im = Float64Array.from({ length: n }, (_, i) => Math.sin(1e-5 * i * i));
    const out = {
      re: new Float64Array(n),
      im: new Float64Array(n),
      valueRe: new Float64Array(n),
      valueIm: new Float64Array(n),
    };
    // Speed is measured by `npm run bench`, not asserted here; this checks that reused buffers give the
    // same codes as fresh ones for every width of the sweep.
    for (let w = 6; w <= 24; w++) {
      const s = spec(w, w - 1, { scaling: "full-scale" });
      const reused = quantize({ re, im }, s, out);
      const fresh = quantize({ re: re.subarray(0, 4096), im: im.subarray(0, 4096) }, s);
      expect(reused.re.subarray(0, 4096)).toEqual(fresh.re);
      expect(reused.im.subarray(0, 4096)).toEqual(fresh.im);
    }
  });
});

describe("quantize: bad input", () => {
  const x = real([0.5]);
  it("rejects bad specs and samples with errors naming the parameter", () => {
    expect(() => quantize(x, spec(1, 0))).toThrow(/spec\.wordLength/);
    expect(() => quantize(x, spec(33, 0))).toThrow(RangeError);
    expect(() => quantize(x, spec(2.5, 0))).toThrow(/spec\.wordLength/);
    expect(() => quantize(x, spec(8, 1.5))).toThrow(/spec\.fractionLength/);
    expect(() => quantize(x, spec(8, 97))).toThrow(/spec\.fractionLength/);
    expect(() => quantize(x, spec(8, -65))).toThrow(RangeError);
    expect(() => quantize(x, spec(8, 0, { rounding: "up" as RoundingMode }))).toThrow(/spec\.rounding/);
    expect(() => quantize(x, spec(8, 0, { overflow: "clip" as OverflowMode }))).toThrow(/spec\.overflow/);
    expect(() => quantize(x, spec(8, 0, { scaling: "auto" as ScalingMode }))).toThrow(/spec\.scaling/);
    expect(() => quantize(x, { ...spec(8, 0), signed: "yes" as unknown as boolean })).toThrow(TypeError);
    expect(() => quantize(real([NaN]), spec(8, 0))).toThrow(/signal\.re\[0\]/);
    expect(() => quantize({ re: Float64Array.of(1), im: Float64Array.of(Infinity) }, spec(8, 0))).toThrow(
      /signal\.im\[0\]/,
    );
    expect(() => quantize(real([]), spec(8, 0))).toThrow(/signal\.re/);
    expect(() => quantize({ re: Float64Array.of(1, 2), im: Float64Array.of(1) }, spec(8, 0))).toThrow(
      /differ in length/,
    );
    expect(() => quantize(x, spec(8, 0), { re: new Float64Array(2) })).toThrow(/out\.re/);
  });
});
