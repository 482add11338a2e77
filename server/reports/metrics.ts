/**
 * The words the report uses for each figure and limit (Tapwright's own wording), and how each is printed.
 */
import { db, plain, si } from "./format";

/** Human label of each report figure (keys of AnalysisReport float/fixed/diff). */
export const METRIC_LABELS: Record<string, string> = {
  pslDb: "Peak sidelobe level (PSL)",
  islrDb: "Integrated sidelobe ratio (ISLR)",
  mismatchLossDb: "Mismatch (SNR) loss",
  peakLossDb: "Peak loss, fixed vs float",
  width3dbSamples: "\u22123 dB mainlobe width",
  width3dbSeconds: "\u22123 dB mainlobe width (time)",
  width3dbMetres: "\u22123 dB mainlobe width (range)",
  peakAmplitude: "Peak |y|",
  peakPositionSamples: "Peak position",
  peakOffsetSamples: "Peak offset from the target",
  passbandRippleDb: "Passband ripple (peak-to-peak)",
  passbandGainDb: "Passband gain",
  stopbandAttenuationDb: "Stopband attenuation",
  dcGain: "DC gain",
  dcGainDb: "DC gain (dB)",
  coefficientSqnrDb: "Coefficient SQNR (worst table)",
};

/** Which figure each acceptance limit judges, and in which direction. */
export const LIMIT_METRIC: Record<string, { metric: string; bound: "max" | "min" }> = {
  pslDbMax: { metric: "pslDb", bound: "max" },
  islrDbMax: { metric: "islrDb", bound: "max" },
  mismatchLossDbMax: { metric: "mismatchLossDb", bound: "max" },
  peakLossDbMax: { metric: "peakLossDb", bound: "max" },
  coefficientSqnrDbMin: { metric: "coefficientSqnrDb", bound: "min" },
  stopbandAttenuationDbMin: { metric: "stopbandAttenuationDb", bound: "min" },
  passbandRippleDbMax: { metric: "passbandRippleDb", bound: "max" },
};

/** A label for any figure key, falling back to the key itself. */
export const labelOf = (key: string): string => METRIC_LABELS[key] ?? key;

/** Print a figure by its key's unit suffix (Db, Seconds, Metres, Samples). */
export function formatMetric(key: string, v: number | null | undefined): string {
  if (key === "coefficientSqnrDb" && v === null) return "exact";
  if (key.endsWith("Db")) return db(v);
  if (key.endsWith("Seconds")) return si(v, "s");
  if (key.endsWith("Metres")) return si(v, "m");
  if (key.endsWith("Samples")) return v === null || v === undefined ? "\u2014" : `${plain(v)} samples`;
  return plain(v);
}
