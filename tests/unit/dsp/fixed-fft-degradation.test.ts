import { describe, expect, it } from "vitest";
import {
  fixedFastConvolution,
  referenceSpectrum,
  type FastConvolutionSpec,
} from "@shared/dsp/fast-convolution/convolution";
import {
  blockEdgeEffect,
  fastConvolutionDegradation,
  inputCodes,
  pointTarget,
  responseSpan,
  widthSweep,
} from "@shared/dsp/fast-convolution/degradation";
import type { StageSchedule } from "@shared/dsp/fast-convolution/fixed-fft";
import { linearFm } from "@shared/dsp/lfm";
import { matchedFilter } from "@shared/dsp/matched-filter";
import type { ComplexSignal } from "@shared/dsp/types";
import { naiveDft } from "./fixed-fft-reference";

const FS = 10e6;
const BFP: StageSchedule = { kind: "block-floating-point", rule: "measured" };

function lfm(samples: number): ComplexSignal {
  return linearFm({ bandwidthHz: 8e6, pulseWidthS: samples / FS, sampleRateHz: FS });
}

function spec(o: {
  n: number;
  b: number;
  wd: number;
  wt?: number;
  wh?: number;
  method?: FastConvolutionSpec["method"];
  schedule?: StageSchedule;
  inverse?: StageSchedule;
  productShift?: FastConvolutionSpec["productShift"];
}): FastConvolutionSpec {
  const wt = o.wt ?? 16;
  const wh = o.wh ?? 16;
  return {
    method: o.method ?? "overlap-save",
    fftSize: o.n,
    blockLength: o.b,
    fft: {
      dataBits: o.wd,
      twiddleBits: wt,
      twiddleRounding: "nearest-even",
      rounding: "nearest-even",
      productGuardBits: wt - 1,
      overflow: "saturate",
      schedule: o.schedule ?? BFP,
    },
    inverseSchedule: o.inverse,
    spectrum: {
      wordLength: wh,
      fractionLength: wh - 1,
      signed: true,
      scaling: "full-scale",
      rounding: "nearest-even",
      overflow: "saturate",
    },
    productShift: o.productShift ?? "block-floating-point",
  };
}

const db = (x: number) => 10 * Math.log10(x);

describe("degradation figures agree with an independent computation", () => {
  it("PSL, ISLR, peak loss, self-noise, error peaks and SNR loss recomputed by hand", () => {
    const s = lfm(64);
    const h = matchedFilter(s, { kind: "taylor", nbar: 4, sidelobeDb: -30 });
    const sp = spec({ n: 256, b: 193, wd: 10, wt: 9, wh: 10 });
    const x = inputCodes(pointTarget(s, 150, 400), 10); // the echo straddles blocks 0 and 1
    const f = fastConvolutionDegradation({ input: x, filter: h, waveform: s, spec: sp, sampleRateHz: FS });
    const y = fixedFastConvolution(x, referenceSpectrum(h, 256, sp.spectrum), sp);
    // Direct convolution, written out.
    const ny = 400 + 64 - 1;
    const dr = new Array<number>(ny).fill(0);
    const di = new Array<number>(ny).fill(0);
    for (let n = 0; n < ny; n++)
      for (let k = 0; k < 64; k++) {
        const j = n - k;
        if (j < 0 || j >= 400) continue;
        dr[n] = dr[n]! + h.re[k]! * x.re[j]! - h.im[k]! * x.im[j]!;
        di[n] = di[n]! + h.re[k]! * x.im[j]! + h.im[k]! * x.re[j]!;
      }
    const figures = (re: ArrayLike<number>, im: ArrayLike<number>) => {
      const p = Array.from({ length: ny }, (_, i) => re[i]! ** 2 + im[i]! ** 2);
      const peak = p.indexOf(Math.max(...p));
      let l = peak;
      while (l > 0 && p[l - 1]! < p[l]!) l--;
      let r = peak;
      while (r + 1 < ny && p[r + 1]! < p[r]!) r++;
      let main = 0;
      let side = 0;
      let maxSide = 0;
      p.forEach((v, i) => {
        if (i >= l && i <= r) main += v;
        else {
          side += v;
          maxSide = Math.max(maxSide, v);
        }
      });
      return { p, peak, l, r, psl: db(maxSide / p[peak]!), islr: db(side / main) };
    };
    const fl = figures(dr, di);
    const fx = figures(y.re, y.im);
    expect(f.float.pslDb).toBeCloseTo(fl.psl, 9);
    expect(f.float.islrDb).toBeCloseTo(fl.islr, 9);
    expect(f.fixed.pslDb).toBeCloseTo(fx.psl, 9);
    expect(f.fixed.islrDb).toBeCloseTo(fx.islr, 9);
    expect(f.peakLossDb).toBeCloseTo(db(fl.p[fl.peak]! / fx.p[fx.peak]!), 9);
    let sum = 0;
    let big = 0;
    let count = 0;
    for (let i = 0; i < ny; i++) {
      if (i >= fl.l && i <= fl.r) continue;
      const e = (y.re[i]! - dr[i]!) ** 2 + (y.im[i]! - di[i]!) ** 2;
      sum += e;
      big = Math.max(big, e);
      count++;
    }
    expect(f.sidelobeSamples).toBe(count);
    expect(f.selfNoiseDb).toBeCloseTo(db(sum / count / fl.p[fl.peak]!), 6);
    expect(f.errorPeakDb).toBeCloseTo(db(big / fl.p[fl.peak]!), 6);
    // SNR loss of the quantized table: h_q = IDFT(Ĥ)/G by a naive DFT.
    const t = referenceSpectrum(h, 256, sp.spectrum);
    const inv = naiveDft(Array.from(t.re), Array.from(t.im), +1);
    const hq = { re: inv.re.map((v) => v / 256 / t.scale), im: inv.im.map((v) => v / 256 / t.scale) };
    const aligned = (g: { re: ArrayLike<number>; im: ArrayLike<number> }) => {
      let a = 0;
      let b = 0;
      for (let l = 0; l < 64; l++) {
        a += g.re[l]! * s.re[63 - l]! - g.im[l]! * s.im[63 - l]!;
        b += g.re[l]! * s.im[63 - l]! + g.im[l]! * s.re[63 - l]!;
      }
      return a * a + b * b;
    };
    const en = (g: { re: ArrayLike<number>; im: ArrayLike<number> }, n: number) => {
      let e = 0;
      for (let i = 0; i < n; i++) e += g.re[i]! ** 2 + g.im[i]! ** 2;
      return e;
    };
    expect(f.snrLossDb).toBeCloseTo(db(aligned(h) / en(h, 64) / (aligned(hq) / en(hq, 256))), 6);
    // A Taylor-weighted filter is mismatched: quantizing it may move it either way (here 4e-5 dB).
    expect(Math.abs(f.snrLossDb!)).toBeLessThan(0.01);
    // The unweighted matched filter is optimal (Cauchy–Schwarz): its quantized table can only lose.
    const m = fastConvolutionDegradation({
      input: x,
      filter: matchedFilter(s),
      waveform: s,
      spec: sp,
      sampleRateHz: FS,
    });
    expect(m.snrLossDb!).toBeGreaterThan(0);
  });

  it("the sidelobe region is checked and restricts the average", () => {
    const s = lfm(32);
    const h = matchedFilter(s);
    const sp = spec({ n: 128, b: 97, wd: 10 });
    const x = inputCodes(pointTarget(s, 300, 600), 10); // blocks 0–2 see no signal: exact zeros
    const all = fastConvolutionDegradation({ input: x, filter: h, spec: sp, sampleRateHz: FS });
    const span = fastConvolutionDegradation({
      input: x,
      filter: h,
      spec: sp,
      sampleRateHz: FS,
      sidelobeRegion: responseSpan(300, 32, 32),
    });
    expect(span.sidelobeSamples).toBeLessThan(all.sidelobeSamples);
    expect(span.selfNoiseDb).toBeGreaterThan(all.selfNoiseDb);
    expect(() =>
      fastConvolutionDegradation({
        input: x,
        filter: h,
        spec: sp,
        sampleRateHz: FS,
        sidelobeRegion: { start: 10, end: 700 },
      }),
    ).toThrow(/sidelobeRegion must satisfy 0 ≤ start < end ≤ 631 \(the output length\), got 10..700/);
  });

  it("wide words: the fixed path equals float direct convolution", () => {
    const s = lfm(100);
    const h = matchedFilter(s, { kind: "taylor", nbar: 5, sidelobeDb: -35 });
    const sp = spec({ n: 512, b: 300, wd: 24, wt: 26, wh: 26 });
    const f = fastConvolutionDegradation({
      input: inputCodes(pointTarget(s, 200, 700), 24),
      filter: h,
      waveform: s,
      spec: sp,
      sampleRateHz: FS,
    });
    expect(f.selfNoiseDb).toBeLessThan(-120);
    expect(Math.abs(f.fixed.pslDb - f.float.pslDb)).toBeLessThan(1e-4);
    expect(Math.abs(f.peakLossDb)).toBeLessThan(1e-5);
    expect(Math.abs(f.snrLossDb!)).toBeLessThan(1e-6);
    expect(f.overflowCount).toBe(0);
  });
});

describe("stage schedules", () => {
  const s = lfm(256);
  const h = matchedFilter(s, { kind: "taylor", nbar: 5, sidelobeDb: -35 });
  const x = inputCodes(pointTarget(s, 100, 769), 12);
  const run = (o: Partial<Parameters<typeof spec>[0]>) =>
    fastConvolutionDegradation({
      input: x,
      filter: h,
      waveform: s,
      spec: spec({ n: 1024, b: 769, wd: 12, method: "overlap-add", ...o }),
      sampleRateHz: FS,
    });

  it("a fixed schedule equal to the block-floating-point shifts reproduces BFP bit for bit", () => {
    const sp = spec({ n: 1024, b: 769, wd: 12, method: "overlap-add" });
    const bfp = fixedFastConvolution(x, referenceSpectrum(h, 1024, sp.spectrum), sp);
    const blk = bfp.blocks[0]!;
    const fixedSp = {
      ...sp,
      fft: { ...sp.fft, schedule: { kind: "stages", shifts: blk.fftShifts } as const },
      inverseSchedule: { kind: "stages", shifts: blk.ifftShifts } as const,
      productShift: blk.productShift,
    };
    const fixed = fixedFastConvolution(x, referenceSpectrum(h, 1024, sp.spectrum), fixedSp);
    expect(Array.from(fixed.blocks[0]!.re)).toEqual(Array.from(blk.re));
    expect(Array.from(fixed.blocks[0]!.im)).toEqual(Array.from(blk.im));
  });

  it("block floating point beats shift-every-stage (best fixed product shift) by > 5 dB of self-noise", () => {
    const bfp = run({});
    const worst = run({ schedule: { kind: "block-floating-point", rule: "worst-case" } });
    let every = Infinity;
    for (let ps = 4; ps <= 16; ps++) {
      const f = run({ schedule: { kind: "every-stage" }, productShift: ps });
      if (f.overflowCount === 0) every = Math.min(every, f.selfNoiseDb);
    }
    expect(bfp.overflowCount).toBe(0);
    expect(worst.overflowCount).toBe(0);
    expect(bfp.selfNoiseDb).toBeLessThan(every - 5);
    expect(worst.selfNoiseDb).toBeLessThan(every - 5);
    expect(Math.abs(bfp.fixed.pslDb - bfp.float.pslDb)).toBeLessThan(0.5);
  });
});

describe("width sweep", () => {
  it("returns the smallest data width with a passing twiddle width, then the smallest such twiddle width", () => {
    const s = lfm(128);
    const h = matchedFilter(s, { kind: "taylor", nbar: 5, sidelobeDb: -35 });
    const r = widthSweep({
      input: pointTarget(s, 50, 385),
      filter: h,
      waveform: s,
      spec: spec({ n: 512, b: 385, wd: 12, method: "overlap-add" }),
      sampleRateHz: FS,
      dataBits: [10, 11, 12, 13, 14],
      twiddleBits: [6, 8, 10, 12],
      limits: { selfNoiseDbMax: -70, pslDbMax: -30 },
      sidelobeRegion: responseSpan(50, 128, 128),
    });
    expect(r.points).toHaveLength(20);
    expect(r.smallest).not.toBeNull();
    const { dataBits, twiddleBits } = r.smallest!;
    const at = (wd: number, wt: number) => r.points.find((p) => p.dataBits === wd && p.twiddleBits === wt)!;
    expect(at(dataBits, twiddleBits).passes).toBe(true);
    for (const p of r.points) if (p.dataBits < dataBits) expect(p.passes).toBe(false);
    for (const p of r.points)
      if (p.dataBits === dataBits && p.twiddleBits < twiddleBits) expect(p.passes).toBe(false);
    expect(at(10, 12).failed).toContain("selfNoiseDbMax");
    // measured on this machine: smallest (13, 10); each data bit buys about 3–6 dB of self-noise.
    expect(dataBits).toBeGreaterThanOrEqual(12);
    expect(dataBits).toBeLessThanOrEqual(14);
  });
});

describe("block edges", () => {
  it("a target straddling two overlap-save blocks: exact in the float limit, reported in fixed point", () => {
    const s = lfm(256);
    const h = matchedFilter(s, { kind: "taylor", nbar: 5, sidelobeDb: -35 });
    const wide = blockEdgeEffect({
      waveform: s,
      filter: h,
      spec: spec({ n: 1024, b: 769, wd: 24, wt: 26, wh: 26 }),
      sampleRateHz: FS,
    });
    expect(wide.boundary).toBe(1538);
    expect(wide.inside.selfNoiseDb).toBeLessThan(-120);
    expect(wide.straddling.selfNoiseDb).toBeLessThan(-120);
    expect(Math.abs(wide.straddling.fixed.pslDb - wide.straddling.float.pslDb)).toBeLessThan(1e-4);
    const e = blockEdgeEffect({
      waveform: s,
      filter: h,
      spec: spec({ n: 1024, b: 769, wd: 10 }),
      sampleRateHz: FS,
    });
    // The straddling peak is computed by two blocks with their own exponents.
    expect(e.straddling.exponents[1]!.total).not.toBe(-10);
    expect(e.straddling.exponents[2]!.total).not.toBe(-10);
    expect(Number.isFinite(e.inside.selfNoiseDb) && Number.isFinite(e.straddling.selfNoiseDb)).toBe(true);
    expect(Math.abs(e.straddling.selfNoiseDb - e.inside.selfNoiseDb)).toBeLessThan(6);
  });
});

describe("published scale: block floating point at 9-bit data, 4,096-point FFT convolver", () => {
  // Source: "Digital matched filtering with pipelined floating point fast Fourier transforms (FFT's)",
  // abstract as indexed at paperexplained.cn (paper id 76c60e4ea9652dadc7fe110983c0d30004ee029b);
  // authors, journal and year not located. Its abstract: with 8 bits plus sign for the complex I and
  // Q mantissas and a 12-stage (4,096-point) FFT convolver, linear FM pulse compression of a single
  // point target gave a sidelobe mean square error relative to the peak below −70 dB, with
  // quantization peaks near −50 dB.
  //
  // The comparison is not like for like. That processor keeps a floating-point mantissa per sample,
  // so a small sidelobe sample is rounded relative to its own size; block floating point rounds every
  // sample of a block to one step set by the block's largest value (here the compressed peak), so its
  // self-noise floor relative to the peak sits higher. Measured with this model (LFM 8 MHz, 1,024
  // samples at 10 MHz, rectangular matched filter, one overlap-add segment of 3,073 samples, 9-bit
  // twiddles and table, nearest-even, MSE over the response span): −57.1 dB (measured rule), −57.0 dB
  // (worst-case rule), quantization peaks −43 dB; 10 bits −59.9, 11 bits −64.2, 12 bits −70.2 dB.
  // The test pins that finding — about 13 dB above the published floor at 9 bits, at it with 12 bits
  // (the model is deterministic, so the 0.2 dB margin at 12 bits is not noise) — instead of forcing it.
  const s = lfm(1024);
  const h = matchedFilter(s);
  const x = pointTarget(s, 300, 3073);
  const run = (wd: number, rule: "measured" | "worst-case") =>
    fastConvolutionDegradation({
      input: inputCodes(x, wd),
      filter: h,
      waveform: s,
      spec: spec({
        n: 4096,
        b: 3073,
        wd,
        wt: 9,
        wh: 9,
        method: "overlap-add",
        schedule: { kind: "block-floating-point", rule },
      }),
      sampleRateHz: FS,
    });

  it("9-bit data: self-noise ≈ −57 dB re peak, quantization peaks ≈ −43 dB (published floating point: < −70, ≈ −50)", () => {
    for (const rule of ["measured", "worst-case"] as const) {
      const f = run(9, rule);
      expect(f.overflowCount).toBe(0);
      expect(f.selfNoiseDb).toBeGreaterThan(-61);
      expect(f.selfNoiseDb).toBeLessThan(-54);
      expect(f.errorPeakDb).toBeGreaterThan(-48);
      expect(f.errorPeakDb).toBeLessThan(-38);
    }
  });

  it("12-bit data reaches the published −70 dB floor", () => {
    const f = run(12, "measured");
    expect(f.selfNoiseDb).toBeLessThan(-70);
    expect(Math.abs(f.fixed.pslDb - f.float.pslDb)).toBeLessThan(0.3);
  });
});
