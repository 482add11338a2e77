/**
 * Golden vectors of a bundle: a seeded stimulus (shared/dsp/stimulus.ts) filtered by the bit-true model
 * (shared/dsp/bit-true.ts) with the receive table (waveforms) or the FIR table (filters). Pure: the same
 * tables and content hash always give the same files.
 */
import { accumulatorGrowth } from "../../shared/dsp/accumulator";
import { bitTrueFilter } from "../../shared/dsp/bit-true";
import { makeStimulus, type StimulusScenario, type StimulusTarget } from "../../shared/dsp/stimulus";
import type { ComplexSignal, OverflowMode, RoundingMode } from "../../shared/dsp/types";
import { hexWord } from "../../shared/exports/words";

/** Widest output word written to the golden files (a 32-bit word is what firmware buses carry). */
export const GOLDEN_MAX_OUTPUT_BITS = 32;
/**
 * At most this many multiply-accumulates per golden run. Long filters are convolved exactly by NTT
 * (shared/dsp/bit-true.ts DIRECT_MAX_MACS), so the bound only keeps the stimulus at its 65,536-sample cap:
 * 2^36 covers 65,536 × the longest releasable table (server/bundles/limits.ts) with room to spare.
 */
export const GOLDEN_MAX_MACS = 2 ** 36;
/** Complex noise RMS relative to full scale in every golden stimulus. */
export const GOLDEN_NOISE_RMS = 0.05;

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
  rounding: RoundingMode;
  overflow: OverflowMode;
  /** ADC width of the stimulus (the revision's inputBits). */
  inputBits: number;
  /** Seeds the noise, so each content gets its own but a repeatable stimulus. */
  contentHash: string;
}

/** Everything golden/scenario.json states, beyond the stimulus scenario itself. */
export interface GoldenScenario {
  schema: "tapwright-golden";
  schemaVersion: "1.0";
  tapOrder: string;
  stimulus: StimulusScenario;
  filter: {
    table: string;
    length: number;
    coefficientBits: number;
    coefficientSigned: boolean;
    accumulatorBits: number;
    outputShift: number;
    outputBits: number;
    rounding: RoundingMode;
    overflow: OverflowMode;
    overflowCount: number;
    outputLength: number;
    description: string;
  };
  files: Record<"stimulusText" | "stimulusHex" | "expectedText" | "expectedHex", string>;
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

// A filter's stimulus echoes a unit impulse, so the expected output shows the impulse response in noise.
const IMPULSE: ComplexSignal = { re: Float64Array.of(1), im: Float64Array.of(0) };

function scenarioShape(kind: GoldenInput["kind"], waveformLength: number, filterLength: number) {
  // Two targets, the second weaker and overlapping the first's tail, plus room for the filter to ring out.
  // Bound the multiply-accumulates (length × taps); the build runs in a worker thread (server/bundles/queue.ts).
  const budget = Math.max(256, Math.floor(GOLDEN_MAX_MACS / Math.max(1, filterLength)));
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

/** Builds the golden files and their scenario. */
export function buildGolden(input: GoldenInput): { files: GoldenFile[]; scenario: GoldenScenario } {
  const waveform = input.kind === "waveform" ? input.waveform : IMPULSE;
  if (!waveform)
    throw new RangeError("a waveform design needs its transmit waveform for the golden stimulus");
  const { length, targets } = scenarioShape(input.kind, waveform.re.length, input.codes.re.length);
  const stimulus = makeStimulus({
    waveform,
    length,
    targets,
    noiseRms: GOLDEN_NOISE_RMS,
    seed: goldenSeed(input.contentHash),
    inputBits: input.inputBits,
  });
  // An unsigned W-bit code is a non-negative signed (W+1)-bit code: same value, one more bit on the bus.
  const coefficientBits = input.signed ? input.wordLength : input.wordLength + 1;
  const { worstCaseBits } = accumulatorGrowth(input.inputBits, coefficientBits, input.codes);
  // Keep the top bits of the worst-case accumulator: the output can then never overflow.
  const outputBits = Math.min(worstCaseBits, GOLDEN_MAX_OUTPUT_BITS);
  const outputShift = worstCaseBits - outputBits;
  const result = bitTrueFilter({
    input: stimulus,
    coefficients: input.codes,
    outputShift,
    rounding: input.rounding,
    overflow: input.overflow,
    outputBits,
    inputBits: input.inputBits,
    coefficientBits,
  });
  const enc = new TextEncoder();
  const paths = {
    stimulusText: "golden/stimulus.txt",
    stimulusHex: "golden/stimulus.hex",
    expectedText: "golden/expected.txt",
    expectedHex: "golden/expected.hex",
  };
  const files: GoldenFile[] = [
    { path: paths.stimulusText, bytes: enc.encode(decimalLines(stimulus)) },
    { path: paths.stimulusHex, bytes: enc.encode(hexLines(stimulus, input.inputBits)) },
    { path: paths.expectedText, bytes: enc.encode(decimalLines(result)) },
    { path: paths.expectedHex, bytes: enc.encode(hexLines(result, outputBits)) },
  ];
  const scenario: GoldenScenario = {
    schema: "tapwright-golden",
    schemaVersion: "1.0",
    tapOrder: "y[n] = Σ h[k]·x[n−k]",
    stimulus: stimulus.scenario,
    filter: {
      table: input.filterRole,
      length: input.codes.re.length,
      coefficientBits,
      coefficientSigned: true,
      accumulatorBits: worstCaseBits,
      outputShift,
      outputBits,
      rounding: input.rounding,
      overflow: input.overflow,
      overflowCount: result.overflowCount,
      outputLength: result.re.length,
      description:
        "Full convolution (Nx + Nh − 1 outputs) with exact complex integer multiply-accumulate: acc_I = Σ (hI·xI − hQ·xQ), acc_Q = Σ (hI·xQ + hQ·xI); then acc / 2^outputShift rounded with `rounding`, then `overflow` to a signed outputBits word.",
    },
    files: paths,
    fileFormat: {
      text: "one sample per line: I and Q as signed decimal integers separated by one space, LF line ends",
      hex: "one sample per line: I and Q as two's-complement words of ⌈bits/4⌉ upper-case hex digits separated by one space (IEEE 1364 $readmemh reads them as I0 Q0 I1 Q1 … into consecutive addresses)",
    },
  };
  files.push({ path: "golden/scenario.json", bytes: enc.encode(`${JSON.stringify(scenario, null, 2)}\n`) });
  return { files, scenario };
}
