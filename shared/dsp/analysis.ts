/**
 * The top-level fixed-point analysis of a design (DESIGN.md "The computation"): float reference vs the
 * quantized tables (represented values divided by the gain, ĥ/g), every metric, pass/fail per limit,
 * accumulator growth, the bit-width sweep and small plot data. Returns plain JSON-able data; non-finite
 * figures (e.g. the SQNR of an exactly representable table) are written as null.
 */
import {
  AnalysisSpecSchema,
  type AnalysisSpec,
  type FirSource,
  type WaveformSource,
} from "../schemas/analysis";
import { accumulatorGrowth } from "./accumulator";
import { datapathReport, type DatapathFigures } from "./datapath";
import {
  compress,
  convolutionSize,
  interpolationWorkspace,
  multiplySpectra,
  powerOf,
  spectrumOf,
} from "./compression";
import { applyDoppler, dopplerCut, type DopplerCut } from "./doppler";
import { fftInterleaved } from "./fft";
import { designFir } from "./fir-design";
import { firMagnitude, firMetrics, type Band, type FirMetrics } from "./fir-response";
import { linearFm } from "./lfm";
import { matchedFilter } from "./matched-filter";
import { coefficientSqnrDb, mismatchLossDb, peakLossDb, type ResponseMetrics } from "./metrics";
import { nonlinearFm } from "./nlfm";
import { phaseCode } from "./phase-codes";
import { quantize } from "./quantize";
import { windowWarnings } from "./windows";
import { measureRefined } from "./refine";
import { confirmSmallest, fullResponse, prepareSweep, refinedResponse, type SweepRow } from "./sweep";
import type { AcceptanceLimits, ComplexSignal, FixedPointSpec, QuantizedTable } from "./types";

/** Progress report for the job queue: fraction 0..1 and the stage under way. */
export type ProgressCallback = (fraction: number, stage: string) => void;

/** Version of the report's layout (docs/analysis.md). */
export const ANALYSIS_REPORT_VERSION = 1;
/** Target number of points of each decimated plot trace (min/max pairs). */
export const PLOT_POINTS = 2000;

/** Compression figures of one output, plus the receive filter's losses. */
export interface CompressionFigures extends ResponseMetrics {
  mismatchLossDb: number;
  /** Fixed only: 20·log10(float peak / fixed peak). */
  peakLossDb?: number;
}

/** One coefficient table in the report. */
export interface TableReport {
  role: "tx" | "rx" | "fir";
  length: number;
  complex: boolean;
  fixedPoint: FixedPointSpec;
  gain: number;
  overflowCount: number;
  coefficientSqnrDb: number | null;
  accumulator: { inputBits: number; worstCaseBits: number; recommendedBits: number } | null;
}

/** Pass/fail of one acceptance limit. */
export interface LimitCheck {
  name: keyof AcceptanceLimits;
  limit: number;
  /** The fixed-point figure compared (worst table for the SQNR). */
  value: number | null;
  pass: boolean;
}

/** Decimated plot traces: min/max envelope over the full range plus full resolution near the mainlobe. */
export interface PlotTrace {
  x: number[];
  floatDb: number[];
  fixedDb: number[];
}

/** Coefficient error in LSB of the table's format, (ĥ − g·h)·2^F, I and Q as min/max envelopes. */
export interface LsbTrace {
  x: number[];
  re: number[];
  im: number[];
}

/** The JSON report. */
export interface AnalysisReport {
  version: number;
  kind: "waveform" | "filter";
  sampleRateHz: number;
  interpolation: number;
  tables: TableReport[];
  float: Record<string, number | null>;
  fixed: Record<string, number | null>;
  diff: Record<string, number | null>;
  doppler: { float: DopplerCut; fixed: DopplerCut } | null;
  limits: LimitCheck[];
  pass: boolean;
  sweep: {
    tables: string[];
    rows: { wordLength: number; pass: boolean; method: string; figures: Record<string, number | null> }[];
    smallestPassingWordLength: number | null;
  } | null;
  plots: Record<string, PlotTrace>;
  /** Per table role: quantization error in LSB against the coefficient index. */
  coefficientErrorLsb?: Record<string, LsbTrace>;
  /** The receive/FIR datapath and its figures (shared/dsp/datapath.ts); absent in older reports. */
  datapath?: DatapathFigures;
  /** Filters: the bands the limits are judged over (Hz), for drawing the masks. */
  firBands?: { passbands: Band[]; stopbands: Band[] };
  definitions: Record<string, string>;
  /** Waveforms: what the compression figures are measured on, with the U and mainlobe rule used. */
  measurement?: {
    /** "complex output", or "envelope" (analytic signal) for a real waveform at an IF. */
    signal: "complex output" | "envelope";
    interpolation: number;
    /** True when U was not given and the default for the waveform's kind was used. */
    interpolationDefaulted: boolean;
    mainlobe: string;
  };
  /** Design cautions (window edge spikes, saturated coefficients, …), also printed by the CLI. */
  warnings?: string[];
}

const DEFINITIONS = {
  mainlobe: "from the peak out to the first local minimum on each side, on the ×U grid",
  envelope:
    "real waveforms at an IF: every compression figure is measured on the envelope |y + j·H{y}| (analytic signal), not on the carrier",
  width3db:
    "−3 dB width: the two half-power crossings of the band-limited output nearest the peak (bisection between the ×U points that straddle them)",
  pslDb: "20·log10(max sidelobe |y| / peak |y|)",
  islrDb: "10·log10(Σ sidelobe |y|² / Σ mainlobe |y|²) over the ×U grid",
  mismatchLossDb: "−10·log10(|y0|²/(Σ|h|²·Σ|s|²)), y0 = Σ h[n]·s[N−1−n]",
  peakLossDb: "20·log10(float peak / fixed peak)",
  coefficientSqnrDb: "10·log10(Σ|h|² / Σ|h − ĥ/g|²); null = exact",
  fixed: "quantized tables' represented values divided by their gain (ĥ/g)",
  stopbandAttenuationDb: "mean passband |H| over the largest stopband |H|, dB",
  passbandRippleDb: "max − min of |H| in the passbands, dB peak-to-peak",
};

/** The transmit waveform a source describes: one generator switch for the analysis and the stored tables. */
export function generateWaveform(src: WaveformSource): ComplexSignal {
  switch (src.kind) {
    case "lfm":
      return linearFm(src);
    case "nlfm":
      return nonlinearFm(src);
    case "phase-code":
      return phaseCode(src.code, { samplesPerChip: src.samplesPerChip });
    case "samples":
      return samplesOf(src.re, src.im);
  }
}

function samplesOf(re: number[], im?: number[]): ComplexSignal {
  if (im && im.length !== re.length) throw new RangeError(`im has ${im.length} samples; re has ${re.length}`);
  return { re: Float64Array.from(re), im: im ? Float64Array.from(im) : new Float64Array(re.length) };
}

/** The FIR taps and the bands they are judged by (windowed-sinc edges: cutoff ∓ transition/2). */
function firOf(src: FirSource): { taps: ComplexSignal; passbands: Band[]; stopbands: Band[] } {
  if (src.kind === "taps")
    return { taps: samplesOf(src.re, src.im), passbands: src.passbands, stopbands: src.stopbands };
  const d = designFir(src);
  const taps = { re: d.taps, im: new Float64Array(d.taps.length) };
  const tw = src.transitionHz / 2;
  const nyq = src.sampleRateHz / 2;
  if (src.band === "lowpass") {
    const fc = src.cutoffHz ?? 0;
    return { taps, passbands: [[0, fc - tw]], stopbands: [[fc + tw, nyq]] };
  }
  const lo = src.lowCutoffHz ?? 0;
  const hi = src.highCutoffHz ?? 0;
  return {
    taps,
    passbands: [[lo + tw, hi - tw]],
    stopbands: [
      [0, lo - tw],
      [hi + tw, nyq],
    ],
  };
}

/** ĥ/g as a signal. */
function fixedValues(q: QuantizedTable): ComplexSignal {
  const re = new Float64Array(q.valueRe.length);
  const im = new Float64Array(q.valueIm.length);
  for (let i = 0; i < re.length; i++) {
    re[i] = q.valueRe[i]! / q.gain;
    im[i] = q.valueIm[i]! / q.gain;
  }
  return { re, im };
}

/** (ĥ − g·h)·2^F per coefficient, decimated to a min/max envelope. */
function lsbTrace(float: ComplexSignal, q: QuantizedTable): LsbTrace {
  const lsb = 2 ** q.spec.fractionLength;
  const n = float.re.length;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    re[i] = (q.valueRe[i]! - q.gain * float.re[i]!) * lsb;
    im[i] = (q.valueIm[i]! - q.gain * float.im[i]!) * lsb;
  }
  const t = envelope(
    re,
    im,
    0,
    n,
    PLOT_POINTS,
    (i) => i,
    (v) => round(v, 4),
  );
  return { x: t.x, re: t.floatDb, im: t.fixedDb };
}

/** |S(f)|² of two interleaved spectra, centred (negative frequencies first), x in Hz, dB re the float peak. */
function spectrumTrace(a: Float64Array, b: Float64Array, fs: number): PlotTrace {
  const m = a.length / 2;
  const pa = powerOf(a);
  const pb = powerOf(b);
  const sa = new Float64Array(m);
  const sb = new Float64Array(m);
  const half = Math.floor(m / 2);
  for (let k = 0; k < m; k++) {
    sa[k] = pa[(k + m - half) % m]!;
    sb[k] = pb[(k + m - half) % m]!;
  }
  let ref = 0;
  for (let k = 0; k < m; k++) ref = Math.max(ref, sa[k]!);
  return envelope(
    sa,
    sb,
    0,
    m,
    PLOT_POINTS,
    (k) => ((k - half) * fs) / m,
    (p) => toDb(p, ref > 0 ? ref : 1),
  );
}

function tableReport(
  role: TableReport["role"],
  float: ComplexSignal,
  q: QuantizedTable,
  inputBits: number | null,
): TableReport {
  let accumulator: TableReport["accumulator"] = null;
  if (inputBits !== null && q.spec.signed) {
    const g = accumulatorGrowth(inputBits, q.spec.wordLength, q);
    accumulator = { inputBits, worstCaseBits: g.worstCaseBits, recommendedBits: g.recommendedBits };
  }
  return {
    role,
    length: float.re.length,
    complex: float.im.some((v) => v !== 0),
    fixedPoint: q.spec,
    gain: q.gain,
    overflowCount: q.overflowCount,
    coefficientSqnrDb: finite(coefficientSqnrDb(float, fixedValues(q))),
    accumulator,
  };
}

const finite = (v: number): number | null => (Number.isFinite(v) ? v + 0 : null);

/** Plain numeric fields of a figures object (nested objects dropped). */
function flat(o: object): Record<string, number | null> {
  const r: Record<string, number | null> = {};
  for (const [k, v] of Object.entries(o)) if (typeof v === "number") r[k] = finite(v);
  return r;
}

function difference(
  a: Record<string, number | null>,
  b: Record<string, number | null>,
): Record<string, number | null> {
  const r: Record<string, number | null> = {};
  for (const k of Object.keys(b)) {
    const x = a[k];
    const y = b[k];
    if (x !== undefined) r[k] = x === null || y === null || y === undefined ? null : y - x;
  }
  return r;
}

/** Limit checks against a flat figures record; the SQNR limit applies to the worst table. */
function checkLimits(
  limits: AcceptanceLimits,
  fixed: Record<string, number | null | undefined>,
  worstSqnr: number | null,
): LimitCheck[] {
  const out: LimitCheck[] = [];
  const max = (name: keyof AcceptanceLimits, v: number | null | undefined) => {
    const limit = limits[name];
    if (limit === undefined || v === undefined) return;
    out.push({ name, limit, value: v, pass: v !== null && v <= limit });
  };
  const min = (name: keyof AcceptanceLimits, v: number | null | undefined) => {
    const limit = limits[name];
    if (limit === undefined || v === undefined) return;
    out.push({ name, limit, value: v, pass: v === null || v >= limit }); // null SQNR = exact = infinite
  };
  max("pslDbMax", fixed.pslDb);
  max("islrDbMax", fixed.islrDb);
  max("mismatchLossDbMax", fixed.mismatchLossDb);
  max("peakLossDbMax", fixed.peakLossDb);
  min("coefficientSqnrDbMin", worstSqnr);
  min("stopbandAttenuationDbMin", fixed.stopbandAttenuationDb);
  max("passbandRippleDbMax", fixed.passbandRippleDb);
  return out;
}

function worstOf(tables: TableReport[]): number | null {
  let w: number | null = null;
  for (const t of tables)
    if (t.coefficientSqnrDb !== null && (w === null || t.coefficientSqnrDb < w)) w = t.coefficientSqnrDb;
  return w;
}

const round = (v: number, digits = 3) => {
  const f = 10 ** digits;
  return Math.round(v * f) / f + 0; // + 0: no −0 in the JSON
};
const toDb = (p: number, ref: number) => round(Math.max(10 * Math.log10(p / ref), -200));

/**
 * Min/max envelope of two traces over [from, to): each bucket keeps its minimum and its maximum (in
 * index order), so narrow peaks survive decimation. Arrays shorter than the target pass unchanged.
 */
export function envelope(
  a: Float64Array,
  b: Float64Array,
  from: number,
  to: number,
  points: number,
  xOf: (i: number) => number,
  dbOf: (v: number) => number,
): PlotTrace {
  const trace: PlotTrace = { x: [], floatDb: [], fixedDb: [] };
  const n = to - from;
  const buckets = Math.max(1, Math.floor(points / 2));
  if (n <= points) {
    for (let i = from; i < to; i++) {
      trace.x.push(round(xOf(i), 4));
      trace.floatDb.push(dbOf(a[i]!));
      trace.fixedDb.push(dbOf(b[i]!));
    }
    return trace;
  }
  for (let k = 0; k < buckets; k++) {
    const s = from + Math.floor((k * n) / buckets);
    const e = from + Math.floor(((k + 1) * n) / buckets);
    let amin = Infinity;
    let amax = -Infinity;
    let bmin = Infinity;
    let bmax = -Infinity;
    for (let i = s; i < e; i++) {
      // Plain comparisons: same result as Math.min/max on the finite values met here, and faster.
      const va = a[i]!;
      const vb = b[i]!;
      if (va < amin) amin = va;
      if (va > amax) amax = va;
      if (vb < bmin) bmin = vb;
      if (vb > bmax) bmax = vb;
    }
    trace.x.push(round(xOf(s), 4), round(xOf(e - 1), 4));
    trace.floatDb.push(dbOf(amin), dbOf(amax));
    trace.fixedDb.push(dbOf(bmin), dbOf(bmax));
  }
  return trace;
}

function sweepSpec(spec: FixedPointSpec, w: number): FixedPointSpec {
  // Keep the integer bits (W − F): the table's range stays, only its resolution changes.
  return { ...spec, wordLength: w, fractionLength: spec.fractionLength + (w - spec.wordLength) };
}

/** Analyse a spec (validated with AnalysisSpecSchema; a ZodError names the bad field). */
export function analyze(input: unknown, opts?: { onProgress?: ProgressCallback }): AnalysisReport {
  const spec = AnalysisSpecSchema.parse(input);
  const progress = opts?.onProgress ?? (() => {});
  progress(0, "generate");
  const report = spec.kind === "waveform" ? analyzeWaveform(spec, progress) : analyzeFilter(spec, progress);
  progress(1, "done");
  return report;
}

type WaveformSpec = Extract<AnalysisSpec, { kind: "waveform" }>;
type FilterSpec = Extract<AnalysisSpec, { kind: "filter" }>;

function compressionFigures(m: ResponseMetrics, mismatch: number, peakLoss?: number): CompressionFigures {
  return peakLoss === undefined
    ? { ...m, mismatchLossDb: mismatch }
    : { ...m, mismatchLossDb: mismatch, peakLossDb: peakLoss };
}

/** Default U when the spec gives none: 1 for phase codes (their tables' sample-grid figures), else 8. */
export function defaultInterpolation(tx: WaveformSource): number {
  return tx.kind === "phase-code" ? 1 : 8;
}

/**
 * Smallest transform when U > 1: the ×U output is the band-limited interpolation of the periodic
 * (period M) output, so a short sequence's tail folds back onto it unless M is long enough. 8,192
 * puts Barker-13's PSL and ISLR within 0.003 dB of M → ∞ (tests/unit/dsp/numbers.test.ts).
 */
export const MIN_INTERPOLATED_SIZE = 8192;

/** Refuses an unsigned format for a table with negative components (they would all overflow). */
function checkSignedness(role: string, table: ComplexSignal, fp: FixedPointSpec): void {
  if (fp.signed) return;
  let negative = 0;
  for (let i = 0; i < table.re.length; i++) {
    if (table.re[i]! < 0) negative++;
    if (table.im[i]! < 0) negative++;
  }
  if (negative > 0)
    throw new RangeError(
      `fixedPoint.${role}.signed: false, but the ${role} table has ${negative} negative components of ${2 * table.re.length}; an unsigned word cannot hold them — use signed: true (two's complement)`,
    );
}

/** Keeps the positive frequencies ×2 (DC and Nyquist once): the spectrum of the analytic signal, in place. */
function analyticInPlace(spectrum: Float64Array): Float64Array {
  const m = spectrum.length / 2;
  for (let k = 1; k < m / 2; k++) {
    spectrum[2 * k] = 2 * spectrum[2 * k]!;
    spectrum[2 * k + 1] = 2 * spectrum[2 * k + 1]!;
  }
  spectrum.fill(0, m + 2);
  return spectrum;
}

function saturationWarning(role: string, q: QuantizedTable): string[] {
  if (q.overflowCount === 0) return [];
  const how = q.spec.overflow === "saturate" ? "saturated" : "wrapped";
  return [
    `${role}: ${q.overflowCount} components overflowed the ${q.spec.wordLength}-bit word and were ${how}`,
  ];
}

function analyzeWaveform(spec: WaveformSpec, progress: ProgressCallback): AnalysisReport {
  const fs = spec.tx.sampleRateHz;
  const u = spec.interpolation ?? defaultInterpolation(spec.tx);
  const s = generateWaveform(spec.tx);
  const n = s.re.length;
  if (n < 2)
    throw new RangeError(
      `tx: the waveform has ${n} sample; at least 2 are needed (a one-sample pulse has no sidelobes to measure)`,
    );
  const h = matchedFilter(s, spec.rx.window);
  checkSignedness("tx", s, spec.fixedPoint.tx);
  checkSignedness("rx", h, spec.fixedPoint.rx);
  const envelopeOf = spec.tx.kind === "lfm" && spec.tx.output === "real";
  const asMeasured = envelopeOf ? analyticInPlace : (x: Float64Array) => x;
  progress(0.05, "quantize");
  const qs = quantize(s, spec.fixedPoint.tx);
  const qh = quantize(h, spec.fixedPoint.rx);
  const sq = fixedValues(qs);
  const hq = fixedValues(qh);
  const size = Math.max(convolutionSize(n), u > 1 ? MIN_INTERPOLATED_SIZE : 0);
  const warnings = [
    ...windowWarnings(spec.rx.window, n),
    ...saturationWarning("tx", qs),
    ...saturationWarning("rx", qh),
  ];
  const sSpec = spectrumOf(s, size);
  const sqSpec = spectrumOf(sq, size);
  const expectedIndex = (n - 1) * u;
  const measureOpts = { interpolation: u, sampleRateHz: fs, expectedIndex };
  // One interpolation scratch for every output of this analysis; each output keeps its own ×2 grid
  // (the plots and the sweep read the ×U points from it, shared/dsp/refine.ts).
  const workspace = { interpolation: interpolationWorkspace(size) };
  progress(0.1, "float");
  const hSpec = spectrumOf(h, size);
  const fl = measureRefined(asMeasured(multiplySpectra(sSpec, hSpec, hSpec)), measureOpts, workspace);
  progress(0.35, "fixed");
  const hqSpec = spectrumOf(hq, size);
  const fx = measureRefined(asMeasured(multiplySpectra(sqSpec, hqSpec, hqSpec)), measureOpts, workspace);
  const floatFig = compressionFigures(fl.metrics, mismatchLossDb(s, h));
  const fixedFig = compressionFigures(
    fx.metrics,
    mismatchLossDb(sq, hq),
    peakLossDb(fl.metrics.peakAmplitude, fx.metrics.peakAmplitude),
  );
  const tables = [tableReport("tx", s, qs, null), tableReport("rx", h, qh, spec.inputBits)];
  const floatFlat = flat(floatFig);
  const fixedFlat = flat(fixedFig);
  const limits = checkLimits(spec.limits, fixedFlat, worstOf(tables));

  // Plots: whole output (up to the end of the linear convolution) on the ×2 grid, and the mainlobe at
  // the full ×U resolution (read from the ×2 grids by band-limited interpolation).
  const ref = fl.metrics.peakAmplitude ** 2;
  const dbOf = (p: number) => toDb(p, ref);
  const xOf = (i: number) => (i - expectedIndex) / u;
  const span = Math.min((2 * n - 1) * u, size * u);
  const span2 = Math.min(2 * (2 * n - 1), 2 * size);
  const lobe = Math.max(-fl.metrics.mainlobeSamples.left, fl.metrics.mainlobeSamples.right, 1);
  const zoomHalf = Math.min(Math.ceil(4 * lobe * u), 512);
  const zc = Math.round(fl.metrics.peakPositionSamples * u);
  const zoomFrom = Math.max(0, zc - zoomHalf);
  const zoomTo = Math.min(span, zc + zoomHalf + 1);
  const zoomF = new Float64Array(zoomTo - zoomFrom);
  const zoomQ = new Float64Array(zoomTo - zoomFrom);
  for (let j = zoomFrom; j < zoomTo; j++) {
    zoomF[j - zoomFrom] = fl.fine.at(j);
    zoomQ[j - zoomFrom] = fx.fine.at(j);
  }
  const plots: Record<string, PlotTrace> = {
    compressed: envelope(fl.grid.p, fx.grid.p, 0, span2, PLOT_POINTS, (i) => i / 2 - (n - 1), dbOf),
    mainlobe: envelope(zoomF, zoomQ, 0, zoomF.length, 4 * zoomHalf + 4, (i) => xOf(i + zoomFrom), dbOf),
    // The transmit spectrum at the convolution size (the guard of short sequences adds no information).
    spectrum:
      size === convolutionSize(n)
        ? spectrumTrace(sSpec, sqSpec, fs)
        : spectrumTrace(spectrumOf(s, convolutionSize(n)), spectrumOf(sq, convolutionSize(n)), fs),
  };
  const coefficientErrorLsb = { tx: lsbTrace(s, qs), rx: lsbTrace(h, qh) };

  let doppler: AnalysisReport["doppler"] = null;
  if (spec.dopplerHz !== undefined) {
    progress(0.55, "doppler");
    const base = { dopplerHz: spec.dopplerHz, sampleRateHz: fs, interpolation: u };
    doppler = {
      float: dopplerCut(s, h, { ...base, zeroDopplerPeak: fl.metrics.peakAmplitude }),
      fixed: dopplerCut(sq, hq, { ...base, zeroDopplerPeak: fx.metrics.peakAmplitude }),
    };
    // The cut itself near the target, float and fixed, dB re the zero-Doppler float peak.
    const echo = (x: ComplexSignal, f: ComplexSignal) =>
      powerOf(compress(applyDoppler(x, base.dopplerHz, fs), f, { interpolation: u, size }).y);
    const cutZoom = Math.min(Math.ceil(16 * lobe * u), 2048);
    plots.doppler = envelope(
      echo(s, h),
      echo(sq, hq),
      Math.max(0, zc - cutZoom),
      Math.min(span, zc + cutZoom + 1),
      PLOT_POINTS,
      xOf,
      dbOf,
    );
  }

  let sweep: AnalysisReport["sweep"] = null;
  if (spec.sweep) {
    progress(0.7, "sweep");
    const swept = spec.sweep.tables ?? ["rx"];
    const ctx = prepareSweep({
      floatGrid: fl.fine,
      floatMetrics: fl.metrics,
      size,
      interpolation: u,
      sampleRateHz: fs,
      expectedIndex,
      // The fixed output's ×2 grid has been used (plots made): the full recomputations may overwrite it.
      workspace: { ...workspace, grid: fx.grid },
    });
    const fixedTxSpec = swept.includes("tx") ? null : sqSpec;
    let txReport: TableReport | undefined;
    // Per-W buffers, reused by every W (the rows keep numbers only).
    const rxBufs = {
      re: new Float64Array(n),
      im: new Float64Array(n),
      valueRe: new Float64Array(n),
      valueIm: new Float64Array(n),
    };
    const hwSig = { re: new Float64Array(n), im: new Float64Array(n) };
    const padded = new Float64Array(2 * size);
    const hwSpec = new Float64Array(2 * size);
    const evaluate = (w: number, full: boolean) => {
      const txSpec = sweepSpec(spec.fixedPoint.tx, w);
      const rxSpec = sweepSpec(spec.fixedPoint.rx, w);
      const qsw = fixedTxSpec ? qs : quantize(s, txSpec);
      const qhw = swept.includes("rx") ? quantize(h, rxSpec, rxBufs) : qh;
      const sw = fixedTxSpec ? sq : fixedValues(qsw);
      const hw = hwSig;
      for (let i = 0; i < n; i++) {
        padded[2 * i] = hw.re[i] = qhw.valueRe[i]! / qhw.gain;
        padded[2 * i + 1] = hw.im[i] = qhw.valueIm[i]! / qhw.gain;
      }
      fftInterleaved(padded, false, hwSpec);
      const prod = asMeasured(multiplySpectra(fixedTxSpec ?? spectrumOf(sw, size), hwSpec, hwSpec));
      const m = full ? fullResponse(ctx, prod) : refinedResponse(ctx, prod);
      const fig = flat(
        compressionFigures(m, mismatchLossDb(sw, hw), peakLossDb(fl.metrics.peakAmplitude, m.peakAmplitude)),
      );
      // An unswept table's report is the same at every W: computed once.
      const t = [
        fixedTxSpec ? (txReport ??= tableReport("tx", s, qs, null)) : tableReport("tx", s, qsw, null),
        tableReport("rx", h, qhw, null),
      ];
      fig.coefficientSqnrDb = worstOf(t.filter((x) => swept.includes(x.role)));
      const pass = checkLimits(spec.limits, fig, worstOf(t)).every((c) => c.pass);
      return { figures: fig, pass };
    };
    const rows: SweepRow<Record<string, number | null>>[] = [];
    const { minBits, maxBits } = spec.sweep;
    for (let w = minBits; w <= maxBits; w++) {
      const r = evaluate(w, u === 1);
      rows.push({ wordLength: w, figures: r.figures, pass: r.pass, method: u === 1 ? "exact" : "refined" });
      progress(0.7 + (0.28 * (w - minBits + 1)) / (maxBits - minBits + 1), "sweep");
    }
    const smallest = confirmSmallest(rows, (w) => evaluate(w, true));
    sweep = { tables: swept, rows, smallestPassingWordLength: smallest };
  }

  return {
    version: ANALYSIS_REPORT_VERSION,
    kind: "waveform",
    sampleRateHz: fs,
    interpolation: u,
    tables,
    float: floatFlat,
    fixed: fixedFlat,
    diff: difference(floatFlat, fixedFlat),
    doppler,
    limits,
    pass: limits.every((c) => c.pass),
    sweep,
    plots,
    coefficientErrorLsb,
    datapath: datapathReport({ ...spec, settings: spec.datapath, waveform: s, floatTaps: h, table: qh }),
    definitions: DEFINITIONS,
    measurement: {
      signal: envelopeOf ? "envelope" : "complex output",
      interpolation: u,
      interpolationDefaulted: spec.interpolation === undefined,
      mainlobe: `from the peak to the first local minimum on each side, on the ×${u} grid${u === 1 ? " (the samples themselves)" : ""}`,
    },
    warnings,
  };
}

function analyzeFilter(spec: FilterSpec, progress: ProgressCallback): AnalysisReport {
  const { taps, passbands, stopbands } = firOf(spec.fir);
  const fs = spec.fir.sampleRateHz;
  const bands = { sampleRateHz: fs, passbands, stopbands };
  const points = spec.responsePoints;
  progress(0.1, "quantize");
  checkSignedness("fir", taps, spec.fixedPoint.fir);
  const q = quantize(taps, spec.fixedPoint.fir);
  const hq = fixedValues(q);
  const warnings = [
    ...(spec.fir.kind === "design" && spec.fir.window ? windowWarnings(spec.fir.window, taps.re.length) : []),
    ...saturationWarning("fir", q),
  ];
  const figures = (h: ComplexSignal): FirMetrics => firMetrics(h, bands, points);
  const floatFlat = flat(figures(taps));
  const fixedFlat = flat(figures(hq));
  const tables = [tableReport("fir", taps, q, spec.inputBits)];
  const limits = checkLimits(spec.limits, fixedFlat, worstOf(tables));
  progress(0.4, "response");
  const magF = firMagnitude(taps, points);
  const magQ = firMagnitude(hq, points);
  const real = taps.im.every((v) => v === 0);
  const len = real ? magF.length / 2 + 1 : magF.length;
  const sq = (m: Float64Array) => m.subarray(0, len).map((v) => v * v);
  const dcRef = 10 ** ((floatFlat.passbandGainDb ?? 0) / 10);
  const plots = {
    response: envelope(
      sq(magF),
      sq(magQ),
      0,
      len,
      PLOT_POINTS,
      (k) => (k * fs) / magF.length,
      (p) => toDb(p, dcRef),
    ),
  };

  let sweep: AnalysisReport["sweep"] = null;
  if (spec.sweep) {
    progress(0.6, "sweep");
    const rows: SweepRow<Record<string, number | null>>[] = [];
    for (let w = spec.sweep.minBits; w <= spec.sweep.maxBits; w++) {
      const qw = quantize(taps, sweepSpec(spec.fixedPoint.fir, w));
      const t = [tableReport("fir", taps, qw, null)];
      const fig = flat(figures(fixedValues(qw)));
      fig.coefficientSqnrDb = t[0]!.coefficientSqnrDb;
      rows.push({
        wordLength: w,
        figures: fig,
        pass: checkLimits(spec.limits, fig, worstOf(t)).every((c) => c.pass),
        method: "exact",
      });
    }
    const first = rows.find((r) => r.pass);
    sweep = { tables: ["fir"], rows, smallestPassingWordLength: first ? first.wordLength : null };
  }
  return {
    version: ANALYSIS_REPORT_VERSION,
    kind: "filter",
    sampleRateHz: fs,
    interpolation: 1,
    tables,
    float: floatFlat,
    fixed: fixedFlat,
    diff: difference(floatFlat, fixedFlat),
    doppler: null,
    limits,
    pass: limits.every((c) => c.pass),
    sweep,
    plots,
    coefficientErrorLsb: { fir: lsbTrace(taps, q) },
    datapath: datapathReport({ ...spec, settings: spec.datapath, floatTaps: taps, table: q }),
    firBands: { passbands, stopbands },
    definitions: DEFINITIONS,
    warnings,
  };
}
