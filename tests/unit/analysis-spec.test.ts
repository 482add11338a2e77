import { describe, expect, it } from "vitest";
import { defaultSweep, toAnalysisSpec } from "../../shared/analysis-spec";
import { AnalysisSpecSchema } from "../../shared/schemas/analysis";
import { RevisionContentSchema } from "../../shared/schemas/designs";

const Q15 = { wordLength: 16, fractionLength: 15 };

describe("toAnalysisSpec", () => {
  it("keeps generator sources as parameters", () => {
    const content = RevisionContentSchema.parse({
      kind: "waveform",
      tx: { kind: "lfm", bandwidthHz: 10e6, pulseWidthS: 50e-6, sampleRateHz: 12.5e6 },
      rx: { window: { kind: "taylor", nbar: 5, sidelobeDb: -35 } },
      fixedPoint: { tx: Q15, rx: Q15 },
      limits: { pslDbMax: -35 },
    });
    const spec = AnalysisSpecSchema.parse(toAnalysisSpec(content, []));
    // Every analysis sweeps by default: W = 16 → 6 … 20 bits.
    expect(spec).toEqual(AnalysisSpecSchema.parse({ ...content, sweep: { minBits: 6, maxBits: 20 } }));
  });

  it("sweeps W − 10 … W + 4 of the swept table by default, inside 2 … 32 bits, and keeps a sweep the author set", () => {
    const base = RevisionContentSchema.parse({
      kind: "filter",
      fir: { kind: "upload", uploadId: 3, sampleRateHz: 1e6, passbands: [[0, 1e5]], stopbands: [[3e5, 5e5]] },
      fixedPoint: { fir: { wordLength: 6, fractionLength: 5 } },
    });
    expect(defaultSweep(base)).toEqual({ minBits: 2, maxBits: 10 });
    const wide = { ...base, fixedPoint: { fir: { wordLength: 30, fractionLength: 29 } } } as typeof base;
    expect(defaultSweep(wide)).toEqual({ minBits: 20, maxBits: 32 });
    const own = { ...base, sweep: { minBits: 4, maxBits: 5 } } as typeof base;
    expect(
      AnalysisSpecSchema.parse(toAnalysisSpec(own, [{ role: "fir", re: [0.5, 0.5], im: [0, 0] }])).sweep,
    ).toEqual({
      minBits: 4,
      maxBits: 5,
    });
  });

  it("replaces an uploaded waveform by its samples, complex values with im", () => {
    const content = RevisionContentSchema.parse({
      kind: "waveform",
      tx: { kind: "upload", uploadId: 7, sampleRateHz: 2e6 },
      fixedPoint: { tx: Q15, rx: Q15 },
      dopplerHz: 1000,
    });
    const tables = [
      { role: "tx" as const, re: Float64Array.from([1, 0, -1]), im: Float64Array.from([0, 1, 0.5]) },
      { role: "rx" as const, re: Float64Array.from([-1, 0, 1]), im: Float64Array.from([-0.5, -1, 0]) },
    ];
    const spec = AnalysisSpecSchema.parse(toAnalysisSpec(content, tables));
    expect(spec.kind === "waveform" && spec.tx).toEqual({
      kind: "samples",
      sampleRateHz: 2e6,
      re: [1, 0, -1],
      im: [0, 1, 0.5],
    });
    expect(spec).toMatchObject({
      dopplerHz: 1000,
      interpolation: 8,
      inputBits: 14,
      rx: { window: { kind: "rectangular" } },
    });
  });

  it("replaces uploaded FIR taps by taps with their bands; a real table has no im", () => {
    const content = RevisionContentSchema.parse({
      kind: "filter",
      fir: { kind: "upload", uploadId: 3, sampleRateHz: 1e6, passbands: [[0, 1e5]], stopbands: [[2e5, 5e5]] },
      fixedPoint: { fir: Q15 },
      limits: { stopbandAttenuationDbMin: 60 },
    });
    const spec = AnalysisSpecSchema.parse(
      toAnalysisSpec(content, [{ role: "fir", re: [0.25, 0.5, 0.25], im: [0, 0, 0] }]),
    );
    expect(spec.kind === "filter" && spec.fir).toEqual({
      kind: "taps",
      sampleRateHz: 1e6,
      re: [0.25, 0.5, 0.25],
      passbands: [[0, 1e5]],
      stopbands: [[2e5, 5e5]],
    });
    expect(spec.limits).toEqual({ stopbandAttenuationDbMin: 60 });
  });

  it("refuses a missing table", () => {
    const content = RevisionContentSchema.parse({
      kind: "filter",
      fir: { kind: "upload", uploadId: 3, sampleRateHz: 1e6, passbands: [[0, 1e5]], stopbands: [[2e5, 5e5]] },
      fixedPoint: { fir: Q15 },
    });
    expect(() => toAnalysisSpec(content, [])).toThrow("the revision has no fir table");
  });
});
