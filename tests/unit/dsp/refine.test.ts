/**
 * measureRefined (×2 grid + local band-limited refinement) against the whole ×U grid it replaces
 * (measureInterpolated / interpolateSpectrumPadded, the zero-padded MU-point inverse).
 */
import { describe, expect, it } from "vitest";
import {
  convolutionSize,
  interpolateSpectrumPadded,
  multiplySpectra,
  powerOf,
  spectrumOf,
} from "@shared/dsp/compression";
import { measureInterpolated } from "@shared/dsp/metrics";
import { FineGrid, grid2Of, measureRefined } from "@shared/dsp/refine";
import { createRng } from "@shared/dsp/random";
import type { ComplexSignal } from "@shared/dsp/types";

function chirpPair(bt: number, os: number, hamming: boolean) {
  const n = Math.round(bt * os);
  const s: ComplexSignal = { re: new Float64Array(n), im: new Float64Array(n) };
  const h: ComplexSignal = { re: new Float64Array(n), im: new Float64Array(n) };
  for (let i = 0; i < n; i++) {
    const t = (i - (n - 1) / 2) / n;
    s.re[i] = Math.cos(Math.PI * bt * t * t);
    s.im[i] = Math.sin(Math.PI * bt * t * t);
  }
  for (let i = 0; i < n; i++) {
    const w = hamming ? 0.54 - 0.46 * Math.cos((2 * Math.PI * i) / (n - 1)) : 1;
    h.re[i] = w * s.re[n - 1 - i]!;
    h.im[i] = -w * s.im[n - 1 - i]!;
  }
  return { s, h, n };
}

function noisePair(n: number, seed: number) {
  const rng = createRng(seed);
  const s: ComplexSignal = { re: new Float64Array(n), im: new Float64Array(n) };
  for (let i = 0; i < n; i++) {
    s.re[i] = rng.uniform() * 2 - 1;
    s.im[i] = rng.uniform() * 2 - 1;
  }
  const h: ComplexSignal = {
    re: s.re.slice().reverse(),
    im: s.im
      .slice()
      .reverse()
      .map((v) => -v),
  };
  return { s, h, n };
}

describe("measureRefined against the whole ×U grid", () => {
  const cases = [
    ["LFM BT 400, fs 1.25·B, Hamming", chirpPair(400, 1.25, true)],
    ["LFM BT 400, fs = B, Hamming", chirpPair(400, 1, true)],
    ["LFM BT 300, fs 2·B, unweighted", chirpPair(300, 2, false)],
    ["random complex code, 500 chips", noisePair(500, 3)],
  ] as const;
  for (const [name, pair] of cases)
    it.each([3, 4, 5, 8, 16])(`${name}: PSL, ISLR, peak and mainlobe at U = %i`, (u) => {
      const size = convolutionSize(pair.n);
      const spec = multiplySpectra(spectrumOf(pair.s, size), spectrumOf(pair.h, size));
      const opts = { interpolation: u, sampleRateHz: 1, expectedIndex: (pair.n - 1) * u };
      const full = measureInterpolated(spec, opts, { complex: false }).metrics;
      const fast = measureRefined(spec, opts).metrics;
      expect(Math.abs(fast.pslDb - full.pslDb)).toBeLessThan(1e-9);
      expect(Math.abs(fast.islrDb - full.islrDb)).toBeLessThan(1e-9);
      expect(Math.abs(fast.peakAmplitude / full.peakAmplitude - 1)).toBeLessThan(1e-12);
      expect(fast.peakPositionSamples).toBe(full.peakPositionSamples);
      expect(fast.mainlobeSamples).toEqual(full.mainlobeSamples);
      // The band-limited width does not depend on U; the straight line between ×U points does (≈ 1/U²).
      const w16 = measureRefined(spec, { ...opts, interpolation: 16 }).metrics.width3dbSamples;
      expect(Math.abs(fast.width3dbSamples - w16)).toBeLessThan(1e-6);
      expect(Math.abs(fast.width3dbSamples / full.width3dbSamples - 1)).toBeLessThan(0.4 / (u * u));
    });

  it("reads every ×U point from the ×2 grid to 1e-9 of the peak (the zero-padded MU-point inverse as reference)", () => {
    const { s, h, n } = chirpPair(200, 1.1, true);
    const size = convolutionSize(n);
    const spec = multiplySpectra(spectrumOf(s, size), spectrumOf(h, size));
    for (const u of [4, 8]) {
      const ref = powerOf(interpolateSpectrumPadded(spec, u));
      const fine = new FineGrid(grid2Of(spec), u);
      let peak = 0;
      for (const v of ref) peak = Math.max(peak, v);
      let worst = 0;
      for (let j = 0; j < ref.length; j++) worst = Math.max(worst, Math.abs(fine.at(j) - ref[j]!));
      expect(worst / peak).toBeLessThan(1e-9);
    }
  });
});
