/**
 * The printed report's view of the shared report words (shared/report-words.ts), and how each figure is printed.
 */
import { LIMIT_WORDS, METRIC_WORDS } from "../../shared/report-words";
import { db, plain, si } from "./format";

/** Human label of each report figure (keys of AnalysisReport float/fixed/diff), as printed. */
export const METRIC_LABELS: Record<string, string> = Object.fromEntries(
  Object.entries(METRIC_WORDS).map(([k, w]) => [k, w.label]),
);

/** Which figure each acceptance limit judges, and in which direction. */
export const LIMIT_METRIC: Record<string, { metric: string; bound: "max" | "min" }> = Object.fromEntries(
  Object.entries(LIMIT_WORDS).map(([k, w]) => [k, { metric: w.metric, bound: w.bound }]),
);

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
