/**
 * The words of the analysis report, in one place for the printed report (server) and the report page (client):
 * each figure's name and unit, the acceptance limit that judges it, and each limit's short name and direction.
 * Pure data, Tapwright's own wording.
 */
import type { AcceptanceLimits } from "./dsp/types";

/** How a figure is printed: dB with two decimals, samples/seconds/metres with engineering prefixes, plain ratio. */
export type MetricUnit = "dB" | "samples" | "s" | "m" | "ratio";

/** The name of an acceptance limit. */
export type LimitKey = keyof AcceptanceLimits;

/** What a figure is called and how it is judged. */
export interface MetricWords {
  /** The full name, as the printed report heads the figure's row. */
  label: string;
  /** The name on screen where the unit has its own column, when it differs from `label`. */
  screenLabel?: string;
  unit: MetricUnit;
  /** The acceptance limit judging this figure, if any. */
  limit?: LimitKey;
}

/** Every report figure (keys of AnalysisReport float/fixed/diff). */
export const METRIC_WORDS: Readonly<Record<string, MetricWords>> = {
  pslDb: { label: "Peak sidelobe level (PSL)", unit: "dB", limit: "pslDbMax" },
  islrDb: { label: "Integrated sidelobe ratio (ISLR)", unit: "dB", limit: "islrDbMax" },
  mismatchLossDb: { label: "Mismatch (SNR) loss", unit: "dB", limit: "mismatchLossDbMax" },
  peakLossDb: { label: "Peak loss, fixed vs float", unit: "dB", limit: "peakLossDbMax" },
  width3dbSamples: { label: "\u22123 dB mainlobe width (samples)", unit: "samples" },
  width3dbSeconds: { label: "\u22123 dB mainlobe width (time)", unit: "s" },
  width3dbMetres: {
    label: "\u22123 dB mainlobe width (range)",
    screenLabel: "\u22123 dB range resolution (c/2)",
    unit: "m",
  },
  peakAmplitude: { label: "Peak |y|", unit: "ratio" },
  peakPositionSamples: { label: "Peak position", unit: "samples" },
  peakOffsetSamples: { label: "Peak offset from the target", unit: "samples" },
  passbandRippleDb: { label: "Passband ripple (peak-to-peak)", unit: "dB", limit: "passbandRippleDbMax" },
  passbandGainDb: { label: "Passband gain", unit: "dB" },
  stopbandAttenuationDb: { label: "Stopband attenuation", unit: "dB", limit: "stopbandAttenuationDbMin" },
  dcGain: { label: "DC gain", screenLabel: "DC gain (ratio)", unit: "ratio" },
  dcGainDb: { label: "DC gain (dB)", screenLabel: "DC gain", unit: "dB" },
  coefficientSqnrDb: { label: "Coefficient SQNR (worst table)", unit: "dB", limit: "coefficientSqnrDbMin" },
};

/** What a limit is called in a sentence, the figure it judges, and whether that figure must stay below (max) or above (min). */
export interface LimitWords {
  label: string;
  metric: string;
  bound: "max" | "min";
}

/** Every acceptance limit. */
export const LIMIT_WORDS: Readonly<Record<LimitKey, LimitWords>> = {
  pslDbMax: { label: "PSL", metric: "pslDb", bound: "max" },
  islrDbMax: { label: "ISLR", metric: "islrDb", bound: "max" },
  mismatchLossDbMax: { label: "Mismatch loss", metric: "mismatchLossDb", bound: "max" },
  peakLossDbMax: { label: "Peak loss", metric: "peakLossDb", bound: "max" },
  coefficientSqnrDbMin: { label: "Coefficient SQNR", metric: "coefficientSqnrDb", bound: "min" },
  stopbandAttenuationDbMin: { label: "Stopband attenuation", metric: "stopbandAttenuationDb", bound: "min" },
  passbandRippleDbMax: { label: "Passband ripple", metric: "passbandRippleDb", bound: "max" },
};

/** A report's overall verdict: no limits set means nothing was judged, which is neither a pass nor a fail. */
export type Verdict = "pass" | "fail" | "not-judged";

/** The verdict of a report (or of anything carrying its limit checks). */
export function verdictOf(report: { limits: ReadonlyArray<{ pass: boolean }> }): Verdict {
  if (report.limits.length === 0) return "not-judged";
  return report.limits.every((c) => c.pass) ? "pass" : "fail";
}

/** The verdict in words, the same on screen, in the printed report and in mail. */
export const VERDICT_WORDS: Readonly<Record<Verdict, string>> = {
  pass: "All limits pass",
  fail: "Limits fail",
  "not-judged": "Not judged: no limits set",
};
