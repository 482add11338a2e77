/**
 * Sample tables for template previews and validation: a short complex LFM matched filter and an
 * odd-width real FIR that holds the most negative code, so a template meets both shapes before it is saved.
 */
import { linearFm } from "../dsp/lfm";
import { matchedFilter } from "../dsp/matched-filter";
import { quantize } from "../dsp/quantize";
import type { ComplexSignal, FixedPointSpec } from "../dsp/types";
import { buildExportContext, quantizedTableFields, type ExportContext } from "./context";
import type { SampleKind } from "./sample-kinds";

const META = {
  project: { name: "Harbour Watch sample", slug: "harbour-watch" },
  version: "0.0.0",
  revision: 1,
  contentHash: "sha256:" + "0".repeat(64),
} as const;

function signedSpec(
  wordLength: number,
  fractionLength: number,
  scaling: FixedPointSpec["scaling"],
): FixedPointSpec {
  return {
    wordLength,
    fractionLength,
    signed: true,
    scaling,
    rounding: "nearest-even",
    overflow: "saturate",
  };
}

/** A quantized sample table's render context (fictional names; values from the DSP core). */
export function sampleExportContext(kind: SampleKind = "complex"): ExportContext {
  if (kind === "complex") {
    // 2 MHz over 8 µs at 2 MS/s: 16 taps, Hamming receive weighting, Q1.15 full scale.
    const s = linearFm({ bandwidthHz: 2e6, pulseWidthS: 8e-6, sampleRateHz: 2e6 });
    const h = matchedFilter(s, { kind: "hamming" });
    const spec = signedSpec(16, 15, "full-scale");
    return buildExportContext({
      ...META,
      design: { name: "Sample chirp", kind: "waveform" },
      role: "rx",
      sampleRateHz: 2e6,
      complex: true,
      ...quantizedTableFields(h, quantize(h, spec)),
    });
  }
  // Symmetric taps reaching −1.0, which is the most negative Q1.11 code (−2048).
  const taps = [-0.0625, 0.125, -0.3125, -1, 0.99951171875, -1, -0.3125, 0.125, -0.0625];
  const signal: ComplexSignal = { re: Float64Array.from(taps), im: new Float64Array(taps.length) };
  const spec = signedSpec(12, 11, "as-given");
  return buildExportContext({
    ...META,
    design: { name: "Sample FIR", kind: "filter" },
    role: "fir",
    sampleRateHz: 1e6,
    complex: false,
    ...quantizedTableFields(signal, quantize(signal, spec)),
  });
}
