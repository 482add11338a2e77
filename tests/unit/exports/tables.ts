/**
 * Quantized tables the export tests render: the DSP core's output, so the expected integers come from
 * the quantizer, never from the export code under test.
 */
import { designFir } from "@shared/dsp/fir-design";
import { linearFm } from "@shared/dsp/lfm";
import { matchedFilter } from "@shared/dsp/matched-filter";
import { quantize } from "@shared/dsp/quantize";
import type { ComplexSignal, FixedPointSpec } from "@shared/dsp/types";
import { buildExportContext, quantizedTableFields, type ExportContext } from "@shared/exports/context";

/** A rendered-table fixture: its context and the codes the quantizer produced. */
export interface TableCase {
  label: string;
  ctx: ExportContext;
  codesI: number[];
  codesQ: number[];
}

function make(
  label: string,
  name: string,
  role: string,
  signal: ComplexSignal,
  spec: FixedPointSpec,
  complex: boolean,
): TableCase {
  const q = quantize(signal, spec);
  const ctx = buildExportContext({
    project: { name: "Harbour Watch", slug: "harbour-watch" },
    design: { name, kind: complex ? "waveform" : "filter" },
    version: "1.0.0",
    revision: 2,
    contentHash: "sha256:" + "ab".repeat(32),
    role,
    sampleRateHz: 10e6,
    complex,
    ...quantizedTableFields(signal, q),
  });
  return {
    label,
    ctx,
    codesI: Array.from(q.re, (v) => v + 0),
    codesQ: Array.from(q.im, (v) => (complex ? v + 0 : 0)),
  };
}

const base = { signed: true, rounding: "nearest-even", overflow: "saturate" } as const;

/** 16-bit Hamming-weighted LFM matched filter (5 MHz over 10 µs at 10 MS/s: 100 complex taps). */
export function lfmCase(): TableCase {
  const s = linearFm({ bandwidthHz: 5e6, pulseWidthS: 10e-6, sampleRateHz: 10e6 });
  const h = matchedFilter(s, { kind: "hamming" });
  return make(
    "16-bit Hamming LFM matched filter",
    "Long pulse LFM",
    "rx",
    h,
    {
      ...base,
      wordLength: 16,
      fractionLength: 15,
      scaling: "full-scale",
    },
    true,
  );
}

/**
 * W = 12 real FIR with negative taps and the most negative code: a Kaiser low-pass, sign-inverted and
 * scaled so its centre tap is exactly −1.0 (−2048 at F = 11).
 */
export function firCase(): TableCase {
  const { taps } = designFir({
    band: "lowpass",
    sampleRateHz: 10e6,
    cutoffHz: 1.25e6,
    transitionHz: 0.5e6,
    stopbandAttenuationDb: 60,
  });
  const peak = Math.max(...taps);
  const re = Float64Array.from(taps, (v) => -v / peak);
  return make(
    "12-bit real FIR with −2048",
    "Decimation FIR 4:1",
    "fir",
    { re, im: new Float64Array(re.length) },
    {
      ...base,
      wordLength: 12,
      fractionLength: 11,
      scaling: "as-given",
    },
    false,
  );
}

/** W = 32 edge words: the most negative and most positive 32-bit codes, −1 and 0 (hand-given values). */
export function edge32Case(): TableCase {
  const values = [-1, 1 - 2 ** -31, -(2 ** -31), 0, 0.5];
  const re = Float64Array.from(values);
  return make(
    "32-bit edge words",
    "Edge words",
    "fir",
    { re, im: new Float64Array(re.length) },
    {
      ...base,
      wordLength: 32,
      fractionLength: 31,
      scaling: "as-given",
    },
    false,
  );
}

/** Unsigned W = 8 words (0 and 255 included): uint8_t, unsigned(7 downto 0), unsigned binary bytes. */
export function unsigned8Case(): TableCase {
  const values = [0, 1 / 256, 0.5, 0.75, 255 / 256, 0.1];
  const re = Float64Array.from(values);
  return make(
    "8-bit unsigned words",
    "Gain ramp",
    "fir",
    { re, im: new Float64Array(re.length) },
    { ...base, signed: false, wordLength: 8, fractionLength: 8, scaling: "as-given" },
    false,
  );
}
