/**
 * The analysis spec: what `analyze()` (shared/dsp/analysis.ts), the command line and the web app's
 * forms accept. Parsing applies the defaults, so a parsed spec is complete and reproducible (the
 * interpolation's default depends on the waveform and is applied by `analyze()`, which reports the U used).
 * Every object is strict: an unknown key is an error that names it (a misspelt `windw` is not dropped).
 */
import { z } from "zod";

const positive = (unit: string) => z.number().positive(`must be > 0 ${unit}`).finite();
const sampleArray = z.array(z.number().finite()).min(1, "at least one sample").max(4_194_304);

/** A window kind with its parameters (shared/dsp/windows.ts WindowSpec). */
export const WindowSpecSchema = z.discriminatedUnion("kind", [
  z.strictObject({ kind: z.literal("rectangular") }),
  z.strictObject({ kind: z.literal("hann") }),
  z.strictObject({ kind: z.literal("hamming") }),
  z.strictObject({ kind: z.literal("blackman") }),
  z.strictObject({ kind: z.literal("blackman-harris") }),
  z.strictObject({ kind: z.literal("kaiser"), beta: z.number().min(0).max(100) }),
  z.strictObject({ kind: z.literal("chebyshev"), attenuationDb: z.number().min(13).max(300) }),
  z.strictObject({
    kind: z.literal("taylor"),
    nbar: z.number().int().min(1).max(100),
    sidelobeDb: z.number().min(-300).max(-13),
  }),
]);

/** Fixed-point format of one table (shared/dsp/types.ts FixedPointSpec), with the usual defaults. */
export const FixedPointSpecSchema = z.strictObject({
  wordLength: z.number().int().min(2).max(32),
  fractionLength: z.number().int().min(-64).max(96),
  signed: z.boolean().default(true),
  scaling: z.enum(["as-given", "normalize", "full-scale"]).default("full-scale"),
  rounding: z
    .enum(["nearest-away", "nearest-even", "nearest-up", "floor", "ceiling", "toward-zero"])
    .default("nearest-even"),
  overflow: z.enum(["saturate", "wrap"]).default("saturate"),
});

/**
 * The receive/FIR datapath the firmware builds (shared/dsp/datapath.ts resolves it): accumulator width
 * (absent = the worst-case rule of shared/dsp/accumulator.ts), output width, output shift (absent =
 * accumulator bits − output bits, i.e. keep the top bits), and the output stage's rounding and overflow.
 * The input (ADC) width is the spec's `inputBits`.
 */
export const DatapathSpecSchema = z.object({
  accumulatorBits: z.number().int().min(2, "at least 2 bits").max(96, "at most 96 bits").optional(),
  outputBits: z.number().int().min(2, "at least 2 bits").max(32, "at most 32 bits").default(16),
  outputShift: z.number().int().min(0, "at least 0").max(128, "at most 128").optional(),
  outputRounding: z
    .enum(["nearest-away", "nearest-even", "nearest-up", "floor", "ceiling", "toward-zero"])
    .default("nearest-even"),
  outputOverflow: z.enum(["saturate", "wrap"]).default("saturate"),
});
/** The datapath when the author sets nothing. */
export const DATAPATH_DEFAULTS = {
  outputBits: 16,
  outputRounding: "nearest-even",
  outputOverflow: "saturate",
} as const;
export type DatapathSpec = z.infer<typeof DatapathSpecSchema>;
export type DatapathSpecInput = z.input<typeof DatapathSpecSchema>;

/** Acceptance limits; every field optional (absent = not checked). */
export const AcceptanceLimitsSchema = z.strictObject({
  pslDbMax: z.number().finite().optional(),
  islrDbMax: z.number().finite().optional(),
  mismatchLossDbMax: z.number().finite().optional(),
  peakLossDbMax: z.number().finite().optional(),
  coefficientSqnrDbMin: z.number().finite().optional(),
  stopbandAttenuationDbMin: z.number().finite().optional(),
  passbandRippleDbMax: z.number().finite().optional(),
});

/** The transmit waveform: from a generator's parameters or as explicit samples. */
export const WaveformSourceSchema = z.discriminatedUnion("kind", [
  z.strictObject({
    kind: z.literal("lfm"),
    bandwidthHz: positive("Hz"),
    pulseWidthS: positive("s"),
    sampleRateHz: positive("Hz"),
    direction: z.enum(["up", "down"]).default("up"),
    output: z.enum(["complex", "real"]).default("complex"),
    intermediateFrequencyHz: z.number().finite().optional(),
  }),
  z.strictObject({
    kind: z.literal("nlfm"),
    bandwidthHz: positive("Hz"),
    pulseWidthS: positive("s"),
    sampleRateHz: positive("Hz"),
    window: WindowSpecSchema,
  }),
  z.strictObject({
    kind: z.literal("phase-code"),
    code: z.discriminatedUnion("kind", [
      z.strictObject({ kind: z.literal("barker"), length: z.literal([2, 3, 4, 5, 7, 11, 13]) }),
      z.strictObject({ kind: z.enum(["frank", "p1", "p2"]), order: z.number().int().min(2).max(64) }),
      z.strictObject({ kind: z.enum(["p3", "p4"]), length: z.number().int().min(2).max(4096) }),
    ]),
    samplesPerChip: z.number().int().min(1).max(256).default(1),
    sampleRateHz: positive("Hz"),
  }),
  z.strictObject({
    kind: z.literal("samples"),
    sampleRateHz: positive("Hz"),
    re: sampleArray,
    im: sampleArray.optional(),
  }),
]);

/** A FIR filter: designed by the windowed-sinc method, or explicit taps with the bands to judge them by. */
export const FirSourceSchema = z.discriminatedUnion("kind", [
  z.strictObject({
    kind: z.literal("design"),
    band: z.enum(["lowpass", "bandpass"]),
    sampleRateHz: positive("Hz"),
    cutoffHz: positive("Hz").optional(),
    lowCutoffHz: positive("Hz").optional(),
    highCutoffHz: positive("Hz").optional(),
    transitionHz: positive("Hz"),
    stopbandAttenuationDb: z.number().min(10).max(200),
    window: WindowSpecSchema.optional(),
    taps: z.number().int().min(1).max(65_536).optional(),
  }),
  z.strictObject({
    kind: z.literal("taps"),
    sampleRateHz: positive("Hz"),
    re: sampleArray,
    im: sampleArray.optional(),
    /** Band edges in Hz, [low, high] pairs; real taps are judged on |f|. */
    passbands: z.array(z.tuple([z.number().finite(), z.number().finite()])).min(1),
    stopbands: z.array(z.tuple([z.number().finite(), z.number().finite()])).min(1),
  }),
]);

/** Which word lengths the sweep tries, and which tables it varies (default: the receive/FIR table). */
export const SweepSpecSchema = z
  .strictObject({
    minBits: z.number().int().min(2).max(32).default(6),
    maxBits: z.number().int().min(2).max(32).default(24),
    tables: z
      .array(z.enum(["tx", "rx", "fir"]))
      .min(1)
      .optional(),
  })
  .refine((s) => s.minBits <= s.maxBits, { message: "minBits must not exceed maxBits", path: ["maxBits"] });

const common = {
  /**
   * Interpolation factor U of the compressed output before measuring (1 = none). Absent: 1 for phase
   * codes (the sample-grid figures the tables of codes give, e.g. Barker-13 PSL −22.28 dB), else 8.
   */
  interpolation: z.number().int().min(1).max(16).optional(),
  limits: AcceptanceLimitsSchema.default({}),
  sweep: SweepSpecSchema.optional(),
  /** ADC (input) word length, for the accumulator growth. */
  inputBits: z.number().int().min(2).max(32).default(14),
  /** The receive (waveforms) or FIR (filters) datapath behind the golden vectors and the datapath figures. */
  datapath: DatapathSpecSchema.default(DATAPATH_DEFAULTS),
};

/** A waveform design: transmit table + matched receive filter h[n] = w[n]·conj(s[N−1−n]). */
export const WaveformAnalysisSpecSchema = z.strictObject({
  kind: z.literal("waveform"),
  tx: WaveformSourceSchema,
  rx: z
    .strictObject({ window: WindowSpecSchema.default({ kind: "rectangular" }) })
    .default({ window: { kind: "rectangular" } }),
  fixedPoint: z.strictObject({ tx: FixedPointSpecSchema, rx: FixedPointSpecSchema }),
  /** Doppler frequency of the echo for the ambiguity cut, Hz (absent = no Doppler cut). */
  dopplerHz: z.number().finite().optional(),
  ...common,
});

/** A FIR design: one table `fir`. */
export const FilterAnalysisSpecSchema = z.strictObject({
  kind: z.literal("filter"),
  fir: FirSourceSchema,
  fixedPoint: z.strictObject({ fir: FixedPointSpecSchema }),
  /** Points of the frequency response (at least 8192). */
  responsePoints: z.number().int().min(8192).max(1_048_576).default(8192),
  ...common,
});

/** Everything `analyze()` needs. */
export const AnalysisSpecSchema = z.discriminatedUnion("kind", [
  WaveformAnalysisSpecSchema,
  FilterAnalysisSpecSchema,
]);

/** A parsed (defaults applied) analysis spec. */
export type AnalysisSpec = z.infer<typeof AnalysisSpecSchema>;
/** What callers may write (defaults optional). */
export type AnalysisSpecInput = z.input<typeof AnalysisSpecSchema>;
export type WaveformSource = z.infer<typeof WaveformSourceSchema>;
export type FirSource = z.infer<typeof FirSourceSchema>;
