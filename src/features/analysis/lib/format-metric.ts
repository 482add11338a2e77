/** How report figures are printed: dB with two decimals (UI.md), times and distances with SI prefixes. */
import { formatDb, formatEng } from "@/lib/format";
import type { LimitChip, MetricUnit } from "./metric-rows";

/** A figure in its unit; null prints as `nullText` (e.g. "exact" for the SQNR of an exactly representable table). */
export function formatMetric(value: number | null | undefined, unit: MetricUnit, nullText = "—"): string {
  if (value === null || value === undefined) return nullText;
  switch (unit) {
    case "dB":
      return formatDb(value);
    case "samples":
      return `${trimZero(value.toFixed(3))} samp`;
    case "s":
      return formatEng(value, "s", 4);
    case "m":
      return formatEng(value, "m", 4);
    case "ratio":
      return trimZero(value.toFixed(5));
  }
}

/** A difference with an explicit sign, so "+0.35 dB" reads as worse/better at a glance. */
export function formatDiff(value: number | null | undefined, unit: MetricUnit): string {
  if (value === null || value === undefined) return "—";
  const text = formatMetric(value, unit);
  return text.startsWith("-") || /^0(\.0+)? /.test(text) || text === "0" ? text : `+${text}`;
}

// "-0.000" reads as a sign error to an engineer.
const trimZero = (s: string) => (/^-0\.?0*$/.test(s) ? s.slice(1) : s);

/** A chip's words: "PSL -34.24 dB ≤ -30.00 dB"; the verdict is spelled out beside it, never colour only. */
export function chipText(chip: Pick<LimitChip, "label" | "value" | "limit" | "bound">): string {
  const v = chip.value === null ? (chip.bound === "min" ? "exact" : "—") : formatDb(chip.value);
  return `${chip.label} ${v} ${chip.bound === "max" ? "≤" : "≥"} ${formatDb(chip.limit)}`;
}
