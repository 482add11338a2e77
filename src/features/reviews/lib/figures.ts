/**
 * The review page's figures: this revision's fixed-point metrics beside the previous release's, and the
 * report's limit checks as chips. Pure, so the queue, the review section and unit tests share it.
 */
import type { AcceptanceLimits } from "@shared/dsp/types";
import type { FailingLimit, ReportSummary } from "@shared/schemas/reviews";
import {
  FILTER_METRICS,
  LIMIT_VIEW,
  WAVEFORM_METRICS,
  type LimitChip,
  type MetricUnit,
} from "@/features/analysis/lib/metric-rows";

/** One row of the comparison table: the new figure, the previous release's, and new − previous. */
export interface ComparedFigure {
  key: string;
  label: string;
  unit: MetricUnit;
  current: number | null;
  previous: number | null;
  /** current − previous; null when either side is missing. */
  delta: number | null;
}

/** Fixed-point figures of both reports, in the analysis page's reading order; rows missing on both sides are left out. */
export function compareFigures(
  kind: "waveform" | "filter",
  current: ReportSummary | null,
  previous: ReportSummary | null,
): ComparedFigure[] {
  const defs = kind === "waveform" ? WAVEFORM_METRICS : FILTER_METRICS;
  const rows: ComparedFigure[] = [];
  for (const d of defs) {
    const c = current?.fixed[d.key] ?? null;
    const p = previous?.fixed[d.key] ?? null;
    if (c === null && p === null) continue;
    rows.push({
      key: d.key,
      label: d.label,
      unit: d.unit,
      current: c,
      previous: p,
      delta: c !== null && p !== null ? c - p : null,
    });
  }
  return rows;
}

const isLimitName = (name: string): name is keyof AcceptanceLimits => Object.hasOwn(LIMIT_VIEW, name);

/** A limit check (from the report summary or the queue's failing list) as a chip; unknown names keep their own. */
export function chipOf(check: FailingLimit & { pass?: boolean }): LimitChip {
  const view = isLimitName(check.name)
    ? LIMIT_VIEW[check.name]
    : { label: check.name, bound: "max" as const };
  return {
    key: check.name,
    label: view.label,
    value: check.value,
    limit: check.limit,
    bound: view.bound,
    pass: check.pass ?? false,
  };
}

/** The first 12 hex digits of a hash, as the UI shows it next to a copy button. */
export function shortHash(hash: string): string {
  return `${hash.slice(0, 12)}…`;
}
