/**
 * The receive/FIR datapath a firmware engineer builds: ADC input width, accumulator width, output width,
 * output shift, output rounding and overflow (shared/schemas/analysis.ts DatapathSpecSchema), resolved
 * against a table's integer codes, plus the figures the report shows for it: output SQNR of the
 * bit-true path against the float filter, the worst-case accumulator reached, overflow counts.
 *
 * Accumulator extremes: acc_I = Σ_k (hI[k]·xI − hQ[k]·xQ) and acc_Q = Σ_k (hI[k]·xQ + hQ[k]·xI) are sums
 * of terms c·x with x a signed B-bit code in [−2^(B−1), 2^(B−1)−1]. Each term is largest with x = 2^(B−1)−1
 * for c > 0 and x = −2^(B−1) for c < 0, so the largest sum is (2^(B−1)−1)·P + 2^(B−1)·N and the most
 * negative is −(2^(B−1)·P + (2^(B−1)−1)·N), with P and N the sums of the positive and of the |negative|
 * coefficients c (the terms are independent, so both are reached, by the sign-matched inputs).
 */
import { accumulatorGrowth, bitLength } from "./accumulator";
import { exactAccumulate, outputStage, type IntegerSignal } from "./bit-true";
import { checkInteger } from "./check";
import { fftInterleaved, nextPow2 } from "./fft";
import { makeStimulus, type StimulusTarget } from "./stimulus";
import type { ComplexSignal, OverflowMode, QuantizedTable, RoundingMode } from "./types";

/** At most this many multiply-accumulates per scenario run (measured: 2.0 s for 65,536 complex taps on one core here). */
export const SCENARIO_MAX_MACS = 200_000_000;
/** Complex noise RMS relative to full scale in every scenario stimulus. */
export const SCENARIO_NOISE_RMS = 0.05;
/**
 * The report's scenario is cut to this many multiply-accumulates (about 0.2 s on one core), so long tables
 * do not slow the analysis; the bundle's scenario set keeps SCENARIO_MAX_MACS.
 */
export const REPORT_MAX_MACS = 20_000_000;
/** The report's scenario noise seed (the bundle's scenario set seeds from the content hash instead). */
export const REPORT_SCENARIO_SEED = 1;
/** A filter's scenario echoes a unit impulse, so its output shows the impulse response in noise. */
export const UNIT_IMPULSE: ComplexSignal = { re: Float64Array.of(1), im: Float64Array.of(0) };

/** Length and targets of the scenario stimulus (docs/bundle-format.md "Vector sets"). */
export function scenarioShape(
  kind: "waveform" | "filter",
  waveformLength: number,
  filterLength: number,
  maxMacs = SCENARIO_MAX_MACS,
): { length: number; targets: StimulusTarget[] } {
  // Two targets, the second weaker and overlapping the first's tail, plus room for the filter to ring out.
  // The release waits for this: bound the multiply-accumulates (length × taps).
  const budget = Math.max(256, Math.floor(maxMacs / Math.max(1, filterLength)));
  const length = Math.min(2 * waveformLength + filterLength + 32, 65_536, budget);
  const second = Math.min(
    length - 1,
    8 + Math.max(1, Math.floor(waveformLength / 2)) + (kind === "filter" ? 24 : 0),
  );
  const targets: StimulusTarget[] = [
    { delay: 8, amplitude: 0.5, phaseRad: 0 },
    { delay: second, amplitude: 0.25, phaseRad: Math.PI / 3 },
  ];
  return { length, targets };
}

/** What the author sets (absent fields are derived). */
export interface DatapathSettings {
  accumulatorBits?: number;
  outputBits: number;
  outputShift?: number;
  outputRounding: RoundingMode;
  outputOverflow: OverflowMode;
}

/** Extremes of one accumulator component over every input. */
export interface ComponentExtremes {
  /** Largest value reached (by x = 2^(B−1)−1 on c > 0 and −2^(B−1) on c < 0). */
  max: bigint;
  /** Most negative value reached (by x = −2^(B−1) on c > 0 and 2^(B−1)−1 on c < 0). */
  min: bigint;
}

/** The resolved datapath of one table. */
export interface ResolvedDatapath {
  inputBits: number;
  /** Signed coefficient width (an unsigned W-bit table is a signed W+1-bit one). */
  coefficientBits: number;
  accumulatorBits: number;
  /** True when the author set the accumulator width; false = the worst-case rule. */
  accumulatorBitsSet: boolean;
  /** The worst-case rule: inputBits + coefficientBits + ⌈log2 Σ|ĥ|⌉ (shared/dsp/accumulator.ts). */
  accumulatorRuleBits: number;
  /** Smallest signed width that holds both extremes exactly. */
  accumulatorRequiredBits: number;
  /** Largest |accumulator| any input can reach (decimal text). */
  accumulatorBound: string;
  outputBits: number;
  outputShift: number;
  /** True when the author set the shift; false = max(0, accumulatorBits − outputBits). */
  outputShiftSet: boolean;
  outputRounding: RoundingMode;
  outputOverflow: OverflowMode;
}

/** Extremes of acc_I and acc_Q for B-bit signed inputs (file comment). */
export function accumulatorExtremes(
  codes: IntegerSignal,
  inputBits: number,
): { i: ComponentExtremes; q: ComponentExtremes; bound: bigint } {
  checkInteger("inputBits", inputBits, 2, 32);
  const top = 1n << BigInt(inputBits - 1);
  const ext = (terms: [ArrayLike<number>, 1 | -1][]): ComponentExtremes => {
    let p = 0n;
    let n = 0n;
    for (const [c, sign] of terms)
      for (let k = 0; k < c.length; k++) {
        const v = sign * c[k]!;
        if (v > 0) p += BigInt(v);
        else if (v < 0) n += BigInt(-v);
      }
    return { max: (top - 1n) * p + top * n, min: -(top * p + (top - 1n) * n) };
  };
  const i = ext([
    [codes.re, 1],
    [codes.im, -1],
  ]);
  const q = ext([
    [codes.re, 1],
    [codes.im, 1],
  ]);
  let bound = 0n;
  for (const v of [i.max, -i.min, q.max, -q.min]) if (v > bound) bound = v;
  return { i, q, bound };
}

/** Smallest signed width A with −2^(A−1) ≤ min and max ≤ 2^(A−1) − 1. */
export function signedBitsFor(min: bigint, max: bigint): number {
  const neg = min < 0n ? bitLength(-min - 1n) + 1 : 1;
  const pos = max > 0n ? bitLength(max) + 1 : 1;
  return Math.max(2, neg, pos);
}

/** Resolves the author's settings against the table: accumulator and shift derived where not set. */
export function resolveDatapath(
  settings: DatapathSettings,
  inputBits: number,
  codes: IntegerSignal,
  coefficientBits: number,
): ResolvedDatapath {
  const rule = accumulatorGrowth(inputBits, coefficientBits, codes).worstCaseBits;
  const ext = accumulatorExtremes(codes, inputBits);
  const required = Math.max(signedBitsFor(ext.i.min, ext.i.max), signedBitsFor(ext.q.min, ext.q.max));
  const accumulatorBits = settings.accumulatorBits ?? rule;
  const outputShift = settings.outputShift ?? Math.max(0, accumulatorBits - settings.outputBits);
  return {
    inputBits,
    coefficientBits,
    accumulatorBits,
    accumulatorBitsSet: settings.accumulatorBits !== undefined,
    accumulatorRuleBits: rule,
    accumulatorRequiredBits: required,
    accumulatorBound: ext.bound.toString(),
    outputBits: settings.outputBits,
    outputShift,
    outputShiftSet: settings.outputShift !== undefined,
    outputRounding: settings.outputRounding,
    outputOverflow: settings.outputOverflow,
  };
}

/**
 * The sign-matched full-scale stimulus: four blocks of Nh samples whose last output reaches, in turn,
 * acc_I's largest value, acc_I's most negative, acc_Q's largest, acc_Q's most negative (file comment).
 * Block b ends at input index (b+1)·Nh − 1, so its extreme is output (b+1)·Nh − 1 of the full convolution.
 */
export function worstCaseStimulus(codes: IntegerSignal, inputBits: number): { re: number[]; im: number[] } {
  const nh = codes.re.length;
  const hi = 2 ** (inputBits - 1) - 1;
  const lo = -(2 ** (inputBits - 1));
  // The input that maximizes c·x (positive) or minimizes it (negative); 0 for c = 0.
  const pick = (c: number, positive: boolean) => (c === 0 ? 0 : c > 0 === positive ? hi : lo);
  const re: number[] = [];
  const im: number[] = [];
  for (const [component, positive] of [
    ["i", true],
    ["i", false],
    ["q", true],
    ["q", false],
  ] as const) {
    for (let j = 0; j < nh; j++) {
      const k = nh - 1 - j; // input j of the block meets tap k at the block's last output
      const hr = codes.re[k]!;
      const hq = codes.im[k]!;
      if (component === "i") {
        re.push(pick(hr, positive));
        im.push(pick(-hq, positive));
      } else {
        re.push(pick(hq, positive));
        im.push(pick(hr, positive));
      }
    }
  }
  return { re, im };
}

/** The datapath figures of the report. */
export interface DatapathFigures extends ResolvedDatapath {
  /** 10·log10(Σ|y_f|² / Σ|y_b·2^shift/(g·2^F) − y_f|²) on the scenario; null when the error is zero. */
  outputSqnrDb: number | null;
  scenarioLength: number;
  /** Output components (I, Q counted apart) that saturated or wrapped on the scenario. */
  scenarioOverflowCount: number;
  /** Accumulator components that did not fit accumulatorBits on the scenario. */
  scenarioAccumulatorOverflowCount: number;
  /** Largest |accumulator| reached on the scenario (decimal text) and its signed width. */
  scenarioMaxAbsAccumulator: string;
  scenarioAccumulatorBitsReached: number;
  /** The worst case (sign-matched full-scale input): the bound, its signed width, what it does. */
  worstCase: {
    maxAbsAccumulator: string;
    accumulatorBitsReached: number;
    /** Extremes (of 4) that do not fit the accumulator and wrap. */
    accumulatorOverflowCount: number;
    /** Extremes (of 4) whose output saturates or wraps. */
    outputOverflowCount: number;
  };
}

/** Input the report's datapath figures need. */
export interface DatapathFiguresInput {
  settings: DatapathSettings;
  inputBits: number;
  codes: IntegerSignal;
  coefficientBits: number;
  /** Float coefficients h (before scaling) and the table's gain g and fraction length F: code ≈ g·2^F·h. */
  floatTaps: ComplexSignal;
  gain: number;
  fractionLength: number;
  /** The integer stimulus of the scenario (ADC codes). */
  stimulus: IntegerSignal;
}

/** Float linear convolution by FFT (the reference only; the bit-true path is exact). */
function floatConvolve(x: IntegerSignal, h: ComplexSignal): { re: Float64Array; im: Float64Array } {
  const ny = x.re.length + h.re.length - 1;
  const size = nextPow2(ny);
  const a = new Float64Array(2 * size);
  const b = new Float64Array(2 * size);
  for (let i = 0; i < x.re.length; i++) {
    a[2 * i] = x.re[i]!;
    a[2 * i + 1] = x.im[i]!;
  }
  for (let i = 0; i < h.re.length; i++) {
    b[2 * i] = h.re[i]!;
    b[2 * i + 1] = h.im[i]!;
  }
  const fa = fftInterleaved(a);
  const fb = fftInterleaved(b);
  for (let k = 0; k < size; k++) {
    const ar = fa[2 * k]!;
    const ai = fa[2 * k + 1]!;
    const br = fb[2 * k]!;
    const bi = fb[2 * k + 1]!;
    fa[2 * k] = ar * br - ai * bi;
    fa[2 * k + 1] = ar * bi + ai * br;
  }
  const y = fftInterleaved(fa, true);
  const re = new Float64Array(ny);
  const im = new Float64Array(ny);
  for (let n = 0; n < ny; n++) {
    re[n] = y[2 * n]!;
    im[n] = y[2 * n + 1]!;
  }
  return { re, im };
}

/** Signed width that holds ±v. */
function bitsOfMagnitude(v: bigint): number {
  return signedBitsFor(-v, v);
}

/** Computes the datapath figures (cost: one exact filter run on the scenario, one float FFT convolution). */
export function datapathFigures(input: DatapathFiguresInput): DatapathFigures {
  const resolved = resolveDatapath(input.settings, input.inputBits, input.codes, input.coefficientBits);
  const stage = {
    accumulatorBits: resolved.accumulatorBits,
    outputShift: resolved.outputShift,
    rounding: resolved.outputRounding,
    overflow: resolved.outputOverflow,
    outputBits: resolved.outputBits,
  };
  const acc = exactAccumulate(input.stimulus, input.codes);
  const out = outputStage(acc, stage);
  // Reference: the float taps on the same integer input, in the same units as Σ h·x.
  const ref = floatConvolve(input.stimulus, input.floatTaps);
  const scale = 2 ** resolved.outputShift / (input.gain * 2 ** input.fractionLength);
  let sig = 0;
  let err = 0;
  for (let n = 0; n < ref.re.length; n++) {
    const fr = ref.re[n]!;
    const fi = ref.im[n]!;
    const er = out.re[n]! * scale - fr;
    const ei = out.im[n]! * scale - fi;
    sig += fr * fr + fi * fi;
    err += er * er + ei * ei;
  }
  // The worst case is reached at four known outputs: compute just those, exactly.
  const ext = accumulatorExtremes(input.codes, input.inputBits);
  const extremes = [ext.i.max, ext.i.min, ext.q.max, ext.q.min];
  const wrapped = outputStage({ path: "bigint", re: extremes, im: [0n, 0n, 0n, 0n] }, stage);
  const scenarioMax = BigInt(out.maxAbsAccumulator);
  return {
    ...resolved,
    outputSqnrDb: err === 0 ? null : 10 * Math.log10(sig / err),
    scenarioLength: input.stimulus.re.length,
    scenarioOverflowCount: out.overflowCount,
    scenarioAccumulatorOverflowCount: out.accumulatorOverflowCount,
    scenarioMaxAbsAccumulator: out.maxAbsAccumulator,
    scenarioAccumulatorBitsReached: bitsOfMagnitude(scenarioMax),
    worstCase: {
      maxAbsAccumulator: ext.bound.toString(),
      accumulatorBitsReached: resolved.accumulatorRequiredBits,
      accumulatorOverflowCount: wrapped.accumulatorOverflowCount,
      outputOverflowCount: wrapped.overflowCount,
    },
  };
}

/** What the analysis passes for the report's datapath figures. */
export interface DatapathReportInput {
  kind: "waveform" | "filter";
  settings: DatapathSettings;
  inputBits: number;
  /** The float transmit waveform the scenario echoes (waveforms). */
  waveform?: ComplexSignal;
  /** The float receive/FIR taps and their quantized table. */
  floatTaps: ComplexSignal;
  table: QuantizedTable;
}

/** The report's datapath figures on the scenario with REPORT_SCENARIO_SEED. */
export function datapathReport(o: DatapathReportInput): DatapathFigures {
  const waveform = o.kind === "waveform" && o.waveform ? o.waveform : UNIT_IMPULSE;
  const { length, targets } = scenarioShape(o.kind, waveform.re.length, o.table.re.length, REPORT_MAX_MACS);
  const stimulus = makeStimulus({
    waveform,
    length,
    targets,
    noiseRms: SCENARIO_NOISE_RMS,
    seed: REPORT_SCENARIO_SEED,
    inputBits: o.inputBits,
  });
  return datapathFigures({
    settings: o.settings,
    inputBits: o.inputBits,
    codes: o.table,
    coefficientBits: o.table.spec.signed ? o.table.spec.wordLength : o.table.spec.wordLength + 1,
    floatTaps: o.floatTaps,
    gain: o.table.gain,
    fractionLength: o.table.spec.fractionLength,
    stimulus,
  });
}
