import { describe, expect, it } from "vitest";
import { convolutionSize, multiplySpectra, spectrumOf } from "@shared/dsp/compression";
import { measureRefined } from "@shared/dsp/refine";
import { quantize } from "@shared/dsp/quantize";
import {
  confirmSmallest,
  fullResponse,
  prepareSweep,
  refinedResponse,
  type SweepRow,
} from "@shared/dsp/sweep";
import type { ComplexSignal, FixedPointSpec } from "@shared/dsp/types";

// Chirp and Hamming-weighted matched filter from their formulas (independent of the generator modules).
function pair(bt: number, os: number) {
  const n = Math.round(bt * os);
  const s: ComplexSignal = { re: new Float64Array(n), im: new Float64Array(n) };
  const h: ComplexSignal = { re: new Float64Array(n), im: new Float64Array(n) };
  for (let i = 0; i < n; i++) {
    const t = (i - (n - 1) / 2) / n;
    s.re[i] = Math.cos(Math.PI * bt * t * t);
    s.im[i] = Math.sin(Math.PI * bt * t * t);
  }
  for (let i = 0; i < n; i++) {
    const w = 0.54 - 0.46 * Math.cos((2 * Math.PI * i) / (n - 1));
    h.re[i] = w * s.re[n - 1 - i]!;
    h.im[i] = -w * s.im[n - 1 - i]!;
  }
  return { s, h, n };
}
const rxSpec = (w: number): FixedPointSpec => ({
  wordLength: w,
  fractionLength: w - 1,
  signed: true,
  scaling: "full-scale",
  rounding: "nearest-even",
  overflow: "saturate",
});
function fixedOf(h: ComplexSignal, w: number): ComplexSignal {
  const q = quantize(h, rxSpec(w));
  return { re: q.valueRe.map((v) => v / q.gain), im: q.valueIm.map((v) => v / q.gain) };
}

describe("refined sweep vs the full ×U computation", () => {
  it.each([
    [1.25, "fs = 1.25·B"],
    [2, "fs = 2·B"],
  ])("agree for W = 4…16 at %f (%s)", (os) => {
    const { s, h, n } = pair(400, os);
    const u = 8;
    const size = convolutionSize(n);
    const sSpec = spectrumOf(s, size);
    const fl = measureRefined(multiplySpectra(sSpec, spectrumOf(h, size)), {
      interpolation: u,
      sampleRateHz: os,
      expectedIndex: (n - 1) * u,
    });
    const ctx = prepareSweep({
      floatGrid: fl.fine,
      floatMetrics: fl.metrics,
      size,
      interpolation: u,
      sampleRateHz: os,
      expectedIndex: (n - 1) * u,
    });
    let worstPsl = 0;
    for (let w = 4; w <= 16; w++) {
      const prod = multiplySpectra(sSpec, spectrumOf(fixedOf(h, w), size));
      const r = refinedResponse(ctx, prod);
      const f = fullResponse(ctx, prod);
      // The refined full response against the whole ×U grid (PSL/ISLR/peak as before; width band-limited).
      const g = fullResponse(ctx, prod, "full");
      expect(Math.abs(f.pslDb - g.pslDb)).toBeLessThan(1e-9);
      expect(Math.abs(f.islrDb - g.islrDb)).toBeLessThan(1e-9);
      expect(f.peakAmplitude).toBe(g.peakAmplitude);
      expect(Math.abs(f.width3dbSamples / g.width3dbSamples - 1)).toBeLessThan(3e-3);
      worstPsl = Math.max(worstPsl, Math.abs(r.pslDb - f.pslDb));
      // Stated tolerances; measured worst PSL error 0.0078 dB at fs = 1.25·B, 0.0010 dB at fs = 2·B.
      expect(Math.abs(r.pslDb - f.pslDb)).toBeLessThan(0.02);
      expect(Math.abs(r.islrDb - f.islrDb)).toBeLessThan(0.01);
      expect(Math.abs(r.width3dbSamples - f.width3dbSamples)).toBeLessThan(1e-3);
      expect(Math.abs(r.peakAmplitude / f.peakAmplitude - 1)).toBeLessThan(1e-6);
      expect(r.peakPositionSamples).toBe(f.peakPositionSamples);
    }
    expect(worstPsl).toBeGreaterThanOrEqual(0);
  });
});

describe("confirmSmallest", () => {
  it("returns the first W that passes in full, even when the refinement misjudges", () => {
    // Full truth: W ≥ 9 passes. The "refined" rows wrongly say W ≥ 8 (first case) or W ≥ 11 (second).
    const truth = (w: number) => ({ figures: { w }, pass: w >= 9 });
    for (const claimed of [8, 11, 30]) {
      const rows: SweepRow<{ w: number }>[] = [];
      for (let w = 6; w <= 16; w++)
        rows.push({ wordLength: w, figures: { w }, pass: w >= claimed, method: "refined" });
      expect(confirmSmallest(rows, truth)).toBe(9);
      expect(rows.find((r) => r.wordLength === 9)!.method).toBe("full");
      expect(rows.find((r) => r.wordLength === 8)!.method).toBe("full");
      expect(rows.find((r) => r.wordLength === 8)!.pass).toBe(false);
    }
    const none: SweepRow<{ w: number }>[] = [
      { wordLength: 6, figures: { w: 6 }, pass: false, method: "refined" },
    ];
    expect(confirmSmallest(none, (w) => ({ figures: { w }, pass: false }))).toBeNull();
  });
});
