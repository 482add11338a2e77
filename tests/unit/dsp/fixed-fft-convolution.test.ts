import { describe, expect, it } from "vitest";
import {
  checkFastConvolutionSpec,
  fixedFastConvolution,
  floatConvolution,
  referenceSpectrum,
  type FastConvolutionSpec,
  type SpectrumTable,
} from "@shared/dsp/fast-convolution/convolution";
import type { StageSchedule } from "@shared/dsp/fast-convolution/fixed-fft";
import { createRng } from "@shared/dsp/random";
import type { ComplexSignal, RoundingMode } from "@shared/dsp/types";
import { naiveDft, randomCodes, refFft, refRound, spec as fftSpec } from "./fixed-fft-reference";

function randomFilter(seed: number, n: number): ComplexSignal {
  const rng = createRng(seed);
  return {
    re: Float64Array.from({ length: n }, () => rng.gaussian()),
    im: Float64Array.from({ length: n }, () => rng.gaussian()),
  };
}

function directConvolution(
  x: { re: number[]; im: number[] },
  h: ComplexSignal,
): { re: number[]; im: number[] } {
  const ny = x.re.length + h.re.length - 1;
  const re = new Array<number>(ny).fill(0);
  const im = new Array<number>(ny).fill(0);
  for (let n = 0; n < ny; n++)
    for (let k = 0; k < h.re.length; k++) {
      const j = n - k;
      if (j < 0 || j >= x.re.length) continue;
      re[n] = re[n]! + h.re[k]! * x.re[j]! - h.im[k]! * x.im[j]!;
      im[n] = im[n]! + h.re[k]! * x.im[j]! + h.im[k]! * x.re[j]!;
    }
  return { re, im };
}

function convSpec(
  over: Partial<FastConvolutionSpec> & { schedule?: StageSchedule; rounding?: RoundingMode },
): FastConvolutionSpec {
  const { schedule, rounding, ...rest } = over;
  return {
    method: "overlap-save",
    fftSize: 32,
    blockLength: 20,
    fft: fftSpec({
      dataBits: 10,
      twiddleBits: 10,
      productGuardBits: 0,
      ...(schedule ? { schedule } : {}),
      ...(rounding ? { rounding } : {}),
    }),
    spectrum: {
      wordLength: 10,
      fractionLength: 9,
      signed: true,
      scaling: "full-scale",
      rounding: "nearest-even",
      overflow: "saturate",
    },
    productShift: "block-floating-point",
    ...rest,
  };
}

// Independent chain: frames indexed from the definition, the BigInt DIT recurrence forward, the
// product and its shift in BigInt, the conjugate-twiddle recurrence inverse.
function refChain(x: { re: number[]; im: number[] }, table: SpectrumTable, spec: FastConvolutionSpec) {
  const n = spec.fftSize;
  const l = table.filterLength;
  const b = spec.blockLength;
  const os = spec.method === "overlap-save";
  const nx = x.re.length;
  const ny = nx + l - 1;
  const count = os ? Math.ceil(ny / b) : Math.ceil(nx / b);
  const max = 2n ** BigInt(spec.fft.dataBits - 1) - 1n;
  const min = -(2n ** BigInt(spec.fft.dataBits - 1));
  const out: { exponent: number; productShift: number; re: number[]; im: number[] }[] = [];
  for (let blk = 0; blk < count; blk++) {
    const fr: number[] = [];
    const fi: number[] = [];
    for (let i = 0; i < n; i++) {
      const j = os ? blk * b - (l - 1) + i : blk * b + i;
      const inFrame = os || i < b;
      fr.push(inFrame && j >= 0 && j < nx ? x.re[j]! : 0);
      fi.push(inFrame && j >= 0 && j < nx ? x.im[j]! : 0);
    }
    const X = refFft(fr, fi, spec.fft);
    const pr: bigint[] = [];
    const pi: bigint[] = [];
    for (let k = 0; k < n; k++) {
      const a = BigInt(X.re[k]!);
      const c = BigInt(X.im[k]!);
      const hr = BigInt(table.re[k]!);
      const hi = BigInt(table.im[k]!);
      pr.push(a * hr - c * hi);
      pi.push(a * hi + c * hr);
    }
    let e = 0;
    const rnd = (v: bigint, sh: number) => refRound(v, 2n ** BigInt(sh), spec.fft.rounding);
    if (spec.productShift === "block-floating-point") {
      while (![...pr, ...pi].every((v) => rnd(v, e) <= max && rnd(v, e) >= min)) e++;
    } else e = spec.productShift;
    const sat = (v: bigint) => (v > max ? max : v < min ? min : v);
    const qr = pr.map((v) => Number(sat(rnd(v, e))));
    const qi = pi.map((v) => Number(sat(rnd(v, e))));
    const inv = { ...spec.fft, schedule: spec.inverseSchedule ?? spec.fft.schedule };
    const y = refFft(qr, qi, inv, true);
    const first = os ? l - 1 : 0;
    const keep = os ? b : b + l - 1;
    const exponent =
      X.shifts.reduce((p, q) => p + q, 0) + e + y.shifts.reduce((p, q) => p + q, 0) - Math.log2(n);
    out.push({
      exponent,
      productShift: e,
      re: y.re.slice(first, first + keep),
      im: y.im.slice(first, first + keep),
    });
  }
  return out;
}

describe("reference spectrum H[k]", () => {
  it("is the N-point DFT of the taps, natural bin order, e^(−j2πkn/N), no conjugation", () => {
    const h = randomFilter(1, 12);
    const t = referenceSpectrum(h, 32, {
      wordLength: 16,
      fractionLength: 15,
      signed: true,
      scaling: "full-scale",
      rounding: "nearest-even",
      overflow: "saturate",
    });
    const pad = (v: Float64Array) => [...Array.from(v), ...new Array<number>(20).fill(0)];
    const d = naiveDft(pad(h.re), pad(h.im));
    for (let k = 0; k < 32; k++) {
      expect(t.float[2 * k]).toBeCloseTo(d.re[k]!, 10);
      expect(t.float[2 * k + 1]).toBeCloseTo(d.im[k]!, 10);
      expect(Math.abs(t.re[k]! / t.scale - d.re[k]!)).toBeLessThanOrEqual(0.5 / t.scale + 1e-12);
    }
    expect(Math.max(...Array.from(t.re).map(Math.abs), ...Array.from(t.im).map(Math.abs))).toBe(32767);
  });

  it("an impulse at delay d returns the filter taps at d (the product needs no extra conjugation)", () => {
    const h = randomFilter(2, 9);
    const x = { re: new Array<number>(40).fill(0), im: new Array<number>(40).fill(0) };
    x.re[13] = 2 ** 24; // block floating point shifts right only: give the input its full width
    const spec = convSpec({
      fft: fftSpec({
        dataBits: 26,
        twiddleBits: 26,
        productGuardBits: 25,
        schedule: { kind: "block-floating-point", rule: "measured" },
      }),
      spectrum: {
        wordLength: 26,
        fractionLength: 25,
        signed: true,
        scaling: "normalize",
        rounding: "nearest-even",
        overflow: "saturate",
      },
    });
    const y = fixedFastConvolution(x, referenceSpectrum(h, 32, spec.spectrum), spec);
    for (let k = 0; k < 9; k++) {
      expect(y.re[13 + k]! / 2 ** 24).toBeCloseTo(h.re[k]!, 6);
      expect(y.im[13 + k]! / 2 ** 24).toBeCloseTo(h.im[k]!, 6);
    }
  });
});

describe("float reference", () => {
  it("floatConvolution equals direct convolution", () => {
    const x = randomCodes(3, 50, 10);
    const h = randomFilter(4, 17);
    const a = floatConvolution(x, h);
    const b = directConvolution(x, h);
    for (let i = 0; i < b.re.length; i++) {
      expect(a.re[i]).toBeCloseTo(b.re[i]!, 8);
      expect(a.im[i]).toBeCloseTo(b.im[i]!, 8);
    }
  });
});

describe("fixed fast convolution: bit for bit against the BigInt chain", () => {
  const schedules: StageSchedule[] = [
    { kind: "every-stage" },
    { kind: "block-floating-point", rule: "worst-case" },
    { kind: "block-floating-point", rule: "measured" },
  ];
  let seed = 100;
  for (const method of ["overlap-save", "overlap-add"] as const)
    for (const schedule of schedules)
      it(`${method}, ${schedule.kind}${"rule" in schedule ? ` ${schedule.rule}` : ""}`, () => {
        for (const [n, l, b, nx, rounding] of [
          [32, 7, 26, 70, "nearest-even"],
          [32, 12, 9, 45, "floor"],
          [64, 20, 45, 100, "nearest-away"],
          [16, 16, 1, 5, "toward-zero"],
        ] as const) {
          const h = randomFilter(seed++, l);
          const x = randomCodes(seed++, nx, 10, 0.7);
          const productShift = schedule.kind === "every-stage" ? 9 : ("block-floating-point" as const);
          const spec = convSpec({ method, fftSize: n, blockLength: b, schedule, rounding, productShift });
          const table = referenceSpectrum(h, n, spec.spectrum);
          const got = fixedFastConvolution(x, table, spec);
          const want = refChain(x, table, spec);
          expect(got.blocks.length).toBe(want.length);
          got.blocks.forEach((blk, i) => {
            expect(Array.from(blk.re)).toEqual(want[i]!.re);
            expect(Array.from(blk.im)).toEqual(want[i]!.im);
            expect(blk.exponent).toBe(want[i]!.exponent);
            expect(blk.productShift).toBe(want[i]!.productShift);
          });
        }
      });
});

describe("no-quantization limit", () => {
  it("overlap-save and overlap-add with wide words equal the float direct convolution", () => {
    for (const method of ["overlap-save", "overlap-add"] as const)
      for (const [n, l, b] of [
        [64, 20, 45],
        [64, 20, 8],
        [128, 33, 96],
      ] as const) {
        const h = randomFilter(n + l + b, l);
        const x = randomCodes(l * b, 300, 24);
        const spec = convSpec({
          method,
          fftSize: n,
          blockLength: b,
          fft: fftSpec({
            dataBits: 26,
            twiddleBits: 26,
            productGuardBits: 25,
            schedule: { kind: "block-floating-point", rule: "measured" },
          }),
          spectrum: {
            wordLength: 26,
            fractionLength: 25,
            signed: true,
            scaling: "full-scale",
            rounding: "nearest-even",
            overflow: "saturate",
          },
        });
        const y = fixedFastConvolution(x, referenceSpectrum(h, n, spec.spectrum), spec);
        const d = directConvolution(x, h);
        let peak = 0;
        for (let i = 0; i < d.re.length; i++) peak = Math.max(peak, Math.hypot(d.re[i]!, d.im[i]!));
        for (let i = 0; i < d.re.length; i++) {
          expect(Math.abs(y.re[i]! - d.re[i]!)).toBeLessThan(1e-5 * peak);
          expect(Math.abs(y.im[i]! - d.im[i]!)).toBeLessThan(1e-5 * peak);
        }
        expect(y.overflowCount).toBe(0);
      }
  });
});

describe("validation says precisely what cannot work", () => {
  const base = convSpec({});
  it("FFT size, filter length, block length, table format, product shift", () => {
    expect(() => checkFastConvolutionSpec({ ...base, fftSize: 48 }, 7)).toThrow(
      /fftSize must be a power of two \(radix-2 FFT\), got 48; the nearest are 32 and 64/,
    );
    expect(() => checkFastConvolutionSpec({ ...base, fftSize: 32 }, 40)).toThrow(
      /fftSize 32 is shorter than the receive filter \(40 taps\).*use fftSize ≥ 64/,
    );
    expect(() => checkFastConvolutionSpec({ ...base, blockLength: 30 }, 7)).toThrow(
      /blockLength 30 \+ filter length 7 − 1 = 36 exceeds fftSize 32: .*the longest block is 26/,
    );
    expect(() => checkFastConvolutionSpec({ ...base, blockLength: 0 }, 7)).toThrow(
      /blockLength must be an integer ≥ 1/,
    );
    expect(() => checkFastConvolutionSpec({ ...base, method: "overlap" as never }, 7)).toThrow(
      /method must be/,
    );
    expect(() =>
      checkFastConvolutionSpec({ ...base, spectrum: { ...base.spectrum, signed: false } }, 7),
    ).toThrow(/spectrum.signed must be true/);
    expect(() =>
      checkFastConvolutionSpec(
        { ...base, spectrum: { ...base.spectrum, wordLength: 32 }, fft: { ...base.fft, dataBits: 24 } },
        7,
      ),
    ).toThrow(/fft.dataBits \+ spectrum.wordLength must be ≤ 53/);
    expect(() => checkFastConvolutionSpec({ ...base, productShift: 21 }, 7)).toThrow(
      /productShift must be .* 0..20, got 21/,
    );
    expect(() =>
      checkFastConvolutionSpec({ ...base, inverseSchedule: { kind: "stages", shifts: [1] } }, 7),
    ).toThrow(/inverse.schedule.shifts must have one entry per stage \(5\)/);
    const t = referenceSpectrum(randomFilter(5, 7), 32, base.spectrum);
    expect(() => fixedFastConvolution({ re: [600], im: [0] }, t, base)).toThrow(
      /input.re\[0\] must be an integer code in -512..511/,
    );
    expect(() => fixedFastConvolution({ re: [1], im: [0] }, t, { ...base, fftSize: 64 })).toThrow(
      /the spectrum table has 32 bins but fftSize is 64/,
    );
  });
});
