import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { analyze } from "@shared/dsp/analysis";
import {
  convolutionSize,
  interpolateInto,
  interpolateSpectrum,
  interpolateSpectrumPadded,
  interpolationWorkspace,
  multiplySpectra,
  powerOf,
  spectrumOf,
} from "@shared/dsp/compression";
import { matchedFilter } from "@shared/dsp/matched-filter";
import { linearFm } from "@shared/dsp/lfm";
import {
  measureInterpolated,
  measureResponse,
  measureResponseDirect,
  measureSpectrum,
  type ResponseMetrics,
} from "@shared/dsp/metrics";
import { phaseCode } from "@shared/dsp/phase-codes";

// The performance paths (docs/analysis.md, "Speed") against the straightforward computations.

function seeded(seed: number) {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32) * 2 - 1;
}
const randomSpectrum = (m: number, seed: number) => Float64Array.from({ length: 2 * m }, seeded(seed));

/**
 * Band-limited (trigonometric) interpolation by its definition, one sum per output point:
 * y(t) = (1/M)·[Σ_{k<M/2} Y_k e^{j2πkt/M} + Σ_{k>M/2} Y_k e^{j2π(k−M)t/M} + Y_{M/2}·cos(πt)], t = j/U —
 * Oppenheim & Schafer, "Discrete-Time Signal Processing", 3rd ed., 2010, §4.6 (interpolation by
 * zero-padding the DFT), with the Nyquist bin split evenly between ±M/2 (hence the cosine).
 */
function naiveInterpolation(spec: Float64Array, u: number): Float64Array {
  const m = spec.length / 2;
  const out = new Float64Array(2 * m * u);
  for (let j = 0; j < m * u; j++) {
    const t = j / u;
    let sr = 0;
    let si = 0;
    for (let k = 0; k < m; k++) {
      const xr = spec[2 * k]!;
      const xi = spec[2 * k + 1]!;
      if (k === m / 2) {
        const c = Math.cos(Math.PI * t);
        sr += c * xr;
        si += c * xi;
        continue;
      }
      const a = (2 * Math.PI * (k < m / 2 ? k : k - m) * t) / m;
      sr += xr * Math.cos(a) - xi * Math.sin(a);
      si += xr * Math.sin(a) + xi * Math.cos(a);
    }
    out[2 * j] = sr / m;
    out[2 * j + 1] = si / m;
  }
  return out;
}

const maxAbsDiff = (a: Float64Array, b: Float64Array) => {
  expect(a.length).toBe(b.length);
  let d = 0;
  for (let i = 0; i < a.length; i++) d = Math.max(d, Math.abs(a[i]! - b[i]!));
  return d;
};

describe("interpolation by output phase (interpolateInto)", () => {
  it("equals the interpolation formula evaluated point by point, for U = 1, 2, 3, 5, 8, 16", () => {
    for (const m of [2, 16, 64]) {
      const spec = randomSpectrum(m, m);
      for (const u of [1, 2, 3, 5, 8, 16]) {
        const fast = interpolateSpectrum(spec, u);
        // Measured ≤ 3e-15 here; 1e-12 leaves room for other platforms' libm.
        expect(maxAbsDiff(fast, naiveInterpolation(spec, u))).toBeLessThan(1e-12);
      }
    }
  });

  it("equals one MU-point inverse of the zero-padded spectrum (the textbook form) at M = 4096", () => {
    const spec = randomSpectrum(4096, 3);
    for (const u of [2, 8, 16]) {
      const a = interpolateSpectrum(spec, u);
      const b = interpolateSpectrumPadded(spec, u);
      // Both are O(ε·log N) away from the exact values; measured ≤ 2e-16 on |y| ≈ 0.01.
      expect(maxAbsDiff(a, b)).toBeLessThan(1e-13);
    }
  });

  it("keeps the coarse samples (y_U[U·n] = y[n]) and writes |y|² equal to powerOf(y), reusing one workspace", () => {
    const m = 256;
    const spec = randomSpectrum(m, 5);
    const coarse = interpolateSpectrum(spec, 1);
    const ws = interpolationWorkspace(m);
    for (const u of [3, 8]) {
      const y = new Float64Array(2 * m * u);
      const power = new Float64Array(m * u);
      interpolateInto(spec, u, { y, power }, ws);
      for (let n = 0; n < m; n++) {
        expect(y[2 * n * u]).toBe(coarse[2 * n]);
        expect(y[2 * n * u + 1]).toBe(coarse[2 * n + 1]);
      }
      expect(maxAbsDiff(power, powerOf(y))).toBe(0);
      const again = new Float64Array(m * u);
      interpolateInto(spec, u, { power: again }, ws);
      expect(maxAbsDiff(again, power)).toBe(0);
    }
    expect(() => interpolateInto(spec, 8, { power: new Float64Array(10) })).toThrow(RangeError);
    expect(() => interpolateInto(spec, 8, {}, interpolationWorkspace(128))).toThrow(RangeError);
  });
});

/**
 * Every figure equal; ISLR's sums run in another order, so it may differ by rounding. Both forms get the
 * sidelobe energy as Σ|y|² − mainlobe energy, so its rounding error is ~ε·Σ|y|²: the dB tolerance
 * scales with Σ|y|² / sidelobe energy (about 10⁻¹⁰ dB on real outputs, larger on contrived grids).
 */
function expectSameFigures(a: ResponseMetrics, b: ResponseMetrics, p?: Float64Array) {
  const { islrDb: ia, ...ra } = a;
  const { islrDb: ib, ...rb } = b;
  expect(ra).toEqual(rb);
  if (ia === ib) return; // includes equal infinities (no sidelobe energy)
  let tol = 1e-9;
  if (p) {
    const u = 8;
    const peak = b.peakPositionSamples * u;
    let total = 0;
    let side = 0;
    for (let i = 0; i < p.length; i++) {
      total += p[i]!;
      if (i < peak + b.mainlobeSamples.left * u || i > peak + b.mainlobeSamples.right * u) side += p[i]!;
    }
    tol = 10 * Math.log10(1 + (1e-12 * total) / side) + 1e-9;
  }
  expect(Math.abs(ia - ib)).toBeLessThan(tol);
}

describe("one-pass measureResponse vs the straightforward passes", () => {
  const opts = { interpolation: 8, sampleRateHz: 1e6 };

  it("agrees on compressed LFM (rectangular and Taylor) and Barker-13 outputs", () => {
    const lfm = linearFm({ bandwidthHz: 1e6, pulseWidthS: 500e-6, sampleRateHz: 1.25e6 });
    const barker = phaseCode({ kind: "barker", length: 13 }, { samplesPerChip: 4 });
    for (const [s, h] of [
      [lfm, matchedFilter(lfm)],
      [lfm, matchedFilter(lfm, { kind: "taylor", nbar: 5, sidelobeDb: -35 })],
      [barker, matchedFilter(barker)],
    ] as const) {
      const size = convolutionSize(s.re.length);
      const p = powerOf(
        interpolateSpectrumPadded(multiplySpectra(spectrumOf(s, size), spectrumOf(h, size)), 8),
      );
      expectSameFigures(measureResponse(p, opts), measureResponseDirect(p, opts));
    }
  });

  it("worst cases for the blocks: mainlobe across block edges, largest sidelobe inside a cut block, peak at either end, tied peaks", () => {
    const cases: Float64Array[] = [];
    const base = () => Float64Array.from({ length: 1000 }, (_, i) => 1e-3 * (1 + Math.sin(i)));
    let p = base();
    for (let i = 250; i <= 262; i++) p[i] = 1 - Math.abs(i - 256) * 0.05; // lobe over the 256 edge
    p[249] = 0.3; // sidelobe in the block the lobe cuts, left side
    cases.push(p);
    p = base();
    for (let i = 250; i <= 262; i++) p[i] = 1 - Math.abs(i - 256) * 0.05;
    p[263] = 0.4; // … right side
    cases.push(p);
    p = base();
    p[0] = 2;
    cases.push(p);
    p = base();
    p[999] = 2;
    cases.push(p);
    p = base();
    p[300] = 2;
    p[700] = 2; // tie: the first is the peak, the other the largest sidelobe (PSL 0 dB)
    cases.push(p);
    for (const c of cases) expectSameFigures(measureResponse(c, opts), measureResponseDirect(c, opts));
  });

  it("agrees on arbitrary non-negative grids (fast-check)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 0, max: 1e6, noNaN: true }), { minLength: 2, maxLength: 1500 }),
        (v) => {
          const p = Float64Array.from(v);
          if (!(Math.max(...v) > 0)) return;
          expectSameFigures(measureResponse(p, opts), measureResponseDirect(p, opts), p);
        },
      ),
      { numRuns: 300 },
    );
  });

  it("measureInterpolated without the complex grid gives measureSpectrum's figures and |y|²", () => {
    const lfm = linearFm({ bandwidthHz: 1e6, pulseWidthS: 200e-6, sampleRateHz: 1.25e6 });
    const size = convolutionSize(lfm.re.length);
    const spec = multiplySpectra(spectrumOf(lfm, size), spectrumOf(matchedFilter(lfm), size));
    const a = measureSpectrum(spec, opts);
    const b = measureInterpolated(spec, opts, { complex: false });
    expect(b.y).toBeNull();
    expect(b.metrics).toEqual(a.metrics);
    expect(maxAbsDiff(a.power, b.power)).toBe(0);
  });
});

describe("analyze() against the textbook computation", () => {
  it("float and fixed figures of a 4,096-sample Taylor LFM equal the zero-padded ×8 inverse measured pass by pass", () => {
    const spec = {
      kind: "waveform",
      tx: { kind: "lfm", bandwidthHz: 10e6, pulseWidthS: 4096 / 12.5e6, sampleRateHz: 12.5e6 },
      rx: { window: { kind: "taylor", nbar: 5, sidelobeDb: -35 } },
      fixedPoint: { tx: { wordLength: 14, fractionLength: 13 }, rx: { wordLength: 8, fractionLength: 7 } },
    };
    const r = analyze(spec);
    const s = linearFm({ bandwidthHz: 10e6, pulseWidthS: 4096 / 12.5e6, sampleRateHz: 12.5e6 });
    const h = matchedFilter(s, { kind: "taylor", nbar: 5, sidelobeDb: -35 });
    const size = convolutionSize(s.re.length);
    const p = powerOf(
      interpolateSpectrumPadded(multiplySpectra(spectrumOf(s, size), spectrumOf(h, size)), 8),
    );
    const ref = measureResponseDirect(p, { interpolation: 8, sampleRateHz: 12.5e6, expectedIndex: 4095 * 8 });
    for (const k of ["peakPositionSamples", "pslDb"] as const) expect(r.float[k]).toBeCloseTo(ref[k], 9);
    // The width is the band-limited −3 dB crossing (tests/unit/dsp/refine.test.ts checks it against a
    // direct DFT evaluation); the straight line between ×8 points is within 0.3 % of it.
    expect(Math.abs(r.float.width3dbSamples! / ref.width3dbSamples - 1)).toBeLessThan(3e-3);
    expect(Math.abs(r.float.islrDb! - ref.islrDb)).toBeLessThan(1e-9);
    expect(Math.abs(r.float.peakAmplitude! / ref.peakAmplitude - 1)).toBeLessThan(1e-12);
  });
});
