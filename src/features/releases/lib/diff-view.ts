/** How the release diff reads on the page: metric labels and units, spec field names, values as text. Pure. */
import type { MetricChange, SpecChange } from "@shared/schemas/release-diff";
import { FILTER_METRICS, WAVEFORM_METRICS, type MetricUnit } from "@/features/analysis/lib/metric-rows";

/** Label and unit of a diff metric key; per-table SQNR keys are `coefficientSqnrDb.<role>`. */
export function metricView(
  kind: "waveform" | "filter",
  key: string,
): { label: string; unit: MetricUnit | null } {
  if (key.startsWith("coefficientSqnrDb."))
    return { label: `Coefficient SQNR, table ${key.slice(18)}`, unit: "dB" };
  const def = [
    ...(kind === "waveform" ? WAVEFORM_METRICS : FILTER_METRICS),
    ...WAVEFORM_METRICS,
    ...FILTER_METRICS,
  ].find((d) => d.key === key);
  return def ? { label: def.label, unit: def.unit } : { label: key, unit: null };
}

/** Known metrics first in the report page's reading order, then the per-table SQNRs; figures the page cannot name are left out. */
export function visibleMetrics(
  kind: "waveform" | "filter",
  metrics: readonly MetricChange[],
): MetricChange[] {
  const order = (kind === "waveform" ? WAVEFORM_METRICS : FILTER_METRICS).map((d) => d.key);
  const rank = (k: string) =>
    order.includes(k) ? order.indexOf(k) : k.startsWith("coefficientSqnrDb.") ? order.length : -1;
  return metrics
    .filter((m) => rank(m.key) >= 0)
    .sort((a, b) => rank(a.key) - rank(b.key) || a.key.localeCompare(b.key));
}

const FIELD_LABELS: Record<string, string> = {
  wordLength: "Word length W (bits)",
  fractionLength: "Fraction length F (bits)",
  signed: "Signed",
  scaling: "Scaling",
  rounding: "Rounding",
  overflow: "Overflow",
  gain: "Applied gain",
};

/** A spec field as people name it. */
export function fieldLabel(field: string): string {
  return FIELD_LABELS[field] ?? field;
}

/** A spec value as text: booleans as yes/no, the gain to 10 significant digits, an absent table as "—". */
export function specValue(change: SpecChange, side: "from" | "to"): string {
  const v = change[side];
  if (v === null) return "—";
  if (typeof v === "boolean") return v ? "yes" : "no";
  if (typeof v === "number" && change.field === "gain") return String(Number(v.toPrecision(10)));
  return String(v);
}

/** LSB with up to four decimals (changes are exact multiples of a power of two; 0.9375 stays whole). */
export function formatLsb(v: number | null): string {
  if (v === null) return "—";
  return `${Number(v.toFixed(4))} LSB`;
}
