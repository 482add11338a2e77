/**
 * The report's figures as table rows and limit chips: which metric, its unit, float | fixed | difference,
 * and the acceptance limit it is judged by. Pure: the report page, the what-if panel and tests share it.
 */
import type { AnalysisReport, LimitCheck } from "@shared/dsp/analysis";
import type { AcceptanceLimits } from "@shared/dsp/types";

/** How a figure is printed: dB with two decimals, samples/seconds/metres with engineering prefixes, plain ratio. */
export type MetricUnit = "dB" | "samples" | "s" | "m" | "ratio";

/** One metric of the report as people name it. */
export interface MetricDef {
  key: string;
  label: string;
  unit: MetricUnit;
  /** The acceptance limit judging this figure, if any. */
  limit?: keyof AcceptanceLimits;
}

/** Waveform metrics in reading order (docs/analysis.md "Report"). */
export const WAVEFORM_METRICS: readonly MetricDef[] = [
  { key: "pslDb", label: "Peak sidelobe level (PSL)", unit: "dB", limit: "pslDbMax" },
  { key: "islrDb", label: "Integrated sidelobe ratio (ISLR)", unit: "dB", limit: "islrDbMax" },
  { key: "mismatchLossDb", label: "Mismatch (SNR) loss", unit: "dB", limit: "mismatchLossDbMax" },
  { key: "peakLossDb", label: "Peak loss, fixed vs float", unit: "dB", limit: "peakLossDbMax" },
  { key: "width3dbSamples", label: "−3 dB mainlobe width", unit: "samples" },
  { key: "width3dbSeconds", label: "−3 dB mainlobe width", unit: "s" },
  { key: "width3dbMetres", label: "−3 dB range resolution (c/2)", unit: "m" },
  { key: "peakOffsetSamples", label: "Peak offset from the target", unit: "samples" },
];

/** Filter metrics in reading order. */
export const FILTER_METRICS: readonly MetricDef[] = [
  { key: "stopbandAttenuationDb", label: "Stopband attenuation", unit: "dB", limit: "stopbandAttenuationDbMin" },
  { key: "passbandRippleDb", label: "Passband ripple (peak-to-peak)", unit: "dB", limit: "passbandRippleDbMax" },
  { key: "passbandGainDb", label: "Passband gain", unit: "dB" },
  { key: "dcGainDb", label: "DC gain", unit: "dB" },
  { key: "dcGain", label: "DC gain (ratio)", unit: "ratio" },
];

/** Names of the limits as a sentence fragment, and whether the figure must stay below (max) or above (min). */
export const LIMIT_VIEW: Record<keyof AcceptanceLimits, { label: string; bound: "max" | "min" }> = {
  pslDbMax: { label: "PSL", bound: "max" },
  islrDbMax: { label: "ISLR", bound: "max" },
  mismatchLossDbMax: { label: "Mismatch loss", bound: "max" },
  peakLossDbMax: { label: "Peak loss", bound: "max" },
  coefficientSqnrDbMin: { label: "Coefficient SQNR", bound: "min" },
  stopbandAttenuationDbMin: { label: "Stopband attenuation", bound: "min" },
  passbandRippleDbMax: { label: "Passband ripple", bound: "max" },
};

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
export function metricRows(report: Pick<AnalysisReport, "kind" | "float" | "fixed" | "diff" | "limits" | "tables">): MetricRow[] {
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
    const check = sqnr ? { ...sqnr, value: t.coefficientSqnrDb, pass: t.coefficientSqnrDb === null || t.coefficientSqnrDb >= sqnr.limit } : null;
    rows.push({ key: `sqnr-${t.role}`, label: `Coefficient SQNR, ${t.role}`, unit: "dB", float: null, fixed: t.coefficientSqnrDb, diff: null, check });
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
export function limitChips(report: Pick<AnalysisReport, "limits" | "tables">): { table: string; chips: LimitChip[] }[] {
  const judged = report.tables.find((t) => t.role !== "tx")?.role ?? report.tables[0]?.role ?? "";
  return report.tables.map((t) => {
    const chips: LimitChip[] = [];
    for (const c of report.limits) {
      const view = LIMIT_VIEW[c.name];
      if (c.name === "coefficientSqnrDbMin") {
        const v = t.coefficientSqnrDb;
        chips.push({ key: `${t.role}-${c.name}`, label: view.label, value: v, limit: c.limit, bound: view.bound, pass: v === null || v >= c.limit });
      } else if (t.role === judged) {
        chips.push({ key: `${t.role}-${c.name}`, label: view.label, value: c.value, limit: c.limit, bound: view.bound, pass: c.pass });
      }
    }
    return { table: t.role, chips };
  });
}
