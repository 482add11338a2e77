// The datapath core checked against independent computations: exhaustive BigInt search over every input
// of a tiny table for the accumulator extremes, a BigInt direct convolution for the worst-case stimulus and
// the vector sets, and the rounding definitions written out here (IEEE 754-2019 §4.3 names).
import { describe, expect, it } from "vitest";
import { exactAccumulate, outputStage } from "../../../shared/dsp/bit-true";
import {
  accumulatorExtremes,
  datapathFigures,
  resolveDatapath,
  signedBitsFor,
  worstCaseStimulus,
} from "../../../shared/dsp/datapath";
import { roundingSet, solveExact } from "../../../server/bundles/vector-sets";
import { contentHash } from "../../../server/services/content-hash";
import { RevisionContentSchema } from "../../../shared/schemas/designs";

const big = (v: ArrayLike<number>) => Array.from(v, (x) => BigInt(x));

/** Independent BigInt direct convolution (full), acc_I and acc_Q. */
function convolve(x: { re: number[]; im: number[] }, h: { re: number[]; im: number[] }) {
  const [xr, xi, hr, hi] = [big(x.re), big(x.im), big(h.re), big(h.im)];
  const re: bigint[] = [];
  const im: bigint[] = [];
  for (let n = 0; n < xr.length + hr.length - 1; n++) {
    let a = 0n;
    let b = 0n;
    for (let k = 0; k < hr.length; k++) {
      const i = n - k;
      if (i < 0 || i >= xr.length) continue;
      a += hr[k]! * xr[i]! - hi[k]! * xi[i]!;
      b += hr[k]! * xi[i]! + hi[k]! * xr[i]!;
    }
    re.push(a);
    im.push(b);
  }
  return { re, im };
}

/** floor, toward zero, nearest ties away / even of a / 2^s, from the definitions. */
function roundShift(a: bigint, s: number, mode: string): bigint {
  if (s === 0) return a;
  const d = 1n << BigInt(s);
  const q = a >= 0n ? a / d : -((-a + d - 1n) / d);
  const r = a - q * d;
  if (mode === "floor" || r === 0n) return q;
  if (mode === "toward-zero") return a < 0n ? q + 1n : q;
  if (2n * r > d) return q + 1n;
  if (2n * r < d) return q;
  if (mode === "nearest-away") return a < 0n ? q : q + 1n;
  return q % 2n === 0n ? q : q + 1n;
}

describe("accumulator extremes", () => {
  it("equal an exhaustive search over every 3-bit complex input of a 2-tap complex table", () => {
    const h = { re: [3, -2], im: [-1, 5] };
    const ext = accumulatorExtremes(h, 3);
    let [iMax, iMin, qMax, qMin] = [0n, 0n, 0n, 0n];
    const codes = [-4, -3, -2, -1, 0, 1, 2, 3];
    for (const a of codes)
      for (const b of codes)
        for (const c of codes)
          for (const d of codes) {
            // x[n] = a + jb (meets h[0]), x[n−1] = c + jd (meets h[1])
            const accI = 3 * a - -1 * b + -2 * c - 5 * d;
            const accQ = 3 * b + -1 * a + -2 * d + 5 * c;
            iMax = BigInt(Math.max(Number(iMax), accI));
            iMin = BigInt(Math.min(Number(iMin), accI));
            qMax = BigInt(Math.max(Number(qMax), accQ));
            qMin = BigInt(Math.min(Number(qMin), accQ));
          }
    expect(ext.i).toEqual({ max: iMax, min: iMin });
    expect(ext.q).toEqual({ max: qMax, min: qMin });
    const bound = [iMax, -iMin, qMax, -qMin].reduce((m, v) => (v > m ? v : m), 0n);
    expect(ext.bound).toBe(bound);
  });

  it("the worst-case stimulus reaches all four extremes exactly (independent BigInt convolution)", () => {
    const h = { re: [1200, -7, 0, 31000, -32768, 5], im: [-3, 0, 900, -14000, 2, 32767] };
    const x = worstCaseStimulus(h, 14);
    const acc = convolve(x, h);
    const ext = accumulatorExtremes(h, 14);
    const nh = h.re.length;
    expect([acc.re[nh - 1], acc.re[2 * nh - 1], acc.im[3 * nh - 1], acc.im[4 * nh - 1]]).toEqual([
      ext.i.max,
      ext.i.min,
      ext.q.max,
      ext.q.min,
    ]);
    for (const v of [...acc.re, ...acc.im]) expect(v <= ext.bound && v >= -ext.bound).toBe(true);
  });

  it("required width: the smallest signed width holding both extremes", () => {
    expect(signedBitsFor(-128n, 127n)).toBe(8);
    expect(signedBitsFor(-129n, 0n)).toBe(9);
    expect(signedBitsFor(0n, 128n)).toBe(9);
    const dp = resolveDatapath(
      { outputBits: 16, outputRounding: "nearest-even", outputOverflow: "saturate" },
      14,
      { re: [32767, 32767], im: [0, 0] },
      16,
    );
    // 2·32767·8192 = 536,854,528 < 2^29: 30 signed bits; the rule says 14 + 16 + ⌈log2 1.99997⌉ = 31.
    expect(dp).toMatchObject({ accumulatorRuleBits: 31, accumulatorRequiredBits: 30, accumulatorBits: 31 });
    expect(dp.outputShift).toBe(15);
  });
});

describe("output stage", () => {
  const x = { re: [8191, -8192, 77, -5, 4000], im: [-8192, 8191, 3, 9, -4000] };
  const h = { re: [30001, -29999, 12345, -1], im: [7, -32768, 100, 32767] };
  for (const rounding of ["floor", "toward-zero", "nearest-away", "nearest-even"] as const)
    for (const overflow of ["saturate", "wrap"] as const)
      it(`${rounding}, ${overflow}, accumulator narrowed to 29 bits: equals the definitions in BigInt`, () => {
        const opts = { accumulatorBits: 29, outputShift: 11, rounding, overflow, outputBits: 12 };
        const out = outputStage(exactAccumulate(x, h), opts);
        const acc = convolve(x, h);
        const fit = (v: bigint) => {
          const max = 2047n;
          const min = -2048n;
          if (v <= max && v >= min) return v;
          return overflow === "saturate" ? (v > max ? max : min) : BigInt.asIntN(12, v);
        };
        const want = (a: bigint) => Number(fit(roundShift(BigInt.asIntN(29, a), 11, rounding)));
        expect(Array.from(out.re)).toEqual(acc.re.map(want));
        expect(Array.from(out.im)).toEqual(acc.im.map(want));
        const wrapped = [...acc.re, ...acc.im].filter((a) => a !== BigInt.asIntN(29, a)).length;
        expect(out.accumulatorOverflowCount).toBe(wrapped);
        expect(wrapped).toBeGreaterThan(0);
        const maxAbs = [...acc.re, ...acc.im].reduce(
          (m, v) => ((v < 0n ? -v : v) > m ? (v < 0n ? -v : v) : m),
          0n,
        );
        expect(out.maxAbsAccumulator).toBe(maxAbs.toString());
      });
});

describe("rounding set", () => {
  it("solveExact hits its target exactly within the input range", () => {
    const c = [30001, -29999, 12345, -1111, 7, 2048, -32768, 911];
    for (const target of [0n, 1n, -1n, 123456789n, -98765432n, 2n ** 27n + 2n ** 10n]) {
      const x = solveExact(c, target, -8192, 8191)!;
      expect(x).not.toBeNull();
      for (const v of x) expect(v >= -8192 && v <= 8191).toBe(true);
      expect(x.reduce((s, v, j) => s + BigInt(v) * BigInt(c[j]!), 0n)).toBe(target);
    }
  });

  it("puts the accumulator exactly on half an output LSB, both signs and parities (independent BigInt)", () => {
    const codes = { re: [1200, -7, 0, 31000, -32768, 5], im: [-3, 0, 900, -14000, 2, 32767] };
    const dp = resolveDatapath(
      { outputBits: 16, outputRounding: "nearest-even", outputOverflow: "saturate" },
      14,
      codes,
      16,
    );
    const set = roundingSet(codes, dp);
    expect(set.targets).toHaveLength(8);
    const acc = convolve(set, codes);
    const half = 1n << BigInt(dp.outputShift - 1);
    const step = half * 2n;
    const kinds = new Set<string>();
    for (const t of set.targets) {
      const a = (t.component === "I" ? acc.re : acc.im)[t.output]!;
      expect(a).toBe(t.accumulator);
      expect(((a % step) + step) % step).toBe(half);
      const q = (a - half) / step;
      kinds.add(`${t.component} ${a < 0n ? "−" : "+"} ${q % 2n === 0n ? "even" : "odd"}`);
    }
    expect(kinds.size).toBe(8); // I and Q × both signs × both parities
  });
});

describe("datapath figures", () => {
  it("output SQNR: exact taps and a wide output leave only round-off; the worst case is the bound", () => {
    const codes = { re: [16384, -8192, 4096], im: [0, 0, 0] };
    const f = datapathFigures({
      settings: { outputBits: 32, outputRounding: "nearest-even", outputOverflow: "saturate" },
      inputBits: 12,
      codes,
      coefficientBits: 16,
      floatTaps: { re: Float64Array.of(0.5, -0.25, 0.125), im: new Float64Array(3) },
      gain: 1,
      fractionLength: 15,
      stimulus: { re: [100, -2048, 2047, 5], im: [0, 1, -1, 0] },
    });
    // 32-bit output ≥ the accumulator: no shift, no rounding, and these codes are the float taps exactly.
    expect(f.outputShift).toBe(0);
    // Only the float reference's FFT round-off remains (~1e-16 relative).
    expect(f.outputSqnrDb!).toBeGreaterThan(250);
    // −2^11 on the positive taps, 2^11 − 1 on the negative one: 2048·(16384 + 4096) + 2047·8192.
    expect(f.worstCase.maxAbsAccumulator).toBe(String(2048n * (16384n + 4096n) + 2047n * 8192n));
    expect(f.worstCase.accumulatorOverflowCount).toBe(0);
  });
});

describe("content hash", () => {
  it("changes with the datapath", () => {
    const base = {
      kind: "filter",
      fir: {
        kind: "design",
        band: "lowpass",
        sampleRateHz: 1e6,
        cutoffHz: 1e5,
        transitionHz: 5e4,
        stopbandAttenuationDb: 60,
      },
      fixedPoint: { fir: { wordLength: 16, fractionLength: 15 } },
    };
    const a = RevisionContentSchema.parse(base);
    const b = RevisionContentSchema.parse({ ...base, datapath: { outputBits: 18 } });
    expect(a.datapath).toEqual({
      outputBits: 16,
      outputRounding: "nearest-even",
      outputOverflow: "saturate",
    });
    expect(contentHash(a, [])).not.toBe(contentHash(b, []));
  });
});
