/**
 * Golden vectors of a bundle: five vector sets (the seeded scenario of shared/dsp/stimulus.ts and the sets of
 * server/bundles/vector-sets.ts), each filtered by the bit-true datapath (shared/dsp/bit-true.ts,
 * shared/dsp/datapath.ts) with the receive table (waveforms) or the FIR table (filters). Pure: the same
 * tables, datapath and content hash always give the same files.
 */
import { exactAccumulate, outputStage } from "../../shared/dsp/bit-true";
import {
  resolveDatapath,
  SCENARIO_NOISE_RMS,
  scenarioShape,
  UNIT_IMPULSE,
  type DatapathSettings,
  type ResolvedDatapath,
} from "../../shared/dsp/datapath";
import { makeStimulus, type StimulusScenario } from "../../shared/dsp/stimulus";
import type { ComplexSignal } from "../../shared/dsp/types";
import { hexWord } from "../../shared/exports/words";
import { impulseSet, randomFullScaleSet, roundingSet, worstCaseSet, type SetStimulus } from "./vector-sets";

/**
 * At most this many multiply-accumulates per golden run. Long filters are convolved exactly by NTT
 * (shared/dsp/bit-true.ts DIRECT_MAX_MACS), so the bound only keeps the stimulus at its 65,536-sample cap:
 * 2^36 covers 65,536 × the longest releasable table (server/bundles/limits.ts) with room to spare.
 */
export const GOLDEN_MAX_MACS = 2 ** 36;
/** Complex noise RMS relative to full scale in every golden stimulus. */
export const GOLDEN_NOISE_RMS = SCENARIO_NOISE_RMS;

/** What the golden vectors need to know. */
export interface GoldenInput {
  kind: "waveform" | "filter";
  /** The float transmit waveform echoed by the targets (waveforms only). */
  waveform?: ComplexSignal;
  /** Role of the table the stimulus is filtered with (`rx` or `fir`). */
  filterRole: string;
  /** Integer codes of that table. */
  codes: { re: ArrayLike<number>; im: ArrayLike<number> };
  wordLength: number;
  signed: boolean;
  /** The revision's datapath settings for this table. */
  datapath: DatapathSettings;
  /** ADC width of the stimulus (the revision's inputBits). */
  inputBits: number;
  /** Seeds the noise, so each content gets its own but a repeatable stimulus. */
  contentHash: string;
}

/** Names of the vector sets, in the order the bundle and the testbenches run them. */
export const VECTOR_SET_NAMES = [
  "scenario",
  "impulse",
  "worst-case",
  "rounding",
  "random-full-scale",
] as const;
export type VectorSetName = (typeof VECTOR_SET_NAMES)[number];

/** One vector set as the manifest and golden/sets.json describe it. */
export interface GoldenSet {
  name: VectorSetName;
  description: string;
  stimulus: { text: string; hex: string; length: number; bits: number };
  expected: { text: string; hex: string; length: number; bits: number };
  /** Largest |accumulator| this set reaches, exactly (decimal text: it may pass 2^53). */
  maxAbsAccumulator: string;
  /** Largest |accumulator| any input can reach (decimal text). */
  accumulatorBound: string;
  /** Output components that saturated or wrapped; accumulator components that wrapped. */
  overflowCount: number;
  accumulatorOverflowCount: number;
}

/** Everything golden/sets.json states. */
export interface GoldenSummary {
  schema: "tapwright-golden";
  schemaVersion: "2.0";
  tapOrder: string;
  filter: { table: string; length: number; coefficientBits: number; coefficientSigned: boolean };
  datapath: ResolvedDatapath;
  computation: string;
  feeding: string;
  scenario: StimulusScenario;
  sets: GoldenSet[];
  fileFormat: { text: string; hex: string };
}

/** A golden file, path relative to the bundle root. */
export interface GoldenFile {
  path: string;
  bytes: Uint8Array;
}

/** The seed used for a content hash: its first 12 hex digits (48 bits, exact in float64). */
export function goldenSeed(contentHash: string): number {
  const head = /^[0-9a-f]{12}/i.exec(contentHash)?.[0];
  if (!head) throw new RangeError("the content hash must start with 12 hex digits");
  return Number.parseInt(head, 16);
}

/** Lines "<I> <Q>" of decimal integers, one sample per line. */
export function decimalLines(s: { re: ArrayLike<number>; im: ArrayLike<number> }): string {
  let out = "";
  for (let n = 0; n < s.re.length; n++) out += `${s.re[n]! + 0} ${s.im[n]! + 0}\n`;
  return out;
}

/** Lines "<I> <Q>" of two's-complement hex words (⌈W/4⌉ digits), for $readmemh into an interleaved memory. */
export function hexLines(s: { re: ArrayLike<number>; im: ArrayLike<number> }, bits: number): string {
  let out = "";
  for (let n = 0; n < s.re.length; n++) out += `${hexWord(s.re[n]!, bits)} ${hexWord(s.im[n]!, bits)}\n`;
  return out;
}

/** Builds every vector set's files and their summary. */
export function buildGolden(input: GoldenInput): { files: GoldenFile[]; summary: GoldenSummary } {
  const waveform = input.kind === "waveform" ? input.waveform : UNIT_IMPULSE;
  if (!waveform)
    throw new RangeError("a waveform design needs its transmit waveform for the golden stimulus");
  const nh = input.codes.re.length;
  const { length, targets } = scenarioShape(input.kind, waveform.re.length, nh, GOLDEN_MAX_MACS);
  const seed = goldenSeed(input.contentHash);
  const stimulus = makeStimulus({
    waveform,
    length,
    targets,
    noiseRms: GOLDEN_NOISE_RMS,
    seed,
    inputBits: input.inputBits,
  });
  // An unsigned W-bit code is a non-negative signed (W+1)-bit code: same value, one more bit on the bus.
  const coefficientBits = input.signed ? input.wordLength : input.wordLength + 1;
  const dp = resolveDatapath(input.datapath, input.inputBits, input.codes, coefficientBits);
  const budget = Math.max(256, Math.floor(GOLDEN_MAX_MACS / Math.max(1, nh)));
  const stimuli: Record<VectorSetName, SetStimulus> = {
    scenario: {
      re: Array.from(stimulus.re),
      im: Array.from(stimulus.im),
      description:
        `The seeded radar scenario (golden/sets.json "scenario"): ${targets.length} targets ` +
        `(amplitudes ${targets.map((t) => t.amplitude).join(", ")} of full scale) echoing the ${input.kind === "waveform" ? "transmit waveform" : "unit impulse"} ` +
        `in complex noise of ${GOLDEN_NOISE_RMS} full-scale RMS, seed ${seed}.`,
    },
    impulse: impulseSet(input.codes, dp),
    "worst-case": worstCaseSet(input.codes, dp),
    rounding: roundingSet(input.codes, dp),
    "random-full-scale": randomFullScaleSet(
      input.codes,
      dp,
      (seed + 1) % Number.MAX_SAFE_INTEGER,
      Math.min(Math.max(4 * nh, 256), budget),
    ),
  };
  const enc = new TextEncoder();
  const files: GoldenFile[] = [];
  const sets: GoldenSet[] = [];
  for (const name of VECTOR_SET_NAMES) {
    const x = stimuli[name];
    const acc = exactAccumulate(x, input.codes);
    const y = outputStage(acc, {
      accumulatorBits: dp.accumulatorBits,
      outputShift: dp.outputShift,
      rounding: dp.outputRounding,
      overflow: dp.outputOverflow,
      outputBits: dp.outputBits,
    });
    const base = `golden/${name}`;
    const set: GoldenSet = {
      name,
      description: x.description,
      stimulus: {
        text: `${base}/stimulus.txt`,
        hex: `${base}/stimulus.hex`,
        length: x.re.length,
        bits: dp.inputBits,
      },
      expected: {
        text: `${base}/expected.txt`,
        hex: `${base}/expected.hex`,
        length: y.re.length,
        bits: dp.outputBits,
      },
      maxAbsAccumulator: y.maxAbsAccumulator,
      accumulatorBound: dp.accumulatorBound,
      overflowCount: y.overflowCount,
      accumulatorOverflowCount: y.accumulatorOverflowCount,
    };
    files.push(
      { path: set.stimulus.text, bytes: enc.encode(decimalLines(x)) },
      { path: set.stimulus.hex, bytes: enc.encode(hexLines(x, dp.inputBits)) },
      { path: set.expected.text, bytes: enc.encode(decimalLines(y)) },
      { path: set.expected.hex, bytes: enc.encode(hexLines(y, dp.outputBits)) },
    );
    sets.push(set);
  }
  const summary: GoldenSummary = {
    schema: "tapwright-golden",
    schemaVersion: "2.0",
    tapOrder: "y[n] = Σ h[k]·x[n−k]",
    filter: { table: input.filterRole, length: nh, coefficientBits, coefficientSigned: true },
    datapath: dp,
    computation:
      "Full convolution (Nx + Nh − 1 outputs) with exact complex integer multiply-accumulate: acc_I = Σ (hI·xI − hQ·xQ), acc_Q = Σ (hI·xQ + hQ·xI); " +
      "the sum wraps to a signed accumulatorBits register (two's complement), then acc / 2^outputShift is rounded with outputRounding, then outputOverflow to a signed outputBits word.",
    feeding:
      "Each set starts from a cleared delay line (reset), feeds its stimulus samples and then Nh − 1 zero samples; output n belongs to input n (output k of the impulse set is h[k]).",
    scenario: stimulus.scenario,
    sets,
    fileFormat: {
      text: "one sample per line: I and Q as signed decimal integers separated by one space, LF line ends; lines starting with # are comments",
      hex: "one sample per line: I and Q as two's-complement words of ⌈bits/4⌉ upper-case hex digits separated by one space (IEEE 1364 $readmemh reads them as I0 Q0 I1 Q1 … into consecutive addresses, zero-extended: sign-extend them yourself, see README.txt)",
    },
  };
  files.push({ path: "golden/sets.json", bytes: enc.encode(`${JSON.stringify(summary, null, 2)}\n`) });
  return { files, summary };
}
