/**
 * The report's figures as table rows and limit chips: which metric, its unit, float | fixed | difference,
 * and the acceptance limit it is judged by. Pure: the report page, the what-if panel and tests share it.
 */
import type { AnalysisReport, LimitCheck } from "@shared/dsp/analysis";
import type { AcceptanceLimits } from "@shared/dsp/types";
import { LIMIT_WORDS, METRIC_WORDS, type MetricUnit } from "@shared/report-words";

export type { MetricUnit };

/** One metric of the report as people name it. */
export interface MetricDef {
  key: string;
  label: string;
  unit: MetricUnit;
  /** The acceptance limit judging this figure, if any. */
  limit?: keyof AcceptanceLimits;
}

/** The on-screen definitions of the figures named, in the order given. */
function defs(keys: readonly string[]): MetricDef[] {
  return keys.map((key) => {
    const w = METRIC_WORDS[key];
    if (!w) throw new RangeError(`no report words for ${key}`);
    return { key, label: w.screenLabel ?? w.label, unit: w.unit, ...(w.limit ? { limit: w.limit } : {}) };
  });
}

/** Waveform metrics in reading order (docs/analysis.md "Report"). */
export const WAVEFORM_METRICS: readonly MetricDef[] = defs([
  "pslDb",
  "islrDb",
  "mismatchLossDb",
  "peakLossDb",
  "width3dbSamples",
  "width3dbSeconds",
  "width3dbMetres",
  "peakOffsetSamples",
]);

/** Filter metrics in reading order. */
export const FILTER_METRICS: readonly MetricDef[] = defs([
  "stopbandAttenuationDb",
  "passbandRippleDb",
  "passbandGainDb",
  "dcGainDb",
  "dcGain",
]);

/** Names of the limits as a sentence fragment, and whether the figure must stay below (max) or above (min). */
export const LIMIT_VIEW: Readonly<Record<keyof AcceptanceLimits, { label: string; bound: "max" | "min" }>> =
  LIMIT_WORDS;

/** One row of the dense metrics table. */
export interface MetricRow {
  key: string;
  label: string;
  unit: MetricUnit;
  float: number | null;
  fixed: number | null;
  diff: number | null;
  /** The limit check when this figure is judged; null when no limit applies. */
  check: LimitCheck | null;
}

const pick = (r: Record<string, number | null>, k: string): number | null => r[k] ?? null;

/**
 * Rows for the metrics table: the kind's metrics present in the report, then one coefficient-SQNR row per
 * table (float is exact by definition, so only the fixed figure is shown). The SQNR limit is the report's
 * and applies to the worst table; each table's row is judged against the same limit.
 */
export function metricRows(
  report: Pick<AnalysisReport, "kind" | "float" | "fixed" | "diff" | "limits" | "tables">,
): MetricRow[] {
  const defs = report.kind === "waveform" ? WAVEFORM_METRICS : FILTER_METRICS;
  const checks = new Map(report.limits.map((c) => [c.name, c]));
  const rows: MetricRow[] = [];
  for (const d of defs) {
    if (!(d.key in report.fixed) && !(d.key in report.float)) continue;
    rows.push({
      key: d.key,
      label: d.label,
      unit: d.unit,
      float: pick(report.float, d.key),
      fixed: pick(report.fixed, d.key),
      diff: pick(report.diff, d.key),
      check: d.limit ? (checks.get(d.limit) ?? null) : null,
    });
  }
  const sqnr = checks.get("coefficientSqnrDbMin");
  for (const t of report.tables) {
    const check = sqnr
      ? {
          ...sqnr,
          value: t.coefficientSqnrDb,
          pass: t.coefficientSqnrDb === null || t.coefficientSqnrDb >= sqnr.limit,
        }
      : null;
    rows.push({
      key: `sqnr-${t.role}`,
      label: `Coefficient SQNR, ${t.role}`,
      unit: "dB",
      float: null,
      fixed: t.coefficientSqnrDb,
      diff: null,
      check,
    });
  }
  return rows;
}

/** A chip of the pass/fail strip: "PSL −34.24 dB ≤ −30.00 dB · pass". */
export interface LimitChip {
  key: string;
  label: string;
  value: number | null;
  limit: number;
  bound: "max" | "min";
  pass: boolean;
}

/**
 * Chips per table: the compression (or FIR) limits belong to the receive/FIR table, which is the one
 * the firmware engineer changes; the SQNR limit gives a chip for every table.
 */
export function limitChips(
  report: Pick<AnalysisReport, "limits" | "tables">,
): { table: string; chips: LimitChip[] }[] {
  const judged = report.tables.find((t) => t.role !== "tx")?.role ?? report.tables[0]?.role ?? "";
  return report.tables.map((t) => {
    const chips: LimitChip[] = [];
    for (const c of report.limits) {
      const view = LIMIT_VIEW[c.name];
      if (c.name === "coefficientSqnrDbMin") {
        const v = t.coefficientSqnrDb;
        chips.push({
          key: `${t.role}-${c.name}`,
          label: view.label,
          value: v,
          limit: c.limit,
          bound: view.bound,
          pass: v === null || v >= c.limit,
        });
      } else if (t.role === judged) {
        chips.push({
          key: `${t.role}-${c.name}`,
          label: view.label,
          value: c.value,
          limit: c.limit,
          bound: view.bound,
          pass: c.pass,
        });
      }
    }
    return { table: t.role, chips };
  });
}
