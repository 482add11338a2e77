import { describe, expect, it } from "vitest";
import { checkFastConvolutionSpec, type FastConvolutionSpec } from "@shared/dsp/fast-convolution/convolution";
import {
  fastConvolutionDegradation,
  inputCodes,
  pointTarget,
} from "@shared/dsp/fast-convolution/degradation";
import { linearFm } from "@shared/dsp/lfm";
import { matchedFilter } from "@shared/dsp/matched-filter";

// The worked example of docs/fast-convolution.md: LFM 5 MHz at 6.25 MHz, Taylor n̄ = 5, −35 dB receive.
const FS = 6.25e6;
function design(samples: number) {
  const s = linearFm({ bandwidthHz: 5e6, pulseWidthS: samples / FS, sampleRateHz: FS });
  return { s, h: matchedFilter(s, { kind: "taylor", nbar: 5, sidelobeDb: -35 }) };
}
function spec(n: number, b: number, wd: number): FastConvolutionSpec {
  return {
    method: "overlap-save",
    fftSize: n,
    blockLength: b,
    fft: {
      dataBits: wd,
      twiddleBits: 16,
      twiddleRounding: "nearest-even",
      rounding: "nearest-even",
      productGuardBits: 15,
      overflow: "saturate",
      schedule: { kind: "block-floating-point", rule: "measured" },
    },
    spectrum: {
      wordLength: 16,
      fractionLength: 15,
      signed: true,
      scaling: "full-scale",
      rounding: "nearest-even",
      overflow: "saturate",
    },
    productShift: "block-floating-point",
  };
}

describe("worked example", () => {
  it("a 65,536-sample pulse does not fit 8,192-point blocks; 131,072 points with 65,537-sample blocks do", () => {
    expect(() => checkFastConvolutionSpec(spec(8192, 4096, 16), 65536)).toThrow(
      "fftSize 8192 is shorter than the receive filter (65536 taps): H[k] of an N-point FFT holds at most N taps; use fftSize ≥ 131072 (a pulse longer than the FFT needs a partitioned filter, not modelled)",
    );
    expect(() => checkFastConvolutionSpec(spec(131072, 65538, 16), 65536)).toThrow(
      "blockLength 65538 + filter length 65536 − 1 = 131073 exceeds fftSize 131072: the circular convolution would wrap into the kept outputs; with fftSize 131072 the longest block is 65537",
    );
    expect(() => checkFastConvolutionSpec(spec(131072, 65537, 16), 65536)).not.toThrow();
  });

  it("4,096-sample pulse in 8,192-point overlap-save blocks, 16-bit block floating point (figures in the doc)", () => {
    const { s, h } = design(4096);
    const x = pointTarget(s, 2048, 2 * 4097); // compressed peak in the middle of block 1
    const f = fastConvolutionDegradation({
      input: inputCodes(x, 16),
      filter: h,
      waveform: s,
      spec: spec(8192, 4097, 16),
      sampleRateHz: FS,
    });
    expect(f.overflowCount).toBe(0);
    expect(f.float.pslDb).toBeCloseTo(-37.691, 2);
    expect(Math.abs(f.fixed.pslDb - f.float.pslDb)).toBeLessThan(0.1);
    expect(Math.abs(f.fixed.islrDb - f.float.islrDb)).toBeLessThan(0.1);
    expect(Math.abs(f.peakLossDb)).toBeLessThan(0.01);
    expect(f.selfNoiseDb).toBeGreaterThan(-93.5); // measured −91.5 dB
    expect(f.selfNoiseDb).toBeLessThan(-89.5);
    expect(f.errorPeakDb).toBeLessThan(-77);
    expect(f.exponents.map((e) => [e.fft, e.product, e.ifft])).toEqual([
      [7, 15, 11],
      [7, 15, 12],
      [7, 15, 11],
    ]);
  });
});
