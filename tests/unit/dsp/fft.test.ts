import { describe, expect, it } from "vitest";
import { fft, ifft, nextPow2 } from "@shared/dsp/fft";

// Independent reference: the DFT by its definition, X[k] = Σ x[n]·e^{-j2πkn/N}.
function naiveDft(re: Float64Array, im: Float64Array) {
  const n = re.length;
  const outRe = new Float64Array(n);
  const outIm = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    let sr = 0;
    let si = 0;
    for (let t = 0; t < n; t++) {
      const a = (-2 * Math.PI * k * t) / n;
      sr += re[t]! * Math.cos(a) - im[t]! * Math.sin(a);
      si += re[t]! * Math.sin(a) + im[t]! * Math.cos(a);
    }
    outRe[k] = sr;
    outIm[k] = si;
  }
  return { re: outRe, im: outIm };
}

function seeded(seed: number) {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32) * 2 - 1;
}

describe("fft", () => {
  it("matches a naive DFT to 1e-9 for sizes 2..1024", () => {
    const rnd = seeded(7);
    for (const n of [2, 4, 8, 64, 256, 1024]) {
      const re = Float64Array.from({ length: n }, rnd);
      const im = Float64Array.from({ length: n }, rnd);
      const fast = fft({ re, im }, n);
      const slow = naiveDft(re, im);
      for (let k = 0; k < n; k++) {
        expect(Math.abs(fast.re[k]! - slow.re[k]!)).toBeLessThan(1e-9 * n);
        expect(Math.abs(fast.im[k]! - slow.im[k]!)).toBeLessThan(1e-9 * n);
      }
    }
  });

  it("round-trips through the inverse", () => {
    const rnd = seeded(11);
    const re = Float64Array.from({ length: 4096 }, rnd);
    const im = Float64Array.from({ length: 4096 }, rnd);
    const back = ifft(fft({ re, im }));
    for (let i = 0; i < re.length; i++) {
      expect(back.re[i]).toBeCloseTo(re[i]!, 12);
      expect(back.im[i]).toBeCloseTo(im[i]!, 12);
    }
  });

  it("zero-pads to the next power of two and rejects bad sizes", () => {
    expect(nextPow2(1)).toBe(2);
    expect(nextPow2(1000)).toBe(1024);
    expect(nextPow2(1024)).toBe(1024);
    expect(fft({ re: new Float64Array(3), im: new Float64Array(3) }).re.length).toBe(4);
    expect(() => fft({ re: new Float64Array(4), im: new Float64Array(4) }, 6)).toThrow(/power of two/);
    expect(() => nextPow2(0)).toThrow(RangeError);
  });
});
