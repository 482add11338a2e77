import { cn } from "@/lib/cn";
import { chipText } from "../lib/format-metric";
import type { LimitChip } from "../lib/metric-rows";

/** One limit as a chip: the figure against its limit, and the verdict in words (never colour only). */
export function LimitChipView({ chip }: { chip: LimitChip }) {
  return (
    <li
      className={cn(
        "inline-flex items-center gap-1.5 rounded-sm border px-2 py-0.5 font-mono text-xs",
        chip.pass ? "border-pass-300 bg-pass-50 text-pass-800" : "border-fail-300 bg-fail-50 text-fail-800",
      )}
    >
      <span aria-hidden="true">{chip.pass ? "✓" : "✗"}</span>
      <span>{chipText(chip)}</span>
      <span className="font-sans font-semibold uppercase">{chip.pass ? "pass" : "fail"}</span>
    </li>
  );
}

/** The pass/fail strip: one row of chips per coefficient table. */
export function LimitChipStrip({ groups }: { groups: { table: string; chips: LimitChip[] }[] }) {
  const shown = groups.filter((g) => g.chips.length > 0);
  if (shown.length === 0)
    return <p className="text-sm text-ink-600">No acceptance limits are set for this revision.</p>;
  return (
    <div className="flex flex-col gap-1.5">
      {shown.map((g) => (
        <div key={g.table} className="flex items-start gap-1.5">
          <span className="w-8 shrink-0 pt-0.5 font-mono text-xs font-semibold text-ink-700">{g.table}</span>
          <ul className="flex min-w-0 flex-1 flex-wrap gap-1.5" aria-label={`Limits of table ${g.table}`}>
            {g.chips.map((c) => (
              <LimitChipView key={c.key} chip={c} />
            ))}
          </ul>
        </div>
      ))}
    </div>
  );
}
