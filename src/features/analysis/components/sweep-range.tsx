import { useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { defaultSweep } from "@shared/analysis-spec";
import type { RevisionDetail } from "@shared/schemas/designs";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/input";
import { useUpdateRevision } from "@/features/revisions/api/update-revision";
import { parseNumberText } from "@/lib/parse-number";
import { analysisKeys } from "../api/keys";

function problemOf(min: number | string, max: number | string): string | null {
  for (const [v, name] of [
    [min, "From"],
    [max, "To"],
  ] as const)
    if (typeof v !== "number" || !Number.isInteger(v) || v < 2 || v > 32)
      return `${name}: a whole number of bits from 2 to 32`;
  return (min as number) > (max as number) ? "From must not be above To" : null;
}

/**
 * The bit-width sweep's range on a draft: every analysis sweeps (default: the table's W − 10 … W + 4,
 * shared/analysis-spec.ts); the author may narrow or widen it here.
 */
export function SweepRange({ detail }: { detail: RevisionDetail }) {
  const current = detail.content.sweep ?? defaultSweep(detail.content);
  const [from, setFrom] = useState(String(current.minBits));
  const [to, setTo] = useState(String(current.maxBits));
  const update = useUpdateRevision(detail.revision.id);
  const qc = useQueryClient();
  const min = parseNumberText(from);
  const max = parseNumberText(to);
  const problem = problemOf(min, max);
  const changed = min !== current.minBits || max !== current.maxBits;
  const table = detail.content.kind === "waveform" ? "rx" : "fir";
  return (
    <form
      aria-label="Sweep range"
      className="flex flex-wrap items-end gap-2 text-sm text-ink-800"
      onSubmit={(e) => {
        e.preventDefault();
        if (problem || !changed) return;
        update.mutate(
          {
            ...detail.content,
            sweep: { ...detail.content.sweep, minBits: min as number, maxBits: max as number },
          },
          { onSuccess: () => void qc.invalidateQueries({ queryKey: analysisKeys.all }) },
        );
      }}
    >
      <span className="pb-1.5">
        Bit-width sweep of <span className="font-mono">{table}</span>
        {detail.content.sweep ? "" : " (default range)"}: W from
      </span>
      <label className="sr-only" htmlFor="sweep-from">
        Sweep from (bits)
      </label>
      <div className="w-16">
        <Input
          id="sweep-from"
          inputMode="numeric"
          autoComplete="off"
          className="text-right font-mono"
          value={from}
          invalid={problem?.startsWith("From") ?? false}
          onChange={(e) => setFrom(e.target.value)}
        />
      </div>
      <span className="pb-1.5">to</span>
      <label className="sr-only" htmlFor="sweep-to">
        Sweep to (bits)
      </label>
      <div className="w-16">
        <Input
          id="sweep-to"
          inputMode="numeric"
          autoComplete="off"
          className="text-right font-mono"
          value={to}
          invalid={problem?.startsWith("To") ?? false}
          onChange={(e) => setTo(e.target.value)}
        />
      </div>
      <span className="pb-1.5">bits</span>
      <Button size="sm" type="submit" busy={update.isPending} disabled={!changed || problem !== null}>
        Set range
      </Button>
      {problem && changed && (
        <span role="alert" className="pb-1.5 text-xs text-fail-700">
          {problem}
        </span>
      )}
      {update.isError && (
        <span role="alert" className="pb-1.5 text-xs text-fail-700">
          {update.error.message}
        </span>
      )}
    </form>
  );
}
