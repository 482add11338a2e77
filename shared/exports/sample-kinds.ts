/** The sample tables a preview can use (kept apart from sample.ts so schemas do not pull in the DSP core). */
export const SAMPLE_KINDS = ["complex", "real"] as const;
/** One sample shape. */
export type SampleKind = (typeof SAMPLE_KINDS)[number];
