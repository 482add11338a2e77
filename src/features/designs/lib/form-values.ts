/**
 * The new-design form's own shape: what the inputs hold (MHz, µs, NaN for an empty number field), with
 * every generator's fields kept side by side so switching generator or window loses nothing typed.
 */
import type { DesignKind } from "@shared/schemas/designs";
import type { WindowSpec } from "@shared/dsp/windows";

/** A window choice with the parameters of every kind (only the chosen kind's are sent). */
export interface WindowFields {
  kind: WindowSpec["kind"];
  beta: number;
  attenuationDb: number;
  nbar: number;
  sidelobeDb: number;
}

/** One table's fixed-point format as the form holds it. */
export interface FixedPointFields {
  wordLength: number;
  fractionLength: number;
  signed: boolean;
  scaling: "as-given" | "normalize" | "full-scale";
  rounding: "nearest-away" | "nearest-even" | "nearest-up" | "floor" | "ceiling" | "toward-zero";
  overflow: "saturate" | "wrap";
}

/** Acceptance limits in dB; NaN = not checked. */
export interface LimitFields {
  pslDbMax: number;
  islrDbMax: number;
  mismatchLossDbMax: number;
  peakLossDbMax: number;
  coefficientSqnrDbMin: number;
  stopbandAttenuationDbMin: number;
  passbandRippleDbMax: number;
}

export type PhaseCodeKind = "barker" | "frank" | "p1" | "p2" | "p3" | "p4";
export type WaveformGenerator = "lfm" | "nlfm" | "phase-code";
export type SourceChoice = "generator" | "upload";

/** Everything the new-design form holds. */
export interface DesignFormValues {
  name: string;
  description: string;
  kind: DesignKind;
  source: SourceChoice;
  generator: WaveformGenerator;
  lfm: {
    bandwidthMHz: number;
    pulseWidthUs: number;
    sampleRateMHz: number;
    direction: "up" | "down";
    output: "complex" | "real";
    intermediateFrequencyMHz: number;
  };
  nlfm: { bandwidthMHz: number; pulseWidthUs: number; sampleRateMHz: number; window: WindowFields };
  phaseCode: {
    code: PhaseCodeKind;
    barkerLength: number;
    order: number;
    length: number;
    samplesPerChip: number;
    /** Whether `rateMHz` is the chip rate (sample rate = chip rate × samples per chip) or the sample rate. */
    rateBasis: "chip" | "sample";
    rateMHz: number;
  };
  fir: {
    band: "lowpass" | "bandpass";
    sampleRateMHz: number;
    cutoffMHz: number;
    lowCutoffMHz: number;
    highCutoffMHz: number;
    transitionMHz: number;
    stopbandAttenuationDb: number;
    /** false: Kaiser with β and order from the attenuation (the default of the DSP core). */
    customWindow: boolean;
    window: WindowFields;
    /** NaN = from the order formula. */
    taps: number;
  };
  upload: {
    /** NaN until a file is accepted by the server. */
    uploadId: number;
    sampleRateMHz: number;
    passLowMHz: number;
    passHighMHz: number;
    stopLowMHz: number;
    stopHighMHz: number;
  };
  rxWindow: WindowFields;
  fixedPoint: { tx: FixedPointFields; rx: FixedPointFields; fir: FixedPointFields };
  limits: LimitFields;
}

const window = (kind: WindowSpec["kind"]): WindowFields => ({
  kind,
  beta: 6,
  attenuationDb: 50,
  nbar: 6,
  sidelobeDb: -35,
});

// n̄ = 6 is the smallest meeting n̄ ≥ 2A² + 0.5 at −35 dB (shared/dsp/windows.ts taylorMinNbar).
// 16-bit two's complement, Q1.15, full scale: the usual starting point for DAC and FIR words (common practice).
const fixed16 = (): FixedPointFields => ({
  wordLength: 16,
  fractionLength: 15,
  signed: true,
  scaling: "full-scale",
  rounding: "nearest-even",
  overflow: "saturate",
});

const NO_LIMITS: LimitFields = {
  pslDbMax: NaN,
  islrDbMax: NaN,
  mismatchLossDbMax: NaN,
  peakLossDbMax: NaN,
  coefficientSqnrDbMin: NaN,
  stopbandAttenuationDbMin: NaN,
  passbandRippleDbMax: NaN,
};

/** A fresh form: a 10 MHz / 50 µs chirp sampled at 12.5 MHz with Taylor receive weighting, or a 70 dB low-pass. */
export function defaultFormValues(): DesignFormValues {
  return {
    name: "",
    description: "",
    kind: "waveform",
    source: "generator",
    generator: "lfm",
    lfm: {
      bandwidthMHz: 10,
      pulseWidthUs: 50,
      sampleRateMHz: 12.5,
      direction: "up",
      output: "complex",
      intermediateFrequencyMHz: NaN,
    },
    nlfm: { bandwidthMHz: 5, pulseWidthUs: 100, sampleRateMHz: 6.25, window: window("taylor") },
    phaseCode: {
      code: "barker",
      barkerLength: 13,
      order: 4,
      length: 16,
      samplesPerChip: 1,
      rateBasis: "chip",
      rateMHz: 5,
    },
    fir: {
      band: "lowpass",
      sampleRateMHz: 100,
      cutoffMHz: 10,
      lowCutoffMHz: 10,
      highCutoffMHz: 20,
      transitionMHz: 5,
      stopbandAttenuationDb: 70,
      customWindow: false,
      window: window("kaiser"),
      taps: NaN,
    },
    upload: {
      uploadId: NaN,
      sampleRateMHz: NaN,
      passLowMHz: 0,
      passHighMHz: NaN,
      stopLowMHz: NaN,
      stopHighMHz: NaN,
    },
    rxWindow: window("taylor"),
    fixedPoint: { tx: fixed16(), rx: fixed16(), fir: fixed16() },
    limits: { ...NO_LIMITS },
  };
}
